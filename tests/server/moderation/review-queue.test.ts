import { beforeAll, describe, expect, it } from 'vitest';
import { createSubmissionInput } from '../../../shared/schemas/submission';
import { analyseSubmission } from '../../../server/features/submissions/analyse-submission.job';
import { createSubmission } from '../../../server/features/submissions/submissions.service';
import { createCatalogue, submissionMeta, type TestCatalogue } from '../support/catalogue-factory';
import { signedInAgent } from '../support/sign-in';
import { createTestContext } from '../support/test-app';
import { asBuffer, cleanPair } from '../submissions/fit-pairs';
import { submissionAwaitingReview } from './moderation-fixtures';
import { testObjectStore } from '../../support/test-object-store';

const { app, db } = await createTestContext({ fakes: true });

let catalogue: TestCatalogue;
let other: TestCatalogue;
let moderator: Awaited<ReturnType<typeof signedInAgent>>;
let rider: Awaited<ReturnType<typeof signedInAgent>>;

beforeAll(async () => {
  catalogue = await createCatalogue(db);
  other = await createCatalogue(db);
  moderator = await signedInAgent(app, { handle: 'queue-mod', roles: ['moderator'] });
  rider = await signedInAgent(app, { handle: 'queue-rider' });
});

const severe = { code: 'low_correlation', severity: 'severe', message: 'The two power traces barely move together.' };

describe('the review queue', () => {
  it('when submissions wait, then the most severe flags come first, with headline figures, and the filters narrow the list', async () => {
    const calm = await submissionAwaitingReview(db, rider.user.id, catalogue);
    const flagged = await submissionAwaitingReview(db, rider.user.id, other);
    await db('submissions')
      .where({ id: flagged.id })
      .update({ flags: JSON.stringify([severe]), flag_severity: 3 });
    await db('submissions')
      .where({ id: calm.id })
      .update({ created_at: db.raw(`now() - interval '3 days'`) });

    const all = await moderator.agent.get('/api/moderation/queue');
    const byFlag = await moderator.agent.get('/api/moderation/queue').query({ flag: 'low_correlation' });
    const byMaker = await moderator.agent.get('/api/moderation/queue').query({ maker: catalogue.maker.id });
    const byModel = await moderator.agent.get('/api/moderation/queue').query({ model: other.pedals.id });
    const old = await moderator.agent.get('/api/moderation/queue').query({ minAgeDays: 2 });

    expect(all.status).toBe(200);
    const ids = all.body.submissions.map((s: { id: number }) => s.id);
    expect(ids.indexOf(flagged.id)).toBeLessThan(ids.indexOf(calm.id));
    expect(all.body.submissions[0]).toMatchObject({ id: flagged.id, flagSeverity: 3, riderHandle: 'queue-rider' });
    expect(all.body.submissions[0].biasPercent).toBeCloseTo(3, 0);
    expect(all.body.submissions[0].recordings[0]).toMatchObject({ modelName: 'Orbit', firmwareVersion: '2.1.0' });
    expect(all.body.flagCounts).toContainEqual({ code: 'low_correlation', count: 1 });
    expect(byFlag.body.submissions.map((s: { id: number }) => s.id)).toEqual([flagged.id]);
    expect(byMaker.body.submissions.map((s: { id: number }) => s.id)).toEqual([calm.id]);
    expect(byModel.body.submissions.map((s: { id: number }) => s.id)).toEqual([flagged.id]);
    expect(old.body.submissions.map((s: { id: number }) => s.id)).toEqual([calm.id]);
  });

  it('when the filter is not a flag code, then it is a 400 on that field', async () => {
    const res = await moderator.agent.get('/api/moderation/queue').query({ flag: "x' or 1=1" });

    expect(res.status).toBe(400);
    expect(res.body.error.details.fields.flag).toMatch(/flag code/);
  });

  it('when a rider asks for the queue, then it is refused with 403', async () => {
    expect((await rider.agent.get('/api/moderation/queue')).status).toBe(403);
  });
});

describe('the review page', () => {
  it('when the same ride comes again with other files, then the review lists it as a near-identical duplicate, with the rider history and the device checks', async () => {
    const original = await submissionAwaitingReview(db, rider.user.id, catalogue, { seed: 7001 });
    await moderator.agent
      .post(`/api/moderation/submissions/${original.id}/decision`)
      .set('X-CSRF-Token', await moderator.csrf())
      .send({ decision: 'accept', expectedVersion: original.version });
    // The same ride written by another head unit: other files by hash, the same streams.
    const input = createSubmissionInput.parse(submissionMeta(catalogue));
    const other = cleanPair(7001, { headUnitSerial: 987_654 });
    const { id: again } = await createSubmission({ db, store: testObjectStore() }, rider.user.id, input, {
      a: { buffer: asBuffer(other.a), originalName: 'a.fit' },
      b: { buffer: asBuffer(other.b), originalName: 'b.fit' },
    });
    await analyseSubmission(db, again);

    const res = await moderator.agent.get(`/api/moderation/submissions/${again}`);

    expect(res.status).toBe(200);
    expect(res.body.submission).toMatchObject({ id: again, status: 'awaiting_review' });
    expect(res.body.submission.recordings[0].deviceInfo).toBeDefined();
    const duplicate = res.body.duplicates.find((d: { id: number }) => d.id === original.id);
    expect(duplicate).toMatchObject({ status: 'accepted', nearIdentical: true });
    expect(duplicate.sameStreamShare).toBeGreaterThan(0.95);
    expect(res.body.riderHistory.accepted).toBeGreaterThanOrEqual(1);
    const deviceCheck = res.body.deviceChecks.find(
      (c: { side: string; what: string }) => c.side === 'a' && c.what === 'recording_device_firmware',
    );
    expect(deviceCheck).toMatchObject({ tagged: '12.1', agrees: false });
    expect(deviceCheck.message).toMatch(/tagged 12\.1/);
  });

  it('when a submission carries a flag, then the review explains what to check and suggests a reason', async () => {
    const { id } = await submissionAwaitingReview(db, rider.user.id, catalogue);
    await db('submissions')
      .where({ id })
      .update({ flags: JSON.stringify([severe]), flag_severity: 3 });

    const res = await moderator.agent.get(`/api/moderation/submissions/${id}`);

    expect(res.body.flags[0]).toMatchObject({ code: 'low_correlation', likelyReason: 'not_same_ride' });
    expect(res.body.flags[0].check).toMatch(/different rides/);
  });
});
