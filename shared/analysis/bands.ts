import { fromSums } from './bias';
import type { BandBias } from './types';

export const POWER_BAND_EDGES_WATTS = [0, 150, 250, 400, 700];
export const CADENCE_BAND_EDGES_RPM = [0, 70, 90, 110];

/** Bias within each power band of the two devices' mean power. */
export function powerBands(a: Float64Array, b: Float64Array, matched: Uint8Array): BandBias[] {
  const key = new Float64Array(a.length);
  for (let i = 0; i < a.length; i++) key[i] = (a[i] + b[i]) / 2;
  return biasByBand(a, b, matched, key, POWER_BAND_EDGES_WATTS, 'W');
}

/** Bias within each cadence band; cadence is the mean of the devices that report it. */
export function cadenceBands(
  a: Float64Array,
  b: Float64Array,
  matched: Uint8Array,
  aCadence: Float64Array,
  bCadence: Float64Array,
): BandBias[] {
  const key = new Float64Array(a.length);
  for (let i = 0; i < a.length; i++) {
    const x = aCadence[i];
    const y = bCadence[i];
    key[i] = x === x && y === y ? (x + y) / 2 : x === x ? x : y;
  }
  return biasByBand(a, b, matched, key, CADENCE_BAND_EDGES_RPM, 'rpm');
}

function biasByBand(a: Float64Array, b: Float64Array, matched: Uint8Array, key: Float64Array, edges: number[], unit: string): BandBias[] {
  const bands = edges.length;
  const sumA = new Float64Array(bands);
  const sumB = new Float64Array(bands);
  const counts = new Uint32Array(bands);
  for (let i = 0; i < a.length; i++) {
    const value = key[i];
    if (matched[i] === 0 || value !== value) continue;
    let band = bands - 1;
    while (band > 0 && value < edges[band]) band--;
    sumA[band] += a[i];
    sumB[band] += b[i];
    counts[band]++;
  }
  return edges.map((from, band) => {
    const to = band + 1 < bands ? edges[band + 1] : null;
    const { percent, meanDifferenceWatts, matchedSeconds } = fromSums(sumA[band], sumB[band], counts[band]);
    const label = to === null ? `≥ ${from} ${unit}` : from === 0 ? `< ${to} ${unit}` : `${from}–${to} ${unit}`;
    return { label, from, to, matchedSeconds, percent, meanDifferenceWatts };
  });
}
