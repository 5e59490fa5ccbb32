import type { Knex } from 'knex';
import {
  createPostInput,
  createThreadInput,
  editPostInput,
  POST_EDIT_WINDOW_MINUTES,
  setThreadStatusInput,
  type CreatePostInput,
  type CreateThreadInput,
  type EditPostInput,
  type ModelThreadSummary,
  type PostView,
  type SetThreadStatusInput,
  type ThreadDetail,
  type ThreadListQuery,
  type ThreadListResponse,
} from '../../../shared/schemas/threads';
import { dayOf } from '../../../shared/schemas/day';
import { assertIndependentOf, isStaffOf } from '../../auth/require-user';
import type { Config } from '../../config/env';
import type { Queue } from '../../jobs/queue';
import { AppError, ForbiddenError, NotFoundError, ValidationError } from '../../lib/errors';
import { recordAudit } from '../audit/audit.repository';
import type { SessionUser } from '../users/users.service';
import { notifyFollowers } from './notify-followers';
import { renderPostHtml } from './render-post';
import * as threads from './threads.repository';

export interface ThreadDeps {
  db: Knex;
  config: Config;
  queue?: Queue;
}

type Viewer = SessionUser | undefined;

const EDIT_WINDOW_MS = POST_EDIT_WINDOW_MINUTES * 60_000;

class ThreadLockedError extends AppError {
  constructor() {
    super(409, 'thread_locked', 'A moderator has locked this thread: it takes no new posts or edits.');
  }
}

async function approvedModel(db: Knex | Knex.Transaction, slug: string) {
  const model = await threads.findModelBySlug(db, slug);
  if (model?.status !== 'approved') throw new NotFoundError(`There is no model "${slug}" in the catalogue.`);
  return model;
}

async function existingThread(db: Knex | Knex.Transaction, id: number, forUpdate = false) {
  const thread = await threads.findThread(db, id, { forUpdate });
  if (!thread) throw new NotFoundError('There is no such thread.');
  const model = (await threads.findModelById(db, thread.modelId))!;
  return { thread, model };
}

/** The maker whose staff may act on a thread: for requireMakerStaff in the routes. */
export async function makerOfThread(db: Knex, threadId: number): Promise<number> {
  return (await existingThread(db, threadId)).model.maker.id;
}

async function checkedSubmissionIds(db: Knex | Knex.Transaction, modelId: number, ids: number[], modelName: string) {
  const found = await threads.acceptedSubmissionsOfModel(db, modelId, ids);
  const missing = ids.filter((id) => !found.includes(id));
  if (missing.length) {
    const message = `submissionIds: ${missing.map((id) => `#${id}`).join(', ')} ${missing.length === 1 ? 'is not an accepted submission' : 'are not accepted submissions'} of ${modelName}`;
    throw new ValidationError(message, { fields: { submissionIds: message.replace('submissionIds: ', '') } });
  }
  return ids;
}

// ——— reading ———

export async function listModelThreads(db: Knex, slug: string, query: ThreadListQuery): Promise<ThreadListResponse> {
  const model = await approvedModel(db, slug);
  const [{ threads: list, total }, firmware] = await Promise.all([
    threads.listThreads(db, model.id, query),
    threads.listFirmware(db, model.id),
  ]);
  const { status: _status, ...ref } = model;
  return { model: { ...ref, firmware }, threads: list, total, page: query.page, pageSize: threads.THREADS_PAGE_SIZE };
}

/** What the model page shows: how many threads are open and what the maker has said. */
export async function getModelThreadSummary(db: Knex, slug: string): Promise<ModelThreadSummary> {
  const model = await approvedModel(db, slug);
  const [counts, withMaker] = await Promise.all([threads.countThreads(db, model.id), threads.listThreadsWithMakerStatus(db, model.id, 5)]);
  return {
    openCount: counts.open,
    totalCount: counts.total,
    threads: withMaker.map(({ id, title, status, fixedIn, lastActivityOn, hasOfficialResponse }) => ({
      id,
      title,
      status,
      fixedIn,
      lastActivityOn,
      hasOfficialResponse,
    })),
  };
}

function toPostView(post: threads.PostRow, viewer: Viewer, linked: PostView['linkedSubmissions'], now: number): PostView {
  const isModerator = !!viewer?.roles.includes('moderator');
  const editableUntil = post.createdAt.getTime() + EDIT_WINDOW_MS;
  const ownEditable = !!viewer && viewer.id === post.authorId && !post.hiddenReason && now < editableUntil;
  return {
    id: post.id,
    author: threads.postAuthor(post),
    staffOf: post.staffMakerId && post.staffMakerName ? { id: post.staffMakerId, name: post.staffMakerName } : null,
    // Hidden posts keep their text for moderators only; everyone else sees the reason.
    bodyHtml: post.hiddenReason && !isModerator ? null : post.bodyHtml,
    bodySource: ownEditable ? post.bodySource : null,
    hidden: post.hiddenReason ? { reason: post.hiddenReason } : null,
    isOpening: post.isOpening,
    isOfficialResponse: post.isOfficialResponse,
    createdOn: dayOf(post.createdAt),
    editedOn: post.editedAt ? dayOf(post.editedAt) : null,
    editableUntil: ownEditable ? new Date(editableUntil).toISOString() : null,
    linkedSubmissions: post.hiddenReason && !isModerator ? [] : linked,
  };
}

export async function getThread(db: Knex, id: number, viewer: Viewer): Promise<ThreadDetail> {
  const { thread, model } = await existingThread(db, id);
  const [summary, posts, firmware, movedFrom, following] = await Promise.all([
    threads.findThreadSummary(db, id),
    threads.listPosts(db, id),
    threads.listFirmware(db, model.id),
    thread.movedFromModelId ? threads.findModelById(db, thread.movedFromModelId) : undefined,
    viewer ? threads.isFollowing(db, id, viewer.id) : false,
  ]);
  const linked = await threads.linkedSubmissions(
    db,
    posts.map((p) => p.id),
    model.id,
  );
  const now = Date.now();
  const views = posts.map((p) => toPostView(p, viewer, linked.get(p.id) ?? [], now));
  const isModerator = !!viewer?.roles.includes('moderator');
  const isMakerStaff = isStaffOf(viewer, model.maker.id);
  const { status: _status, ...modelRef } = model;
  return {
    ...summary!,
    model: { ...modelRef, firmware },
    movedFrom: movedFrom ? { slug: movedFrom.slug, name: movedFrom.name } : null,
    officialResponse: views.find((p) => p.isOfficialResponse && !p.hidden) ?? null,
    posts: views,
    viewer: {
      signedIn: !!viewer,
      following,
      isMakerStaff,
      isModerator,
      canModerate: isModerator && !isMakerStaff,
      canReply: !!viewer && !thread.locked,
    },
  };
}

export async function listLinkableSubmissions(db: Knex, user: SessionUser, slug: string) {
  const model = await approvedModel(db, slug);
  return threads.linkableSubmissions(db, user.id, model.id);
}

// ——— riders and staff write ———

/** The maker a new post speaks for: set only for verified staff of this model's maker. */
function staffMakerFor(user: SessionUser, model: threads.ModelRow): number | null {
  return isStaffOf(user, model.maker.id) ? model.maker.id : null;
}

export async function createThread(
  deps: ThreadDeps,
  user: SessionUser,
  slug: string,
  raw: CreateThreadInput,
): Promise<{ id: number; postId: number }> {
  const input = createThreadInput.parse(raw);
  return deps.db.transaction(async (trx) => {
    const model = await approvedModel(trx, slug);
    if (input.firmwareId !== null && !(await threads.firmwareOfModel(trx, input.firmwareId, model.id))) {
      throw new ValidationError(`firmwareId: not a firmware version of ${model.name}`, {
        fields: { firmwareId: `not a firmware version of ${model.name}` },
      });
    }
    const submissionIds = await checkedSubmissionIds(trx, model.id, input.submissionIds, model.name);
    const id = await threads.insertThread(trx, { modelId: model.id, firmwareId: input.firmwareId, authorId: user.id, title: input.title });
    const postId = await threads.insertPost(trx, {
      threadId: id,
      authorId: user.id,
      staffMakerId: staffMakerFor(user, model),
      bodySource: input.body,
      bodyHtml: renderPostHtml(input.body),
      isOpening: true,
    });
    await threads.replacePostSubmissions(trx, postId, submissionIds);
    await threads.follow(trx, id, user.id);
    return { id, postId };
  });
}

export async function replyToThread(deps: ThreadDeps, user: SessionUser, threadId: number, raw: CreatePostInput): Promise<{ id: number }> {
  const input = createPostInput.parse(raw);
  return deps.db.transaction(async (trx) => {
    const { thread, model } = await existingThread(trx, threadId, true);
    if (thread.locked) throw new ThreadLockedError();
    const submissionIds = await checkedSubmissionIds(trx, model.id, input.submissionIds, model.name);
    const staffMakerId = staffMakerFor(user, model);
    const id = await threads.insertPost(trx, {
      threadId,
      authorId: user.id,
      staffMakerId,
      bodySource: input.body,
      bodyHtml: renderPostHtml(input.body),
      isOpening: false,
    });
    await threads.replacePostSubmissions(trx, id, submissionIds);
    await threads.touchThreadForReply(trx, threadId, staffMakerId !== null);
    await notifyFollowers(trx, deps, { threadId, postId: id, actorId: user.id, kind: 'reply' });
    await threads.follow(trx, threadId, user.id);
    return { id };
  });
}

export async function editPost(deps: ThreadDeps, user: SessionUser, postId: number, raw: EditPostInput): Promise<void> {
  const input = editPostInput.parse(raw);
  await deps.db.transaction(async (trx) => {
    const post = await threads.findPost(trx, postId, { forUpdate: true });
    if (!post) throw new NotFoundError('There is no such post.');
    // Only the author: not the maker's staff, not moderators (they hide instead).
    if (post.authorId !== user.id) throw new ForbiddenError('Only the author of a post can edit it.');
    if (post.hiddenReason) throw new ForbiddenError('A moderator has hidden this post, so it cannot be edited.');
    if (Date.now() - post.createdAt.getTime() > EDIT_WINDOW_MS) {
      throw new AppError(
        403,
        'edit_window_closed',
        `Posts can be edited for ${POST_EDIT_WINDOW_MINUTES} minutes after writing them; write a reply instead.`,
      );
    }
    const { thread, model } = await existingThread(trx, post.threadId);
    if (thread.locked) throw new ThreadLockedError();
    await threads.updatePostBody(trx, postId, { source: input.body, html: renderPostHtml(input.body) });
    if (input.submissionIds) {
      await threads.replacePostSubmissions(trx, postId, await checkedSubmissionIds(trx, model.id, input.submissionIds, model.name));
    }
  });
}

export async function markOfficialResponse(deps: ThreadDeps, user: SessionUser, threadId: number, postId: number | null): Promise<void> {
  await deps.db.transaction(async (trx) => {
    const { model } = await existingThread(trx, threadId, true);
    if (!isStaffOf(user, model.maker.id))
      throw new ForbiddenError(`Only verified staff of ${model.maker.name} can mark the official response.`);
    if (postId === null) {
      await threads.setOfficialResponse(trx, threadId, null);
      return;
    }
    const post = await threads.findPost(trx, postId);
    if (!post || post.threadId !== threadId)
      throw new ValidationError('postId: not a post of this thread', { fields: { postId: 'not a post of this thread' } });
    if (post.staffMakerId !== model.maker.id || post.isOpening) {
      throw new ValidationError(`postId: only a reply written by staff of ${model.maker.name} can be the official response`, {
        fields: { postId: `choose a reply written by staff of ${model.maker.name}` },
      });
    }
    if (post.hiddenReason)
      throw new ValidationError('postId: a hidden post cannot be the official response', { fields: { postId: 'this post is hidden' } });
    if (post.isOfficialResponse) return;
    await threads.setOfficialResponse(trx, threadId, postId);
    await threads.touchThread(trx, threadId);
    await notifyFollowers(trx, deps, { threadId, postId, actorId: user.id, kind: 'official_response' });
  });
}

export async function setThreadStatus(deps: ThreadDeps, user: SessionUser, threadId: number, raw: SetThreadStatusInput): Promise<void> {
  const input = setThreadStatusInput.parse(raw);
  await deps.db.transaction(async (trx) => {
    const { thread, model } = await existingThread(trx, threadId, true);
    if (!isStaffOf(user, model.maker.id))
      throw new ForbiddenError(`Only verified staff of ${model.maker.name} can set this thread's status.`);
    if (input.fixedInFirmwareId !== null && !(await threads.firmwareOfModel(trx, input.fixedInFirmwareId, model.id))) {
      throw new ValidationError(`fixedInFirmwareId: not a firmware version of ${model.name}`, {
        fields: { fixedInFirmwareId: `not a firmware version of ${model.name}` },
      });
    }
    if (thread.status === input.status && thread.fixedInFirmwareId === input.fixedInFirmwareId) return;
    await threads.updateThread(trx, threadId, {
      status: input.status,
      fixedInFirmwareId: input.fixedInFirmwareId,
      statusSetBy: user.id,
      // Setting the status is the maker answering, even before any reply.
      makerRespondedAt: thread.makerRespondedAt ?? new Date(),
    });
    await threads.touchThread(trx, threadId);
    await notifyFollowers(trx, deps, { threadId, postId: null, actorId: user.id, kind: 'status' });
  });
}

export async function setFollowing(db: Knex, user: SessionUser, threadId: number, following: boolean): Promise<void> {
  await existingThread(db, threadId);
  if (following) await threads.follow(db, threadId, user.id);
  else await threads.unfollow(db, threadId, user.id);
}

// ——— moderators ———

export async function setPostVisibility(
  db: Knex,
  moderator: SessionUser,
  postId: number,
  change: { hidden: true; reason: string } | { hidden: false },
): Promise<void> {
  await db.transaction(async (trx) => {
    const post = await threads.findPost(trx, postId, { forUpdate: true });
    if (!post) throw new NotFoundError('There is no such post.');
    const { model } = await existingThread(trx, post.threadId);
    assertIndependentOf(moderator, [model.maker.id]);
    if (!!post.hiddenReason === change.hidden && (!change.hidden || post.hiddenReason === change.reason)) return;
    await threads.setPostHidden(trx, postId, change.hidden ? { reason: change.reason, by: moderator.id } : null);
    if (change.hidden && post.isOfficialResponse) await threads.setOfficialResponse(trx, post.threadId, null);
    await recordAudit(trx, {
      actorId: moderator.id,
      action: change.hidden ? 'post.hidden' : 'post.unhidden',
      subjectType: 'post',
      subjectId: postId,
      reason: change.hidden ? change.reason : null,
      before: { hiddenReason: post.hiddenReason, threadId: post.threadId },
      after: { hiddenReason: change.hidden ? change.reason : null },
    });
  });
}

export async function setThreadLocked(db: Knex, moderator: SessionUser, threadId: number, locked: boolean, reason?: string): Promise<void> {
  await db.transaction(async (trx) => {
    const { thread, model } = await existingThread(trx, threadId, true);
    assertIndependentOf(moderator, [model.maker.id]);
    if (thread.locked === locked) return;
    await threads.updateThread(trx, threadId, { locked });
    await recordAudit(trx, {
      actorId: moderator.id,
      action: locked ? 'thread.locked' : 'thread.unlocked',
      subjectType: 'thread',
      subjectId: threadId,
      reason: reason ?? null,
      before: { locked: thread.locked },
      after: { locked },
    });
  });
}

/**
 * Moves a thread to the model it is really about. Firmware belongs to a model, so
 * the firmware tag is dropped; under another maker, the old maker's status and
 * official response no longer speak for anyone and are cleared.
 */
export async function moveThread(db: Knex, moderator: SessionUser, threadId: number, targetSlug: string, reason: string): Promise<void> {
  await db.transaction(async (trx) => {
    const { thread, model } = await existingThread(trx, threadId, true);
    const target = await threads.findModelBySlug(trx, targetSlug);
    if (target?.status !== 'approved') {
      throw new ValidationError(`modelSlug: there is no model "${targetSlug}" in the catalogue`, {
        fields: { modelSlug: 'unknown model' },
      });
    }
    assertIndependentOf(moderator, [model.maker.id, target.maker.id]);
    if (target.id === model.id)
      throw new ValidationError('modelSlug: the thread is already about this model', { fields: { modelSlug: 'same model' } });
    const sameMaker = target.maker.id === model.maker.id;
    await threads.updateThread(trx, threadId, {
      modelId: target.id,
      firmwareId: null,
      movedFromModelId: model.id,
      ...(!sameMaker && {
        status: 'open',
        fixedInFirmwareId: null,
        makerRespondedAt: await threads.firstStaffReplyAt(trx, threadId, target.maker.id),
      }),
    });
    if (!sameMaker) await threads.setOfficialResponse(trx, threadId, null);
    await recordAudit(trx, {
      actorId: moderator.id,
      action: 'thread.moved',
      subjectType: 'thread',
      subjectId: threadId,
      reason,
      before: { modelSlug: model.slug, firmwareId: thread.firmwareId, status: thread.status },
      after: { modelSlug: target.slug, firmwareId: null, status: sameMaker ? thread.status : 'open' },
    });
  });
}

// ——— notifications ———

export async function getNotifications(db: Knex, user: SessionUser) {
  const [unreadCount, notifications] = await Promise.all([threads.countUnread(db, user.id), threads.listNotifications(db, user.id)]);
  return { unreadCount, notifications };
}

export async function markNotificationsRead(db: Knex, user: SessionUser, ids: number[] | 'all'): Promise<{ unreadCount: number }> {
  await threads.markRead(db, user.id, ids);
  return { unreadCount: await threads.countUnread(db, user.id) };
}
