import { studentTQuantile } from '../statistics/distributions';
import type { DriftEstimate } from './types';

export interface DriftBlock {
  /** Hours from the start of the aligned ride to the block's middle usable second. */
  atHours: number;
  percent: number;
  watts: number;
}

export const DRIFT_BLOCK_SECONDS = 300;
/** Fewer blocks than this (20 minutes) leave the slope to two or three points. */
export const MIN_DRIFT_BLOCKS = 4;

/**
 * The ride cut into blocks of `blockSeconds`; each block's difference is the ratio of
 * energies over its usable seconds (as the ride's bias), kept when at least half the
 * block is usable. Blocks rather than seconds because second-to-second differences are
 * strongly autocorrelated (smoothing, lag); five-minute blocks are close to independent.
 */
export function driftBlocks(a: Float64Array, b: Float64Array, usable: Uint8Array, blockSeconds = DRIFT_BLOCK_SECONDS): DriftBlock[] {
  const blocks: DriftBlock[] = [];
  for (let start = 0; start < a.length; start += blockSeconds) {
    let sumA = 0;
    let sumB = 0;
    let seconds = 0;
    let sumT = 0;
    for (let i = start; i < Math.min(a.length, start + blockSeconds); i++) {
      if (usable[i] === 0) continue;
      sumA += a[i];
      sumB += b[i];
      sumT += i;
      seconds++;
    }
    if (seconds < blockSeconds / 2 || sumB <= 0) continue;
    blocks.push({ atHours: sumT / seconds / 3600, percent: 100 * (sumA / sumB - 1), watts: (sumA - sumB) / seconds });
  }
  return blocks;
}

/**
 * Ordinary least squares of the blocks' differences on time, with the slope's t
 * interval on blocks − 2 degrees of freedom (as R's lm and confint give it).
 * Null below MIN_DRIFT_BLOCKS.
 */
export function differenceDrift(blocks: DriftBlock[], confidence = 0.95): DriftEstimate | null {
  const n = blocks.length;
  if (n < MIN_DRIFT_BLOCKS) return null;
  const slope = (y: (block: DriftBlock) => number) => {
    const meanX = blocks.reduce((s, block) => s + block.atHours, 0) / n;
    const meanY = blocks.reduce((s, block) => s + y(block), 0) / n;
    let sxx = 0;
    let sxy = 0;
    for (const block of blocks) {
      sxx += (block.atHours - meanX) ** 2;
      sxy += (block.atHours - meanX) * (y(block) - meanY);
    }
    const beta = sxy / sxx;
    let residual = 0;
    for (const block of blocks) residual += (y(block) - meanY - beta * (block.atHours - meanX)) ** 2;
    return { beta, standardError: Math.sqrt(residual / (n - 2) / sxx) };
  };
  const percent = slope((block) => block.percent);
  const t = studentTQuantile(1 - (1 - confidence) / 2, n - 2);
  return {
    percentPerHour: percent.beta,
    lower: percent.beta - t * percent.standardError,
    upper: percent.beta + t * percent.standardError,
    wattsPerHour: slope((block) => block.watts).beta,
    blocks: n,
    spanHours: blocks[n - 1]!.atHours - blocks[0]!.atHours,
  };
}

/** The temperature bands a ride's bias is split into, in °C (lower bound inclusive). */
export const TEMPERATURE_BANDS = [
  { label: 'below 5 °C', from: Number.NEGATIVE_INFINITY, to: 5 },
  { label: '5 to 15 °C', from: 5, to: 15 },
  { label: '15 to 25 °C', from: 15, to: 25 },
  { label: '25 °C and above', from: 25, to: Number.POSITIVE_INFINITY },
] as const;

export type TemperatureBandLabel = (typeof TEMPERATURE_BANDS)[number]['label'];

export interface TemperatureBandBias {
  band: TemperatureBandLabel;
  seconds: number;
  sumA: number;
  sumB: number;
  /** 100 × (ΣA / ΣB − 1) over the band's usable seconds; null when B sums to zero. */
  percent: number | null;
}

/** The ride's bias in each temperature band the head unit recorded, over the same usable seconds as the ride's bias. */
export function biasByTemperatureBand(
  a: Float64Array,
  b: Float64Array,
  usable: Uint8Array,
  temperatureCelsius: Float64Array,
): TemperatureBandBias[] {
  const sums = TEMPERATURE_BANDS.map(() => ({ seconds: 0, sumA: 0, sumB: 0 }));
  for (let i = 0; i < a.length; i++) {
    const celsius = temperatureCelsius[i];
    if (usable[i] === 0 || !Number.isFinite(celsius)) continue;
    const index = TEMPERATURE_BANDS.findIndex((band) => celsius >= band.from && celsius < band.to);
    const sum = sums[index]!;
    sum.seconds++;
    sum.sumA += a[i];
    sum.sumB += b[i];
  }
  return TEMPERATURE_BANDS.map((band, index) => ({
    band: band.label,
    ...sums[index]!,
    percent: sums[index]!.sumB > 0 ? 100 * (sums[index]!.sumA / sums[index]!.sumB - 1) : null,
  })).filter((band) => band.seconds > 0);
}
