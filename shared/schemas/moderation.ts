import { z } from 'zod';
import type { QualityFlag } from '../analysis/types';
import { day } from './day';
import { boundedWholeNumber, idNumber, singleLineText } from './fields';
import { recordingTagsInput, SUBMISSION_STATUSES } from './submission';

/** Why a moderator rejects a submission: a fixed list, so riders and statistics can rely on it. */
export const REJECT_REASONS = [
  'not_same_ride',
  'wrong_tag',
  'not_calibrated',
  'mixed_comparison',
  'damaged_data',
  'duplicate',
  'other',
] as const;
export type RejectReason = (typeof REJECT_REASONS)[number];

export const REJECT_REASON_LABELS: Record<RejectReason, string> = {
  not_same_ride: 'The two files are not from the same ride',
  wrong_tag: 'Wrong device or firmware tag',
  not_calibrated: 'One meter was not calibrated (no zero offset)',
  mixed_comparison: 'A one-leg meter against a total meter without balance data',
  damaged_data: 'Damaged or incomplete data',
  duplicate: 'The same ride was submitted before',
  other: 'Another reason (see the note)',
};

export const DECISIONS = ['accept', 'reject', 'send_back', 'withdraw'] as const;
export type Decision = (typeof DECISIONS)[number];

const note = z
  .string()
  // Plain text only: control characters other than line breaks are dropped.
  .transform((s) => s.replace(/[\u0000-\u0009\u000b-\u001f\u007f]/g, '').trim())
  .pipe(z.string().max(1000, 'at most 1000 characters'));

const expectedVersion = idNumber('say which version of the submission you saw');

/** One decision on a submission; the version is the one the moderator saw. */
export const decideSubmissionInput = z.discriminatedUnion('decision', [
  z.object({ decision: z.literal('accept'), note: note.optional(), expectedVersion }),
  z
    .object({
      decision: z.literal('reject'),
      reason: z.enum(REJECT_REASONS, { message: 'choose a reason from the list' }),
      note: note.optional(),
      expectedVersion,
    })
    .refine((v) => v.reason !== 'other' || (v.note ?? '').length > 0, { path: ['note'], message: 'say what the other reason is' }),
  z.object({
    decision: z.literal('send_back'),
    note: note.pipe(z.string().min(1, 'tell the rider what to correct')),
    expectedVersion,
  }),
  z.object({
    decision: z.literal('withdraw'),
    reason: note.pipe(z.string().min(5, 'say why it leaves the statistics (at least 5 characters)')),
    expectedVersion,
  }),
]);
export type DecideSubmissionInput = z.infer<typeof decideSubmissionInput>;

/** Tag corrections: only the fields that change, per side. */
const partialTags = recordingTagsInput.partial().strict();
export const correctTagsInput = z
  .object({
    a: partialTags.optional(),
    b: partialTags.optional(),
    note: note.optional(),
    expectedVersion,
  })
  .refine((v) => Object.keys(v.a ?? {}).length + Object.keys(v.b ?? {}).length > 0, { message: 'change at least one tag' });
export type CorrectTagsInput = z.infer<typeof correctTagsInput>;

export const reviewQueueQuery = z.object({
  flag: z
    .string()
    .trim()
    .regex(/^[a-z_]{1,40}$/, 'a flag code like low_correlation')
    .optional(),
  maker: idNumber().optional(),
  model: idNumber().optional(),
  /** Only submissions waiting at least this many days. */
  minAgeDays: boundedWholeNumber(0, 3650).optional(),
  page: boundedWholeNumber(1, 10_000).default(1),
});
export type ReviewQueueQuery = z.infer<typeof reviewQueueQuery>;

// Catalogue curation
export const CATALOGUE_ENTRY_TYPES = ['maker', 'model', 'firmware', 'recording_device'] as const;
export type CatalogueEntryType = (typeof CATALOGUE_ENTRY_TYPES)[number];

const entryName = singleLineText().trim().min(1, 'enter a name').max(80, 'at most 80 characters');

export const curateEntryInput = z.discriminatedUnion('action', [
  z.object({ action: z.literal('approve') }),
  z.object({ action: z.literal('reject'), reason: note.pipe(z.string().min(3, 'say why (at least 3 characters)')) }),
  z.object({ action: z.literal('rename'), name: entryName }),
]);
export type CurateEntryInput = z.infer<typeof curateEntryInput>;

export const mergeEntriesInput = z.object({
  intoId: idNumber('choose the entry to keep'),
  reason: note.pipe(z.string().min(3, 'say why they are the same (at least 3 characters)')),
});
export type MergeEntriesInput = z.infer<typeof mergeEntriesInput>;

export const pinNoteInput = z.object({
  body: note.pipe(z.string().min(1, 'write the note').max(280, 'keep it under 280 characters')),
});

export const hideModelInput = z.object({
  reason: note.pipe(z.string().min(3, 'say why it is hidden (at least 3 characters)').max(280, 'keep it under 280 characters')),
});

// ——— answers ———

/** The last decision on a submission, as its rider and the public see it. */
export const decisionView = z.object({
  reason: z.string().nullable(),
  reasonLabel: z.string().nullable(),
  note: z.string().nullable(),
  decidedOn: day,
});
export type DecisionView = z.infer<typeof decisionView>;

export const submissionDecisionResponse = z.object({
  id: z.number(),
  status: z.enum(SUBMISSION_STATUSES),
  version: z.number(),
  decision: decisionView.nullable(),
});
export type SubmissionDecisionResponse = z.infer<typeof submissionDecisionResponse>;

// ——— responses of the moderation API (the client reads these same types) ———

/** A catalogue entry a rider proposed, waiting for a moderator. */
export interface PendingEntry {
  id: number;
  name: string;
  slug?: string;
  makerName?: string;
  modelName?: string;
  proposedBy: string | null;
  createdAt: string;
}

export interface PendingEntries {
  makers: PendingEntry[];
  models: PendingEntry[];
  firmware: PendingEntry[];
  recordingDevices: PendingEntry[];
}

export interface ReviewQueueRecording {
  side: 'a' | 'b';
  makerId: number;
  makerName: string;
  modelId: number;
  modelName: string;
  firmwareVersion: string;
  position: string;
  recordingDeviceName: string;
}

export interface ReviewQueueRow {
  id: number;
  version: number;
  createdAt: string;
  flags: QualityFlag[];
  flagSeverity: number;
  biasPercent: number | null;
  loaLowerPercent: number | null;
  loaUpperPercent: number | null;
  matchedSeconds: number | null;
  correlation: number | null;
  likeForLikeMode: string | null;
  aPowerDropouts: number | null;
  bPowerDropouts: number | null;
  riderHandle: string | null;
  recordings: ReviewQueueRecording[];
}

export interface ReviewQueue {
  total: number;
  pageSize: number;
  submissions: ReviewQueueRow[];
  flagCounts: Array<{ code: string; count: number }>;
}

export interface ReviewFlag extends QualityFlag {
  /** What the moderator should look at, and the rejection reason it most often leads to. */
  check: string | null;
  likelyReason: RejectReason | null;
}

export interface PossibleDuplicate {
  id: number;
  status: string;
  riderHandle: string | null;
  createdAt: string;
  overlapSeconds: number;
  overlapShare: number;
  sameStreamShare: number;
  nearIdentical: boolean;
}

/** Everything a moderator needs to decide one submission; `S` is the submission as the viewer may see it. */
export interface Review<S = unknown> {
  submission: S & { id: number; status: string; version: number };
  decision: DecisionView | null;
  flags: ReviewFlag[];
  riderHistory: { accepted: number; rejected: number; sentBack: number; withdrawn: number; other: number };
  duplicates: PossibleDuplicate[];
  deviceChecks: Array<{ side: 'a' | 'b'; what: string; tagged: string; inFile: string | null; agrees: boolean | null; message: string }>;
  originals: Array<{ side: 'a' | 'b'; kept: boolean; decoderVersion: number | null }>;
  history: Array<{ id: number; action: string; reason: string | null; actorHandle: string | null; createdAt: string }>;
}

/** A rider's corrected tags for a submission a moderator sent back. */
export const resubmitTagsInput = z.object({
  a: recordingTagsInput.partial().strict().optional(),
  b: recordingTagsInput.partial().strict().optional(),
  expectedVersion: z.coerce.number().int().positive(),
});
export type ResubmitTagsInput = z.infer<typeof resubmitTagsInput>;

/** What a tag change answers: the submission's new state. */
export interface TagChangeResult {
  id: number;
  status: (typeof SUBMISSION_STATUSES)[number];
  version: number;
  /** Position or model changed: the submission goes through the analysis again. */
  reanalyse: boolean;
}

/** What curation answers: the curated entry, or what a merge moved. */
export type CurationResult = CuratedEntry | MergeResult;
export interface CuratedEntry {
  id: number;
  type: CatalogueEntryType;
  name: string;
  status: string;
}
export interface MergeResult {
  mergedId: number;
  intoId: number;
  movedRecordings: number;
  movedAcceptedSubmissions: number;
}
