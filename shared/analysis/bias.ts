import type { Bias } from './types';

/** Matched: both devices report power above zero and neither is inside a power dropout event. */
export function matchedSeconds(a: Float64Array, b: Float64Array, aDropout: Uint8Array, bDropout: Uint8Array): Uint8Array {
  const mask = new Uint8Array(a.length);
  for (let i = 0; i < a.length; i++) if (a[i] > 0 && b[i] > 0 && aDropout[i] === 0 && bDropout[i] === 0) mask[i] = 1;
  return mask;
}

/**
 * Method version 2, the seconds the bias is summed over: both devices report a number and
 * neither is inside a power dropout event, whether or not either pedals. A head unit's
 * average moves energy into the seconds after a stop but keeps it, so the ratio of
 * energies over these seconds is free of smoothing; "both above zero" (version 1) cut the
 * smoothed side's tail off at every coast.
 */
export function energySeconds(a: Float64Array, b: Float64Array, aDropout: Uint8Array, bDropout: Uint8Array): Uint8Array {
  const mask = new Uint8Array(a.length);
  for (let i = 0; i < a.length; i++)
    if (a[i] === a[i] && b[i] === b[i] && (a[i] > 0 || b[i] > 0) && aDropout[i] === 0 && bDropout[i] === 0) mask[i] = 1;
  return mask;
}

export interface BiasWithSums extends Bias {
  sumA: number;
  sumB: number;
}

/** Percent = 100 × (ΣA / ΣB − 1): a ratio of energies, so hard efforts weigh as much as they cost. */
export function biasOverMatched(a: Float64Array, b: Float64Array, matched: Uint8Array): BiasWithSums {
  let sumA = 0;
  let sumB = 0;
  let count = 0;
  for (let i = 0; i < a.length; i++) {
    if (matched[i] === 0) continue;
    sumA += a[i];
    sumB += b[i];
    count++;
  }
  return fromSums(sumA, sumB, count);
}

export function fromSums(sumA: number, sumB: number, count: number): BiasWithSums {
  return {
    percent: count > 0 && sumB > 0 ? 100 * (sumA / sumB - 1) : null,
    meanDifferenceWatts: count > 0 ? (sumA - sumB) / count : null,
    matchedSeconds: count,
    sumA,
    sumB,
  };
}
