import { beforeAll, describe, expect, it } from 'vitest';
import { createTransport, sendQueuedMail } from '../../../server/features/mail/send-mail.job';
import { freePort } from '../../../scripts/lib/port';
import { createCatalogue, type TestCatalogue } from '../support/catalogue-factory';
import { signedInAgent } from '../support/sign-in';
import { createTestContext, testConfig } from '../support/test-app';
import { waitFor } from '../../support/wait-for';
import { submissionAwaitingReview } from '../moderation/moderation-fixtures';

// The mail service is down: nothing listens on SMTP_PORT.
const smtpPort = String(await freePort());
const { app, db, config } = await createTestContext({
  fakes: true,
  worker: true,
  env: { SMTP_PORT: smtpPort, MAIL_RETRY_FIRST_DELAY_SECONDS: '60' },
});

let catalogue: TestCatalogue;

beforeAll(async () => {
  catalogue = await createCatalogue(db);
});

describe('e-mail when the mail service is down', () => {
  it('when the SMTP service refuses connections, then the decision still succeeds and the mail waits for its next attempt', async () => {
    const rider = await signedInAgent(app, { handle: 'unlucky-rider' });
    const moderator = await signedInAgent(app, { handle: 'down-mod', roles: ['moderator'] });
    const { id, version } = await submissionAwaitingReview(db, rider.user.id, catalogue);

    const res = await moderator.agent
      .post(`/api/moderation/submissions/${id}/decision`)
      .set('X-CSRF-Token', await moderator.csrf())
      .send({ decision: 'accept', expectedVersion: version });

    expect(res.status).toBe(200);
    const message = await waitFor<{ status: string; attempts: number; last_error: string | null; next_attempt_at: Date; created_at: Date }>(
      () =>
        db('mail_messages')
          .where({ user_id: rider.user.id })
          .where('attempts', '>', 0)
          .first('status', 'attempts', 'last_error', 'next_attempt_at', 'created_at'),
      { what: 'a first failed attempt' },
    );
    expect(message).toMatchObject({ status: 'queued', attempts: 1 });
    expect(message.last_error).toMatch(/ECONNREFUSED|connect/i);
    // The next attempt is a minute on (MAIL_RETRY_FIRST_DELAY_SECONDS above), not at once.
    expect(message.next_attempt_at.getTime() - message.created_at.getTime()).toBeGreaterThan(50_000);
  });

  it('when an attempt fails after the give-up time, then the message is marked failed with its error', async () => {
    const rider = await signedInAgent(app, { handle: 'failed-mail-rider' });
    const [{ id }] = await db('mail_messages')
      .insert({
        user_id: rider.user.id,
        kind: 'submission_accepted',
        to_address: 'x@riders.crosswatt.test',
        subject: 's',
        text_body: 't',
        attempts: 20,
        retrying_since: db.raw(`now() - interval '3 days'`),
      })
      .returning('id');

    await sendQueuedMail(db, createTransport(config), config, id);

    const stored = await db('mail_messages').where({ id }).first('status', 'attempts', 'last_error');
    expect(stored).toMatchObject({ status: 'failed', attempts: 21 });
    expect(stored.last_error).toMatch(/ECONNREFUSED|connect/i);
  });

  it('when an attempt fails within the give-up time, then the message stays queued', async () => {
    const rider = await signedInAgent(app, { handle: 'patient-mail-rider' });
    const [{ id }] = await db('mail_messages')
      .insert({
        user_id: rider.user.id,
        kind: 'submission_accepted',
        to_address: 'y@riders.crosswatt.test',
        subject: 's',
        text_body: 't',
        attempts: 20,
        retrying_since: db.raw(`now() - interval '23 hours'`),
      })
      .returning('id');

    // Two days by default (server/config/env.ts): an outage of a whole day is outlived.
    await sendQueuedMail(db, createTransport(config), testConfig({ SMTP_PORT: smtpPort }), id);

    expect(await db('mail_messages').where({ id }).first('status', 'attempts')).toEqual({ status: 'queued', attempts: 21 });
  });
});
