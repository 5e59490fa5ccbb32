import { createHmac, timingSafeEqual } from 'node:crypto';

/** What a person can stop receiving with one click; each maps to one notification preference. */
export const MAIL_TOPICS = ['decision', 'reply'] as const;
export type MailTopic = (typeof MAIL_TOPICS)[number];

// The link must work without signing in, so it carries who and what, signed with
// an HMAC of the session secret: nobody can unsubscribe someone else by guessing.
function signature(secret: string, payload: string): Buffer {
  return createHmac('sha256', secret).update(`unsubscribe:${payload}`).digest();
}

export function signUnsubscribeToken(secret: string, userId: number, topic: MailTopic): string {
  const payload = `${userId}.${topic}`;
  return `${payload}.${signature(secret, payload).toString('base64url')}`;
}

export function verifyUnsubscribeToken(secret: string, token: string): { userId: number; topic: MailTopic } | null {
  const match = /^(\d{1,10})\.([a-z]+)\.([A-Za-z0-9_-]{43})$/.exec(token);
  if (!match) return null;
  const [, id, topic, sig] = match;
  if (!(MAIL_TOPICS as readonly string[]).includes(topic!)) return null;
  const expected = signature(secret, `${id}.${topic}`);
  const given = Buffer.from(sig!, 'base64url');
  if (given.length !== expected.length || !timingSafeEqual(given, expected)) return null;
  return { userId: Number(id), topic: topic as MailTopic };
}
