import type { Knex } from 'knex';
import { type Config, publicUrl } from '../../config/env';
import type { UndeliveredMail } from '../../../shared/schemas/mail';
import type { Queue } from '../../jobs/queue';
import { ConflictError, NotFoundError } from '../../lib/errors';
import { recordAudit } from '../audit/audit.repository';
import * as mail from './mail.repository';
import { enqueueMail } from './send-mail.job';
import { type MailTopic, signUnsubscribeToken, verifyUnsubscribeToken } from './unsubscribe-token';

/** Every kind of e-mail Crosswatt sends, and the preference that switches it off. */
export const MAIL_KINDS = {
  submission_accepted: 'decision',
  submission_rejected: 'decision',
  submission_sent_back: 'decision',
  thread_reply: 'reply',
  maker_response: 'reply',
} as const satisfies Record<string, MailTopic>;
export type MailKind = keyof typeof MAIL_KINDS;

const TOPIC_TEXT: Record<MailTopic, string> = {
  decision: 'decisions on your submissions',
  reply: 'replies in threads you follow',
};

export interface MailDeps {
  config: Config;
  /** Without a queue the message waits until a worker starts (it sweeps waiting messages). */
  queue?: Queue;
}

export function unsubscribeUrl(config: Config, userId: number, topic: MailTopic): string {
  return `${publicUrl(config)}/api/mail/unsubscribe?token=${signUnsubscribeToken(config.SESSION_SECRET, userId, topic)}`;
}

/**
 * Queues one e-mail to a user, if their preferences allow it and they have an
 * address; returns the message id, or null when nothing is sent. Pass the
 * transaction that makes the change the mail is about: the message is stored with
 * it, and handed to the mail job only once it commits (a rollback sends nothing;
 * a slow mail service never holds the transaction).
 *
 *   await queueMail(trx, { config, queue }, { userId, kind: 'thread_reply', subject, text });
 */
export async function queueMail(
  dbOrTrx: Knex | Knex.Transaction,
  deps: MailDeps,
  message: { userId: number; kind: MailKind; subject: string; text: string },
): Promise<number | null> {
  const recipient = await mail.findRecipient(dbOrTrx, message.userId);
  if (!recipient || recipient.deleted || !recipient.email) return null;
  const topic = MAIL_KINDS[message.kind];
  const wanted = topic === 'decision' ? recipient.emailOnDecision : recipient.emailOnReply;
  if (!wanted) return null;

  const link = unsubscribeUrl(deps.config, recipient.id, topic);
  const text = `${message.text.trimEnd()}\n\n--\nYou get this e-mail because you asked Crosswatt for ${TOPIC_TEXT[topic]}.\nStop these e-mails with one click: ${link}\n`;
  const id = await mail.insertMessage(dbOrTrx, {
    userId: recipient.id,
    kind: message.kind,
    to: recipient.email,
    subject: message.subject,
    text,
    unsubscribeUrl: link,
  });

  const queue = deps.queue;
  if (queue) {
    const send = () => enqueueMail(queue, id).catch(() => undefined);
    if ('executionPromise' in dbOrTrx && dbOrTrx.isTransaction) {
      // After commit only; a rolled-back transaction leaves no message to send.
      dbOrTrx.executionPromise.then(send, () => undefined);
    } else {
      await send();
    }
  }
  return id;
}

/** Follows a signed unsubscribe link: switches the matching preference off. */
export async function unsubscribe(db: Knex, config: Config, token: string): Promise<{ topic: MailTopic } | null> {
  const verified = verifyUnsubscribeToken(config.SESSION_SECRET, token);
  if (!verified) return null;
  const column = verified.topic === 'decision' ? 'email_on_decision' : 'email_on_reply';
  const updated = await mail.setPreference(db, verified.userId, column, false);
  return updated ? { topic: verified.topic } : null;
}

export function topicDescription(topic: MailTopic): string {
  return TOPIC_TEXT[topic];
}

/** Undelivered mail for the admins' Outbox, field by field. */
export async function listUndeliveredMail(db: Knex): Promise<UndeliveredMail[]> {
  const rows = await mail.listUndelivered(db);
  return rows.map((r) => ({
    id: r.id,
    kind: r.kind,
    to: r.to,
    subject: r.subject,
    status: r.status,
    attempts: r.attempts,
    lastError: r.lastError,
    nextAttemptAt: new Date(r.nextAttemptAt).toISOString(),
    createdAt: new Date(r.createdAt).toISOString(),
  }));
}

/**
 * An admin's "send again" for a message that was given up: queued once more, due
 * now, with a fresh give-up clock, and audited. Only a failed message can be sent
 * again, so a second click (or two admins at once) queues nothing more.
 */
export async function resendFailedMail(db: Knex, deps: MailDeps, { actorId, mailId }: { actorId: number; mailId: number }): Promise<void> {
  const requeued = await db.transaction(async (trx) => {
    const before = await mail.requeueFailed(trx, mailId);
    if (before) {
      await recordAudit(trx, {
        actorId,
        action: 'mail.resent',
        subjectType: 'mail_message',
        subjectId: mailId,
        before: { status: 'failed', attempts: before.attempts, lastError: before.lastError },
        after: { status: 'queued' },
      });
    }
    return before;
  });
  if (!requeued) {
    if (await mail.messageExists(db, mailId))
      throw new ConflictError('This message is not failed: it was sent, or it is already waiting to be sent.');
    throw new NotFoundError('There is no such message.');
  }
  // Without a queue (or if queueing fails) a worker's sweep sends it.
  if (deps.queue) await enqueueMail(deps.queue, mailId).catch(() => undefined);
}
