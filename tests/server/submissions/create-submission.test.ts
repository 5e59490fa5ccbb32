import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { MAX_FIT_FILE_BYTES } from '../../../shared/limits';
import { MAX_RECORDS_PER_FILE } from '../../../shared/analysis/decode-fit';
import { FILE_TYPE, simpleActivity, tinyRecordFile } from '../../../scripts/lib/fit-bytes';
import { recordingFit } from '../../shared/analysis/fit-files';
import { createCatalogue, submissionMeta, type TestCatalogue } from '../support/catalogue-factory';
import { signedInAgent, type TestAgent } from '../support/sign-in';
import { createTestContext } from '../support/test-app';
import { asBuffer, cleanPair } from './fit-pairs';

const { app, db } = await createTestContext({ fakes: true });

let catalogue: TestCatalogue;
let rider: { agent: TestAgent; csrf: () => Promise<string> };

beforeAll(async () => {
  catalogue = await createCatalogue(db);
  rider = await signedInAgent(app, { handle: 'upload-rider' });
});

const pair = cleanPair();
const PNG_BYTES = Buffer.from('89504e470d0a1a0a0000000d49484452000000010000000108060000001f15c489', 'hex');

async function upload(
  files: Array<[field: string, bytes: Buffer, name?: string]>,
  meta: unknown = submissionMeta(catalogue),
  options: { agent?: TestAgent; csrf?: boolean } = {},
) {
  const agent = options.agent ?? rider.agent;
  let req = agent.post('/api/submissions');
  if (options.csrf !== false) req = req.set('X-CSRF-Token', await rider.csrf());
  req = req.field('meta', typeof meta === 'string' ? meta : JSON.stringify(meta));
  for (const [field, bytes, name] of files) req = req.attach(field, bytes, name ?? `${field}.fit`);
  return req;
}

const bothFiles = (): Array<[string, Buffer]> => [
  ['fileA', asBuffer(pair.a)],
  ['fileB', asBuffer(pair.b)],
];

async function rowCounts() {
  const [{ count: submissions }] = await db('submissions').count();
  const [{ count: recordings }] = await db('submission_recordings').count();
  return { submissions: Number(submissions), recordings: Number(recordings) };
}

describe('POST /api/submissions', () => {
  it('when a rider uploads two FIT files of one ride with valid tags, then both streams are stored without location and the submission is received', async () => {
    const before = await rowCounts();

    const res = await upload(bothFiles());

    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ status: 'received', url: `/submissions/${res.body.id}` });
    expect(await rowCounts()).toEqual({ submissions: before.submissions + 1, recordings: before.recordings + 2 });
    const recordings = await db('submission_recordings').where({ submission_id: res.body.id }).orderBy('side');
    expect(recordings.map((r) => r.side)).toEqual(['a', 'b']);
    // The original files are not kept: what is stored is smaller and carries no FIT signature.
    for (const r of recordings) {
      expect(r.stream.includes(Buffer.from('.FIT'))).toBe(false);
      expect(JSON.stringify(r.device_info)).not.toMatch(/lat|long/i);
    }
  });

  it('when the same two files are uploaded again, then the answer is 409 with a link to the first submission', async () => {
    const first = await db('submissions').orderBy('id').first('id');

    const res = await upload(bothFiles());

    expect(res.status).toBe(409);
    expect(res.body.error.details).toEqual({ submissionId: first.id, url: `/submissions/${first.id}` });
  });

  it('when the same ride is uploaded again with A and B swapped (and the tags swapped), then it is refused like an exact re-upload and nothing is stored', async () => {
    // Issue 14: demo pair 03 as A/B, then as B/A, was accepted as a new submission.
    const first = await db('submissions').orderBy('id').first('id');
    const meta = submissionMeta(catalogue);
    const before = await rowCounts();

    const res = await upload(
      [
        ['fileA', asBuffer(pair.b)],
        ['fileB', asBuffer(pair.a)],
      ],
      { ...meta, a: meta.b, b: meta.a },
    );

    expect(res.status).toBe(409);
    expect(res.body.error.details).toEqual({ submissionId: first.id, url: `/submissions/${first.id}` });
    expect(await rowCounts()).toEqual(before);
  });
});

describe('POST /api/submissions with bad input', () => {
  const other = cleanPair(99);
  const farApart = recordingFit({ seconds: 900, start: 1_600_000_000 });
  const truncated = asBuffer(other.a).subarray(0, Math.floor(other.a.length * 0.6));
  const withoutPower = recordingFit({ seconds: 900, power: () => 0xffff });
  const flipped = Buffer.from(other.b);
  flipped[Math.floor(flipped.length / 2)] ^= 0x10;
  const rideStart = 1_717_225_200;
  const settings = simpleActivity({ seconds: 900, fileType: FILE_TYPE.settings });
  const oneRecordAYearOn = simpleActivity({ seconds: 900, start: rideStart, time: (i) => rideStart + i + (i === 450 ? 365 * 86400 : 0) });
  const tooShort = recordingFit({ seconds: 300 });
  const tooManyRecords = tinyRecordFile(MAX_RECORDS_PER_FILE + 1);

  const cases: Array<{
    when: string;
    send: () => ReturnType<typeof upload>;
    status: number;
    code: string;
    field?: string;
    message: RegExp;
  }> = [
    {
      when: 'file A is a PNG renamed .fit',
      send: () =>
        upload([
          ['fileA', PNG_BYTES, 'ride.fit'],
          ['fileB', asBuffer(other.b)],
        ]),
      status: 400,
      code: 'not_fit',
      field: 'fileA',
      message: /not a FIT file/,
    },
    {
      when: 'file B is truncated',
      send: () =>
        upload([
          ['fileA', asBuffer(other.a)],
          ['fileB', truncated],
        ]),
      status: 400,
      code: 'ended_early',
      field: 'fileB',
      message: /The second file ended early: its header promises/,
    },
    {
      when: 'file B has a changed byte',
      send: () =>
        upload([
          ['fileA', asBuffer(other.a)],
          ['fileB', flipped],
        ]),
      status: 400,
      code: 'damaged_file',
      field: 'fileB',
      message: /The second file is damaged: its checksum does not match/,
    },
    {
      when: 'file A is a settings file',
      send: () =>
        upload([
          ['fileA', asBuffer(settings)],
          ['fileB', asBuffer(other.b)],
        ]),
      status: 400,
      code: 'not_activity',
      field: 'fileA',
      message: /FIT settings file, not a recorded activity/,
    },
    {
      when: 'one record of file B is dated a year later',
      send: () =>
        upload([
          ['fileA', asBuffer(other.a)],
          ['fileB', asBuffer(oneRecordAYearOn)],
        ]),
      status: 400,
      code: 'implausible_timestamps',
      field: 'fileB',
      message: /spans 365 days/,
    },
    {
      when: 'file B lasts 5 minutes',
      send: () =>
        upload([
          ['fileA', asBuffer(other.a)],
          ['fileB', asBuffer(tooShort)],
        ]),
      status: 400,
      code: 'too_short',
      field: 'fileB',
      message: /too short/,
    },
    {
      when: 'file B holds more records than the cap',
      send: () =>
        upload([
          ['fileA', asBuffer(other.a)],
          ['fileB', asBuffer(tooManyRecords)],
        ]),
      status: 400,
      code: 'too_many_records',
      field: 'fileB',
      message: /more than 1,500,000 records/,
    },
    {
      when: 'file B has no power',
      send: () =>
        upload([
          ['fileA', asBuffer(other.a)],
          ['fileB', asBuffer(withoutPower)],
        ]),
      status: 400,
      code: 'no_power',
      field: 'fileB',
      message: /no power data/,
    },
    {
      when: 'the two recordings do not overlap',
      send: () =>
        upload([
          ['fileA', asBuffer(other.a)],
          ['fileB', asBuffer(farApart)],
        ]),
      status: 400,
      code: 'no_overlap',
      field: 'files',
      message: /do not overlap in time/,
    },
    {
      when: 'file B is missing',
      send: () => upload([['fileA', asBuffer(other.a)]]),
      status: 400,
      code: 'validation_failed',
      field: 'fileB',
      message: /exactly two FIT files/,
    },
    {
      when: 'a third file is attached',
      send: () =>
        upload([
          ['fileA', asBuffer(other.a)],
          ['fileB', asBuffer(other.b)],
          ['fileC', asBuffer(other.b)],
        ]),
      status: 400,
      code: 'validation_failed',
      message: /exactly two FIT files/,
    },
    {
      when: 'a file is larger than the limit',
      send: () =>
        upload([
          ['fileA', Buffer.alloc(MAX_FIT_FILE_BYTES + 1024)],
          ['fileB', asBuffer(other.b)],
        ]),
      status: 413,
      code: 'payload_too_large',
      message: /larger than 25 MB/,
    },
    {
      when: 'both files are the same recording',
      send: () =>
        upload([
          ['fileA', asBuffer(other.a)],
          ['fileB', asBuffer(other.a)],
        ]),
      status: 400,
      code: 'identical_files',
      field: 'fileB',
      message: /same recording/,
    },
    {
      when: 'the firmware does not belong to the model',
      send: () =>
        upload(
          [
            ['fileA', asBuffer(other.a)],
            ['fileB', asBuffer(other.b)],
          ],
          submissionMeta(catalogue, { a: { ...submissionMeta(catalogue).a, firmwareId: catalogue.pedalsFirmware.id } }),
        ),
      status: 400,
      code: 'validation_failed',
      field: 'a.firmwareId',
      message: /not listed for Orbit/,
    },
    {
      when: 'the model does not exist',
      send: () =>
        upload(
          [
            ['fileA', asBuffer(other.a)],
            ['fileB', asBuffer(other.b)],
          ],
          submissionMeta(catalogue, { b: { ...submissionMeta(catalogue).b, modelId: 999_999 } }),
        ),
      status: 400,
      code: 'validation_failed',
      field: 'b.modelId',
      message: /not in the catalogue/,
    },
    {
      when: 'a form field is out of range',
      send: () =>
        upload(
          [
            ['fileA', asBuffer(other.a)],
            ['fileB', asBuffer(other.b)],
          ],
          submissionMeta(catalogue, { surface: 'ice', notes: 'x'.repeat(2001) }),
        ),
      status: 400,
      code: 'validation_failed',
      field: 'surface',
      message: /notes: at most 2000 characters/,
    },
    {
      when: 'the recording device id is true rather than a number',
      send: () =>
        upload(
          [
            ['fileA', asBuffer(other.a)],
            ['fileB', asBuffer(other.b)],
          ],
          submissionMeta(catalogue, { a: { ...submissionMeta(catalogue).a, recordingDeviceId: true } }),
        ),
      status: 400,
      code: 'validation_failed',
      field: 'a.recordingDeviceId',
      message: /choose a recording device/,
    },
    {
      when: 'the recording device firmware carries a line break and a header',
      send: () =>
        upload(
          [
            ['fileA', asBuffer(other.a)],
            ['fileB', asBuffer(other.b)],
          ],
          submissionMeta(catalogue, { a: { ...submissionMeta(catalogue).a, recordingDeviceFirmware: '4.1\r\nBcc: someone@example.test' } }),
        ),
      status: 400,
      code: 'validation_failed',
      field: 'a.recordingDeviceFirmware',
      message: /one line of plain text/,
    },
    {
      when: 'the form data is not JSON',
      send: () =>
        upload(
          [
            ['fileA', asBuffer(other.a)],
            ['fileB', asBuffer(other.b)],
          ],
          '{not json',
        ),
      status: 400,
      code: 'validation_failed',
      field: 'meta',
      message: /not valid JSON/,
    },
  ];

  it.each(cases)('when $when, then the answer is $status $code and nothing is stored', async ({ send, status, code, field, message }) => {
    const before = await rowCounts();

    const res = await send();

    expect(res.status).toBe(status);
    expect(res.body.error.code).toBe(code);
    expect(res.body.error.message).toMatch(message);
    if (field) expect(Object.keys(res.body.error.details.fields)).toContain(field);
    expect(await rowCounts()).toEqual(before);
  });

  it('when the request has no CSRF token, then it is refused with 403 and nothing is stored', async () => {
    const before = await rowCounts();

    const res = await upload(
      [
        ['fileA', asBuffer(other.a)],
        ['fileB', asBuffer(other.b)],
      ],
      undefined,
      { csrf: false },
    );

    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('csrf_invalid');
    expect(await rowCounts()).toEqual(before);
  });

  it('when nobody is signed in, then it is refused with 401 and nothing is stored', async () => {
    const before = await rowCounts();
    const visitor = request.agent(app);
    const token = (await visitor.get('/api/csrf-token')).body.token;

    const res = await visitor
      .post('/api/submissions')
      .set('X-CSRF-Token', token)
      .field('meta', JSON.stringify(submissionMeta(catalogue)))
      .attach('fileA', asBuffer(other.a), 'a.fit')
      .attach('fileB', asBuffer(other.b), 'b.fit');

    expect(res.status).toBe(401);
    expect(await rowCounts()).toEqual(before);
  });

  it('when the database fails while the second recording is written, then the whole submission is rolled back', async () => {
    const before = await rowCounts();
    // A real failure inside the transaction: a trigger refuses B's row.
    await db.raw(`create function refuse_b() returns trigger language plpgsql as $$
      begin if new.side = 'b' then raise exception 'disk full (test)'; end if; return new; end $$`);
    await db.raw('create trigger refuse_b before insert on submission_recordings for each row execute function refuse_b()');
    try {
      const res = await upload([
        ['fileA', asBuffer(other.a)],
        ['fileB', asBuffer(other.b)],
      ]);

      expect(res.status).toBe(500);
      expect(res.body.error.message).toMatch(/Something went wrong/);
      expect(await rowCounts()).toEqual(before);
    } finally {
      await db.raw('drop trigger refuse_b on submission_recordings');
      await db.raw('drop function refuse_b()');
    }
  });
});
