import type { Knex } from 'knex';
import type { NotificationKind } from '../../../shared/schemas/threads';
import { publicUrl } from '../../config/env';
import { type MailDeps, type MailKind, queueMail } from '../mail/mail.service';
import * as threads from './threads.repository';

// Replies and official responses are also e-mailed (if the follower wants
// replies by e-mail); a status change is only an in-app notification.
const MAIL_KIND: Partial<Record<NotificationKind, MailKind>> = {
  reply: 'thread_reply',
  official_response: 'maker_response',
};

/**
 * Tells the followers of a thread (except whoever acted) about a new reply, an
 * official response or a status change: an in-app notification for each, and an
 * e-mail through the mail service. Runs inside the change's transaction, so a
 * rolled-back change notifies nobody; the mail service hands messages to its job
 * only after commit.
 */
export async function notifyFollowers(
  trx: Knex.Transaction,
  deps: MailDeps,
  event: { threadId: number; postId: number | null; actorId: number; kind: NotificationKind },
): Promise<number[]> {
  const followers = await threads.followerIds(trx, event.threadId, event.actorId);
  if (followers.length === 0) return [];
  await threads.insertNotifications(
    trx,
    followers.map((userId) => ({ userId, threadId: event.threadId, postId: event.postId, kind: event.kind })),
  );

  const mailKind = MAIL_KIND[event.kind];
  if (!mailKind || event.postId === null) return followers;
  const thread = (await threads.findThread(trx, event.threadId))!;
  const model = (await threads.findModelById(trx, thread.modelId))!;
  const post = (await threads.findPost(trx, event.postId))!;
  const author = threads.postAuthor(post);
  const url = `${publicUrl(deps.config)}/threads/${thread.id}#post-${post.id}`;
  const byline = post.staffMakerName ? `${author.name} (${post.staffMakerName} staff)` : author.name;
  const message =
    mailKind === 'maker_response'
      ? {
          subject: `${model.maker.name} answered: ${thread.title}`,
          text: `${model.maker.name} marked this reply by ${byline} as its official response in "${thread.title}" (${model.name}):\n\n${post.bodySource}\n\nRead the thread: ${url}`,
        }
      : {
          subject: `New reply: ${thread.title}`,
          text: `${byline} replied in "${thread.title}" (${model.name}):\n\n${post.bodySource}\n\nRead the thread: ${url}`,
        };
  for (const userId of followers) await queueMail(trx, deps, { userId, kind: mailKind, ...message });
  return followers;
}
