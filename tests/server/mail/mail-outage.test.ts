import { describe, expect, it } from 'vitest';
import { startFakeSmtp } from '../../../server/fakes/fake-smtp';
import { queueMail } from '../../../server/features/mail/mail.service';
import { SEND_MAIL_QUEUE } from '../../../server/features/mail/send-mail.job';
import { freePort } from '../../../scripts/lib/port';
import { signedInAgent } from '../support/sign-in';
import { createTestContext } from '../support/test-app';
import { waitFor } from '../../support/wait-for';

// SMTP_PORT points at a port where the fake mail service is started and stopped by
// the tests; retries and sweeps in seconds instead of minutes.
const smtpPort = await freePort();
const { app, db, config, queue } = await createTestContext({
  fakes: true,
  worker: true,
  env: { SMTP_PORT: String(smtpPort), MAIL_RETRY_FIRST_DELAY_SECONDS: '1', MAIL_RETRY_MAX_DELAY_SECONDS: '2', MAIL_SWEEP_SECONDS: '1' },
});

function receivedWithSubject(subject: string) {
  return db('mail_outbox')
    .where({ subject })
    .count<{ count: string }[]>({ count: '*' })
    .then(([row]) => Number(row!.count));
}

function liveJobs(mailId: number) {
  return db('pgboss.job')
    .where({ name: SEND_MAIL_QUEUE, singleton_key: String(mailId) })
    .whereIn('state', ['created', 'retry', 'active'])
    .count<{ count: string }[]>({ count: '*' })
    .then(([row]) => Number(row!.count));
}

describe('mail through an outage of the mail service', () => {
  it('when SMTP is down for longer than the first retries and comes back, then the message is delivered exactly once', async () => {
    const rider = await signedInAgent(app, { handle: 'outage-rider' });
    const subject = 'A reply while the mail service was down';

    const mailId = await queueMail(
      db,
      { config, queue },
      { userId: rider.user.id, kind: 'thread_reply', subject, text: 'Someone replied.' },
    );
    // Three failed attempts: the first retries (after 1 s, then 2 s) have passed.
    await waitFor(() => db('mail_messages').where({ id: mailId }).where('attempts', '>=', 3).first('id'), {
      what: 'three failed attempts',
    });
    const smtp = await startFakeSmtp({ db, port: smtpPort });
    try {
      const sent = await waitFor<{ attempts: number; last_error: string | null }>(
        () => db('mail_messages').where({ id: mailId, status: 'sent' }).first('attempts', 'last_error'),
        { what: 'the message sent' },
      );
      await waitFor(async () => (await liveJobs(mailId!)) === 0, { what: 'no job left for the message' });

      expect(sent.attempts).toBeGreaterThanOrEqual(4);
      expect(sent.last_error).toBeNull();
      expect(await receivedWithSubject(subject)).toBe(1);
    } finally {
      await smtp.stop();
    }
  });

  it('when mail is stored with no job (as the demo seed stores it before any worker), then the periodic sweep sends it', async () => {
    const smtp = await startFakeSmtp({ db, port: smtpPort });
    try {
      const rider = await signedInAgent(app, { handle: 'seeded-rider' });
      const subject = 'Queued while no worker ran';

      // No queue: the message is stored and waits, as it does when no worker runs.
      const mailId = await queueMail(db, { config }, { userId: rider.user.id, kind: 'thread_reply', subject, text: 'Waiting.' });

      await waitFor(() => db('mail_messages').where({ id: mailId, status: 'sent' }).first('id'), { what: 'the swept message sent' });
      await waitFor(async () => (await liveJobs(mailId!)) === 0, { what: 'no job left for the message' });
      expect(await receivedWithSubject(subject)).toBe(1);
    } finally {
      await smtp.stop();
    }
  });
});
