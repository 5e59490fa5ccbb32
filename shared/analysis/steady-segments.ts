import { movingMean } from './correlation';
import type { SteadySegment } from './types';

const ROLLING_SECONDS = 30;
const MIN_SEGMENT_SECONDS = 60;
const TOLERANCE = 0.1;

/**
 * Stretches of at least a minute of matched seconds where B's 30 s rolling power stays
 * within ±10 % of the stretch's mean: the automatic version of comparing hand-picked
 * steady sections. Greedy: grow a stretch while it holds; a stretch that breaks before
 * a minute restarts one second later, so the work stays linear in the ride's length.
 */
export function findSteadySegments(a: Float64Array, b: Float64Array, matched: Uint8Array): SteadySegment[] {
  const rolling = movingMean(b, ROLLING_SECONDS);
  const segments: SteadySegment[] = [];
  let start = 0;
  while (start < b.length) {
    let end = steadyEnd(rolling, matched, start);
    if (end - start < MIN_SEGMENT_SECONDS) {
      start++;
      continue;
    }
    // The rolling window lets the effort before a steady block leak into its first
    // seconds; a later start within one window may hold the stretch much longer.
    let bestStart = start;
    for (let later = start + 1; later <= start + ROLLING_SECONDS && later < end; later++) {
      const laterEnd = steadyEnd(rolling, matched, later);
      if (laterEnd > end) {
        end = laterEnd;
        bestStart = later;
      }
    }
    segments.push(describe(a, b, bestStart, end));
    start = end;
  }
  return segments;
}

/** One past the last second of the steady stretch that starts at `start`. */
function steadyEnd(rolling: Float64Array, matched: Uint8Array, start: number): number {
  let end = start;
  let sum = 0;
  let min = Infinity;
  let max = -Infinity;
  while (end < rolling.length && matched[end] === 1) {
    const value = rolling[end];
    const mean = (sum + value) / (end - start + 1);
    const nextMin = Math.min(min, value);
    const nextMax = Math.max(max, value);
    if (nextMax > (1 + TOLERANCE) * mean || nextMin < (1 - TOLERANCE) * mean) break;
    sum += value;
    min = nextMin;
    max = nextMax;
    end++;
  }
  return end;
}

function describe(a: Float64Array, b: Float64Array, start: number, end: number): SteadySegment {
  let sumA = 0;
  let sumB = 0;
  for (let i = start; i < end; i++) {
    sumA += a[i];
    sumB += b[i];
  }
  return {
    startSeconds: start,
    durationSeconds: end - start,
    aWatts: sumA / (end - start),
    bWatts: sumB / (end - start),
    percent: 100 * (sumA / sumB - 1),
  };
}
