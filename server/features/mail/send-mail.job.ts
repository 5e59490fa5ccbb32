import type { Knex } from 'knex';
import nodemailer, { type Transporter } from 'nodemailer';
import type { Config } from '../../config/env';
import type { Queue } from '../../jobs/queue';
import type { Logger } from '../../lib/logger';
import * as mail from './mail.repository';

export const SEND_MAIL_QUEUE = 'send-mail';
/** Attempts before a message is given up as failed (with back-off, about a quarter of an hour in all). */
export const MAX_MAIL_ATTEMPTS = 6;

export async function createMailQueue(queue: Queue) {
  await queue.createQueue(SEND_MAIL_QUEUE, {
    name: SEND_MAIL_QUEUE,
    retryLimit: MAX_MAIL_ATTEMPTS - 1,
    retryDelay: 5,
    retryBackoff: true,
  });
}

export async function enqueueMail(queue: Queue, mailId: number) {
  await queue.send(SEND_MAIL_QUEUE, { mailId }, { singletonKey: String(mailId) });
}

export function createTransport(config: Config): Transporter {
  return nodemailer.createTransport({
    host: config.SMTP_HOST,
    port: config.SMTP_PORT,
    secure: config.SMTP_SECURE,
    ...(config.SMTP_USER && { auth: { user: config.SMTP_USER, pass: config.SMTP_PASSWORD ?? '' } }),
    connectionTimeout: 10_000,
    greetingTimeout: 10_000,
    socketTimeout: 20_000,
  });
}

export async function workMailQueue(queue: Queue, db: Knex, config: Config, logger: Logger) {
  const transport = createTransport(config);
  await queue.work<{ mailId: number }>(SEND_MAIL_QUEUE, { batchSize: 1, pollingIntervalSeconds: 0.5 }, async ([job]) => {
    await sendQueuedMail(db, transport, config, job.data.mailId, logger);
  });
  // Messages stored while no worker ran (or whose job was lost) are queued again.
  for (const id of await mail.findQueuedIds(db)) await enqueueMail(queue, id);
}

/**
 * Sends one stored message. Idempotent: a message already sent (or given up) is
 * left alone. A failure is recorded and thrown so pg-boss retries with back-off;
 * after the last attempt the message is marked failed.
 */
export async function sendQueuedMail(db: Knex, transport: Transporter, config: Config, mailId: number, logger?: Logger): Promise<void> {
  const message = await mail.findQueuedMessage(db, mailId);
  if (!message) return;
  try {
    await transport.sendMail({
      from: config.SMTP_FROM,
      to: message.to,
      subject: message.subject,
      text: message.text,
      ...(message.unsubscribeUrl && {
        list: { unsubscribe: { url: message.unsubscribeUrl, comment: 'Unsubscribe' } },
      }),
    });
    await mail.markSent(db, mailId);
  } catch (err) {
    const final = message.attempts + 1 >= MAX_MAIL_ATTEMPTS;
    await mail.markAttemptFailed(db, mailId, err instanceof Error ? err.message : String(err), final);
    logger?.warn({ err, mailId, attempts: message.attempts + 1 }, 'sending mail failed');
    if (!final) throw err;
  }
}
