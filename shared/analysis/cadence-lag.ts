import { bestLag, range } from './correlation';
import { MAX_CADENCE_LAG_SECONDS } from './method';

const MIN_PAIRED_SECONDS = 60;

/**
 * The lag in ±MAX_CADENCE_LAG_SECONDS (clock offset already removed) that best lines
 * A's cadence up with B's; positive when A's cadence trails B's, i.e. A(t + lag) ≈ B(t).
 */
export function findCadenceLag(aCadence: Float64Array, bCadence: Float64Array): { lagSeconds: number; correlation: number } | null {
  const lags = range(-MAX_CADENCE_LAG_SECONDS, MAX_CADENCE_LAG_SECONDS).sort((x, y) => Math.abs(x) - Math.abs(y));
  const best = bestLag(bCadence, aCadence, lags, MIN_PAIRED_SECONDS);
  return best === null ? null : { lagSeconds: best.lag, correlation: best.r };
}
