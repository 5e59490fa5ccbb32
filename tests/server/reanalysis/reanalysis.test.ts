import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { decideSubmission } from '../../../server/features/moderation/moderation.service';
import { reanalyseSubmission, workReanalysisQueue } from '../../../server/features/reanalysis/reanalyse-submission.job';
import { recomputeAllAggregates } from '../../../server/features/statistics/aggregates';
import { createLogger } from '../../../server/lib/logger';
import { DECODER_VERSION } from '../../../shared/analysis/decode-fit';
import { METHOD_VERSION } from '../../../shared/analysis/method';
import { testObjectStore } from '../../support/test-object-store';
import type { QualityFlag } from '../../../shared/analysis/types';
import { simulatePair } from '../../../shared/simulator/pair';
import { submissionAwaitingReview } from '../moderation/moderation-fixtures';
import { createCatalogue, type TestCatalogue } from '../support/catalogue-factory';
import { signedInAgent, type TestAgent } from '../support/sign-in';
import { expectSameFigures, statisticsSnapshot } from '../support/statistics-factory';
import { createTestContext } from '../support/test-app';
import { waitFor } from '../../support/wait-for';

// A real pg-boss queue without the worker at first, so a run stays running until
// the test starts the re-analysis worker on it (the 409 is then certain).
const { app, db, queue, config } = await createTestContext({ fakes: true, queue: true });

let catalogue: TestCatalogue;
let admin: { agent: TestAgent; csrf: () => Promise<string> };
let moderator: { agent: TestAgent; csrf: () => Promise<string> };
let rider: { agent: TestAgent; csrf: () => Promise<string> };
let moderatorId: number;
let riderId: number;

/** What an older method left: its version, and flags without the tag check method 2 added. */
async function asLeftByMethod1(id: number, change: Record<string, unknown> = {}) {
  const row = await db('submissions').where({ id }).first('flags');
  const flags = (row.flags as QualityFlag[]).filter((f) => !f.code.endsWith('_tag_mismatch'));
  const rank = { info: 1, warning: 2, severe: 3 } as const;
  await db('submissions')
    .where({ id })
    .update({
      method_version: 1,
      flags: JSON.stringify(flags),
      flag_severity: Math.max(0, ...flags.map((f) => rank[f.severity])),
      ...change,
    });
}

async function decide(id: number, decision: 'accept' | 'reject') {
  await decideSubmission(db, { submissionId: id, moderatorId, decision, ...(decision === 'reject' && { reason: 'other', note: 'Test' }) });
}

const rows = (ids: number[]) =>
  db('submissions')
    .whereIn('id', ids)
    .orderBy('id')
    .select('id', 'status', 'method_version', 'bias_percent', 'flags', 'version', 'decided_by', 'decision_reason');

beforeAll(async () => {
  catalogue = await createCatalogue(db);
  admin = await signedInAgent(app, { handle: 'reanalysis-admin', roles: ['admin'] });
  const signedInModerator = await signedInAgent(app, { handle: 'reanalysis-moderator', roles: ['moderator'] });
  const signedInRider = await signedInAgent(app, { handle: 'reanalysis-rider' });
  moderator = signedInModerator;
  rider = signedInRider;
  moderatorId = signedInModerator.user.id;
  riderId = signedInRider.user.id;
});

describe('re-analysis of stored submissions', () => {
  it('when an admin re-analyses rides of an older method, then all reach the current method, decisions stay, a newly severe ride waits for review again and the statistics equal a full recompute', async () => {
    // Arrange: four rides through the real upload and analysis.
    const edited = await submissionAwaitingReview(db, riderId, catalogue, { seed: 7101 });
    const plain = await submissionAwaitingReview(db, riderId, catalogue, { seed: 7102 });
    const rejected = await submissionAwaitingReview(db, riderId, catalogue, { seed: 7103 });
    // A's file reports firmware 1.2 while the ride is tagged 2.1.0: method 2's tag check raises a severe flag; method 1 had none.
    const mistagged = await submissionAwaitingReview(db, riderId, catalogue, {
      pair: simulatePair({
        seed: 7104,
        durationSeconds: 1200,
        profile: 'endurance',
        a: { position: 'total', scale: 1.03, noisePercent: 1, sensor: { productId: 9, serialNumber: 4343, softwareVersion: 1.2 } },
        b: { position: 'dual', scale: 1.0, noisePercent: 1 },
      }),
    });
    const ids = [edited.id, plain.id, rejected.id, mistagged.id];
    const analysedBias = (await db('submissions').where({ id: edited.id }).first('bias_percent')).bias_percent as number;
    await asLeftByMethod1(edited.id, { bias_percent: analysedBias + 4 });
    await asLeftByMethod1(plain.id);
    await asLeftByMethod1(rejected.id);
    await asLeftByMethod1(mistagged.id);
    for (const id of [edited.id, plain.id, mistagged.id]) await decide(id, 'accept');
    await decide(rejected.id, 'reject');
    const before = await rows(ids);
    const modelPageBefore = await request(app).get(`/api/models/${catalogue.spider.slug}`);
    const acceptedBefore = (
      await db('meter_statistics').where({ model_id: catalogue.spider.id }).whereNull('firmware_id').first('submission_count')
    ).submission_count;

    // Act: start a run over HTTP; a second start while it runs is refused; then a worker works the queue.
    const start = await admin.agent
      .post('/api/admin/reanalysis')
      .set('X-CSRF-Token', await admin.csrf())
      .send({});
    const second = await admin.agent
      .post('/api/admin/reanalysis')
      .set('X-CSRF-Token', await admin.csrf())
      .send({});
    const progress = await admin.agent.get('/api/admin/reanalysis');
    await workReanalysisQueue(queue!, db, createLogger(config), testObjectStore());
    const finished = await waitFor(
      async () => {
        const res = await admin.agent.get('/api/admin/reanalysis');
        return res.body.runs[0].status !== 'running' && res.body.runs[0];
      },
      { timeoutMs: 90_000, what: 'the re-analysis run to end' },
    );

    // Assert: the run and its progress.
    expect(start.status).toBe(202);
    expect(start.body.run).toMatchObject({ status: 'running', methodVersion: METHOD_VERSION, source: 'streams', total: 4, done: 0 });
    expect(second.status).toBe(409);
    expect(second.body.error.message).toMatch(/already running/);
    expect(progress.body).toMatchObject({
      currentMethodVersion: METHOD_VERSION,
      runs: [{ id: start.body.run.id, status: 'running', total: 4 }],
    });
    expect(finished).toMatchObject({
      id: start.body.run.id,
      status: 'finished',
      total: 4,
      done: 4,
      failed: 0,
      sentBack: 1,
      lastError: null,
    });
    expect(finished.finishedAt).not.toBeNull();

    // Every ride at the current method; the edited bias is the engine's again.
    const after = await rows(ids);
    expect(after.map((r) => r.method_version)).toEqual([METHOD_VERSION, METHOD_VERSION, METHOD_VERSION, METHOD_VERSION]);
    expect(after[0].bias_percent).toBeCloseTo(analysedBias, 9);
    expect(after[0].bias_percent).not.toBeCloseTo(before[0].bias_percent, 3);
    // Decisions as they were, but the newly severe ride is back in the review queue.
    expect(after.map((r) => r.status)).toEqual(['accepted', 'accepted', 'rejected', 'awaiting_review']);
    expect(after.map((r) => [r.decided_by, r.decision_reason])).toEqual(before.map((r) => [r.decided_by, r.decision_reason]));
    expect(after[3].flags).toContainEqual(expect.objectContaining({ code: 'firmware_tag_mismatch', severity: 'severe' }));

    // The reason is in the audit log and on the moderator's review page.
    const reason = `Re-analysed with method ${METHOD_VERSION}: Device A's power meter firmware is tagged 2.1.0, but its file reports 1.2.`;
    const audit = await db('audit_log')
      .where({ subject_type: 'submission', subject_id: String(mistagged.id), action: 'submission.sent_back_by_reanalysis' })
      .select('reason');
    expect(audit).toEqual([{ reason }]);
    const review = await moderator.agent.get(`/api/moderation/submissions/${mistagged.id}`);
    expect(review.body.history).toContainEqual(expect.objectContaining({ action: 'submission.sent_back_by_reanalysis', reason }));

    // The statistics: rebuilt once, without the ride sent back, and what a full recompute gives.
    const acceptedAfter = (
      await db('meter_statistics').where({ model_id: catalogue.spider.id }).whereNull('firmware_id').first('submission_count')
    ).submission_count;
    expect(acceptedAfter).toBe(acceptedBefore - 1);
    const afterRun = await statisticsSnapshot(db);
    await recomputeAllAggregates(db);
    expectSameFigures(await statisticsSnapshot(db), afterRun);

    // The public model page says its figures now come from the current method only.
    expect(modelPageBefore.body.methods).toEqual({ current: METHOD_VERSION, versions: [1] });
    expect((await request(app).get(`/api/models/${catalogue.spider.slug}`)).body.methods).toEqual({
      current: METHOD_VERSION,
      versions: [METHOD_VERSION],
    });

    // A second run finds nothing to re-analyse and changes no submission.
    const rerun = await admin.agent
      .post('/api/admin/reanalysis')
      .set('X-CSRF-Token', await admin.csrf())
      .send({});
    expect(rerun.status).toBe(202);
    expect(rerun.body.run).toMatchObject({ status: 'finished', total: 0, done: 0, failed: 0, sentBack: 0 });
    expect(await rows(ids)).toEqual(after);
  }, 120_000);

  it('when the job of a finished item runs again, then nothing changes and nothing is counted twice', async () => {
    const run = (await db('reanalysis_runs').whereNot('total', 0).orderBy('id', 'desc').first('id'))!;
    const item = (await db('reanalysis_run_items').where({ run_id: run.id }).first('submission_id'))!;
    const beforeRow = await db('submissions').where({ id: item.submission_id }).first('version', 'analysed_at');
    const beforeRun = await db('reanalysis_runs').where({ id: run.id }).first('done', 'failed', 'sent_back', 'status');

    await reanalyseSubmission(db, run.id, item.submission_id);

    expect(await db('submissions').where({ id: item.submission_id }).first('version', 'analysed_at')).toEqual(beforeRow);
    expect(await db('reanalysis_runs').where({ id: run.id }).first('done', 'failed', 'sent_back', 'status')).toEqual(beforeRun);
  });

  it('when the decoder is newer than the one that read a kept original, then a run from the originals decodes it again and stores the new stream with its decoder; a run from the streams leaves it', async () => {
    const kept = await submissionAwaitingReview(db, riderId, catalogue, { seed: 7105 });
    const recordings = () =>
      db('submission_recordings')
        .where({ submission_id: kept.id })
        .orderBy('side')
        .select('side', 'original_key', 'decoder_version', 'stream');
    const [a, b] = await recordings();
    expect(a.original_key).not.toBeNull();
    // As an older decoder would have left it: its version, and (to see the stream replaced) the other side's stream in A.
    await db('submission_recordings').where({ submission_id: kept.id, side: 'a' }).update({ decoder_version: 1, stream: b.stream });
    const run = async (source: string) => {
      const res = await admin.agent
        .post('/api/admin/reanalysis')
        .set('X-CSRF-Token', await admin.csrf())
        .send({ source });
      expect(res.status).toBe(202);
      return waitFor(
        async () => {
          const list = await admin.agent.get('/api/admin/reanalysis');
          return list.body.runs[0].status !== 'running' && list.body.runs[0];
        },
        { timeoutMs: 90_000, what: `the ${source} run to end` },
      );
    };

    const fromStreams = await run('streams');
    const afterStreams = await recordings();
    const fromOriginals = await run('originals');
    const [aAfter] = await recordings();

    expect(fromStreams).toMatchObject({ status: 'finished', total: 0 });
    expect(afterStreams[0].decoder_version).toBe(1);
    expect(fromOriginals).toMatchObject({ status: 'finished', source: 'originals', total: 1, done: 1, failed: 0 });
    expect(aAfter.decoder_version).toBe(DECODER_VERSION);
    expect(Buffer.compare(aAfter.stream, a.stream)).toBe(0);
    const bad = await admin.agent
      .post('/api/admin/reanalysis')
      .set('X-CSRF-Token', await admin.csrf())
      .send({ source: 'files' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.message).toMatch(/^source:/);
  }, 180_000);

  it('when a visitor, a rider or a moderator asks for the re-analysis, then they are refused', async () => {
    const runsBefore = await db('reanalysis_runs').count({ n: '*' }).first();

    expect((await request(app).get('/api/admin/reanalysis')).status).toBe(401);
    expect((await rider.agent.get('/api/admin/reanalysis')).status).toBe(403);
    expect((await moderator.agent.get('/api/admin/reanalysis')).status).toBe(403);
    expect(
      (
        await moderator.agent
          .post('/api/admin/reanalysis')
          .set('X-CSRF-Token', await moderator.csrf())
          .send({})
      ).status,
    ).toBe(403);
    expect((await admin.agent.post('/api/admin/reanalysis').send({})).status).toBe(403);
    expect(await db('reanalysis_runs').count({ n: '*' }).first()).toEqual(runsBefore);
  });
});
