import { bestLag, blockMeans, movingMean, range } from './correlation';
import { AnalysisError } from './errors';
import { ALIGNMENT_SMOOTHING_SECONDS, MAX_CLOCK_OFFSET_SECONDS } from './method';
import type { SecondGrid } from './timeline';

const MIN_PAIRED_SECONDS = 60;
const REFINED_CANDIDATES = 3;

export interface ClockOffset {
  clockOffsetSeconds: number;
  correlation: number;
}

/**
 * The offset in ±MAX_CLOCK_OFFSET_SECONDS that maximises the correlation of the two
 * smoothed power series. Searched coarse to fine (5 s block means, then 1 s around the
 * best few blocks) so a 4-hour pair costs a few hundred thousand products, not millions;
 * the correlation peak of 5 s-smoothed power is wider than one block, so the
 * coarse pass does not step over it.
 */
export function findClockOffset(a: SecondGrid, b: SecondGrid): ClockOffset {
  const startDifference = a.start - b.start;
  // With offset o, A's index i is B's index i + startDifference - o.
  const minLag = startDifference - MAX_CLOCK_OFFSET_SECONDS;
  const maxLag = startDifference + MAX_CLOCK_OFFSET_SECONDS;
  if (maxLag + a.length <= 0 || minLag >= b.length) {
    throw new AnalysisError('no_overlap', 'These recordings do not overlap in time. Were they recorded on the same ride?');
  }

  const block = ALIGNMENT_SMOOTHING_SECONDS;
  const aBlocks = blockMeans(a.power, block);
  const bBlocks = blockMeans(b.power, block);
  const coarse: { lag: number; r: number }[] = [];
  for (let k = Math.ceil(minLag / block); k <= Math.floor(maxLag / block); k++) {
    const best = bestLag(aBlocks, bBlocks, [k], MIN_PAIRED_SECONDS / block);
    if (best !== null) coarse.push({ lag: k * block, r: best.r });
  }
  coarse.sort((x, y) => y.r - x.r);

  const aSmooth = movingMean(a.power, ALIGNMENT_SMOOTHING_SECONDS);
  const bSmooth = movingMean(b.power, ALIGNMENT_SMOOTHING_SECONDS);
  const lags = new Set<number>();
  for (const candidate of coarse.slice(0, REFINED_CANDIDATES)) {
    for (const lag of range(candidate.lag - block, candidate.lag + block)) if (lag >= minLag && lag <= maxLag) lags.add(lag);
  }
  const best = bestLag(aSmooth, bSmooth, [...lags].sort((x, y) => Math.abs(x - startDifference) - Math.abs(y - startDifference)), MIN_PAIRED_SECONDS);
  // Overlapping spans but not a minute of shared power at any offset: the overlap check names it.
  if (best === null) return { clockOffsetSeconds: 0, correlation: 0 };
  return { clockOffsetSeconds: startDifference - best.lag, correlation: best.r };
}
