import { formatDuration } from './errors';
import { SMOOTHING_MISMATCH_RATIO } from './smoothing';
import type { CadenceLag } from './cadence-lag';
import { MAX_CADENCE_LAG_SECONDS, MAX_CLOCK_OFFSET_SECONDS } from './method';
import type { Alignment, Bias, DriftEstimate, LikeForLike, QualityFlag, Side, Smoothing } from './types';
import type { SecondGrid } from './timeline';

const COMFORTABLE_OVERLAP_SECONDS = 20 * 60;
const LOW_CORRELATION = 0.5;
const LARGE_BIAS_PERCENT = 15;
const IMPLAUSIBLE_POWER_WATTS = 3000;
const IMPLAUSIBLE_POWER_SECONDS = 5;
const IMPLAUSIBLE_CADENCE_RPM = 250;
const MANY_GAPS = 10;
const MANY_GAP_FRACTION = 0.05;
/** Estimated head-unit averages this many seconds apart count as a smoothing mismatch (method 2). */
const SMOOTHING_WINDOW_MISMATCH_SECONDS = 2;
/** A difference that moves this many points per hour, surely (interval clear of zero), over at least an hour of blocks: shorter rides confuse a trend with the interval structure of the ride. */
export const STRONG_DRIFT_PERCENT_PER_HOUR = 1;
const MIN_DRIFT_SPAN_HOURS = 1;

const DEVICE_NAMES: Record<Side, string> = { a: 'Device A', b: 'Device B' };

export interface FlagInputs {
  alignment: Alignment;
  cadenceLag: CadenceLag | null;
  bias: Bias;
  likeForLike: LikeForLike;
  smoothing: Smoothing;
  grids: Record<Side, SecondGrid>;
  gaps: Record<Side, { longGapCount: number; longGapSeconds: number; durationSeconds: number }>;
  identicalStreams: boolean;
  drift?: DriftEstimate | null;
}

export function qualityFlags(inputs: FlagInputs): QualityFlag[] {
  const flags: QualityFlag[] = [];
  const { alignment, bias, likeForLike, smoothing } = inputs;
  if (alignment.overlapSeconds < COMFORTABLE_OVERLAP_SECONDS) {
    flags.push({
      code: 'short_overlap',
      severity: 'warning',
      message: `The recordings share only ${formatDuration(alignment.overlapSeconds)}; longer rides give firmer numbers.`,
    });
  }
  if (alignment.outsideWindow) {
    flags.push({
      code: 'estimate_on_bound',
      severity: 'severe',
      message: `The best clock offset lies outside the ±${MAX_CLOCK_OFFSET_SECONDS} s the comparison searches, so the two recordings are not lined up and every figure is doubtful; check both devices' clocks.`,
    });
  }
  if (inputs.cadenceLag?.outsideWindow) {
    flags.push({
      code: 'estimate_on_bound',
      severity: 'warning',
      message: `The cadence lag sits beyond the ±${MAX_CADENCE_LAG_SECONDS} s the comparison searches; the cadence figures of this ride are not usable.`,
    });
  }
  if (alignment.correlation < LOW_CORRELATION) {
    flags.push({
      code: 'low_correlation',
      severity: 'severe',
      message: 'The two power traces barely move together: these may not be recordings of the same ride.',
    });
  }
  if (bias.percent !== null && Math.abs(bias.percent) > LARGE_BIAS_PERCENT) {
    flags.push({
      code: 'large_bias',
      severity: 'severe',
      message: `The meters differ by ${bias.percent.toFixed(1)} %, far beyond what calibrated meters show; check the positions and the zero offset.`,
    });
  }
  if (inputs.identicalStreams) {
    flags.push({
      code: 'identical_streams',
      severity: 'severe',
      message: 'Both recordings carry exactly the same power values: they look like one recording uploaded twice.',
    });
  }
  for (const side of ['a', 'b'] as const) {
    const grid = inputs.grids[side];
    if (longestRunAbove(grid.power, IMPLAUSIBLE_POWER_WATTS) > IMPLAUSIBLE_POWER_SECONDS) {
      flags.push({
        code: 'implausible_power',
        severity: 'warning',
        message: `${DEVICE_NAMES[side]} reports more than ${IMPLAUSIBLE_POWER_WATTS} W for over ${IMPLAUSIBLE_POWER_SECONDS} s, which no rider sustains.`,
      });
    }
    if (longestRunAbove(grid.cadence, IMPLAUSIBLE_CADENCE_RPM) > 0) {
      flags.push({
        code: 'implausible_cadence',
        severity: 'warning',
        message: `${DEVICE_NAMES[side]} reports a cadence above ${IMPLAUSIBLE_CADENCE_RPM} rpm.`,
      });
    }
    const gaps = inputs.gaps[side];
    if (gaps.longGapCount > MANY_GAPS || gaps.longGapSeconds > MANY_GAP_FRACTION * gaps.durationSeconds) {
      flags.push({
        code: 'many_gaps',
        severity: 'warning',
        message: `${DEVICE_NAMES[side]}'s recording has ${gaps.longGapCount} gaps longer than 5 s (${formatDuration(gaps.longGapSeconds)} in all).`,
      });
    }
  }
  const drift = inputs.drift;
  if (
    drift &&
    drift.spanHours >= MIN_DRIFT_SPAN_HOURS &&
    Math.abs(drift.percentPerHour) >= STRONG_DRIFT_PERCENT_PER_HOUR &&
    (drift.lower > 0 || drift.upper < 0)
  ) {
    const direction = drift.percentPerHour > 0 ? 'grows' : 'shrinks';
    flags.push({
      code: 'difference_drift',
      severity: 'warning',
      message: `The difference between the meters ${direction} by ${Math.abs(drift.percentPerHour).toFixed(1)} points per hour over the ride: one meter may not have been zeroed before the start, or it drifts as it warms or cools. Zero it as its maker's instructions say, before the ride, not while riding.`,
    });
  }
  if (likeForLike.mode === 'mixed') {
    flags.push({
      code: 'mixed_comparison',
      severity: 'warning',
      message:
        'One meter measures a single leg and the other does not measure that leg on its own, so leg imbalance is mixed into the difference.',
    });
  }
  const windows = smoothing.windowSeconds;
  if (windows && Math.abs(windows.a - windows.b) >= SMOOTHING_WINDOW_MISMATCH_SECONDS) {
    const smoother = windows.a > windows.b ? DEVICE_NAMES.a : DEVICE_NAMES.b;
    flags.push({
      code: 'smoothing_mismatch',
      severity: 'warning',
      message: `${smoother}'s recording looks averaged over about ${Math.max(windows.a, windows.b)} s; head units that average power blur short efforts and peaks (the bias still counts).`,
    });
  } else if (smoothing.ratio !== null && (smoothing.ratio > SMOOTHING_MISMATCH_RATIO || smoothing.ratio < 1 / SMOOTHING_MISMATCH_RATIO)) {
    const smoother = smoothing.ratio < 1 ? DEVICE_NAMES.a : DEVICE_NAMES.b;
    flags.push({
      code: 'smoothing_mismatch',
      severity: 'warning',
      message: `${smoother}'s recording looks much smoother than the other's; head units that average power blur short efforts.`,
    });
  }
  if (likeForLike.expectedDrivetrainPercent !== null) {
    const after = likeForLike.expectedDrivetrainPercent < 0 ? DEVICE_NAMES.a : DEVICE_NAMES.b;
    flags.push({
      code: 'drivetrain_loss',
      severity: 'info',
      message: `${after} measures after the drivetrain, which takes about 2 % (±1.5 %) before the rear wheel; the bias is reported as measured.`,
    });
  }
  return flags;
}

function longestRunAbove(values: Float64Array, threshold: number): number {
  let longest = 0;
  let run = 0;
  for (let i = 0; i < values.length; i++) {
    run = values[i] > threshold ? run + 1 : 0;
    if (run > longest) longest = run;
  }
  return longest;
}
