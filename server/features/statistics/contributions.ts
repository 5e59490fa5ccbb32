import type { Sprint } from '@shared/analysis/types';
import { biasWeight } from '@shared/statistics/weighted-bias';

// What one side of an accepted submission adds to its model + firmware's statistics.
// Side A is the device judged against B; side B is judged against A with every
// difference inverted (bias 100·(ΣB/ΣA − 1), the other side's dropouts). Pure: rows in, deltas out.

export interface SubmissionRow {
  id: number;
  rider_id: number | null;
  indoor: boolean;
  surface: string;
  bias_percent: number | null;
  sum_a: number | null;
  sum_b: number | null;
  pedalling_seconds: number | null;
  cadence_lag_seconds: number | null;
  like_for_like_mode: string | null;
  a_power_dropouts: number | null;
  a_cadence_dropouts: number | null;
  b_power_dropouts: number | null;
  b_cadence_dropouts: number | null;
  /** From result.agreement (percent): the blocks themselves are not needed. */
  agreement_block_count: number | null;
  agreement_mean_difference_percent: number | null;
  agreement_sd_percent: number | null;
  sprints: Pick<Sprint, 'percent' | 'aSecondsTo80Percent' | 'bSecondsTo80Percent'>[] | null;
}

export interface RecordingRow {
  side: 'a' | 'b';
  model_id: number;
  firmware_id: number;
  recording_device_id: number;
  recording_mode: string;
  other_meters_on: boolean;
}

/** Column deltas of meter_statistics (riders and the cadence median are handled apart). */
export const STATISTICS_SUM_COLUMNS = [
  'submission_count',
  'like_for_like_count',
  'pedalling_hours',
  'bias_count',
  'bias_hours',
  'sum_weight',
  'sum_weight_squared',
  'sum_weight_cubed',
  'sum_weighted_bias',
  'sum_weighted_bias_squared',
  'sum_bias',
  'sum_bias_squared',
  'power_dropouts',
  'cadence_dropouts',
  'agreement_submissions',
  'agreement_blocks',
  'agreement_blocks_squared',
  'agreement_within_ss',
  'agreement_sum_difference',
  'agreement_sum_difference_squared',
  'cadence_lag_count',
  'sprint_count',
  'sum_sprint_peak_percent',
  'sprint_rise_count',
  'sum_sprint_rise_seconds',
] as const;

export type StatisticsSums = Record<(typeof STATISTICS_SUM_COLUMNS)[number], number>;

export const DROPOUT_TAGS = ['surface', 'environment', 'recording_device', 'recording_mode', 'other_meters_on'] as const;
export type DropoutTag = (typeof DROPOUT_TAGS)[number];

export interface SideContribution {
  modelId: number;
  firmwareId: number;
  riderId: number | null;
  sums: StatisticsSums;
  cadenceLagSeconds: number | null;
  tags: { tag: DropoutTag; value: string }[];
}

export function emptySums(): StatisticsSums {
  return Object.fromEntries(STATISTICS_SUM_COLUMNS.map((column) => [column, 0])) as StatisticsSums;
}

const inversePercent = (percent: number) => 100 * (100 / (100 + percent) - 1);

/** Both sides' contributions; a submission without pedalling time contributes nothing. */
export function contributionsOf(submission: SubmissionRow, recordings: RecordingRow[]): SideContribution[] {
  const hours = (submission.pedalling_seconds ?? 0) / 3600;
  if (!(hours > 0)) return [];
  return recordings.map((recording) => sideContribution(submission, recording, hours));
}

function sideContribution(submission: SubmissionRow, recording: RecordingRow, hours: number): SideContribution {
  const isA = recording.side === 'a';
  const sign = isA ? 1 : -1;
  const sums = emptySums();
  sums.submission_count = 1;
  sums.pedalling_hours = hours;
  if (submission.like_for_like_mode === 'direct' || submission.like_for_like_mode === 'via_balance') sums.like_for_like_count = 1;

  const bias = poolsBias(submission.like_for_like_mode) ? sideBias(submission, isA) : null;
  if (bias !== null) {
    const w = biasWeight(hours);
    sums.bias_count = 1;
    sums.bias_hours = hours;
    sums.sum_weight = w;
    sums.sum_weight_squared = w * w;
    sums.sum_weight_cubed = w * w * w;
    sums.sum_weighted_bias = w * bias;
    sums.sum_weighted_bias_squared = w * bias * bias;
    sums.sum_bias = bias;
    sums.sum_bias_squared = bias * bias;
  }

  sums.power_dropouts = (isA ? submission.a_power_dropouts : submission.b_power_dropouts) ?? 0;
  sums.cadence_dropouts = (isA ? submission.a_cadence_dropouts : submission.b_cadence_dropouts) ?? 0;

  const n = submission.agreement_block_count ?? 0;
  if (n >= 1 && submission.agreement_mean_difference_percent !== null) {
    const d = sign * submission.agreement_mean_difference_percent;
    sums.agreement_submissions = 1;
    sums.agreement_blocks = n;
    sums.agreement_blocks_squared = n * n;
    sums.agreement_within_ss = (n - 1) * (submission.agreement_sd_percent ?? 0) ** 2;
    sums.agreement_sum_difference = n * d;
    sums.agreement_sum_difference_squared = n * d * d;
  }

  const cadenceLagSeconds = submission.cadence_lag_seconds === null ? null : sign * submission.cadence_lag_seconds;
  if (cadenceLagSeconds !== null) sums.cadence_lag_count = 1;

  for (const sprint of submission.sprints ?? []) {
    if (sprint.percent !== null) {
      sums.sprint_count += 1;
      sums.sum_sprint_peak_percent += isA ? sprint.percent : inversePercent(sprint.percent);
    }
    if (sprint.aSecondsTo80Percent !== null && sprint.bSecondsTo80Percent !== null) {
      sums.sprint_rise_count += 1;
      sums.sum_sprint_rise_seconds += sign * (sprint.aSecondsTo80Percent - sprint.bSecondsTo80Percent);
    }
  }

  return {
    modelId: recording.model_id,
    firmwareId: recording.firmware_id,
    riderId: submission.rider_id,
    sums,
    cadenceLagSeconds,
    tags: [
      { tag: 'surface', value: submission.surface },
      { tag: 'environment', value: submission.indoor ? 'indoor' : 'outdoor' },
      { tag: 'recording_device', value: String(recording.recording_device_id) },
      { tag: 'recording_mode', value: recording.recording_mode },
      { tag: 'other_meters_on', value: recording.other_meters_on ? 'yes' : 'no' },
    ],
  };
}

/**
 * A mixed comparison (one leg against a total meter without balance) measures the
 * comparison, not the meter: its bias stays out of both models' pooled figures (its
 * dropouts still count). Its own page still shows its bias.
 */
export function poolsBias(likeForLikeMode: string | null): boolean {
  return likeForLikeMode !== 'mixed';
}

/** The side's bias against its partner in percent, or null when the submission has none. */
export function sideBias(submission: Pick<SubmissionRow, 'bias_percent' | 'sum_a' | 'sum_b'>, isA: boolean): number | null {
  if (submission.bias_percent === null || !Number.isFinite(submission.bias_percent)) return null;
  if (isA) return submission.bias_percent;
  if (submission.sum_a && submission.sum_b && submission.sum_a > 0) return 100 * (submission.sum_b / submission.sum_a - 1);
  return inversePercent(submission.bias_percent);
}
