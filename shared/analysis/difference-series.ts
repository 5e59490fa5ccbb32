import type { DifferenceSeries } from './types';

export const SERIES_INTERVAL_SECONDS = 10;

/** Interval means over matched seconds for the ride chart, rounded to 0.1 W to keep results small. */
export function differenceSeries(a: Float64Array, b: Float64Array, matched: Uint8Array): DifferenceSeries {
  const intervals = Math.ceil(a.length / SERIES_INTERVAL_SECONDS);
  const aWatts: (number | null)[] = new Array(intervals);
  const bWatts: (number | null)[] = new Array(intervals);
  const differenceWatts: (number | null)[] = new Array(intervals);
  for (let k = 0; k < intervals; k++) {
    let sumA = 0;
    let sumB = 0;
    let count = 0;
    const end = Math.min(a.length, (k + 1) * SERIES_INTERVAL_SECONDS);
    for (let i = k * SERIES_INTERVAL_SECONDS; i < end; i++) {
      if (matched[i] === 0) continue;
      sumA += a[i];
      sumB += b[i];
      count++;
    }
    aWatts[k] = count > 0 ? round1(sumA / count) : null;
    bWatts[k] = count > 0 ? round1(sumB / count) : null;
    differenceWatts[k] = count > 0 ? round1((sumA - sumB) / count) : null;
  }
  return { intervalSeconds: SERIES_INTERVAL_SECONDS, aWatts, bWatts, differenceWatts };
}

function round1(value: number): number {
  return Math.round(value * 10) / 10;
}
