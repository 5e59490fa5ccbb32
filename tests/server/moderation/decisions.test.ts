import { beforeAll, describe, expect, it } from 'vitest';
import { createCatalogue, type TestCatalogue } from '../support/catalogue-factory';
import { signedInAgent } from '../support/sign-in';
import { createTestContext } from '../support/test-app';
import { capturedMail, submissionAwaitingReview } from './moderation-fixtures';

const { app, db } = await createTestContext({ fakes: true, worker: true });

let catalogue: TestCatalogue;
let rider: Awaited<ReturnType<typeof signedInAgent>>;
let moderator: Awaited<ReturnType<typeof signedInAgent>>;

beforeAll(async () => {
  catalogue = await createCatalogue(db);
  rider = await signedInAgent(app, { handle: 'decided-rider' });
  moderator = await signedInAgent(app, { handle: 'decision-mod', roles: ['moderator'] });
});

async function decide(agent: typeof moderator, id: number, body: object) {
  return agent.agent
    .post(`/api/moderation/submissions/${id}/decision`)
    .set('X-CSRF-Token', await agent.csrf())
    .send(body);
}

async function statisticsOf(modelId: number) {
  return db('meter_statistics').where({ model_id: modelId }).whereNull('firmware_id').first('submission_count');
}

describe('moderation decisions', () => {
  it('when a moderator accepts a submission, then it is accepted, counts in the statistics, is audited and the rider is mailed', async () => {
    const { id, version } = await submissionAwaitingReview(db, rider.user.id, catalogue);
    const before = (await statisticsOf(catalogue.spider.id))?.submission_count ?? 0;

    const res = await decide(moderator, id, { decision: 'accept', expectedVersion: version });

    expect(res.status).toBe(200);
    expect(res.body).toEqual({ id, status: 'accepted', version: version + 1 });
    expect((await statisticsOf(catalogue.spider.id))?.submission_count).toBe(before + 1);
    const audit = await db('audit_log')
      .where({ subject_type: 'submission', subject_id: String(id), action: 'submission.accepted' })
      .first();
    expect(audit.actor_id).toBe(moderator.user.id);
    expect(audit.before).toMatchObject({ status: 'awaiting_review', version });
    expect(audit.after).toMatchObject({ status: 'accepted', version: version + 1 });
    const mail = await capturedMail(db, 'decided-rider@riders.crosswatt.test', new RegExp(`#${id} was accepted`));
    expect(mail.text_body).toContain('Orbit 2.1.0 against Treadle 4.0.2');
  });

  it('when a moderator rejects with a reason and a note, then the rider sees both and the e-mail carries them', async () => {
    const { id, version } = await submissionAwaitingReview(db, rider.user.id, catalogue);

    const res = await decide(moderator, id, {
      decision: 'reject',
      reason: 'not_calibrated',
      note: 'Meter A skipped its zero offset.',
      expectedVersion: version,
    });

    expect(res.status).toBe(200);
    expect(res.body.status).toBe('rejected');
    const seen = await rider.agent.get(`/api/submissions/${id}/decision`);
    expect(seen.status).toBe(200);
    expect(seen.body).toMatchObject({
      status: 'rejected',
      decision: { reason: 'not_calibrated', note: 'Meter A skipped its zero offset.' },
    });
    expect(seen.body.decision.reasonLabel).toMatch(/not calibrated/);
    const mail = await capturedMail(db, 'decided-rider@riders.crosswatt.test', new RegExp(`#${id} was not accepted`));
    expect(mail.text_body).toContain('Reason: One meter was not calibrated (no zero offset)');
    expect(mail.text_body).toContain('Meter A skipped its zero offset.');
    const audit = await db('audit_log')
      .where({ subject_id: String(id), action: 'submission.rejected' })
      .first();
    expect(audit.reason).toBe('not_calibrated: Meter A skipped its zero offset.');
  });

  it('when a reject has no reason from the list, then it is refused with 400 on the reason field and nothing changes', async () => {
    const { id, version } = await submissionAwaitingReview(db, rider.user.id, catalogue);

    const res = await decide(moderator, id, { decision: 'reject', reason: 'looks odd', expectedVersion: version });

    expect(res.status).toBe(400);
    expect(res.body.error.details.fields.reason).toMatch(/choose a reason/);
    expect((await db('submissions').where({ id }).first('status')).status).toBe('awaiting_review');
  });

  it('when a moderator sends a submission back and the rider corrects a tag, then it returns to the queue', async () => {
    const { id, version } = await submissionAwaitingReview(db, rider.user.id, catalogue);
    const sent = await decide(moderator, id, {
      decision: 'send_back',
      note: 'Device A runs 2.1.0? Check the firmware.',
      expectedVersion: version,
    });
    expect(sent.status).toBe(200);
    expect(sent.body.status).toBe('sent_back');
    await capturedMail(db, 'decided-rider@riders.crosswatt.test', new RegExp(`correct the tags of submission #${id}`));

    const edit = await rider.agent
      .patch(`/api/submissions/${id}/tags`)
      .set('X-CSRF-Token', await rider.csrf())
      .send({ a: { recordingDeviceFirmware: '12.2' }, expectedVersion: sent.body.version });

    expect(edit.status).toBe(200);
    expect(edit.body).toMatchObject({ status: 'awaiting_review', reanalyse: false });
    const queue = await moderator.agent.get('/api/moderation/queue');
    expect(queue.body.submissions.map((s: { id: number }) => s.id)).toContain(id);
    const audit = await db('audit_log')
      .where({ subject_id: String(id), action: 'submission.tags_edited' })
      .first();
    expect(audit.before.tags[0].recordingDeviceFirmware).toBe('12.1');
    expect(audit.after.tags[0].recordingDeviceFirmware).toBe('12.2');
  });

  it('when someone else edits a rider’s sent-back submission, then it is not found for them', async () => {
    const { id, version } = await submissionAwaitingReview(db, rider.user.id, catalogue);
    const sent = await decide(moderator, id, { decision: 'send_back', note: 'Check the tags.', expectedVersion: version });
    const stranger = await signedInAgent(app, { handle: 'tag-stranger' });

    const edit = await stranger.agent
      .patch(`/api/submissions/${id}/tags`)
      .set('X-CSRF-Token', await stranger.csrf())
      .send({ a: { zeroOffset: 'no' }, expectedVersion: sent.body.version });

    expect(edit.status).toBe(404);
  });

  it('when a moderator corrects the firmware tag of an accepted submission, then the statistics move to the corrected firmware and it is audited as a correction', async () => {
    const { id, version } = await submissionAwaitingReview(db, rider.user.id, catalogue);
    const accepted = await decide(moderator, id, { decision: 'accept', expectedVersion: version });
    const newer = await db('firmware_versions')
      .insert({ model_id: catalogue.spider.id, version: '2.2.0', version_order: [2, 2, 0], status: 'approved' })
      .returning('id');
    const countAt = async (firmwareId: number) =>
      (await db('meter_statistics').where({ model_id: catalogue.spider.id, firmware_id: firmwareId }).first('submission_count'))
        ?.submission_count ?? 0;
    const oldBefore = await countAt(catalogue.spiderFirmware.id);

    const res = await moderator.agent
      .post(`/api/moderation/submissions/${id}/tags`)
      .set('X-CSRF-Token', await moderator.csrf())
      .send({ a: { firmwareId: newer[0].id }, note: 'The file says 2.2', expectedVersion: accepted.body.version });

    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ status: 'accepted', reanalyse: false });
    expect(await countAt(catalogue.spiderFirmware.id)).toBe(oldBefore - 1);
    expect(await countAt(newer[0].id)).toBe(1);
    const audit = await db('audit_log')
      .where({ subject_id: String(id), action: 'submission.tags_corrected' })
      .first();
    expect(audit.actor_id).toBe(moderator.user.id);
    expect(audit.reason).toBe('The file says 2.2');
  });

  it('when an accepted submission is withdrawn with a reason, then it leaves the statistics and the audit keeps why', async () => {
    const { id, version } = await submissionAwaitingReview(db, rider.user.id, catalogue);
    const accepted = await decide(moderator, id, { decision: 'accept', expectedVersion: version });
    const during = (await statisticsOf(catalogue.pedals.id))!.submission_count;

    const res = await decide(moderator, id, {
      decision: 'withdraw',
      reason: 'The rider told us meter B was faulty that day.',
      expectedVersion: accepted.body.version,
    });

    expect(res.status).toBe(200);
    expect(res.body.status).toBe('withdrawn');
    expect((await statisticsOf(catalogue.pedals.id))?.submission_count ?? 0).toBe(during - 1);
    const audit = await db('audit_log')
      .where({ subject_id: String(id), action: 'submission.withdrawn' })
      .first();
    expect(audit.reason).toBe('The rider told us meter B was faulty that day.');
    expect(audit.before.status).toBe('accepted');
  });

  it('when a submission awaiting review is withdrawn, then it is a 409 that says why', async () => {
    const { id, version } = await submissionAwaitingReview(db, rider.user.id, catalogue);

    const res = await decide(moderator, id, { decision: 'withdraw', reason: 'Not yet accepted anyway.', expectedVersion: version });

    expect(res.status).toBe(409);
    expect(res.body.error.message).toBe('This submission is awaiting review, so it cannot be withdrawn.');
  });

  it('when two moderators decide at once, then the second gets a 409 conflict and the first decision stands', async () => {
    const { id, version } = await submissionAwaitingReview(db, rider.user.id, catalogue);
    const second = await signedInAgent(app, { handle: 'decision-mod-2', roles: ['moderator'] });
    const [tokenA, tokenB] = [await moderator.csrf(), await second.csrf()];

    const [a, b] = await Promise.all([
      moderator.agent
        .post(`/api/moderation/submissions/${id}/decision`)
        .set('X-CSRF-Token', tokenA)
        .send({ decision: 'accept', expectedVersion: version }),
      second.agent
        .post(`/api/moderation/submissions/${id}/decision`)
        .set('X-CSRF-Token', tokenB)
        .send({ decision: 'reject', reason: 'duplicate', expectedVersion: version }),
    ]);

    const statuses = [a.status, b.status].sort();
    expect(statuses).toEqual([200, 409]);
    const loser = a.status === 409 ? a : b;
    const winner = a.status === 200 ? a : b;
    expect(loser.body.error.code).toBe('conflict');
    expect(loser.body.error.message).toMatch(/Someone changed this submission while you were looking at it: it is now (accepted|rejected)/);
    expect((await db('submissions').where({ id }).first('status')).status).toBe(winner.body.status);
    expect(
      await db('audit_log')
        .where({ subject_id: String(id) })
        .whereIn('action', ['submission.accepted', 'submission.rejected']),
    ).toHaveLength(1);
  });

  it('when a moderator is staff of a maker in the submission, then they may not decide on it', async () => {
    const { id, version } = await submissionAwaitingReview(db, rider.user.id, catalogue);
    const staffModerator = await signedInAgent(app, { handle: 'staff-mod', roles: ['moderator'], makerSlug: catalogue.maker.slug });

    const res = await decide(staffModerator, id, { decision: 'accept', expectedVersion: version });

    expect(res.status).toBe(403);
    expect(res.body.error.message).toMatch(/someone independent has to decide/);
    expect((await db('submissions').where({ id }).first('status')).status).toBe('awaiting_review');
  });

  it('when a rider tries to decide, then it is refused with 403', async () => {
    const { id, version } = await submissionAwaitingReview(db, rider.user.id, catalogue);

    const res = await decide(rider, id, { decision: 'accept', expectedVersion: version });

    expect(res.status).toBe(403);
  });

  it('when the rider has switched off decision e-mails, then a decision sends nothing', async () => {
    const quiet = await signedInAgent(app, { handle: 'quiet-rider' });
    await quiet.agent
      .patch('/api/account')
      .set('X-CSRF-Token', await quiet.csrf())
      .send({ notificationPrefs: { emailOnDecision: false } });
    const { id, version } = await submissionAwaitingReview(db, quiet.user.id, catalogue);

    const res = await decide(moderator, id, { decision: 'accept', expectedVersion: version });

    expect(res.status).toBe(200);
    expect(await db('mail_messages').where({ user_id: quiet.user.id })).toHaveLength(0);
  });
});
