import { z } from 'zod';
import { boundedWholeNumber, idNumber, multiLineText, singleLineText } from './fields';

// Discussion threads: riders report what they see on a model, makers' verified
// staff answer. One set of schemas for the forms and the server.

export const THREAD_STATUSES = ['open', 'acknowledged', 'investigating', 'fixed'] as const;
export type ThreadStatus = (typeof THREAD_STATUSES)[number];
export const THREAD_STATUS_LABELS: Record<ThreadStatus, string> = {
  open: 'Open',
  acknowledged: 'Acknowledged by the maker',
  investigating: 'Maker investigating',
  fixed: 'Fixed',
};

export const THREAD_TITLE_MAX = 140;
export const POST_BODY_MAX = 10_000;
export const MAX_LINKED_SUBMISSIONS = 6;
/** How long after writing a post its author may still edit it. */
export const POST_EDIT_WINDOW_MINUTES = 30;
export const HIDE_REASON_MAX = 300;

const threadTitle = singleLineText()
  .trim()
  .min(8, 'at least 8 characters: say what you see')
  .max(THREAD_TITLE_MAX, `at most ${THREAD_TITLE_MAX} characters`);

const postBody = multiLineText().trim().min(2, 'write at least a few words').max(POST_BODY_MAX, `at most ${POST_BODY_MAX} characters`);

const id = idNumber();

const submissionIds = z
  .array(id)
  .max(MAX_LINKED_SUBMISSIONS, `link at most ${MAX_LINKED_SUBMISSIONS} submissions`)
  .default([])
  .transform((ids) => [...new Set(ids)]);

export const createThreadInput = z.object({
  title: threadTitle,
  body: postBody,
  firmwareId: id.nullish().transform((v) => v ?? null),
  submissionIds,
});
export type CreateThreadInput = z.input<typeof createThreadInput>;

export const createPostInput = z.object({ body: postBody, submissionIds });
export type CreatePostInput = z.input<typeof createPostInput>;

export const editPostInput = z.object({ body: postBody, submissionIds: submissionIds.optional() });
export type EditPostInput = z.input<typeof editPostInput>;

export const setThreadStatusInput = z
  .object({
    status: z.enum(THREAD_STATUSES),
    fixedInFirmwareId: id.nullish().transform((v) => v ?? null),
  })
  .refine((v) => v.status !== 'fixed' || v.fixedInFirmwareId !== null, {
    path: ['fixedInFirmwareId'],
    message: 'say which firmware version fixes it',
  })
  .refine((v) => v.status === 'fixed' || v.fixedInFirmwareId === null, {
    path: ['fixedInFirmwareId'],
    message: 'only a fixed thread names a firmware version',
  });
export type SetThreadStatusInput = z.input<typeof setThreadStatusInput>;

export const officialResponseInput = z.object({ postId: id });

const reason = singleLineText().trim().min(3, 'give a short reason').max(HIDE_REASON_MAX, `at most ${HIDE_REASON_MAX} characters`);

export const postVisibilityInput = z.discriminatedUnion('hidden', [
  z.object({ hidden: z.literal(true), reason }),
  z.object({ hidden: z.literal(false) }),
]);
export type PostVisibilityInput = z.infer<typeof postVisibilityInput>;

export const lockThreadInput = z.object({ locked: z.boolean(), reason: reason.optional() });
export const moveThreadInput = z.object({ modelSlug: z.string().trim().min(1).max(120), reason });

const flag = z.enum(['true', 'false']).transform((v) => v === 'true');
export const threadListQuery = z.object({
  /** Not yet fixed. */
  open: flag.optional(),
  makerResponded: flag.optional(),
  firmwareId: id.optional(),
  page: boundedWholeNumber(1, 1000).default(1),
});
export type ThreadListQuery = z.infer<typeof threadListQuery>;

export const markNotificationsReadInput = z.union([z.object({ all: z.literal(true) }), z.object({ ids: z.array(id).min(1).max(200) })]);
export type MarkNotificationsReadInput = z.infer<typeof markNotificationsReadInput>;

// ——— answers ———

export interface PersonRef {
  id: number | null;
  handle: string | null;
  name: string;
}

export interface FirmwareRef {
  id: number;
  version: string;
}

export interface LinkedSubmission {
  id: number;
  url: string;
  /** Which side of the pair this model was on. */
  side: 'a' | 'b';
  /** A relative to B, as the submission reports it. */
  biasPercent: number | null;
  loaLowerPercent: number | null;
  loaUpperPercent: number | null;
  /** Power dropouts of this model's recording. */
  powerDropouts: number | null;
  firmware: string;
  /** The day of the ride (YYYY-MM-DD). */
  rideDate: string;
}

export interface PostView {
  id: number;
  author: PersonRef;
  /** Set when a verified staff member of this maker wrote the post. */
  staffOf: { id: number; name: string } | null;
  /** Sanitised HTML; null when a moderator has hidden the post. */
  bodyHtml: string | null;
  /** The Markdown source, only for its author while they may still edit. */
  bodySource: string | null;
  hidden: { reason: string } | null;
  isOpening: boolean;
  isOfficialResponse: boolean;
  /** Days (YYYY-MM-DD): a post's time of day is nobody's business. */
  createdOn: string;
  editedOn: string | null;
  /** Only for the author, while they may still edit: an exact time. */
  editableUntil: string | null;
  linkedSubmissions: LinkedSubmission[];
}

export interface LinkableSubmission {
  id: number;
  rideDate: string;
  firmware: string;
  side: 'a' | 'b';
  biasPercent: number | null;
}

export interface ThreadModelRef {
  id: number;
  slug: string;
  name: string;
  maker: { id: number; name: string };
}

export interface ThreadSummary {
  id: number;
  title: string;
  status: ThreadStatus;
  fixedIn: FirmwareRef | null;
  firmware: FirmwareRef | null;
  locked: boolean;
  author: PersonRef;
  replyCount: number;
  makerResponded: boolean;
  hasOfficialResponse: boolean;
  /** Days (YYYY-MM-DD). */
  lastActivityOn: string;
  createdOn: string;
}

export interface ThreadListResponse {
  model: ThreadModelRef & { firmware: FirmwareRef[] };
  threads: ThreadSummary[];
  total: number;
  page: number;
  pageSize: number;
}

export interface ThreadViewer {
  signedIn: boolean;
  following: boolean;
  /** Staff of this model's maker: may mark an official response and set the status. */
  isMakerStaff: boolean;
  isModerator: boolean;
  /** False when a moderator must not act here (they are staff of this maker). */
  canModerate: boolean;
  canReply: boolean;
}

export interface ThreadDetail extends ThreadSummary {
  model: ThreadModelRef & { firmware: FirmwareRef[] };
  movedFrom: { slug: string; name: string } | null;
  officialResponse: PostView | null;
  posts: PostView[];
  viewer: ThreadViewer;
}

export interface ModelThreadSummary {
  openCount: number;
  totalCount: number;
  /** Threads where the maker has said something, latest activity first. */
  threads: Array<Pick<ThreadSummary, 'id' | 'title' | 'status' | 'fixedIn' | 'lastActivityOn' | 'hasOfficialResponse'>>;
}

export type NotificationKind = 'reply' | 'official_response' | 'status';

export interface NotificationView {
  id: number;
  kind: NotificationKind;
  thread: { id: number; title: string; modelName: string };
  postId: number | null;
  actor: PersonRef | null;
  createdAt: string;
  read: boolean;
  url: string;
}

export interface NotificationList {
  unreadCount: number;
  notifications: NotificationView[];
}
