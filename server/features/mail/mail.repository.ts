import type { Knex } from 'knex';
import type { Outbox, OutboxMessage } from '@shared/schemas/mail';
import { hasLiveJob } from '../../jobs/queue-schema';

type Db = Knex | Knex.Transaction;

export interface Recipient {
  id: number;
  email: string | null;
  name: string;
  emailOnDecision: boolean;
  emailOnReply: boolean;
  deleted: boolean;
}

export async function findRecipient(db: Db, userId: number): Promise<Recipient | undefined> {
  const row = await db('users').where({ id: userId }).first('id', 'email', 'name', 'email_on_decision', 'email_on_reply', 'deleted_at');
  return (
    row && {
      id: row.id,
      email: row.email,
      name: row.name,
      emailOnDecision: row.email_on_decision,
      emailOnReply: row.email_on_reply,
      deleted: row.deleted_at !== null,
    }
  );
}

export async function insertMessage(
  db: Db,
  message: { userId: number; kind: string; to: string; subject: string; text: string; unsubscribeUrl: string },
): Promise<number> {
  const [{ id }] = await db('mail_messages')
    .insert({
      user_id: message.userId,
      kind: message.kind,
      to_address: message.to,
      subject: message.subject,
      text_body: message.text,
      unsubscribe_url: message.unsubscribeUrl,
    })
    .returning('id');
  return id;
}

/** The message, locked for sending, if it is queued and due; undefined when another worker holds it. */
export interface DueMessage {
  id: number;
  to: string;
  subject: string;
  text: string;
  unsubscribeUrl: string | null;
  attempts: number;
}

export async function lockDueMessage(trx: Knex.Transaction, id: number): Promise<DueMessage | undefined> {
  return trx('mail_messages')
    .where({ id, status: 'queued' })
    .where('next_attempt_at', '<=', trx.fn.now())
    .forUpdate()
    .skipLocked()
    .first<DueMessage | undefined>(
      'id',
      'to_address as to',
      'subject',
      'text_body as text',
      'unsubscribe_url as unsubscribeUrl',
      'attempts',
    );
}

export async function markSent(db: Db, id: number): Promise<void> {
  await db('mail_messages')
    .where({ id })
    .update({ status: 'sent', sent_at: db.fn.now(), attempts: db.raw('attempts + 1'), last_error: null });
}

/** Records a failed attempt and when the next is due; gives up (status failed) when that would be past the give-up time. */
export async function markAttemptFailed(
  db: Db,
  id: number,
  failure: { error: string; retryInSeconds: number; giveUpAfterSeconds: number },
): Promise<'queued' | 'failed'> {
  const next = db.raw('now() + make_interval(secs => ?)', [failure.retryInSeconds]);
  const [row] = await db('mail_messages')
    .where({ id })
    .update({
      attempts: db.raw('attempts + 1'),
      last_error: failure.error.slice(0, 500),
      next_attempt_at: next,
      status: db.raw(
        `case when now() + make_interval(secs => ?) > retrying_since + make_interval(secs => ?) then 'failed' else 'queued' end`,
        [failure.retryInSeconds, failure.giveUpAfterSeconds],
      ),
    })
    .returning('status');
  return row.status;
}

/** Queued messages whose next attempt is due and that have no job waiting or running. */
export async function findDueWithoutJob(db: Db, queueName: string): Promise<number[]> {
  const rows = await db('mail_messages as m')
    .where('m.status', 'queued')
    .where('m.next_attempt_at', '<=', db.fn.now())
    .whereNot(hasLiveJob(db, queueName, 'm.id'))
    .orderBy('m.id')
    .select('m.id');
  return rows.map((r) => r.id);
}

export interface UndeliveredMailRecord {
  id: number;
  kind: string;
  to: string;
  subject: string;
  status: 'queued' | 'failed';
  attempts: number;
  lastError: string | null;
  nextAttemptAt: Date;
  createdAt: Date;
}

export const UNDELIVERED_LIST_SIZE = 100;

/** Messages given up, and those still being retried after a failed attempt; newest first. */
export async function listUndelivered(db: Db): Promise<UndeliveredMailRecord[]> {
  return db('mail_messages')
    .where('status', 'failed')
    .orWhere((q) => q.where('status', 'queued').where('attempts', '>', 0))
    .orderBy('id', 'desc')
    .limit(UNDELIVERED_LIST_SIZE)
    .select(
      'id',
      'kind',
      'to_address as to',
      'subject',
      'status',
      'attempts',
      'last_error as lastError',
      'next_attempt_at as nextAttemptAt',
      'created_at as createdAt',
    );
}

/** A failed message back to queued, due now, with a fresh give-up clock; undefined unless it was failed. */
export async function requeueFailed(db: Db, id: number): Promise<{ attempts: number; lastError: string | null } | undefined> {
  const [row] = await db('mail_messages')
    .where({ id, status: 'failed' })
    .update({ status: 'queued', next_attempt_at: db.fn.now(), retrying_since: db.fn.now() })
    .returning(['attempts', 'last_error as lastError']);
  return row;
}

export async function messageExists(db: Db, id: number): Promise<boolean> {
  return Boolean(await db('mail_messages').where({ id }).first('id'));
}

export async function setPreference(db: Db, userId: number, column: 'email_on_decision' | 'email_on_reply', value: boolean) {
  return db('users')
    .where({ id: userId })
    .whereNull('deleted_at')
    .update({ [column]: value, updated_at: db.fn.now() });
}

export const OUTBOX_PAGE_SIZE = 50;

export async function listOutbox(db: Db, page: number): Promise<Omit<Outbox, 'pageSize'>> {
  const [{ count }] = await db('mail_outbox').count<{ count: string }[]>({ count: '*' });
  const rows = await db('mail_outbox')
    .orderBy('id', 'desc')
    .limit(OUTBOX_PAGE_SIZE)
    .offset((page - 1) * OUTBOX_PAGE_SIZE)
    .select<(Omit<OutboxMessage, 'receivedAt'> & { receivedAt: Date })[]>(
      'id',
      'mail_from as from',
      'recipients',
      'subject',
      'text_body as text',
      'headers',
      'received_at as receivedAt',
    );
  return { total: Number(count), messages: rows.map((row) => ({ ...row, receivedAt: row.receivedAt.toISOString() })) };
}
