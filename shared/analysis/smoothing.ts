import type { Smoothing } from './types';

/** A ratio beyond this (either way) means one recording looks much smoother than the other. */
export const SMOOTHING_MISMATCH_RATIO = 2;

/**
 * Mean absolute second-to-second change over pairs of consecutive matched seconds,
 * relative to the mean power: head units that average before recording score low.
 */
export function smoothingSignature(a: Float64Array, b: Float64Array, matched: Uint8Array): Smoothing {
  let changeA = 0;
  let changeB = 0;
  let sumA = 0;
  let sumB = 0;
  let pairs = 0;
  for (let i = 1; i < a.length; i++) {
    if (matched[i] === 0 || matched[i - 1] === 0) continue;
    changeA += Math.abs(a[i] - a[i - 1]);
    changeB += Math.abs(b[i] - b[i - 1]);
    sumA += a[i];
    sumB += b[i];
    pairs++;
  }
  if (pairs === 0) return { aVariation: null, bVariation: null, ratio: null };
  const aVariation = changeA / sumA;
  const bVariation = changeB / sumB;
  return { aVariation, bVariation, ratio: bVariation > 0 ? aVariation / bVariation : null };
}
