import { createHash } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { freePort } from '../../../scripts/lib/port';
import { SWEEP_ORIGINALS_QUEUE } from '../../../server/features/originals/originals-sweep.job';
import { ORIGINALS_PREFIX, originalKey, sweepUnreferencedOriginals } from '../../../server/features/originals/originals.service';
import { DECODER_VERSION } from '../../../shared/analysis/decode-fit';
import { simulatePair } from '../../../shared/simulator/pair';
import { startS3ProxyFailingWrites } from '../../support/failing-s3-proxy';
import { testObjectStore } from '../../support/test-object-store';
import { coordinatesIn, decodeWithSdk, expectStrippedLikeOriginal } from '../../shared/fit/sdk-messages';
import { createCatalogue, submissionMeta, type TestCatalogue } from '../support/catalogue-factory';
import { signedInAgent } from '../support/sign-in';
import { createTestContext, type TestContext } from '../support/test-app';
import { asBuffer, cleanPair } from '../submissions/fit-pairs';

const context = await createTestContext({ fakes: true });
const { app, db } = context;
const store = testObjectStore();
const HOUR_MS = 3600_000;

let catalogue: TestCatalogue;
beforeAll(async () => {
  catalogue = await createCatalogue(db);
});

/** A 20-minute ride whose two head units both logged GPS positions. */
function pairWithGps(seed: number) {
  return simulatePair({
    seed,
    durationSeconds: 1200,
    profile: 'endurance',
    a: { position: 'total', scale: 1.02, noisePercent: 1, includeLocation: true },
    b: { position: 'dual', noisePercent: 1, includeLocation: true },
  });
}

async function upload(target: TestContext['app'], handle: string, files: { a: Uint8Array; b: Uint8Array }) {
  const { agent, csrf } = await signedInAgent(target, { handle });
  return agent
    .post('/api/submissions')
    .set('X-CSRF-Token', await csrf())
    .field('meta', JSON.stringify(submissionMeta(catalogue)))
    .attach('fileA', asBuffer(files.a), 'a.fit')
    .attach('fileB', asBuffer(files.b), 'b.fit');
}

async function rowCounts() {
  const [{ count: submissions }] = await db('submissions').count();
  const [{ count: recordings }] = await db('submission_recordings').count();
  return { submissions: Number(submissions), recordings: Number(recordings) };
}

async function keysInStore(): Promise<string[]> {
  const keys: string[] = [];
  for await (const object of store.list(ORIGINALS_PREFIX)) keys.push(object.key);
  return keys.sort();
}

const sha256 = (bytes: Uint8Array) => createHash('sha256').update(bytes).digest('hex');

describe('keeping the uploaded files', () => {
  it('when two files with GPS positions are uploaded, then each recording names its stripped original in the store, which the SDK decodes to the upload minus every coordinate', async () => {
    const pair = pairWithGps(301);
    expect(coordinatesIn(decodeWithSdk(pair.a).messages).length).toBeGreaterThan(0);

    const res = await upload(app, 'gps-rider', pair);

    expect(res.status).toBe(201);
    const recordings = await db('submission_recordings').where({ submission_id: res.body.id }).orderBy('side');
    for (const [recording, uploaded] of [
      [recordings[0], pair.a],
      [recordings[1], pair.b],
    ] as const) {
      const stored = await store.get(recording.original_key);
      expect(stored).toBeDefined();
      expect(recording.original_key).toBe(originalKey(sha256(stored!)));
      expect(recording.original_key).toMatch(/^originals\/[0-9a-f]{2}\/[0-9a-f]{2}\/[0-9a-f]{64}\.fit$/);
      expect(recording.original_bytes).toBe(stored!.length);
      expect(recording.decoder_version).toBe(DECODER_VERSION);
      expect(recording.sha256).toBe(sha256(uploaded));
      expectStrippedLikeOriginal(uploaded, stored!);
    }
  });

  it('when nothing answers at the store during an upload, then the answer is 503 store_unavailable and no row is written', async () => {
    const down = await createTestContext({ fakes: true, env: { S3_ENDPOINT: `http://127.0.0.1:${await freePort()}` } });
    const before = await rowCounts();

    const res = await upload(down.app, 'outage-rider', cleanPair(302));

    expect(res.status).toBe(503);
    expect(res.body.error.code).toBe('store_unavailable');
    expect(res.body.error.message).toMatch(/nothing was saved/);
    expect(await rowCounts()).toEqual(before);
  });

  it('when the store fails after the first of the two writes, then the upload is refused with no rows, and the sweep removes the orphan once it is past the grace period and not before', async () => {
    const proxy = await startS3ProxyFailingWrites(process.env.S3_ENDPOINT!, 1);
    afterAll(() => proxy.stop());
    const flaky = await createTestContext({ fakes: true, env: { S3_ENDPOINT: proxy.endpoint } });
    const before = { rows: await rowCounts(), keys: await keysInStore() };

    const res = await upload(flaky.app, 'half-written-rider', cleanPair(303));

    expect(res.status).toBe(503);
    expect(await rowCounts()).toEqual(before.rows);
    const orphans = (await keysInStore()).filter((key) => !before.keys.includes(key));
    expect(orphans).toHaveLength(1);

    const young = await sweepUnreferencedOriginals({ db, store, graceHours: 24, now: new Date(Date.now() + 23 * HOUR_MS) });
    expect(young.removed).toBe(0);
    expect(await store.head(orphans[0])).toBeDefined();

    const old = await sweepUnreferencedOriginals({ db, store, graceHours: 24, now: new Date(Date.now() + 25 * HOUR_MS) });
    expect(old.removed).toBe(1);
    expect(await store.head(orphans[0])).toBeUndefined();
    expect(await keysInStore()).toEqual(before.keys);
  });

  it('when the sweep runs long after an upload, then the objects that recordings name stay', async () => {
    const named: Array<{ original_key: string }> = await db('submission_recordings').whereNotNull('original_key').select('original_key');
    expect(named.length).toBeGreaterThan(0);

    await sweepUnreferencedOriginals({ db, store, graceHours: 24, now: new Date(Date.now() + 30 * 24 * HOUR_MS) });

    for (const { original_key } of named) expect(await store.head(original_key)).toBeDefined();
  });

  it('when recordings have no original (stored before they were kept), then the review says so for each file while one with originals says kept', async () => {
    const older = await upload(app, 'older-rider', cleanPair(304));
    const newer = await upload(app, 'newer-rider', cleanPair(307));
    await db('submission_recordings')
      .where({ submission_id: older.body.id })
      .update({ original_key: null, original_bytes: null, decoder_version: null });
    const { agent } = await signedInAgent(app, { handle: 'originals-moderator', roles: ['moderator'] });

    const olderReview = await agent.get(`/api/moderation/submissions/${older.body.id}`);
    const newerReview = await agent.get(`/api/moderation/submissions/${newer.body.id}`);

    expect(olderReview.status).toBe(200);
    expect(olderReview.body.submission.id).toBe(older.body.id);
    expect(olderReview.body.originals).toEqual([
      { side: 'a', kept: false, decoderVersion: null },
      { side: 'b', kept: false, decoderVersion: null },
    ]);
    expect(newerReview.body.originals).toEqual([
      { side: 'a', kept: true, decoderVersion: DECODER_VERSION },
      { side: 'b', kept: true, decoderVersion: DECODER_VERSION },
    ]);
  });
});

describe('deleting an account', () => {
  it('when a rider deletes their account, then their originals leave the store and the recordings keep their streams with no key', async () => {
    const res = await upload(app, 'leaving-rider', cleanPair(305));
    const recordings = await db('submission_recordings').where({ submission_id: res.body.id });
    const keys = recordings.map((r) => r.original_key as string);
    for (const key of keys) expect(await store.head(key)).toBeDefined();
    const { agent, csrf } = await signedInAgent(app, { handle: 'leaving-rider' });

    const deletion = await agent
      .post('/api/account/deletion')
      .set('X-CSRF-Token', await csrf())
      .send({ confirmHandle: 'leaving-rider' });

    expect(deletion.status).toBe(204);
    for (const key of keys) expect(await store.head(key)).toBeUndefined();
    const after = await db('submission_recordings').where({ submission_id: res.body.id });
    expect(after).toHaveLength(2);
    for (const r of after) {
      expect(r.original_key).toBeNull();
      expect(r.original_bytes).toBeNull();
      expect(r.stream.length).toBeGreaterThan(0);
    }
    expect(await db('submissions').where({ id: res.body.id }).first('id')).toBeDefined();
  });

  it('when another rider uploaded the very same file, then deleting one account leaves the object the other recording names', async () => {
    const shared = cleanPair(306);
    const other = cleanPair(306, { headUnitSerial: 99 });
    const first = await upload(app, 'first-sharer', { a: shared.a, b: shared.b });
    const second = await upload(app, 'second-sharer', { a: shared.a, b: other.b });
    expect([first.status, second.status]).toEqual([201, 201]);
    const sharedKey = (await db('submission_recordings').where({ submission_id: first.body.id, side: 'a' }).first('original_key'))
      .original_key;
    const { agent, csrf } = await signedInAgent(app, { handle: 'first-sharer' });

    await agent
      .post('/api/account/deletion')
      .set('X-CSRF-Token', await csrf())
      .send({ confirmHandle: 'first-sharer' });

    expect(await store.head(sharedKey)).toBeDefined();
    expect((await db('submission_recordings').where({ submission_id: second.body.id, side: 'a' }).first('original_key')).original_key).toBe(
      sharedKey,
    );
  });
});

describe('the store size for admins', () => {
  it('when an admin asks, then the answer is the number of originals and their bytes; a rider is refused', async () => {
    const admin = await signedInAgent(app, { handle: 'store-admin', roles: ['admin'] });
    const rider = await signedInAgent(app, { handle: 'curious-rider' });

    const res = await admin.agent.get('/api/admin/object-store');
    const refused = await rider.agent.get('/api/admin/object-store');

    expect(res.status).toBe(200);
    expect(res.body).toEqual(await store.size(ORIGINALS_PREFIX));
    expect(res.body.objects).toBeGreaterThan(0);
    expect(refused.status).toBe(403);
  });

  it('when the store does not answer, then the admin gets a 503 that says so', async () => {
    const down = await createTestContext({ fakes: true, env: { S3_ENDPOINT: `http://127.0.0.1:${await freePort()}` } });
    const admin = await signedInAgent(down.app, { handle: 'store-admin-down', roles: ['admin'] });

    const res = await admin.agent.get('/api/admin/object-store');

    expect(res.status).toBe(503);
    expect(res.body.error.code).toBe('store_unavailable');
  });
});

describe('the sweep of unnamed originals', () => {
  it('when the worker is registered, then pg-boss runs the sweep on an hourly schedule', async () => {
    const worker = await createTestContext({ worker: true });

    const schedules = await worker.queue!.getSchedules();

    expect(schedules.map((s) => ({ name: s.name, cron: s.cron }))).toContainEqual({ name: SWEEP_ORIGINALS_QUEUE, cron: '17 * * * *' });
  });
});
