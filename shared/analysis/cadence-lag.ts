import { maskCandidateCadenceDropouts } from './candidate-dropouts';
import { bestLag, range } from './correlation';
import { MAX_CADENCE_LAG_SECONDS, SEARCH_MARGIN_SECONDS } from './method';
import type { SharedTimeline } from './timeline';

const MIN_PAIRED_SECONDS = 60;

export interface CadenceLag {
  lagSeconds: number;
  correlation: number;
  /** True when the best lag lies beyond ±MAX_CADENCE_LAG_SECONDS. */
  outsideWindow: boolean;
}

/**
 * The lag (clock offset and power smoothing already removed by the alignment) that best
 * lines A's cadence up with B's, from cadence alone, with each device's candidate
 * cadence dropouts masked; positive when A's cadence trails B's, i.e. A(t + lag) ≈ B(t).
 * Searched SEARCH_MARGIN_SECONDS past the window so that a lag beyond it is seen.
 */
export function findCadenceLag(timeline: SharedTimeline): CadenceLag | null {
  const reach = MAX_CADENCE_LAG_SECONDS + SEARCH_MARGIN_SECONDS;
  const lags = range(-reach, reach).sort((x, y) => Math.abs(x) - Math.abs(y));
  const a = maskCandidateCadenceDropouts(timeline.aCadence, timeline.aPower);
  const b = maskCandidateCadenceDropouts(timeline.bCadence, timeline.bPower);
  const best = bestLag(b, a, lags, MIN_PAIRED_SECONDS);
  return best === null ? null : { lagSeconds: best.lag, correlation: best.r, outsideWindow: Math.abs(best.lag) > MAX_CADENCE_LAG_SECONDS };
}

/**
 * Both cadences on one clock: the later of the two is moved earlier by the lag (a
 * device can only report cadence late, never early). Both are NaN over the last
 * seconds the shift empties, so the shift cannot look like a dropout.
 */
export function alignCadences(timeline: SharedTimeline, lagSeconds: number): { a: Float64Array; b: Float64Array } {
  if (lagSeconds === 0) return { a: timeline.aCadence, b: timeline.bCadence };
  const by = Math.abs(lagSeconds);
  const later = lagSeconds > 0 ? timeline.aCadence : timeline.bCadence;
  const other = lagSeconds > 0 ? timeline.bCadence : timeline.aCadence;
  const shifted = new Float64Array(later.length).fill(NaN);
  shifted.set(later.subarray(Math.min(by, later.length)), 0);
  const trimmed = Float64Array.from(other);
  trimmed.fill(NaN, Math.max(0, other.length - by));
  return lagSeconds > 0 ? { a: shifted, b: trimmed } : { a: trimmed, b: shifted };
}
