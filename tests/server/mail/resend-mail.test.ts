import { beforeAll, describe, expect, it } from 'vitest';
import { SEND_MAIL_QUEUE } from '../../../server/features/mail/send-mail.job';
import { signedInAgent } from '../support/sign-in';
import { createTestContext } from '../support/test-app';

// A queue but no worker: what "send again" queues stays visible in pg-boss's table.
const { app, db } = await createTestContext({ fakes: true, queue: true });

let admin: Awaited<ReturnType<typeof signedInAgent>>;
let riderId: number;

beforeAll(async () => {
  admin = await signedInAgent(app, { handle: 'outbox-admin', roles: ['admin'] });
  riderId = (await signedInAgent(app, { handle: 'resend-rider' })).user.id;
});

async function failedMessage(subject: string): Promise<number> {
  const [{ id }] = await db('mail_messages')
    .insert({
      user_id: riderId,
      kind: 'submission_accepted',
      to_address: 'resend-rider@riders.crosswatt.test',
      subject,
      text_body: 't',
      status: 'failed',
      attempts: 31,
      last_error: 'connect ECONNREFUSED 127.0.0.1:2525',
    })
    .returning('id');
  return id;
}

function jobsFor(mailId: number) {
  return db('pgboss.job')
    .where({ name: SEND_MAIL_QUEUE, singleton_key: String(mailId) })
    .select('state');
}

describe('failed mail in the Outbox', () => {
  it('when an admin lists undelivered mail, then a failed message shows with its error and attempts', async () => {
    const id = await failedMessage('Listed failure');

    const res = await admin.agent.get('/api/mail/undelivered');

    expect(res.status).toBe(200);
    expect(res.body.messages.find((m: { id: number }) => m.id === id)).toMatchObject({
      status: 'failed',
      subject: 'Listed failure',
      attempts: 31,
      lastError: 'connect ECONNREFUSED 127.0.0.1:2525',
    });
  });

  it('when a moderator or a rider asks for undelivered mail, then they are refused', async () => {
    const moderator = await signedInAgent(app, { handle: 'outbox-mod', roles: ['moderator'] });

    expect((await moderator.agent.get('/api/mail/undelivered')).status).toBe(403);
  });

  it('when an admin sends a failed message again twice, then it is queued exactly once and audited once', async () => {
    const id = await failedMessage('Send me again');
    const token = await admin.csrf();

    const first = await admin.agent.post(`/api/mail/messages/${id}/resend`).set('X-CSRF-Token', token);
    const second = await admin.agent.post(`/api/mail/messages/${id}/resend`).set('X-CSRF-Token', token);

    expect(first.status).toBe(204);
    expect(second.status).toBe(409);
    expect(second.body.error.message).toMatch(/not failed/);
    expect(await db('mail_messages').where({ id }).first('status', 'attempts')).toEqual({ status: 'queued', attempts: 31 });
    expect(await jobsFor(id)).toEqual([{ state: 'created' }]);
    const audit = await db('audit_log')
      .where({ action: 'mail.resent', subject_id: String(id) })
      .select('actor_id', 'before', 'after');
    expect(audit).toEqual([
      {
        actor_id: admin.user.id,
        before: { status: 'failed', attempts: 31, lastError: 'connect ECONNREFUSED 127.0.0.1:2525' },
        after: { status: 'queued' },
      },
    ]);
  });

  it('when the message id does not exist or is not a number, then a clear 4xx and nothing changes', async () => {
    const token = await admin.csrf();

    const missing = await admin.agent.post('/api/mail/messages/999999/resend').set('X-CSRF-Token', token);
    const notANumber = await admin.agent.post('/api/mail/messages/abc/resend').set('X-CSRF-Token', token);

    expect(missing.status).toBe(404);
    expect(notANumber.status).toBe(400);
    expect(notANumber.body.error.message).toMatch(/id/);
  });
});
