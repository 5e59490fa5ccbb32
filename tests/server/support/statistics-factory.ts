import { expect } from 'vitest';
import { randomBytes } from 'node:crypto';
import type { Db } from '../../../server/db/knex';
import { decideSubmission } from '../../../server/features/moderation/moderation.service';

// Analysed submissions with chosen headline figures, written straight to the
// database (no FIT files, no job), so statistics tests can use hand-checkable numbers.

export interface SideTags {
  modelId: number;
  firmwareId: number;
  recordingDeviceId: number;
  recordingMode?: 'every_second' | 'change_only';
  otherMetersOn?: boolean;
  position?: 'left' | 'right' | 'dual' | 'total';
}

export interface AnalysedSubmission {
  riderId: number;
  a: SideTags;
  b: SideTags;
  biasPercent: number;
  pedallingHours: number;
  indoor?: boolean;
  surface?: 'smooth_road' | 'rough_road' | 'gravel' | 'trainer';
  likeForLike?: 'direct' | 'via_balance' | 'mixed';
  aPowerDropouts?: number;
  bPowerDropouts?: number;
  aCadenceDropouts?: number;
  bCadenceDropouts?: number;
  cadenceLagSeconds?: number | null;
  /** Blocks of the agreement (percent): count, mean A − B and SD. */
  agreement?: { blockCount: number; meanDifferencePercent: number; sdPercent: number | null };
  sprints?: { percent: number; aSecondsTo80Percent: number; bSecondsTo80Percent: number }[];
}

export async function insertRider(db: Db, handle = `rider-${randomBytes(3).toString('hex')}`): Promise<number> {
  const [{ id }] = await db('users').insert({ handle, name: handle, provider_id: handle }).returning('id');
  return id;
}

export async function insertAnalysedSubmission(db: Db, s: AnalysedSubmission): Promise<number> {
  const pedallingSeconds = Math.round(s.pedallingHours * 3600);
  const sumB = 1_000_000;
  const sumA = sumB * (1 + s.biasPercent / 100);
  const agreement = s.agreement ?? { blockCount: 40, meanDifferencePercent: s.biasPercent, sdPercent: 2 };
  const result = {
    agreement: { ...agreement, blocks: [] },
    peaks: { sprints: s.sprints ?? [] },
  };
  const started = new Date('2026-06-01T08:00:00Z');
  const [{ id }] = await db('submissions')
    .insert({
      rider_id: s.riderId,
      status: 'awaiting_review',
      indoor: s.indoor ?? false,
      surface: s.surface ?? 'smooth_road',
      a_sha256: randomBytes(32).toString('hex'),
      b_sha256: randomBytes(32).toString('hex'),
      ride_started_at: started,
      ride_ended_at: new Date(started.getTime() + pedallingSeconds * 1000),
      method_version: 1,
      result: JSON.stringify(result),
      bias_percent: s.biasPercent,
      loa_lower_percent: agreement.meanDifferencePercent - 1.96 * (agreement.sdPercent ?? 0),
      loa_upper_percent: agreement.meanDifferencePercent + 1.96 * (agreement.sdPercent ?? 0),
      sum_a: sumA,
      sum_b: sumB,
      matched_seconds: pedallingSeconds,
      pedalling_seconds: pedallingSeconds,
      overlap_seconds: pedallingSeconds,
      clock_offset_seconds: 0,
      correlation: 0.98,
      cadence_lag_seconds: s.cadenceLagSeconds === undefined ? 0 : s.cadenceLagSeconds,
      like_for_like_mode: s.likeForLike ?? 'direct',
      a_power_dropouts: s.aPowerDropouts ?? 0,
      a_cadence_dropouts: s.aCadenceDropouts ?? 0,
      b_power_dropouts: s.bPowerDropouts ?? 0,
      b_cadence_dropouts: s.bCadenceDropouts ?? 0,
      analysed_at: db.fn.now(),
    })
    .returning('id');
  await db('submission_recordings').insert(
    (['a', 'b'] as const).map((side) => {
      const tags = s[side];
      return {
        submission_id: id,
        side,
        model_id: tags.modelId,
        firmware_id: tags.firmwareId,
        position: tags.position ?? 'total',
        recording_device_id: tags.recordingDeviceId,
        recording_mode: tags.recordingMode ?? 'every_second',
        zero_offset: 'yes',
        other_meters_on: tags.otherMetersOn ?? false,
        sha256: randomBytes(32).toString('hex'),
        device_info: JSON.stringify({}),
        recording_stats: JSON.stringify({}),
        stream: Buffer.alloc(0),
      };
    }),
  );
  return id;
}

let moderatorId: number | undefined;
async function moderator(db: Db): Promise<number> {
  moderatorId ??= await insertRider(db, `statistics-moderator-${randomBytes(3).toString('hex')}`);
  return moderatorId;
}

/** Accepts a submission through the moderation decision (status change and aggregate update in one transaction). */
export async function acceptSubmission(db: Db, submissionId: number): Promise<void> {
  await decideSubmission(db, { submissionId, moderatorId: await moderator(db), decision: 'accept' });
}

/** Withdraws an accepted submission, which takes it out of the statistics. */
export async function unacceptSubmission(db: Db, submissionId: number): Promise<void> {
  await decideSubmission(db, { submissionId, moderatorId: await moderator(db), decision: 'withdraw', reason: 'Statistics test' });
}

/** Every statistics row without ids and timestamps, in a stable order. */
export async function statisticsSnapshot(database: Db) {
  const strip = (rows: Record<string, unknown>[]) => rows.map(({ id: _id, updated_at: _updated, ...rest }) => rest);
  const order = ['model_id', 'firmware_id'];
  return {
    statistics: strip(await database('meter_statistics').orderBy(order)),
    riders: strip(await database('meter_statistics_riders').orderBy([...order, 'rider_id'])),
    lags: strip(await database('cadence_lag_counts').orderBy([...order, 'lag_seconds'])),
    tags: strip(await database('dropout_tag_statistics').orderBy([...order, 'tag', 'value'])),
  };
}

/** Two snapshots agree: the same rows, numbers equal to 9 decimals (sums of floats in another order). */
export function expectSameFigures(actual: unknown, expected: unknown, path = '') {
  if (typeof expected === 'number' && typeof actual === 'number') {
    expect(actual, path).toBeCloseTo(expected, 9);
  } else if (expected && typeof expected === 'object') {
    expect(Object.keys(actual as object).length, path).toBe(Object.keys(expected).length);
    for (const [key, value] of Object.entries(expected))
      expectSameFigures((actual as Record<string, unknown>)[key], value, `${path}.${key}`);
  } else {
    expect(actual, path).toEqual(expected);
  }
}
