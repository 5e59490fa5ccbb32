/**
 * Cadence steps: moments the rider's cadence jumps (the on/off efforts a reviewer
 * rides to see how fast each meter's cadence follows). A step is found on the mean of
 * both meters' cadence; each meter's own time is when its reading crosses halfway
 * between the levels before and after, interpolated between seconds.
 */
export interface CadenceStep {
  /** Seconds from the alignment start where the step was found. */
  atSeconds: number;
  direction: 'up' | 'down';
  fromRpm: number;
  toRpm: number;
  /** When each meter crossed halfway; null when it never did within the window. */
  aSeconds: number | null;
  bSeconds: number | null;
  /** aSeconds − bSeconds: positive when A follows later than B. */
  lagSeconds: number | null;
}

/** Levels are means over this many seconds on each side of the step. */
const LEVEL_SECONDS = 4;
/** A jump smaller than this is pedalling noise, not a step. */
export const MIN_STEP_RPM = 25;
/** How far either side of the step each meter's crossing is looked for. */
const SEARCH_SECONDS = 8;

export function findCadenceSteps(aCadence: (number | null)[], bCadence: (number | null)[]): CadenceStep[] {
  const length = Math.min(aCadence.length, bCadence.length);
  const both = new Array<number | null>(length);
  for (let i = 0; i < length; i++) {
    const a = aCadence[i];
    const b = bCadence[i];
    both[i] = a === null ? b : b === null ? a : (a + b) / 2;
  }
  const steps: CadenceStep[] = [];
  for (let i = LEVEL_SECONDS; i + LEVEL_SECONDS <= length; i++) {
    const before = mean(both, i - LEVEL_SECONDS, i);
    const after = mean(both, i, i + LEVEL_SECONDS);
    if (before === null || after === null || Math.abs(after - before) < MIN_STEP_RPM) continue;
    // Walk on to the second where the jump is largest, so one step is found once.
    let best = i;
    let bestJump = Math.abs(after - before);
    for (let j = i + 1; j < Math.min(length - LEVEL_SECONDS + 1, i + LEVEL_SECONDS); j++) {
      const jb = mean(both, j - LEVEL_SECONDS, j);
      const ja = mean(both, j, j + LEVEL_SECONDS);
      if (jb === null || ja === null) continue;
      const jump = Math.abs(ja - jb);
      if (jump > bestJump && Math.sign(ja - jb) === Math.sign(after - before)) {
        best = j;
        bestJump = jump;
      }
    }
    const fromRpm = mean(both, best - LEVEL_SECONDS, best) as number;
    const toRpm = mean(both, best, best + LEVEL_SECONDS) as number;
    const midpoint = (fromRpm + toRpm) / 2;
    const up = toRpm > fromRpm;
    const aSeconds = crossing(aCadence, best, midpoint, up, length);
    const bSeconds = crossing(bCadence, best, midpoint, up, length);
    steps.push({
      atSeconds: best,
      direction: up ? 'up' : 'down',
      fromRpm,
      toRpm,
      aSeconds,
      bSeconds,
      lagSeconds: aSeconds !== null && bSeconds !== null ? aSeconds - bSeconds : null,
    });
    i = best + LEVEL_SECONDS - 1;
  }
  return steps;
}

/** Median lag over the steps where both meters crossed, by direction. */
export function medianStepLag(steps: CadenceStep[], direction?: 'up' | 'down'): number | null {
  const lags = steps
    .filter((s) => (direction === undefined || s.direction === direction) && s.lagSeconds !== null)
    .map((s) => s.lagSeconds as number)
    .sort((x, y) => x - y);
  if (lags.length === 0) return null;
  const middle = Math.floor(lags.length / 2);
  return lags.length % 2 === 1 ? lags[middle] : (lags[middle - 1] + lags[middle]) / 2;
}

function mean(values: (number | null)[], from: number, to: number): number | null {
  let sum = 0;
  let count = 0;
  for (let i = Math.max(0, from); i < Math.min(values.length, to); i++) {
    const v = values[i];
    if (v === null) continue;
    sum += v;
    count++;
  }
  return count >= (to - from) / 2 ? sum / count : null;
}

/** First time near `around` the meter's reading passes the midpoint in the step's direction. */
function crossing(values: (number | null)[], around: number, midpoint: number, up: boolean, length: number): number | null {
  const from = Math.max(1, around - SEARCH_SECONDS);
  const to = Math.min(length, around + SEARCH_SECONDS);
  const reading = (i: number) => values[i] ?? 0;
  for (let i = from; i < to; i++) {
    const previous = reading(i - 1);
    const current = reading(i);
    const passed = up ? previous < midpoint && current >= midpoint : previous > midpoint && current <= midpoint;
    if (passed) return i - 1 + (midpoint - previous) / (current - previous);
  }
  return null;
}
