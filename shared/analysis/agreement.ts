import { BLOCK_SECONDS, LIMITS_OF_AGREEMENT_Z } from './method';
import type { Agreement, AgreementBlock } from './types';

/** Non-overlapping blocks of BLOCK_SECONDS consecutive matched seconds, with each device's mean. */
export function matchedBlocks(a: Float64Array, b: Float64Array, matched: Uint8Array): AgreementBlock[] {
  const blocks: AgreementBlock[] = [];
  let runStart = 0;
  let sumA = 0;
  let sumB = 0;
  for (let i = 0; i < a.length; i++) {
    if (matched[i] === 0) {
      runStart = i + 1;
      sumA = 0;
      sumB = 0;
      continue;
    }
    sumA += a[i];
    sumB += b[i];
    if (i - runStart + 1 === BLOCK_SECONDS) {
      blocks.push({ startSeconds: runStart, aWatts: sumA / BLOCK_SECONDS, bWatts: sumB / BLOCK_SECONDS });
      runStart = i + 1;
      sumA = 0;
      sumB = 0;
    }
  }
  return blocks;
}

export function agreementOf(blocks: AgreementBlock[]): Agreement {
  const x = blocks.map((block) => block.bWatts);
  const y = blocks.map((block) => block.aWatts);
  const differences = blocks.map((block) => block.aWatts - block.bWatts);
  const percentDifferences = blocks.map((block) => (200 * (block.aWatts - block.bWatts)) / (block.aWatts + block.bWatts));
  const watts = blandAltman(differences);
  const percent = blandAltman(percentDifferences);
  return {
    blockSeconds: BLOCK_SECONDS,
    blockCount: blocks.length,
    meanDifferenceWatts: watts?.mean ?? null,
    sdWatts: watts?.sd ?? null,
    lowerLimitWatts: watts?.lower ?? null,
    upperLimitWatts: watts?.upper ?? null,
    meanDifferencePercent: percent?.mean ?? null,
    sdPercent: percent?.sd ?? null,
    lowerLimitPercent: percent?.lower ?? null,
    upperLimitPercent: percent?.upper ?? null,
    pearsonR: nullIfNaN(pearson(x, y)),
    concordance: nullIfNaN(linConcordance(x, y)),
    deming: demingRegression(x, y),
    blocks,
  };
}

function nullIfNaN(value: number): number | null {
  return Number.isNaN(value) ? null : value;
}

export function mean(values: ArrayLike<number>): number {
  let sum = 0;
  for (let i = 0; i < values.length; i++) sum += values[i];
  return sum / values.length;
}

/** Sample standard deviation (n − 1). */
export function sampleSd(values: ArrayLike<number>): number {
  const m = mean(values);
  let sum = 0;
  for (let i = 0; i < values.length; i++) sum += (values[i] - m) ** 2;
  return Math.sqrt(sum / (values.length - 1));
}

/**
 * Mean difference, SD and limits of agreement mean ± 1.96 SD
 * (Bland & Altman, Lancet 1986;327(8476):307–310). Null with fewer than two differences.
 */
export function blandAltman(differences: number[]): { mean: number; sd: number; lower: number; upper: number } | null {
  if (differences.length < 2) return null;
  const m = mean(differences);
  const sd = sampleSd(differences);
  return { mean: m, sd, lower: m - LIMITS_OF_AGREEMENT_Z * sd, upper: m + LIMITS_OF_AGREEMENT_Z * sd };
}

interface Moments {
  meanX: number;
  meanY: number;
  /** Sums of squares and cross-products about the means. */
  sxx: number;
  syy: number;
  sxy: number;
  n: number;
}

function moments(x: number[], y: number[]): Moments {
  const meanX = mean(x);
  const meanY = mean(y);
  let sxx = 0;
  let syy = 0;
  let sxy = 0;
  for (let i = 0; i < x.length; i++) {
    sxx += (x[i] - meanX) ** 2;
    syy += (y[i] - meanY) ** 2;
    sxy += (x[i] - meanX) * (y[i] - meanY);
  }
  return { meanX, meanY, sxx, syy, sxy, n: x.length };
}

export function pearson(x: number[], y: number[]): number {
  if (x.length < 2) return NaN;
  const { sxx, syy, sxy } = moments(x, y);
  return sxx > 0 && syy > 0 ? sxy / Math.sqrt(sxx * syy) : NaN;
}

/**
 * Lin's concordance correlation coefficient, 2·s_xy / (s_x² + s_y² + (x̄ − ȳ)²) with
 * moments divided by n (Lin, Biometrics 1989;45:255–268): agreement with the line y = x.
 */
export function linConcordance(x: number[], y: number[]): number {
  if (x.length < 2) return NaN;
  const { meanX, meanY, sxx, syy, sxy, n } = moments(x, y);
  const denominator = sxx / n + syy / n + (meanX - meanY) ** 2;
  return denominator > 0 ? (2 * sxy) / n / denominator : NaN;
}

/**
 * Deming regression of y on x with error-variance ratio 1 (orthogonal regression):
 * slope = (s_yy − s_xx + √((s_yy − s_xx)² + 4·s_xy²)) / (2·s_xy)
 * (Deming 1943; closed form as in Cornbleet & Gochman, Clin Chem 1979).
 */
export function demingRegression(x: number[], y: number[]): { slope: number; intercept: number } | null {
  if (x.length < 2) return null;
  const { meanX, meanY, sxx, syy, sxy } = moments(x, y);
  if (sxy === 0) return null;
  const slope = (syy - sxx + Math.sqrt((syy - sxx) ** 2 + 4 * sxy * sxy)) / (2 * sxy);
  return { slope, intercept: meanY - slope * meanX };
}
