import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { decideSubmission } from '../../../server/features/moderation/moderation.service';
import {
  analyseSubmission,
  enqueueAnalysis,
  MAX_ANALYSIS_ATTEMPTS,
  workAnalysisQueue,
} from '../../../server/features/submissions/analyse-submission.job';
import { createLogger } from '../../../server/lib/logger';
import { METHOD_VERSION } from '../../../shared/analysis/method';
import { createSubmission } from '../../../server/features/submissions/submissions.service';
import { createSubmissionInput } from '../../../shared/schemas/submission';
import { submissionView } from '../../../shared/schemas/submission-view';
import { decodeStream } from '../../../server/features/submissions/stream-codec';
import { createCatalogue, submissionMeta, type TestCatalogue } from '../support/catalogue-factory';
import { signedInAgent, type TestAgent } from '../support/sign-in';
import { createTestContext } from '../support/test-app';
import { asBuffer, cleanPair } from './fit-pairs';
import { insertFirmware } from '../../../server/features/catalogue/catalogue.repository';
import { versionOrder } from '../../../shared/schemas/catalogue';
import { simulatePair } from '../../../shared/simulator/pair';
import { testObjectStore } from '../../support/test-object-store';

const { app, db, queue } = await createTestContext({ fakes: true, worker: true });

let catalogue: TestCatalogue;
let rider: { agent: TestAgent; csrf: () => Promise<string>; user: { id: number } };

beforeAll(async () => {
  catalogue = await createCatalogue(db);
  rider = await signedInAgent(app, { handle: 'job-rider' });
});

async function waitForStatus(agent: TestAgent, id: number, statuses: string[], timeoutMs = 20_000) {
  const until = Date.now() + timeoutMs;
  for (;;) {
    const res = await agent.get(`/api/submissions/${id}`);
    if (statuses.includes(res.body.status) || Date.now() > until) return res;
    await new Promise((r) => setTimeout(r, 200));
  }
}

/** Stores a submission through the service without queueing it, so a test controls the job. */
async function storedSubmission(seed: number) {
  const pair = cleanPair(seed);
  const input = createSubmissionInput.parse(submissionMeta(catalogue));
  const { id } = await createSubmission({ db, store: testObjectStore() }, rider.user.id, input, {
    a: { buffer: asBuffer(pair.a), originalName: 'a.fit' },
    b: { buffer: asBuffer(pair.b), originalName: 'b.fit' },
  });
  return { id, pair };
}

describe('the analysis job', () => {
  it('when a rider uploads a pair, then the worker analyses it and the result recovers the injected bias', async () => {
    const pair = cleanPair(21);
    const upload = await rider.agent
      .post('/api/submissions')
      .set('X-CSRF-Token', await rider.csrf())
      .field('meta', JSON.stringify(submissionMeta(catalogue)))
      .attach('fileA', asBuffer(pair.a), 'a.fit')
      .attach('fileB', asBuffer(pair.b), 'b.fit');
    expect(upload.status).toBe(201);

    const res = await waitForStatus(rider.agent, upload.body.id, ['awaiting_review', 'failed']);

    expect(res.body.status).toBe('awaiting_review');
    expect(res.body.result.methodVersion).toBe(METHOD_VERSION);
    // Known truth from the simulator: A (spider) reads 3 % high against B (dual pedals).
    expect(res.body.result.bias.percent).toBeCloseTo(pair.truth.biasPercent, 0);
    expect(res.body.result.alignment.overlapSeconds).toBeGreaterThan(1000);
    expect(res.body.recordings.map((r: { modelName: string }) => r.modelName)).toEqual(['Orbit', 'Treadle']);
    const row = await db('submissions').where({ id: upload.body.id }).first();
    expect(row.bias_percent).toBeCloseTo(res.body.result.bias.percent, 9);
    expect(row.a_power_dropouts).toBe(0);
  });

  it("when A's firmware tag contradicts the version its file reports, then the analysis raises a severe firmware_tag_mismatch flag", async () => {
    // Issue 14: demo pair 01 tagged 2.2 while its file reports 1.2 showed "No flags" in the queue.
    const reported = await insertFirmware(db, {
      modelId: catalogue.spider.id,
      version: '1.2',
      versionOrder: versionOrder('1.2'),
      releasedOn: '2026-01-01',
      status: 'approved',
    });
    const tagged = await insertFirmware(db, {
      modelId: catalogue.spider.id,
      version: '2.2',
      versionOrder: versionOrder('2.2'),
      releasedOn: '2026-02-01',
      status: 'approved',
    });
    const pair = simulatePair({
      seed: 61,
      durationSeconds: 1200,
      a: { position: 'total', scale: 1.03, sensor: { productId: 9, serialNumber: 4242, softwareVersion: 1.2 } },
      b: { position: 'dual' },
    });
    const meta = submissionMeta(catalogue);
    const input = createSubmissionInput.parse({ ...meta, a: { ...meta.a, firmwareId: tagged.id } });
    const { id } = await createSubmission({ db, store: testObjectStore() }, rider.user.id, input, {
      a: { buffer: asBuffer(pair.a), originalName: 'a.fit' },
      b: { buffer: asBuffer(pair.b), originalName: 'b.fit' },
    });

    await analyseSubmission(db, id);

    const row = await db('submissions').where({ id }).first('flags', 'flag_severity');
    expect(row.flags).toContainEqual({
      code: 'firmware_tag_mismatch',
      severity: 'severe',
      message: "Device A's power meter firmware is tagged 2.2, but its file reports 1.2.",
    });
    expect(row.flag_severity).toBe(3);
    expect(reported.id).not.toBe(tagged.id);
  });

  it('when the job runs twice for the same submission, then there is one result and the second run changes nothing', async () => {
    const { id } = await storedSubmission(31);
    await analyseSubmission(db, id);
    const first = await db('submissions').where({ id }).first('analysed_at', 'attempts', 'result');

    await analyseSubmission(db, id);

    const second = await db('submissions').where({ id }).first('analysed_at', 'attempts', 'result');
    expect(second).toEqual(first);
    expect(first.attempts).toBe(1);
  });

  it('when the stored stream cannot be read, then the job is retried and the submission fails after the last attempt', async () => {
    const { id } = await storedSubmission(41);
    await db('submission_recordings')
      .where({ submission_id: id, side: 'b' })
      .update({ stream: Buffer.from('not gzip') });

    await enqueueAnalysis(queue!, id);
    const res = await waitForStatus(rider.agent, id, ['failed'], 25_000);

    expect(res.body.status).toBe('failed');
    expect(res.body.errorMessage).toMatch(/could not be completed/);
    const row = await db('submissions').where({ id }).first('attempts');
    expect(row.attempts).toBe(MAX_ANALYSIS_ATTEMPTS);
  });
});

describe('lost analysis jobs', () => {
  it('when a stored submission never got its job while a worker runs, then the sweep queues it and it is analysed', async () => {
    const separate = await createTestContext({ queue: true });
    // The worker starts before the submission exists, so only its sweep can find it.
    await workAnalysisQueue(separate.queue!, separate.db, createLogger({ LOG_LEVEL: 'silent' }), { everyMs: 200, idleSeconds: 60 });
    const { id } = await storedSubmission(71);
    await db('submissions')
      .where({ id })
      .update({ updated_at: db.raw("now() - interval '1 hour'") });

    const res = await waitForStatus(rider.agent, id, ['awaiting_review', 'failed']);

    expect(res.body.status).toBe('awaiting_review');
  });
});

describe('who sees a submission before it is accepted', () => {
  let id: number;
  beforeAll(async () => {
    ({ id } = await storedSubmission(51));
  });

  it('when the rider who uploaded it asks, then it is shown with device info', async () => {
    const res = await rider.agent.get(`/api/submissions/${id}`);
    expect(res.status).toBe(200);
    expect(res.body.isOwn).toBe(true);
    expect(res.body.recordings[0].deviceInfo).toBeDefined();
  });

  it('when another rider or a visitor asks, then it is not found', async () => {
    const other = await signedInAgent(app, { handle: 'curious-rider' });
    expect((await other.agent.get(`/api/submissions/${id}`)).status).toBe(404);
    expect((await request(app).get(`/api/submissions/${id}`)).status).toBe(404);
  });

  it('when a moderator asks, then it is shown', async () => {
    const moderator = await signedInAgent(app, { handle: 'job-moderator', roles: ['moderator'] });
    expect((await moderator.agent.get(`/api/submissions/${id}`)).status).toBe(200);
  });

  it('when the rider lists their submissions, then it is among them', async () => {
    const res = await rider.agent.get('/api/me/submissions');
    expect(res.status).toBe(200);
    expect(res.body.submissions.map((s: { id: number }) => s.id)).toContain(id);
  });
});

describe('who sees a submission once it is accepted', () => {
  let id: number;
  beforeAll(async () => {
    ({ id } = await storedSubmission(61));
    await analyseSubmission(db, id);
    const moderator = await signedInAgent(app, { handle: 'accepting-moderator', roles: ['moderator'] });
    await decideSubmission(db, { submissionId: id, moderatorId: moderator.user.id, decision: 'accept' });
  });

  it("when a visitor asks, then it is shown without the devices' details, the ride's clock times or file hashes", async () => {
    const res = await request(app).get(`/api/submissions/${id}`);

    expect(res.status).toBe(200);
    expect(submissionView.strict().safeParse(res.body).success).toBe(true);
    expect(res.body.status).toBe('accepted');
    expect(res.body.isOwn).toBe(false);
    expect(res.body.recordings.every((r: Record<string, unknown>) => !('deviceInfo' in r))).toBe(true);
    // The public gets the day of the ride, not the minute it started.
    expect(res.body.rideDate).toMatch(/^\d{4}-\d{2}-\d{2}$/);
    expect(res.body.result.alignment).not.toHaveProperty('startTime');
    expect(res.body.result).not.toHaveProperty('devices');
    expect(res.body.result).not.toHaveProperty('recordings');
    expect(JSON.stringify(res.body)).not.toMatch(/serial|sha256|T\d{2}:\d{2}/i);
  });

  it("when the rider asks, then the devices' makes and software are shown but no serial number is", async () => {
    const res = await rider.agent.get(`/api/submissions/${id}`);

    expect(res.body.recordings[0].deviceInfo.creator).toEqual({
      manufacturerId: expect.any(Number),
      productId: expect.any(Number),
      softwareVersion: expect.any(Number),
    });
    expect(JSON.stringify(res.body)).not.toMatch(/serial/i);
  });

  it('when the result is stored, then no serial number or clock time of the recordings is kept outside the stream', async () => {
    const stored = await db('submissions').where({ id }).first('result');
    const recordings = await db('submission_recordings').where({ submission_id: id }).select('device_info', 'recording_stats', 'stream');

    expect(stored.result).not.toHaveProperty('devices');
    expect(stored.result.alignment).not.toHaveProperty('startTime');
    for (const r of recordings) {
      expect(r.device_info.creator.serialNumber).toBeNull();
      expect(r.recording_stats).not.toHaveProperty('startTime');
      expect(r.recording_stats.durationSeconds).toBeGreaterThan(0);
      expect(decodeStream(r.stream).device.creator.serialNumber).toBeNull();
    }
  });
});
