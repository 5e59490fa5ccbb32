import type { Knex } from 'knex';

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

export async function findQueuedMessage(db: Db, id: number) {
  return db('mail_messages')
    .where({ id, status: 'queued' })
    .first('id', 'to_address as to', 'subject', 'text_body as text', 'unsubscribe_url as unsubscribeUrl', 'attempts');
}

export async function markSent(db: Db, id: number): Promise<void> {
  await db('mail_messages').where({ id }).update({ status: 'sent', sent_at: db.fn.now(), attempts: db.raw('attempts + 1'), last_error: null });
}

export async function markAttemptFailed(db: Db, id: number, error: string, final: boolean): Promise<void> {
  await db('mail_messages')
    .where({ id })
    .update({ attempts: db.raw('attempts + 1'), last_error: error.slice(0, 500), ...(final && { status: 'failed' }) });
}

export async function findQueuedIds(db: Db): Promise<number[]> {
  const rows = await db('mail_messages').where({ status: 'queued' }).select('id');
  return rows.map((r) => r.id);
}

export async function setPreference(db: Db, userId: number, column: 'email_on_decision' | 'email_on_reply', value: boolean) {
  return db('users').where({ id: userId }).whereNull('deleted_at').update({ [column]: value, updated_at: db.fn.now() });
}

export const OUTBOX_PAGE_SIZE = 50;

export async function listOutbox(db: Db, page: number) {
  const [{ count }] = await db('mail_outbox').count<{ count: string }[]>({ count: '*' });
  const rows = await db('mail_outbox')
    .orderBy('id', 'desc')
    .limit(OUTBOX_PAGE_SIZE)
    .offset((page - 1) * OUTBOX_PAGE_SIZE)
    .select('id', 'mail_from as from', 'recipients', 'subject', 'text_body as text', 'headers', 'received_at as receivedAt');
  return { total: Number(count), messages: rows };
}
