import type { PeakComparison, Peaks, Sprint } from './types';

export const PEAK_DURATIONS_SECONDS = [1, 5, 30, 60, 300, 1200];
const NORMALISED_WINDOW_SECONDS = 30;
const SPRINT_FACTOR = 2;
const MIN_SPRINT_SECONDS = 5;
/** Seconds before and after a sprint searched for each device's own peak. */
const SPRINT_MARGIN_SECONDS = 5;
const RESPONSE_FRACTION = 0.8;

/** Missing seconds count as zero: a dropout in a sprint costs that device its peak, as it would on the road. */
function filled(values: Float64Array): Float64Array {
  const out = new Float64Array(values.length);
  for (let i = 0; i < values.length; i++) out[i] = values[i] === values[i] ? values[i] : 0;
  return out;
}

export function bestMeanPower(values: Float64Array, durationSeconds: number): number | null {
  if (values.length < durationSeconds) return null;
  let sum = 0;
  for (let i = 0; i < durationSeconds; i++) sum += values[i];
  let best = sum;
  for (let i = durationSeconds; i < values.length; i++) {
    sum += values[i] - values[i - durationSeconds];
    if (sum > best) best = sum;
  }
  return best / durationSeconds;
}

/** Mean over the seconds the device reported, coasting included. */
export function averagePower(values: Float64Array): number | null {
  let sum = 0;
  let count = 0;
  for (let i = 0; i < values.length; i++) {
    if (values[i] !== values[i]) continue;
    sum += values[i];
    count++;
  }
  return count > 0 ? sum / count : null;
}

/** Fourth root of the mean fourth power of the 30 s rolling mean: weighs hard efforts by their cost. */
export function normalisedPower(values: Float64Array): number | null {
  if (values.length < NORMALISED_WINDOW_SECONDS) return null;
  let sum = 0;
  for (let i = 0; i < NORMALISED_WINDOW_SECONDS; i++) sum += values[i];
  let total = fourthPower(sum / NORMALISED_WINDOW_SECONDS);
  for (let i = NORMALISED_WINDOW_SECONDS; i < values.length; i++) {
    sum += values[i] - values[i - NORMALISED_WINDOW_SECONDS];
    total += fourthPower(sum / NORMALISED_WINDOW_SECONDS);
  }
  return (total / (values.length - NORMALISED_WINDOW_SECONDS + 1)) ** 0.25;
}

function fourthPower(x: number): number {
  const square = x * x;
  return square * square;
}

function percentDifference(a: number | null, b: number | null): number | null {
  return a === null || b === null || b <= 0 ? null : 100 * (a / b - 1);
}

export function analysePeaks(aPower: Float64Array, bPower: Float64Array): Peaks {
  const a = filled(aPower);
  const b = filled(bPower);
  const best: PeakComparison[] = PEAK_DURATIONS_SECONDS.map((durationSeconds) => {
    const aWatts = bestMeanPower(a, durationSeconds);
    const bWatts = bestMeanPower(b, durationSeconds);
    return { durationSeconds, aWatts, bWatts, percent: percentDifference(aWatts, bWatts) };
  });
  return {
    best,
    averageWatts: { a: averagePower(aPower), b: averagePower(bPower) },
    normalisedWatts: { a: normalisedPower(a), b: normalisedPower(b) },
    sprints: findSprints(a, b, averagePower(bPower)),
  };
}

/**
 * Sprints are found on B, the partner device, so that A's own dropouts or lag cannot
 * hide the effort it is being judged on: B above twice its ride average for 5 s or more.
 */
export function findSprints(a: Float64Array, b: Float64Array, bAverage: number | null): Sprint[] {
  if (bAverage === null || bAverage <= 0) return [];
  const threshold = SPRINT_FACTOR * bAverage;
  const sprints: Sprint[] = [];
  for (let i = 0; i < b.length; i++) {
    if (b[i] <= threshold) continue;
    let end = i;
    while (end < b.length && b[end] > threshold) end++;
    if (end - i >= MIN_SPRINT_SECONDS) sprints.push(describeSprint(a, b, i, end));
    i = end;
  }
  return sprints;
}

function describeSprint(a: Float64Array, b: Float64Array, start: number, end: number): Sprint {
  const from = Math.max(0, start - SPRINT_MARGIN_SECONDS);
  const to = Math.min(b.length, end + SPRINT_MARGIN_SECONDS);
  const aPeak = peakIn(a, from, to);
  const bPeak = peakIn(b, from, to);
  return {
    startSeconds: start,
    durationSeconds: end - start,
    aPeakWatts: aPeak,
    bPeakWatts: bPeak,
    percent: percentDifference(aPeak, bPeak),
    aSecondsTo80Percent: secondsToFraction(a, aPeak, from, to, start),
    bSecondsTo80Percent: secondsToFraction(b, bPeak, from, to, start),
  };
}

function peakIn(values: Float64Array, from: number, to: number): number {
  let peak = 0;
  for (let i = from; i < to; i++) if (values[i] > peak) peak = values[i];
  return peak;
}

/** Negative when the device got there before the partner's effort crossed the sprint threshold. */
function secondsToFraction(values: Float64Array, peak: number, from: number, to: number, effortStart: number): number | null {
  if (peak <= 0) return null;
  for (let i = from; i < to; i++) if (values[i] >= RESPONSE_FRACTION * peak) return i - effortStart;
  return null;
}
