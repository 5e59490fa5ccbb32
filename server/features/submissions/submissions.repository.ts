import type { Knex } from 'knex';
import type { ComparisonResult, DeviceInfo, MeasurementPosition, QualityFlag, RecordingStatistics, Side } from '@shared/analysis/types';
import type { ModelKind } from '@shared/schemas/catalogue';
import type { RecordingMode, RecordingTagsInput, SubmissionStatus, Surface, ZeroOffsetAnswer } from '@shared/schemas/submission';
import { storedDeviceInfo, storedRecordingStats, storedResult } from './stored-ride-facts';
import { hasLiveJob } from '../../jobs/queue-schema';

export interface NewRecording {
  side: 'a' | 'b';
  tags: RecordingTagsInput;
  sha256: string;
  deviceInfo: DeviceInfo;
  recordingStats: RecordingStatistics;
  stream: Buffer;
  /** The uploaded file minus location, already in the object store. */
  original: { key: string; bytes: number };
  decoderVersion: number;
}

/** The earlier submission of the same two files in either order (A and B swapped is the same ride). */
export async function findIdBySameFiles(db: Knex, aSha256: string, bSha256: string): Promise<number | undefined> {
  const row = await db('submissions')
    .where((q) => q.where({ a_sha256: aSha256, b_sha256: bSha256 }).orWhere({ a_sha256: bSha256, b_sha256: aSha256 }))
    .orderBy('id')
    .first('id');
  return row?.id;
}

/** Submissions the rider made in the last `hours` hours. */
export async function countSinceHoursAgo(db: Knex | Knex.Transaction, riderId: number, hours: number): Promise<number> {
  const [{ count }] = await db('submissions')
    .where({ rider_id: riderId })
    .where('created_at', '>', db.raw('now() - make_interval(hours => ?)', [hours]))
    .count<{ count: string }[]>({ count: '*' });
  return Number(count);
}

// The first key of the two-key advisory lock: what is locked (a rider's new submissions).
const RIDER_SUBMISSIONS_LOCK = 19_001;

/** Holds until the transaction ends: one new submission of this rider at a time, in every process. */
export async function lockRiderSubmissions(trx: Knex.Transaction, riderId: number): Promise<void> {
  await trx.raw('select pg_advisory_xact_lock(?, ?)', [RIDER_SUBMISSIONS_LOCK, riderId]);
}

export async function insertSubmission(
  trx: Knex.Transaction,
  row: {
    riderId: number;
    indoor: boolean;
    surface: string;
    notes: string;
    aSha256: string;
    bSha256: string;
    rideStartedAt: Date;
    rideEndedAt: Date;
  },
  recordings: NewRecording[],
): Promise<number> {
  const [{ id }] = await trx('submissions')
    .insert({
      rider_id: row.riderId,
      indoor: row.indoor,
      surface: row.surface,
      notes: row.notes,
      a_sha256: row.aSha256,
      b_sha256: row.bSha256,
      ride_started_at: row.rideStartedAt,
      ride_ended_at: row.rideEndedAt,
    })
    .returning('id');
  await trx('submission_recordings').insert(
    recordings.map((r) => ({
      submission_id: id,
      side: r.side,
      model_id: r.tags.modelId,
      firmware_id: r.tags.firmwareId,
      position: r.tags.position,
      recording_device_id: r.tags.recordingDeviceId,
      recording_device_firmware: r.tags.recordingDeviceFirmware,
      recording_mode: r.tags.recordingMode,
      zero_offset: r.tags.zeroOffset,
      other_meters_on: r.tags.otherMetersOn,
      sha256: r.sha256,
      device_info: JSON.stringify(storedDeviceInfo(r.deviceInfo)),
      recording_stats: JSON.stringify(storedRecordingStats(r.recordingStats)),
      stream: r.stream,
      original_key: r.original.key,
      original_bytes: r.original.bytes,
      decoder_version: r.decoderVersion,
    })),
  );
  return id;
}

export interface StoredRecording {
  side: 'a' | 'b';
  position: 'left' | 'right' | 'dual' | 'total';
  modelId: number;
  modelKind: string;
  firmwareId: number;
  recordingDeviceId: number;
  recordingDeviceFirmware: string;
  stream: Buffer;
  /** The kept original (location removed) to decode again with a newer decoder (originals.service fetchOriginal); null: streams only. */
  originalKey: string | null;
  /** The decoder that built `stream`; null when not recorded. */
  decoderVersion: number | null;
}

/** Both stored recordings of a submission with the tags the comparison needs, A first. */
export async function findStoredRecordings(db: Knex, id: number): Promise<StoredRecording[]> {
  return db('submission_recordings as r')
    .join('models as m', 'm.id', 'r.model_id')
    .where('r.submission_id', id)
    .select(
      'r.side',
      'r.position',
      'r.model_id as modelId',
      'm.kind as modelKind',
      'r.firmware_id as firmwareId',
      'r.recording_device_id as recordingDeviceId',
      'r.recording_device_firmware as recordingDeviceFirmware',
      'r.stream',
      'r.original_key as originalKey',
      'r.decoder_version as decoderVersion',
    )
    .orderBy('r.side');
}

export async function findForAnalysis(db: Knex, id: number) {
  const submission = await db('submissions').where({ id }).first('id', 'status', 'attempts');
  if (!submission) return undefined;
  const recordings = await findStoredRecordings(db, id);
  return {
    id: submission.id as number,
    status: submission.status as SubmissionStatus,
    attempts: submission.attempts as number,
    recordings,
  };
}

/** What the tag check compares a recording's tags with: its model's firmware versions and every recording device. */
export async function findTagCatalogue(
  db: Knex,
  modelId: number,
): Promise<{ firmware: { id: number; version: string }[]; recordingDevices: { id: number; name: string }[] }> {
  const [firmware, recordingDevices] = await Promise.all([
    db('firmware_versions').where({ model_id: modelId }).whereNot('status', 'rejected').select('id', 'version'),
    db('recording_devices').whereNot('status', 'rejected').select('id', 'name'),
  ]);
  return { firmware, recordingDevices };
}

/** Moves a submission into analysis; false when it is no longer waiting for it. */
export async function markAnalysing(db: Knex, id: number): Promise<number | undefined> {
  const [row] = await db('submissions')
    .where({ id })
    .whereIn('status', ['received', 'analysing'])
    .update({ status: 'analysing', attempts: db.raw('attempts + 1'), updated_at: db.fn.now() })
    .returning('attempts');
  return row?.attempts;
}

const SEVERITY_RANK = { info: 1, warning: 2, severe: 3 } as const;

export function flagSeverity(flags: QualityFlag[]): number {
  return flags.reduce((max, f) => Math.max(max, SEVERITY_RANK[f.severity] ?? 0), 0);
}

/** Stores the analysis once; a second run of the same job finds nothing to update. */
export async function storeResult(db: Knex, id: number, result: ComparisonResult): Promise<boolean> {
  const count = await db('submissions')
    .where({ id, status: 'analysing' })
    .update({ status: 'awaiting_review', ...resultColumns(db, result) });
  return count === 1;
}

/** The stored result, its flags and its headline columns, as one update (also used by re-analysis). */
export function resultColumns(db: Knex, result: ComparisonResult) {
  return {
    method_version: result.methodVersion,
    result: JSON.stringify(storedResult(result)),
    flags: JSON.stringify(result.flags),
    flag_severity: flagSeverity(result.flags),
    error_code: null,
    error_message: null,
    bias_percent: result.bias.percent,
    loa_lower_percent: result.agreement.lowerLimitPercent,
    loa_upper_percent: result.agreement.upperLimitPercent,
    sum_a: result.sums.a,
    sum_b: result.sums.b,
    matched_seconds: result.bias.matchedSeconds,
    pedalling_seconds: result.pedallingSeconds,
    overlap_seconds: result.alignment.overlapSeconds,
    clock_offset_seconds: result.alignment.clockOffsetSeconds,
    correlation: result.alignment.correlation,
    cadence_lag_seconds: result.cadenceLagSeconds,
    like_for_like_mode: result.likeForLike.mode,
    a_power_dropouts: result.dropouts.a.power.count,
    a_cadence_dropouts: result.dropouts.a.cadence.count,
    b_power_dropouts: result.dropouts.b.power.count,
    b_cadence_dropouts: result.dropouts.b.cadence.count,
    analysed_at: db.fn.now(),
    updated_at: db.fn.now(),
  };
}

export async function markFailed(db: Knex, id: number, code: string, message: string): Promise<void> {
  await db('submissions')
    .where({ id })
    .whereIn('status', ['received', 'analysing'])
    .update({ status: 'failed', error_code: code, error_message: message, updated_at: db.fn.now() });
}

/** Submissions still waiting for their analysis, untouched for at least `idleSeconds`, with no job waiting or running. */
export async function findWaitingWithoutJob(db: Knex, queueName: string, idleSeconds = 0): Promise<number[]> {
  const rows = await db('submissions as s')
    .whereIn('s.status', ['received', 'analysing'])
    .where('s.updated_at', '<=', db.raw(`now() - make_interval(secs => ?)`, [idleSeconds]))
    .whereNot(hasLiveJob(db, queueName, 's.id'))
    .orderBy('s.id')
    .select('s.id');
  return rows.map((r) => r.id);
}

const recordingColumns = [
  'r.side',
  'r.position',
  'r.recording_device_firmware as recordingDeviceFirmware',
  'r.recording_mode as recordingMode',
  'r.zero_offset as zeroOffset',
  'r.other_meters_on as otherMetersOn',
  'r.device_info as deviceInfo',
  'r.model_id as modelId',
  'm.slug as modelSlug',
  'm.name as modelName',
  'm.kind as modelKind',
  'mk.id as makerId',
  'mk.name as makerName',
  'mk.slug as makerSlug',
  'r.firmware_id as firmwareId',
  'f.version as firmwareVersion',
  'r.recording_device_id as recordingDeviceId',
  'd.name as recordingDeviceName',
  'r.original_bytes as originalBytes',
  'r.decoder_version as decoderVersion',
];

export interface SubmissionRecordingRow {
  side: Side;
  position: MeasurementPosition;
  recordingDeviceFirmware: string;
  recordingMode: RecordingMode;
  zeroOffset: ZeroOffsetAnswer;
  otherMetersOn: boolean;
  deviceInfo: DeviceInfo | null;
  modelId: number;
  modelSlug: string;
  modelName: string;
  modelKind: ModelKind;
  makerId: number;
  makerName: string;
  makerSlug: string;
  firmwareId: number;
  firmwareVersion: string;
  recordingDeviceId: number;
  recordingDeviceName: string;
  /** Size of the kept original (location removed); null for recordings stored before originals were kept. */
  originalBytes: number | null;
  /** The decoder that built the stored stream; null when it was not recorded. */
  decoderVersion: number | null;
}

export interface SubmissionRow {
  id: number;
  riderId: number | null;
  riderHandle: string | null;
  riderName: string | null;
  status: SubmissionStatus;
  indoor: boolean;
  surface: Surface;
  notes: string;
  /** The stored analysis: its shape is checked where it leaves the server (rideComparisonView). */
  result: unknown;
  flags: QualityFlag[];
  errorCode: string | null;
  errorMessage: string | null;
  version: number;
  createdAt: Date;
  analysedAt: Date | null;
  rideStartedAt: Date | null;
  recordings: SubmissionRecordingRow[];
}

export async function findSubmission(db: Knex, id: number): Promise<SubmissionRow | undefined> {
  const submission = await db('submissions as s')
    .leftJoin('users as u', 'u.id', 's.rider_id')
    .where('s.id', id)
    .first(
      's.id',
      's.rider_id as riderId',
      'u.handle as riderHandle',
      'u.name as riderName',
      's.status',
      's.indoor',
      's.surface',
      's.notes',
      's.result',
      's.flags',
      's.error_code as errorCode',
      's.error_message as errorMessage',
      's.version',
      's.created_at as createdAt',
      's.analysed_at as analysedAt',
      's.ride_started_at as rideStartedAt',
    );
  if (!submission) return undefined;
  const recordings: SubmissionRecordingRow[] = await db('submission_recordings as r')
    .join('models as m', 'm.id', 'r.model_id')
    .join('makers as mk', 'mk.id', 'm.maker_id')
    .join('firmware_versions as f', 'f.id', 'r.firmware_id')
    .join('recording_devices as d', 'd.id', 'r.recording_device_id')
    .where('r.submission_id', id)
    .select(recordingColumns)
    .orderBy('r.side');
  return { ...(submission as Omit<SubmissionRow, 'recordings'>), recordings };
}

export interface RiderSubmissionRow {
  id: number;
  status: SubmissionStatus;
  createdAt: Date;
  biasPercent: number | null;
  flags: QualityFlag[] | null;
  recordings: Array<{ side: Side; model: string; firmware: string }> | null;
}

export async function listByRider(db: Knex, riderId: number): Promise<RiderSubmissionRow[]> {
  return db('submissions as s')
    .where('s.rider_id', riderId)
    .select(
      's.id',
      's.status',
      's.created_at as createdAt',
      's.bias_percent as biasPercent',
      's.flags',
      db.raw(
        `(select json_agg(json_build_object('side', r.side, 'model', m.name, 'firmware', f.version) order by r.side)
          from submission_recordings r join models m on m.id = r.model_id join firmware_versions f on f.id = r.firmware_id
          where r.submission_id = s.id) as recordings`,
      ),
    )
    .orderBy('s.created_at', 'desc');
}
