import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { queueMail } from '../../../server/features/mail/mail.service';
import { createCatalogue, type TestCatalogue } from '../support/catalogue-factory';
import { signedInAgent } from '../support/sign-in';
import { createTestContext } from '../support/test-app';
import { waitFor } from '../../support/wait-for';
import { capturedMail, submissionAwaitingReview } from '../moderation/moderation-fixtures';

const { app, db, config, queue } = await createTestContext({ fakes: true, worker: true });

let catalogue: TestCatalogue;
let moderator: Awaited<ReturnType<typeof signedInAgent>>;

beforeAll(async () => {
  catalogue = await createCatalogue(db);
  moderator = await signedInAgent(app, { handle: 'mail-mod', roles: ['moderator'] });
});

async function rejectNew(riderId: number) {
  const { id, version } = await submissionAwaitingReview(db, riderId, catalogue);
  const res = await moderator.agent
    .post(`/api/moderation/submissions/${id}/decision`)
    .set('X-CSRF-Token', await moderator.csrf())
    .send({ decision: 'reject', reason: 'wrong_tag', note: 'The file names firmware 1.9.', expectedVersion: version });
  expect(res.status).toBe(200);
  return id;
}

function unsubscribePath(text: string): string {
  const match = /Stop these e-mails with one click: (\S+)/.exec(text);
  expect(match, 'the e-mail should carry an unsubscribe link').not.toBeNull();
  const url = new URL(match![1]!);
  return `${url.pathname}${url.search}`;
}

describe('e-mail', () => {
  it('when a submission is rejected, then the fake SMTP service captures a mail to the rider with the reason, the note and an unsubscribe header', async () => {
    const rider = await signedInAgent(app, { handle: 'mail-rider' });

    const id = await rejectNew(rider.user.id);

    const mail = await capturedMail(db, 'mail-rider@riders.crosswatt.test', new RegExp(`#${id} was not accepted`));
    expect(mail.recipients).toEqual(['mail-rider@riders.crosswatt.test']);
    expect(mail.text_body).toContain('Reason: Wrong device or firmware tag');
    expect(mail.text_body).toContain('The file names firmware 1.9.');
    expect(mail.text_body).toContain(`/submissions/${id}`);
    expect(mail.headers['list-unsubscribe']).toMatch(/\/api\/mail\/unsubscribe\?token=/);
    // The fake service stores the message before the worker marks it sent: wait for that state.
    const stored = await waitFor(
      async () => {
        const row = await db('mail_messages').where({ user_id: rider.user.id }).first('status', 'attempts');
        return row?.status === 'queued' ? undefined : row;
      },
      { what: 'the message to leave the queue' },
    );
    expect(stored).toEqual({ status: 'sent', attempts: 1 });
  });

  it('when the rider follows the unsubscribe link without signing in, then decision e-mails stop and reply e-mails do not', async () => {
    const rider = await signedInAgent(app, { handle: 'leaving-rider' });
    const first = await rejectNew(rider.user.id);
    const mail = await capturedMail(db, 'leaving-rider@riders.crosswatt.test', new RegExp(`#${first}`));

    const res = await request(app).get(unsubscribePath(mail.text_body));

    expect(res.status).toBe(200);
    expect(res.text).toContain('You are unsubscribed');
    const prefs = (await rider.agent.get('/api/me')).body.notificationPrefs;
    expect(prefs).toEqual({ emailOnDecision: false, emailOnReply: true });
    await rejectNew(rider.user.id);
    expect(await db('mail_messages').where({ user_id: rider.user.id })).toHaveLength(1);
  });

  it('when the unsubscribe token is changed, then the page says the link does not work and nothing changes', async () => {
    const rider = await signedInAgent(app, { handle: 'tampered-rider' });
    const first = await rejectNew(rider.user.id);
    const mail = await capturedMail(db, 'tampered-rider@riders.crosswatt.test', new RegExp(`#${first}`));
    const forged = unsubscribePath(mail.text_body).replace(/token=\d+/, `token=${moderator.user.id}`);

    const res = await request(app).get(forged);

    expect(res.status).toBe(400);
    expect(res.text).toContain('This link does not work');
    expect((await db('users').where({ id: moderator.user.id }).first('email_on_decision')).email_on_decision).toBe(true);
    expect((await db('users').where({ id: rider.user.id }).first('email_on_decision')).email_on_decision).toBe(true);
  });

  it('when a thread reply is queued for someone who switched reply e-mails off, then nothing is queued; with them on, it is sent', async () => {
    const quiet = await signedInAgent(app, { handle: 'reply-quiet' });
    const keen = await signedInAgent(app, { handle: 'reply-keen' });
    await quiet.agent
      .patch('/api/account')
      .set('X-CSRF-Token', await quiet.csrf())
      .send({ notificationPrefs: { emailOnReply: false } });
    const message = {
      kind: 'thread_reply' as const,
      subject: 'New reply: cadence dropouts on 1.4',
      text: 'Someone replied in a thread you follow.',
    };

    const skipped = await queueMail(db, { config, queue }, { userId: quiet.user.id, ...message });
    const queued = await queueMail(db, { config, queue }, { userId: keen.user.id, ...message });

    expect(skipped).toBeNull();
    expect(queued).toEqual(expect.any(Number));
    const mail = await capturedMail(db, 'reply-keen@riders.crosswatt.test', /New reply: cadence dropouts/);
    expect(mail.text_body).toContain('replies in threads you follow');
  });

  it('when the transaction that queued a mail rolls back, then no mail is stored or sent', async () => {
    const rider = await signedInAgent(app, { handle: 'rollback-rider' });

    await expect(
      db.transaction(async (trx) => {
        await queueMail(
          trx,
          { config, queue },
          { userId: rider.user.id, kind: 'maker_response', subject: 'Official answer', text: 'The maker answered.' },
        );
        throw new Error('the change failed');
      }),
    ).rejects.toThrow('the change failed');

    expect(await db('mail_messages').where({ user_id: rider.user.id })).toHaveLength(0);
  });

  it('when an admin opens the outbox, then they see the captured messages; a moderator is refused', async () => {
    const admin = await signedInAgent(app, { handle: 'outbox-admin', roles: ['admin'] });
    const rider = await signedInAgent(app, { handle: 'outbox-rider' });
    const id = await rejectNew(rider.user.id);
    await capturedMail(db, 'outbox-rider@riders.crosswatt.test', new RegExp(`#${id}`));

    const seen = await admin.agent.get('/api/mail/outbox');
    const refused = await moderator.agent.get('/api/mail/outbox');

    expect(seen.status).toBe(200);
    const message = seen.body.messages.find((m: { subject: string }) => m.subject.includes(`#${id}`));
    expect(message).toMatchObject({ recipients: ['outbox-rider@riders.crosswatt.test'], from: 'no-reply@crosswatt.test' });
    expect(message.text).toContain('Reason: Wrong device or firmware tag');
    expect(refused.status).toBe(403);
  });
});
