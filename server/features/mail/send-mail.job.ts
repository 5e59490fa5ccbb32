import type { Knex } from 'knex';
import nodemailer, { type Transporter } from 'nodemailer';
import type { Config } from '../../config/env';
import type { Queue } from '../../jobs/queue';
import { defineQueue } from '../../jobs/queue-schema';
import type { Logger } from '../../lib/logger';
import * as mail from './mail.repository';

export const SEND_MAIL_QUEUE = 'send-mail';

// A job sends one stored message once. Failures to reach the mail service are not
// pg-boss retries: the message row keeps its attempts, last error and next attempt,
// and every worker's sweep queues it again when it is due (retryLimit here covers
// only our own unexpected errors). 'stately' with the message id as singleton key:
// at most one job waiting and one running per message, whoever sends.
export async function createMailQueue(queue: Queue) {
  await defineQueue(queue, SEND_MAIL_QUEUE, { policy: 'stately', retryLimit: 3, retryDelay: 5, retryBackoff: true, expireInSeconds: 120 });
}

export async function enqueueMail(queue: Queue, mailId: number) {
  await queue.send(SEND_MAIL_QUEUE, { mailId }, { singletonKey: String(mailId) });
}

export type MailRetryConfig = Pick<
  Config,
  'MAIL_RETRY_FIRST_DELAY_SECONDS' | 'MAIL_RETRY_MAX_DELAY_SECONDS' | 'MAIL_GIVE_UP_AFTER_SECONDS'
>;

/** Seconds to wait after the `attempts`-th failed attempt: doubling from the first delay, capped. */
export function mailRetryDelaySeconds(attempts: number, config: MailRetryConfig): number {
  return Math.min(config.MAIL_RETRY_FIRST_DELAY_SECONDS * 2 ** Math.min(attempts - 1, 30), config.MAIL_RETRY_MAX_DELAY_SECONDS);
}

/**
 * One Message-ID per stored message, the same on every attempt: a message sent twice
 * (the mail service took it, then the worker died before recording that) is
 * recognisable as one message, by mail clients and by the soak's count.
 */
export function mailMessageId(config: Pick<Config, 'SMTP_FROM'>, mailId: number): string {
  const domain = /@([^>\s]+)/.exec(config.SMTP_FROM)?.[1] ?? 'crosswatt.invalid';
  return `<crosswatt-mail-${mailId}@${domain}>`;
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
  // Messages that are due and have no job: retries, mail stored while no worker ran
  // (the demo seed's, say) or whose job was lost. At start, then periodically.
  const sweep = async () => {
    for (const id of await mail.findDueWithoutJob(db, SEND_MAIL_QUEUE)) await enqueueMail(queue, id);
  };
  await sweep();
  const timer = setInterval(() => {
    sweep().catch((err) => logger.warn({ err }, 'sweep for waiting mail failed'));
  }, config.MAIL_SWEEP_SECONDS * 1000);
  timer.unref();
  queue.once('stopped', () => clearInterval(timer));
}

/**
 * Sends one stored message if it is queued and due. The row stays locked while
 * it is sent, so two workers never send the same message. A failure is recorded
 * with the next attempt's time; once the next attempt would fall past the give-up
 * time the message is marked failed (an admin can send it again).
 */
export async function sendQueuedMail(db: Knex, transport: Transporter, config: Config, mailId: number, logger?: Logger): Promise<void> {
  await db.transaction(async (trx) => {
    const message = await mail.lockDueMessage(trx, mailId);
    if (!message) return;
    try {
      await transport.sendMail({
        messageId: mailMessageId(config, mailId),
        from: config.SMTP_FROM,
        to: message.to,
        subject: message.subject,
        text: message.text,
        ...(message.unsubscribeUrl && {
          list: { unsubscribe: { url: message.unsubscribeUrl, comment: 'Unsubscribe' } },
        }),
      });
      await mail.markSent(trx, mailId);
    } catch (err) {
      const attempts = message.attempts + 1;
      const status = await mail.markAttemptFailed(trx, mailId, {
        error: err instanceof Error ? err.message : String(err),
        retryInSeconds: mailRetryDelaySeconds(attempts, config),
        giveUpAfterSeconds: config.MAIL_GIVE_UP_AFTER_SECONDS,
      });
      logger?.warn({ err, mailId, attempts, status }, 'sending mail failed');
    }
  });
}
