import { z } from 'zod';
import { idNumber } from './fields';

export const mailMessageParams = z.object({ id: idNumber() });
export type MailMessageParams = z.infer<typeof mailMessageParams>;

/** A stored e-mail that has not reached the mail service: still retried ('queued') or given up ('failed'). */
export const undeliveredMailSchema = z.object({
  id: z.number(),
  kind: z.string(),
  to: z.string(),
  subject: z.string(),
  status: z.enum(['queued', 'failed']),
  attempts: z.number(),
  lastError: z.string().nullable(),
  /** ISO time; for a failed message, when it would have been tried next. */
  nextAttemptAt: z.string(),
  createdAt: z.string(),
});
export type UndeliveredMail = z.infer<typeof undeliveredMailSchema>;

export const undeliveredMailListSchema = z.object({ messages: z.array(undeliveredMailSchema) });
export type UndeliveredMailList = z.infer<typeof undeliveredMailListSchema>;

/** A message the local stand-in SMTP service received (the admins' Outbox). */
export interface OutboxMessage {
  id: number;
  from: string;
  recipients: string[];
  subject: string;
  text: string;
  headers: Record<string, string>;
  receivedAt: string;
}

export interface Outbox {
  total: number;
  pageSize: number;
  messages: OutboxMessage[];
}
