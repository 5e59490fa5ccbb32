import type { Knex } from 'knex';
import { DELETED_RIDER_NAME } from '../../../shared/roles';
import { dayOf } from '../../../shared/schemas/day';
import type {
  FirmwareRef,
  LinkableSubmission,
  LinkedSubmission,
  NotificationKind,
  NotificationView,
  PersonRef,
  ThreadListQuery,
  ThreadModelRef,
  ThreadStatus,
  ThreadSummary,
} from '../../../shared/schemas/threads';

type Db = Knex | Knex.Transaction;

export const THREADS_PAGE_SIZE = 30;

export interface ModelRow extends ThreadModelRef {
  status: string;
}

const iso = (d: Date | string | null) => (d ? new Date(d).toISOString() : null);

function person(id: number | null, handle: string | null, name: string | null, deletedAt: Date | null): PersonRef {
  if (id === null || deletedAt) return { id: null, handle: null, name: DELETED_RIDER_NAME };
  return { id, handle, name: name ?? handle ?? DELETED_RIDER_NAME };
}

/** A model row joined with its maker's name, as the queries below select it. */
interface ModelRefRecord {
  id: number;
  slug: string;
  name: string;
  status: string;
  maker_id: number;
  maker_name: string;
}

function modelRef(r: ModelRefRecord): ModelRow {
  return { id: r.id, slug: r.slug, name: r.name, status: r.status, maker: { id: r.maker_id, name: r.maker_name } };
}

const modelColumns = ['m.id', 'm.slug', 'm.name', 'm.status', 'm.maker_id', 'mk.name as maker_name'];

export async function findModelBySlug(db: Db, slug: string): Promise<ModelRow | undefined> {
  const row = await db('models as m').join('makers as mk', 'mk.id', 'm.maker_id').where('m.slug', slug).first(modelColumns);
  return row && modelRef(row);
}

export async function findModelById(db: Db, id: number): Promise<ModelRow | undefined> {
  const row = await db('models as m').join('makers as mk', 'mk.id', 'm.maker_id').where('m.id', id).first(modelColumns);
  return row && modelRef(row);
}

export async function listFirmware(db: Db, modelId: number): Promise<FirmwareRef[]> {
  return db('firmware_versions')
    .where({ model_id: modelId })
    .whereNot('status', 'rejected')
    .orderBy('version_order', 'desc')
    .select('id', 'version');
}

export async function firmwareOfModel(db: Db, firmwareId: number, modelId: number): Promise<FirmwareRef | undefined> {
  return db('firmware_versions').where({ id: firmwareId, model_id: modelId }).whereNot('status', 'rejected').first('id', 'version');
}

// ——— threads ———

export interface ThreadRow {
  id: number;
  modelId: number;
  firmwareId: number | null;
  authorId: number | null;
  title: string;
  status: ThreadStatus;
  fixedInFirmwareId: number | null;
  locked: boolean;
  movedFromModelId: number | null;
  makerRespondedAt: Date | null;
}

/** A row of the threads table. */
interface ThreadRecord {
  id: number;
  model_id: number;
  firmware_id: number | null;
  author_id: number | null;
  title: string;
  status: ThreadStatus;
  fixed_in_firmware_id: number | null;
  locked: boolean;
  moved_from_model_id: number | null;
  maker_responded_at: Date | null;
}

function threadRow(r: ThreadRecord): ThreadRow {
  return {
    id: r.id,
    modelId: r.model_id,
    firmwareId: r.firmware_id,
    authorId: r.author_id,
    title: r.title,
    status: r.status,
    fixedInFirmwareId: r.fixed_in_firmware_id,
    locked: r.locked,
    movedFromModelId: r.moved_from_model_id,
    makerRespondedAt: r.maker_responded_at,
  };
}

export async function findThread(db: Db, id: number, options: { forUpdate?: boolean } = {}): Promise<ThreadRow | undefined> {
  const q = db('threads').where({ id }).first();
  if (options.forUpdate) q.forUpdate();
  const row = await q;
  return row && threadRow(row);
}

export async function insertThread(
  db: Db,
  row: { modelId: number; firmwareId: number | null; authorId: number; title: string },
): Promise<number> {
  const [{ id }] = await db('threads')
    .insert({ model_id: row.modelId, firmware_id: row.firmwareId, author_id: row.authorId, title: row.title })
    .returning('id');
  return id;
}

export async function updateThread(
  db: Db,
  id: number,
  patch: Partial<{
    status: ThreadStatus;
    fixedInFirmwareId: number | null;
    statusSetBy: number;
    locked: boolean;
    modelId: number;
    firmwareId: number | null;
    movedFromModelId: number;
    makerRespondedAt: Date | null;
  }>,
): Promise<void> {
  const columns: Record<string, unknown> = {
    status: patch.status,
    fixed_in_firmware_id: patch.fixedInFirmwareId,
    locked: patch.locked,
    model_id: patch.modelId,
    firmware_id: patch.firmwareId,
    moved_from_model_id: patch.movedFromModelId,
    maker_responded_at: patch.makerRespondedAt,
  };
  if (patch.statusSetBy !== undefined) Object.assign(columns, { status_set_by: patch.statusSetBy, status_set_at: db.fn.now() });
  await db('threads')
    .where({ id })
    .update(Object.fromEntries(Object.entries(columns).filter(([, v]) => v !== undefined)));
}

/** A new reply: counts it, moves the thread up the list, and notes the maker's first reply. */
export async function touchThreadForReply(db: Db, id: number, byMakerStaff: boolean): Promise<void> {
  await db('threads')
    .where({ id })
    .update({
      reply_count: db.raw('reply_count + 1'),
      last_activity_at: db.fn.now(),
      ...(byMakerStaff && { maker_responded_at: db.raw('coalesce(maker_responded_at, now())') }),
    });
}

export async function touchThread(db: Db, id: number): Promise<void> {
  await db('threads').where({ id }).update({ last_activity_at: db.fn.now() });
}

function summaryQuery(db: Db) {
  return db('threads as t')
    .leftJoin('users as u', 'u.id', 't.author_id')
    .leftJoin('firmware_versions as f', 'f.id', 't.firmware_id')
    .leftJoin('firmware_versions as fx', 'fx.id', 't.fixed_in_firmware_id')
    .select(
      't.*',
      'u.handle as author_handle',
      'u.name as author_name',
      'u.deleted_at as author_deleted_at',
      'f.version as firmware_version',
      'fx.version as fixed_in_version',
      db.raw('exists (select 1 from posts p where p.thread_id = t.id and p.is_official_response) as has_official_response'),
    );
}

/** A thread as summaryQuery selects it, with its author, versions and counts. */
interface ThreadSummaryRecord extends ThreadRecord {
  fixed_in_version: string | null;
  firmware_version: string | null;
  author_handle: string | null;
  author_name: string | null;
  author_deleted_at: Date | null;
  reply_count: number;
  has_official_response: boolean;
  last_activity_at: Date;
  created_at: Date;
}

function toSummary(r: ThreadSummaryRecord): ThreadSummary {
  return {
    id: r.id,
    title: r.title,
    status: r.status,
    fixedIn: r.fixed_in_firmware_id && r.fixed_in_version !== null ? { id: r.fixed_in_firmware_id, version: r.fixed_in_version } : null,
    firmware: r.firmware_id && r.firmware_version !== null ? { id: r.firmware_id, version: r.firmware_version } : null,
    locked: r.locked,
    author: person(r.author_id, r.author_handle, r.author_name, r.author_deleted_at),
    replyCount: r.reply_count,
    makerResponded: r.maker_responded_at !== null,
    hasOfficialResponse: r.has_official_response,
    lastActivityOn: dayOf(r.last_activity_at),
    createdOn: dayOf(r.created_at),
  };
}

export async function findThreadSummary(db: Db, id: number): Promise<ThreadSummary | undefined> {
  const row = await summaryQuery(db).where('t.id', id).first();
  return row && toSummary(row);
}

export async function listThreads(db: Db, modelId: number, query: ThreadListQuery): Promise<{ threads: ThreadSummary[]; total: number }> {
  const filtered = db('threads as t')
    .where('t.model_id', modelId)
    .modify((q) => {
      if (query.open === true) q.whereNot('t.status', 'fixed');
      if (query.open === false) q.where('t.status', 'fixed');
      if (query.makerResponded === true) q.whereNotNull('t.maker_responded_at');
      if (query.makerResponded === false) q.whereNull('t.maker_responded_at');
      if (query.firmwareId) q.where('t.firmware_id', query.firmwareId);
    });
  const [{ count }] = await filtered.clone().count<{ count: string }[]>({ count: '*' });
  const rows = await summaryQuery(db)
    .whereIn('t.id', filtered.clone().select('t.id'))
    .orderBy([
      { column: 't.last_activity_at', order: 'desc' },
      { column: 't.id', order: 'desc' },
    ])
    .limit(THREADS_PAGE_SIZE)
    .offset((query.page - 1) * THREADS_PAGE_SIZE);
  return { threads: rows.map(toSummary), total: Number(count) };
}

export async function countThreads(db: Db, modelId: number): Promise<{ open: number; total: number }> {
  const [row] = await db('threads')
    .where({ model_id: modelId })
    .select(db.raw("count(*) filter (where status <> 'fixed')::int as open"), db.raw('count(*)::int as total'));
  return { open: row.open, total: row.total };
}

export async function listThreadsWithMakerStatus(db: Db, modelId: number, limit: number): Promise<ThreadSummary[]> {
  const rows = await summaryQuery(db)
    .where('t.model_id', modelId)
    .where((q) => q.whereNot('t.status', 'open').orWhereNotNull('t.maker_responded_at'))
    .orderBy('t.last_activity_at', 'desc')
    .limit(limit);
  return rows.map(toSummary);
}

// ——— posts ———

export interface PostRow {
  id: number;
  threadId: number;
  authorId: number | null;
  authorHandle: string | null;
  authorName: string | null;
  authorDeletedAt: Date | null;
  staffMakerId: number | null;
  staffMakerName: string | null;
  bodySource: string;
  bodyHtml: string;
  isOpening: boolean;
  isOfficialResponse: boolean;
  hiddenReason: string | null;
  createdAt: Date;
  editedAt: Date | null;
}

/** A post joined with its author and the maker its author is staff of. */
interface PostRecord {
  id: number;
  thread_id: number;
  author_id: number | null;
  author_handle: string | null;
  author_name: string | null;
  author_deleted_at: Date | null;
  staff_maker_id: number | null;
  staff_maker_name: string | null;
  body_source: string;
  body_html: string;
  is_opening: boolean;
  is_official_response: boolean;
  hidden_reason: string | null;
  created_at: Date;
  edited_at: Date | null;
}

function postRow(r: PostRecord): PostRow {
  return {
    id: r.id,
    threadId: r.thread_id,
    authorId: r.author_id,
    authorHandle: r.author_handle,
    authorName: r.author_name,
    authorDeletedAt: r.author_deleted_at,
    staffMakerId: r.staff_maker_id,
    staffMakerName: r.staff_maker_name,
    bodySource: r.body_source,
    bodyHtml: r.body_html,
    isOpening: r.is_opening,
    isOfficialResponse: r.is_official_response,
    hiddenReason: r.hidden_reason,
    createdAt: r.created_at,
    editedAt: r.edited_at,
  };
}

export function postAuthor(p: PostRow): PersonRef {
  return person(p.authorId, p.authorHandle, p.authorName, p.authorDeletedAt);
}

function postQuery(db: Db) {
  return db('posts as p')
    .leftJoin('users as u', 'u.id', 'p.author_id')
    .leftJoin('makers as mk', 'mk.id', 'p.staff_maker_id')
    .select(
      'p.*',
      'u.handle as author_handle',
      'u.name as author_name',
      'u.deleted_at as author_deleted_at',
      'mk.name as staff_maker_name',
    );
}

export async function listPosts(db: Db, threadId: number): Promise<PostRow[]> {
  return (await postQuery(db).where('p.thread_id', threadId).orderBy('p.id')).map(postRow);
}

export async function findPost(db: Db, id: number, options: { forUpdate?: boolean } = {}): Promise<PostRow | undefined> {
  if (options.forUpdate) await db('posts').where({ id }).forUpdate().first('id');
  const row = await postQuery(db).where('p.id', id).first();
  return row && postRow(row);
}

export async function insertPost(
  db: Db,
  row: { threadId: number; authorId: number; staffMakerId: number | null; bodySource: string; bodyHtml: string; isOpening: boolean },
): Promise<number> {
  const [{ id }] = await db('posts')
    .insert({
      thread_id: row.threadId,
      author_id: row.authorId,
      staff_maker_id: row.staffMakerId,
      body_source: row.bodySource,
      body_html: row.bodyHtml,
      is_opening: row.isOpening,
    })
    .returning('id');
  return id;
}

export async function updatePostBody(db: Db, id: number, body: { source: string; html: string }): Promise<void> {
  await db('posts').where({ id }).update({ body_source: body.source, body_html: body.html, edited_at: db.fn.now() });
}

export async function setPostHidden(db: Db, id: number, hidden: { reason: string; by: number } | null): Promise<void> {
  await db('posts')
    .where({ id })
    .update(
      hidden
        ? { hidden_reason: hidden.reason, hidden_by: hidden.by, hidden_at: db.fn.now() }
        : { hidden_reason: null, hidden_by: null, hidden_at: null },
    );
}

export async function setOfficialResponse(db: Db, threadId: number, postId: number | null): Promise<void> {
  await db('posts').where({ thread_id: threadId, is_official_response: true }).update({ is_official_response: false });
  if (postId !== null) await db('posts').where({ id: postId, thread_id: threadId }).update({ is_official_response: true });
}

/** Staff badges belong to the maker of the model; after a move to another maker's model they no longer speak for it. */
export async function firstStaffReplyAt(db: Db, threadId: number, makerId: number): Promise<Date | null> {
  const row = await db('posts')
    .where({ thread_id: threadId, staff_maker_id: makerId, is_opening: false })
    .min<{ min: Date | null }>('created_at as min')
    .first();
  return row?.min ?? null;
}

// ——— linked submissions ———

/** Of the given ids, the accepted submissions that have this model on one side. */
export async function acceptedSubmissionsOfModel(db: Db, modelId: number, ids: number[]): Promise<number[]> {
  if (ids.length === 0) return [];
  const rows = await db('submissions as s')
    .join('submission_recordings as r', 'r.submission_id', 's.id')
    .whereIn('s.id', ids)
    .where({ 's.status': 'accepted', 'r.model_id': modelId })
    .distinct('s.id');
  return rows.map((r) => r.id);
}

export async function replacePostSubmissions(db: Db, postId: number, submissionIds: number[]): Promise<void> {
  await db('post_submissions').where({ post_id: postId }).delete();
  if (submissionIds.length) await db('post_submissions').insert(submissionIds.map((submission_id) => ({ post_id: postId, submission_id })));
}

/**
 * Headline figures of the linked submissions, per post, from the side this
 * model was on. A submission withdrawn since it was linked no longer shows.
 */
export async function linkedSubmissions(db: Db, postIds: number[], modelId: number): Promise<Map<number, LinkedSubmission[]>> {
  const byPost = new Map<number, LinkedSubmission[]>();
  if (postIds.length === 0) return byPost;
  const rows = await db('post_submissions as ps')
    .join('submissions as s', 's.id', 'ps.submission_id')
    .join('submission_recordings as r', function () {
      this.on('r.submission_id', '=', 's.id').andOn('r.model_id', '=', db.raw('?', [modelId]));
    })
    .join('firmware_versions as f', 'f.id', 'r.firmware_id')
    .whereIn('ps.post_id', postIds)
    .where('s.status', 'accepted')
    .orderBy(['ps.post_id', 's.id', 'r.side'])
    .select(
      'ps.post_id',
      's.id',
      'r.side',
      'f.version',
      's.bias_percent',
      's.loa_lower_percent',
      's.loa_upper_percent',
      's.a_power_dropouts',
      's.b_power_dropouts',
      's.ride_started_at',
    );
  for (const r of rows) {
    const list = byPost.get(r.post_id) ?? [];
    if (list.some((l) => l.id === r.id)) continue;
    list.push({
      id: r.id,
      url: `/submissions/${r.id}`,
      side: r.side,
      // As the submission reports them: A relative to B (side says which one this model was).
      biasPercent: r.bias_percent,
      loaLowerPercent: r.loa_lower_percent,
      loaUpperPercent: r.loa_upper_percent,
      powerDropouts: r.side === 'a' ? r.a_power_dropouts : r.b_power_dropouts,
      firmware: r.version,
      rideDate: dayOf(r.ride_started_at),
    });
    byPost.set(r.post_id, list);
  }
  return byPost;
}

export async function linkableSubmissions(db: Db, riderId: number, modelId: number): Promise<LinkableSubmission[]> {
  const rows = await db('submissions as s')
    .join('submission_recordings as r', 'r.submission_id', 's.id')
    .join('firmware_versions as f', 'f.id', 'r.firmware_id')
    .where({ 's.rider_id': riderId, 's.status': 'accepted', 'r.model_id': modelId })
    .orderBy('s.ride_started_at', 'desc')
    .limit(50)
    .select('s.id', 's.ride_started_at', 'f.version', 'r.side', 's.bias_percent');
  return rows.map((r) => ({
    id: r.id,
    rideDate: dayOf(r.ride_started_at),
    firmware: r.version,
    side: r.side as 'a' | 'b',
    biasPercent: r.bias_percent,
  }));
}

// ——— follows ———

export async function follow(db: Db, threadId: number, userId: number): Promise<void> {
  await db('thread_follows').insert({ thread_id: threadId, user_id: userId }).onConflict(['thread_id', 'user_id']).ignore();
}

export async function unfollow(db: Db, threadId: number, userId: number): Promise<void> {
  await db('thread_follows').where({ thread_id: threadId, user_id: userId }).delete();
}

export async function isFollowing(db: Db, threadId: number, userId: number): Promise<boolean> {
  return !!(await db('thread_follows').where({ thread_id: threadId, user_id: userId }).first('user_id'));
}

export async function followerIds(db: Db, threadId: number, exceptUserId: number): Promise<number[]> {
  const rows = await db('thread_follows as tf')
    .join('users as u', 'u.id', 'tf.user_id')
    .where('tf.thread_id', threadId)
    .whereNot('tf.user_id', exceptUserId)
    .whereNull('u.deleted_at')
    .select('tf.user_id');
  return rows.map((r) => r.user_id);
}

// ——— notifications ———

export async function insertNotifications(
  db: Db,
  rows: Array<{ userId: number; threadId: number; postId: number | null; kind: 'reply' | 'official_response' | 'status' }>,
): Promise<void> {
  if (rows.length === 0) return;
  await db('notifications').insert(rows.map((r) => ({ user_id: r.userId, thread_id: r.threadId, post_id: r.postId, kind: r.kind })));
}

export const NOTIFICATIONS_PAGE_SIZE = 30;

/** A notification joined with its thread, model and the post's author. */
interface NotificationRecord {
  id: number;
  kind: NotificationKind;
  thread_id: number;
  title: string;
  model_name: string;
  post_id: number | null;
  author_id: number | null;
  author_handle: string | null;
  author_name: string | null;
  author_deleted_at: Date | null;
  created_at: Date;
  read_at: Date | null;
}

export async function listNotifications(db: Db, userId: number): Promise<NotificationView[]> {
  return db('notifications as n')
    .join('threads as t', 't.id', 'n.thread_id')
    .join('models as m', 'm.id', 't.model_id')
    .leftJoin('posts as p', 'p.id', 'n.post_id')
    .leftJoin('users as u', 'u.id', 'p.author_id')
    .where('n.user_id', userId)
    .orderBy('n.id', 'desc')
    .limit(NOTIFICATIONS_PAGE_SIZE)
    .select(
      'n.*',
      't.title',
      'm.name as model_name',
      'p.author_id',
      'u.handle as author_handle',
      'u.name as author_name',
      'u.deleted_at as author_deleted_at',
    )
    .then((rows) =>
      rows.map((r: NotificationRecord) => ({
        id: r.id,
        kind: r.kind,
        thread: { id: r.thread_id, title: r.title, modelName: r.model_name },
        postId: r.post_id,
        actor: r.post_id ? person(r.author_id, r.author_handle, r.author_name, r.author_deleted_at) : null,
        createdAt: iso(r.created_at)!,
        read: r.read_at !== null,
        url: `/threads/${r.thread_id}${r.post_id ? `#post-${r.post_id}` : ''}`,
      })),
    );
}

export async function countUnread(db: Db, userId: number): Promise<number> {
  const [{ count }] = await db('notifications').where({ user_id: userId }).whereNull('read_at').count<{ count: string }[]>({ count: '*' });
  return Number(count);
}

export async function markRead(db: Db, userId: number, ids: number[] | 'all'): Promise<void> {
  await db('notifications')
    .where({ user_id: userId })
    .whereNull('read_at')
    .modify((q) => {
      if (ids !== 'all') q.whereIn('id', ids);
    })
    .update({ read_at: db.fn.now() });
}
