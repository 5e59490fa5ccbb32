import { maskCandidatePowerDropouts } from './candidate-dropouts';
import { bestLag, blockMeans, movingMean, range, trailingMean } from './correlation';
import { AnalysisError } from './errors';
import { ALIGNMENT_SMOOTHING_SECONDS, MAX_CLOCK_OFFSET_SECONDS, MAX_HEAD_UNIT_SMOOTHING_SECONDS, SEARCH_MARGIN_SECONDS } from './method';
import type { SecondGrid } from './timeline';

const MIN_PAIRED_SECONDS = 60;
const REFINED_CANDIDATES = 3;
/** How far around the power-only offset the smoothing model looks: a 12 s average delays power by 5.5 s. */
const SMOOTHING_LAG_REACH = 8;
/** A smoothing hypothesis must beat "no smoothing" by this much correlation to be taken. */
const SMOOTHING_MIN_GAIN = 0.002;
/** How far past the window the coarse pass looks, as a multiple of the window. */
const WIDE_SEARCH_FACTOR = 4;
/** A coarse correlation beyond the window this much higher than inside it means the true offset is outside. */
const BEYOND_MIN_GAIN = 0.05;

export interface ClockOffset {
  clockOffsetSeconds: number;
  correlation: number;
  /** The trailing power average each recording appears to carry, in s (1 = none). */
  smoothingWindowSeconds: { a: number; b: number };
  /** True when the best offset lies outside ±MAX_CLOCK_OFFSET_SECONDS (or a far better one lies beyond it): the ride cannot be aligned within the window. */
  outsideWindow: boolean;
}

/**
 * The clock offset that best lines up the two power traces, method version 2:
 * 1. candidate dropouts of each device (its own silences while it pedals) are masked;
 * 2. the offset in ±(MAX_CLOCK_OFFSET_SECONDS + SEARCH_MARGIN_SECONDS) maximising the
 *    correlation of 5 s-smoothed power, coarse to fine (5 s block means, then 1 s around
 *    the best few blocks) so a 4-hour pair costs a few hundred thousand products;
 * 3. head-unit smoothing: a trailing n-second average delays power by (n − 1) / 2 s, which
 *    power correlation alone takes for clock offset. Each hypothesis "device X averages
 *    over n s" is tested by averaging the other device the same way and correlating again
 *    near the first offset; the best hypothesis gives the clock offset itself, so the
 *    cadence lag measured afterwards is the cadence's own.
 */
export function findClockOffset(a: SecondGrid, b: SecondGrid): ClockOffset {
  const startDifference = a.start - b.start;
  // With offset o, A's index i is B's index i + startDifference - o.
  const reach = MAX_CLOCK_OFFSET_SECONDS + SEARCH_MARGIN_SECONDS;
  const minLag = startDifference - reach;
  const maxLag = startDifference + reach;
  if (maxLag + a.length <= 0 || minLag >= b.length) {
    throw new AnalysisError('no_overlap', 'These recordings do not overlap in time. Were they recorded on the same ride?');
  }
  const aPower = maskCandidatePowerDropouts(a.power, a.cadence);
  const bPower = maskCandidatePowerDropouts(b.power, b.cadence);

  const block = ALIGNMENT_SMOOTHING_SECONDS;
  const aBlocks = blockMeans(aPower, block);
  const bBlocks = blockMeans(bPower, block);
  const coarse: { lag: number; r: number }[] = [];
  let beyond = -Infinity;
  // The coarse pass also looks well past the window, only to tell "the best offset is
  // outside the window" from "the ride correlates poorly": the result stays inside.
  const wide = WIDE_SEARCH_FACTOR * MAX_CLOCK_OFFSET_SECONDS;
  for (let k = Math.ceil((startDifference - wide) / block); k <= Math.floor((startDifference + wide) / block); k++) {
    const best = bestLag(aBlocks, bBlocks, [k], MIN_PAIRED_SECONDS / block);
    if (best === null) continue;
    if (k * block >= minLag && k * block <= maxLag) coarse.push({ lag: k * block, r: best.r });
    else beyond = Math.max(beyond, best.r);
  }
  coarse.sort((x, y) => y.r - x.r);
  const betterBeyond = coarse.length > 0 && beyond > coarse[0].r + BEYOND_MIN_GAIN;

  const aSmooth = movingMean(aPower, ALIGNMENT_SMOOTHING_SECONDS);
  const bSmooth = movingMean(bPower, ALIGNMENT_SMOOTHING_SECONDS);
  const inSearch = (lag: number) => lag >= minLag && lag <= maxLag;
  const lags = new Set<number>();
  for (const candidate of coarse.slice(0, REFINED_CANDIDATES)) {
    for (const lag of range(candidate.lag - block, candidate.lag + block)) if (inSearch(lag)) lags.add(lag);
  }
  const nearestFirst = (values: Iterable<number>) =>
    [...values].sort((x, y) => Math.abs(x - startDifference) - Math.abs(y - startDifference));
  const powerOnly = bestLag(aSmooth, bSmooth, nearestFirst(lags), MIN_PAIRED_SECONDS);
  // Overlapping spans but not a minute of shared power at any offset: the overlap check names it.
  if (powerOnly === null) return { clockOffsetSeconds: 0, correlation: 0, smoothingWindowSeconds: { a: 1, b: 1 }, outsideWindow: false };

  const near = nearestFirst(range(powerOnly.lag - SMOOTHING_LAG_REACH, powerOnly.lag + SMOOTHING_LAG_REACH).filter(inSearch));
  let best = { lag: powerOnly.lag, r: -Infinity, a: 1, b: 1 };
  for (let window = 1; window <= MAX_HEAD_UNIT_SMOOTHING_SECONDS; window++) {
    // "B averages over `window` s": average A the same way; and the mirror hypothesis.
    const hypotheses =
      window === 1
        ? [{ a: 1, b: 1 }]
        : [
            { a: 1, b: window },
            { a: window, b: 1 },
          ];
    for (const hypothesis of hypotheses) {
      const x = hypothesis.b > 1 ? averagedLikeAHeadUnit(a.power, aPower, hypothesis.b) : aPower;
      const y = hypothesis.a > 1 ? averagedLikeAHeadUnit(b.power, bPower, hypothesis.a) : bPower;
      const found = bestLag(x, y, near, MIN_PAIRED_SECONDS);
      if (found === null) continue;
      const gain = best.a === 1 && best.b === 1 ? SMOOTHING_MIN_GAIN : 0;
      if (best.r === -Infinity || found.r > best.r + gain) best = { lag: found.lag, r: found.r, ...hypothesis };
    }
  }
  const clockOffsetSeconds = startDifference - best.lag;
  return {
    clockOffsetSeconds,
    correlation: Math.max(powerOnly.r, best.r),
    smoothingWindowSeconds: { a: best.a, b: best.b },
    outsideWindow: betterBeyond || Math.abs(clockOffsetSeconds) > MAX_CLOCK_OFFSET_SECONDS,
  };
}

/**
 * The trailing average a head unit would record from this power: zeros averaged in as
 * zeros (a masked short silence is still a coast to the head unit), then every output
 * whose window holds a masked second is masked in turn.
 */
function averagedLikeAHeadUnit(power: Float64Array, masked: Float64Array, window: number): Float64Array {
  const out = trailingMean(power, window);
  for (let i = 0; i < power.length; i++) {
    if (masked[i] !== masked[i] && power[i] === power[i]) out.fill(NaN, i, Math.min(power.length, i + window));
  }
  return out;
}
