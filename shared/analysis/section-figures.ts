/** The part of a ride trace that section figures read. */
export interface SectionInput {
  aPower: (number | null)[];
  bPower: (number | null)[];
  matched: (0 | 1)[];
  aRightBalance?: (number | null)[];
  bRightBalance?: (number | null)[];
}

export interface SectionFigures {
  /** Seconds from the alignment start; end exclusive, both clamped to the trace. */
  fromSeconds: number;
  toSeconds: number;
  /** Seconds both meters count for, the same rule as the ride's bias. */
  matchedSeconds: number;
  /** Means over the matched seconds of the section. */
  aAverageWatts: number | null;
  bAverageWatts: number | null;
  /** Mean A − B over the matched seconds. */
  differenceWatts: number | null;
  /** 100 × (ΣA / ΣB − 1) over the matched seconds, as the ride's bias. */
  differencePercent: number | null;
  /** Highest one-second reading of each meter anywhere in the section. */
  aPeakWatts: number | null;
  bPeakWatts: number | null;
  /** Mean right-leg share in % over the section's seconds that carry it; null without balance. */
  aRightBalancePercent: number | null;
  bRightBalancePercent: number | null;
}

/** Figures for the seconds [from, to) of a ride: what a reviewer quotes ("233 W against 232 W"). */
export function sectionFigures(trace: SectionInput, fromSeconds: number, toSeconds: number): SectionFigures {
  const length = trace.matched.length;
  const from = clamp(Math.floor(Math.min(fromSeconds, toSeconds)), 0, length);
  const to = clamp(Math.ceil(Math.max(fromSeconds, toSeconds)), from, length);
  let sumA = 0;
  let sumB = 0;
  let count = 0;
  let aPeak: number | null = null;
  let bPeak: number | null = null;
  for (let i = from; i < to; i++) {
    const a = trace.aPower[i];
    const b = trace.bPower[i];
    if (a !== null && (aPeak === null || a > aPeak)) aPeak = a;
    if (b !== null && (bPeak === null || b > bPeak)) bPeak = b;
    if (trace.matched[i] !== 1 || a === null || b === null) continue;
    sumA += a;
    sumB += b;
    count++;
  }
  return {
    fromSeconds: from,
    toSeconds: to,
    matchedSeconds: count,
    aAverageWatts: count > 0 ? sumA / count : null,
    bAverageWatts: count > 0 ? sumB / count : null,
    differenceWatts: count > 0 ? (sumA - sumB) / count : null,
    differencePercent: count > 0 && sumB > 0 ? 100 * (sumA / sumB - 1) : null,
    aPeakWatts: aPeak,
    bPeakWatts: bPeak,
    aRightBalancePercent: meanOver(trace.aRightBalance, from, to),
    bRightBalancePercent: meanOver(trace.bRightBalance, from, to),
  };
}

/** Mean of the non-null values in [from, to); null when there are none. */
export function meanOver(values: (number | null)[] | undefined, from: number, to: number): number | null {
  if (!values || values.length === 0) return null;
  let sum = 0;
  let count = 0;
  for (let i = from; i < Math.min(to, values.length); i++) {
    const v = values[i];
    if (v === null) continue;
    sum += v;
    count++;
  }
  return count > 0 ? sum / count : null;
}

function clamp(value: number, low: number, high: number): number {
  return Math.min(high, Math.max(low, value));
}
