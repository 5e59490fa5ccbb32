import { beforeAll, describe, expect, it } from 'vitest';
import { createTransport, MAX_MAIL_ATTEMPTS, sendQueuedMail } from '../../../server/features/mail/send-mail.job';
import { freePort } from '../../../scripts/lib/port';
import { createCatalogue, type TestCatalogue } from '../support/catalogue-factory';
import { signedInAgent } from '../support/sign-in';
import { createTestContext } from '../support/test-app';
import { submissionAwaitingReview } from '../moderation/moderation-fixtures';

// The mail service is down: nothing listens on SMTP_PORT.
const { app, db, config } = await createTestContext({ fakes: true, worker: true, env: { SMTP_PORT: String(await freePort()) } });

let catalogue: TestCatalogue;

beforeAll(async () => {
  catalogue = await createCatalogue(db);
});

describe('e-mail when the mail service is down', () => {
  it('when the SMTP service refuses connections, then the decision still succeeds and the mail waits for a retry', async () => {
    const rider = await signedInAgent(app, { handle: 'unlucky-rider' });
    const moderator = await signedInAgent(app, { handle: 'down-mod', roles: ['moderator'] });
    const { id, version } = await submissionAwaitingReview(db, rider.user.id, catalogue);

    const res = await moderator.agent
      .post(`/api/moderation/submissions/${id}/decision`)
      .set('X-CSRF-Token', await moderator.csrf())
      .send({ decision: 'accept', expectedVersion: version });

    expect(res.status).toBe(200);
    const until = Date.now() + 10_000;
    let message: { status: string; attempts: number; last_error: string | null } | undefined;
    do {
      message = await db('mail_messages').where({ user_id: rider.user.id }).first('status', 'attempts', 'last_error');
      if (message && message.attempts > 0) break;
      await new Promise((r) => setTimeout(r, 200));
    } while (Date.now() < until);
    expect(message).toMatchObject({ status: 'queued' });
    expect(message?.attempts).toBeGreaterThanOrEqual(1);
    expect(message?.last_error).toMatch(/ECONNREFUSED|connect/i);
  });

  it('when the last attempt fails, then the message is marked failed and not retried', async () => {
    const rider = await signedInAgent(app, { handle: 'failed-mail-rider' });
    const [{ id }] = await db('mail_messages')
      .insert({ user_id: rider.user.id, kind: 'submission_accepted', to_address: 'x@riders.crosswatt.test', subject: 's', text_body: 't', attempts: MAX_MAIL_ATTEMPTS - 1 })
      .returning('id');

    await sendQueuedMail(db, createTransport(config), config, id);

    expect(await db('mail_messages').where({ id }).first('status', 'attempts')).toEqual({ status: 'failed', attempts: MAX_MAIL_ATTEMPTS });
  });
});
