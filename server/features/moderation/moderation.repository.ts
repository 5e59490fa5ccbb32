import type { Knex } from 'knex';
import type { ReviewQueueQuery, ReviewQueueRow } from '@shared/schemas/moderation';
import type { RecordingTagsInput, SubmissionStatus } from '@shared/schemas/submission';

type Db = Knex | Knex.Transaction;

export interface LockedSubmission {
  id: number;
  riderId: number | null;
  status: SubmissionStatus;
  version: number;
  decisionReason: string | null;
  decisionNote: string | null;
}

/** Locks the submission's row until the transaction ends, so decisions on it happen one after the other. */
export async function lockSubmission(trx: Knex.Transaction, id: number): Promise<LockedSubmission | undefined> {
  return trx('submissions')
    .where({ id })
    .forUpdate()
    .first('id', 'rider_id as riderId', 'status', 'version', 'decision_reason as decisionReason', 'decision_note as decisionNote');
}

/** The makers whose models a submission compares (for the independence rule). */
export async function makerIdsOfSubmission(db: Db, id: number): Promise<number[]> {
  const rows = await db('submission_recordings as r')
    .join('models as m', 'm.id', 'r.model_id')
    .where('r.submission_id', id)
    .distinct('m.maker_id');
  return rows.map((r) => r.maker_id);
}

export async function makerIdsOfModels(db: Db, modelIds: number[]): Promise<number[]> {
  const rows = await db('models').whereIn('id', modelIds).distinct('maker_id');
  return rows.map((r) => r.maker_id);
}

export async function staffMakerIdsOf(db: Db, userId: number): Promise<number[]> {
  const rows = await db('maker_staff').where({ user_id: userId }).select('maker_id');
  return rows.map((r) => r.maker_id);
}

export async function updateDecision(
  trx: Knex.Transaction,
  id: number,
  change: { status: SubmissionStatus; reason: string | null; note: string | null; decidedBy: number },
): Promise<number> {
  const [row] = await trx('submissions')
    .where({ id })
    .update({
      status: change.status,
      decision_reason: change.reason,
      decision_note: change.note,
      decided_by: change.decidedBy,
      decided_at: trx.fn.now(),
      updated_at: trx.fn.now(),
      version: trx.raw('version + 1'),
    })
    .returning('version');
  return row.version;
}

export type StoredTags = RecordingTagsInput & { side: 'a' | 'b' };

export async function tagsOf(db: Db, id: number): Promise<StoredTags[]> {
  return db('submission_recordings')
    .where({ submission_id: id })
    .orderBy('side')
    .select(
      'side',
      'model_id as modelId',
      'firmware_id as firmwareId',
      'position',
      'recording_device_id as recordingDeviceId',
      'recording_device_firmware as recordingDeviceFirmware',
      'recording_mode as recordingMode',
      'zero_offset as zeroOffset',
      'other_meters_on as otherMetersOn',
    );
}

export async function updateTags(trx: Knex.Transaction, id: number, side: 'a' | 'b', tags: RecordingTagsInput): Promise<void> {
  await trx('submission_recordings').where({ submission_id: id, side }).update({
    model_id: tags.modelId,
    firmware_id: tags.firmwareId,
    position: tags.position,
    recording_device_id: tags.recordingDeviceId,
    recording_device_firmware: tags.recordingDeviceFirmware,
    recording_mode: tags.recordingMode,
    zero_offset: tags.zeroOffset,
    other_meters_on: tags.otherMetersOn,
  });
}

/** After tags change: the submission's new status and version (and, for a new analysis, no result). */
export async function bumpAfterTagChange(trx: Knex.Transaction, id: number, status: SubmissionStatus, reanalyse: boolean): Promise<number> {
  const [row] = await trx('submissions')
    .where({ id })
    .update({
      status,
      version: trx.raw('version + 1'),
      updated_at: trx.fn.now(),
      ...(reanalyse && { attempts: 0, result: null, flags: '[]', flag_severity: 0, analysed_at: null }),
    })
    .returning('version');
  return row.version;
}

export const QUEUE_PAGE_SIZE = 50;

const recordingsJson = `(select json_agg(json_build_object(
    'side', r.side, 'makerId', mk.id, 'makerName', mk.name, 'modelId', m.id, 'modelName', m.name,
    'firmwareVersion', f.version, 'position', r.position, 'recordingDeviceName', d.name) order by r.side)
  from submission_recordings r
  join models m on m.id = r.model_id join makers mk on mk.id = m.maker_id
  join firmware_versions f on f.id = r.firmware_id join recording_devices d on d.id = r.recording_device_id
  where r.submission_id = s.id) as recordings`;

/** Awaiting review, most severe flags first, then the longest waiting. */
export async function listReviewQueue(db: Knex, query: ReviewQueueQuery): Promise<{ total: number; rows: ReviewQueueRow[] }> {
  const filtered = db('submissions as s')
    .where('s.status', 'awaiting_review')
    .modify((q) => {
      if (query.flag) q.whereRaw('s.flags @> ?::jsonb', [JSON.stringify([{ code: query.flag }])]);
      if (query.model) {
        q.whereExists((e) =>
          e.select(db.raw('1')).from('submission_recordings as r').whereRaw('r.submission_id = s.id').andWhere('r.model_id', query.model!),
        );
      }
      if (query.maker) {
        q.whereExists((e) =>
          e
            .select(db.raw('1'))
            .from('submission_recordings as r')
            .join('models as m', 'm.id', 'r.model_id')
            .whereRaw('r.submission_id = s.id')
            .andWhere('m.maker_id', query.maker!),
        );
      }
      if (query.minAgeDays !== undefined) q.whereRaw(`s.created_at <= now() - make_interval(days => ?)`, [query.minAgeDays]);
    });
  const [{ count }] = await filtered.clone().count<{ count: string }[]>({ count: '*' });
  const rows = await filtered
    .clone()
    .leftJoin('users as u', 'u.id', 's.rider_id')
    .select<(Omit<ReviewQueueRow, 'createdAt'> & { createdAt: Date })[]>(
      's.id',
      's.version',
      's.created_at as createdAt',
      's.flags',
      's.flag_severity as flagSeverity',
      's.bias_percent as biasPercent',
      's.loa_lower_percent as loaLowerPercent',
      's.loa_upper_percent as loaUpperPercent',
      's.matched_seconds as matchedSeconds',
      's.correlation',
      's.like_for_like_mode as likeForLikeMode',
      's.a_power_dropouts as aPowerDropouts',
      's.b_power_dropouts as bPowerDropouts',
      'u.handle as riderHandle',
      db.raw(recordingsJson),
    )
    .orderBy([
      { column: 's.flag_severity', order: 'desc' },
      { column: 's.created_at', order: 'asc' },
      { column: 's.id', order: 'asc' },
    ])
    .limit(QUEUE_PAGE_SIZE)
    .offset((query.page - 1) * QUEUE_PAGE_SIZE);
  return { total: Number(count), rows: rows.map((row) => ({ ...row, createdAt: row.createdAt.toISOString() })) };
}

/** How many waiting submissions carry each flag, for the queue's filter. */
export async function queueFlagCounts(db: Knex): Promise<Array<{ code: string; count: number }>> {
  const rows = await db.raw(
    `select f->>'code' as code, count(*)::int as count
       from submissions s, jsonb_array_elements(s.flags) f
      where s.status = 'awaiting_review' group by 1 order by 2 desc, 1`,
  );
  return rows.rows;
}

export async function riderHistory(db: Db, riderId: number | null, exceptId: number) {
  const counts: Record<string, number> = {};
  if (riderId !== null) {
    const rows = await db('submissions')
      .where({ rider_id: riderId })
      .whereNot({ id: exceptId })
      .groupBy('status')
      .select('status')
      .count<{ status: string; count: string }[]>({ count: '*' });
    for (const r of rows) counts[r.status] = Number(r.count);
  }
  return {
    accepted: counts.accepted ?? 0,
    rejected: counts.rejected ?? 0,
    sentBack: counts.sent_back ?? 0,
    withdrawn: counts.withdrawn ?? 0,
    other: Object.entries(counts)
      .filter(([s]) => !['accepted', 'rejected', 'sent_back', 'withdrawn'].includes(s))
      .reduce((sum, [, n]) => sum + n, 0),
  };
}

/** Other submissions whose ride overlaps this one's time range (the same ride uploaded twice shows here). */
/** A submission of the same time range, with how long the two overlap. */
export interface OverlappingSubmission {
  id: number;
  status: SubmissionStatus;
  createdAt: Date;
  riderHandle: string | null;
  overlapSeconds: number;
  rideSeconds: number;
}

export async function overlappingSubmissions(db: Db, id: number, limit = 10): Promise<OverlappingSubmission[]> {
  return db('submissions as s2')
    .join('submissions as s', 's.id', db.raw('?', [id]))
    .whereNot('s2.id', id)
    .whereNot('s2.status', 'failed')
    .whereRaw('s2.ride_started_at < s.ride_ended_at and s2.ride_ended_at > s.ride_started_at')
    .leftJoin('users as u', 'u.id', 's2.rider_id')
    .select<OverlappingSubmission[]>(
      's2.id',
      's2.status',
      's2.created_at as createdAt',
      'u.handle as riderHandle',
      db.raw(
        `extract(epoch from (least(s2.ride_ended_at, s.ride_ended_at) - greatest(s2.ride_started_at, s.ride_started_at)))::int as "overlapSeconds"`,
      ),
      db.raw(`extract(epoch from (s.ride_ended_at - s.ride_started_at))::int as "rideSeconds"`),
    )
    .orderBy('overlapSeconds', 'desc')
    .limit(limit);
}

export async function streamsOf(db: Db, ids: number[]): Promise<Array<{ submissionId: number; side: 'a' | 'b'; stream: Buffer }>> {
  return db('submission_recordings').whereIn('submission_id', ids).select('submission_id as submissionId', 'side', 'stream');
}

export interface DecisionHistoryEntry {
  id: number | string;
  action: string;
  reason: string | null;
  before: unknown;
  after: unknown;
  createdAt: Date;
  actorHandle: string | null;
}

export async function decisionHistory(db: Db, id: number): Promise<DecisionHistoryEntry[]> {
  return db('audit_log as a')
    .leftJoin('users as u', 'u.id', 'a.actor_id')
    .where({ 'a.subject_type': 'submission', 'a.subject_id': String(id) })
    .orderBy('a.id', 'asc')
    .select<DecisionHistoryEntry[]>(
      'a.id',
      'a.action',
      'a.reason',
      'a.before',
      'a.after',
      'a.created_at as createdAt',
      'u.handle as actorHandle',
    );
}

export interface DecisionRecord {
  id: number;
  riderId: number | null;
  status: SubmissionStatus;
  version: number;
  decisionReason: string | null;
  decisionNote: string | null;
  decidedAt: Date | null;
  decidedByHandle: string | null;
}

export async function findDecision(db: Db, id: number): Promise<DecisionRecord | undefined> {
  return db('submissions as s')
    .leftJoin('users as u', 'u.id', 's.decided_by')
    .where('s.id', id)
    .first<DecisionRecord | undefined>(
      's.id',
      's.rider_id as riderId',
      's.status',
      's.version',
      's.decision_reason as decisionReason',
      's.decision_note as decisionNote',
      's.decided_at as decidedAt',
      'u.handle as decidedByHandle',
    );
}
