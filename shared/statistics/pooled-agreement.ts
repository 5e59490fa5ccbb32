import { LIMITS_OF_AGREEMENT_Z } from '../analysis/method';

/** One submission's Bland–Altman summary of its blocks (watts or percent, the same unit throughout). */
export interface SubmissionAgreement {
  meanDifference: number;
  /** SD of the block differences; null when the submission has a single block. */
  sd: number | null;
  blockCount: number;
}

export interface PooledAgreement {
  /** Mean of all blocks' differences. */
  meanDifference: number;
  /** SD of one block's difference across submissions: √(between + within variance). */
  sd: number;
  withinSubmissionSd: number;
  betweenSubmissionSd: number;
  lower: number;
  upper: number;
  submissionCount: number;
  blockCount: number;
}

/**
 * Limits of agreement over many submissions, each with several blocks, from the
 * one-way analysis of variance of Bland & Altman, "Agreement between methods of
 * measurement with multiple observations per individual", J Biopharm Stat
 * 2007;17:571–582 (the case where the true value varies, unequal numbers of blocks):
 *   MS_w = Σ(nᵢ − 1)sᵢ² / (N − k),  MS_b = Σnᵢ(d̄ᵢ − d̄)² / (k − 1),
 *   σ²_b = (MS_b − MS_w) / [(N² − Σnᵢ²) / ((k − 1)N)]  (0 if negative),
 *   limits = d̄ ± 1.96 √(σ²_b + MS_w).
 * Null unless there are two submissions and at least one within-submission degree of freedom.
 */
export function pooledAgreement(submissions: SubmissionAgreement[]): PooledAgreement | null {
  const k = submissions.length;
  const totalBlocks = submissions.reduce((sum, s) => sum + s.blockCount, 0);
  if (k < 2 || totalBlocks - k < 1) return null;

  const meanDifference = submissions.reduce((sum, s) => sum + s.blockCount * s.meanDifference, 0) / totalBlocks;
  let withinSumOfSquares = 0;
  let betweenSumOfSquares = 0;
  let sumSquaredCounts = 0;
  for (const s of submissions) {
    if (s.blockCount < 1) throw new RangeError(`a submission needs at least one block, got ${s.blockCount}`);
    withinSumOfSquares += (s.blockCount - 1) * (s.sd ?? 0) ** 2;
    betweenSumOfSquares += s.blockCount * (s.meanDifference - meanDifference) ** 2;
    sumSquaredCounts += s.blockCount * s.blockCount;
  }
  const withinMeanSquare = withinSumOfSquares / (totalBlocks - k);
  const betweenMeanSquare = betweenSumOfSquares / (k - 1);
  const divisor = (totalBlocks * totalBlocks - sumSquaredCounts) / ((k - 1) * totalBlocks);
  const betweenVariance = Math.max(0, (betweenMeanSquare - withinMeanSquare) / divisor);
  const sd = Math.sqrt(betweenVariance + withinMeanSquare);
  return {
    meanDifference,
    sd,
    withinSubmissionSd: Math.sqrt(withinMeanSquare),
    betweenSubmissionSd: Math.sqrt(betweenVariance),
    lower: meanDifference - LIMITS_OF_AGREEMENT_Z * sd,
    upper: meanDifference + LIMITS_OF_AGREEMENT_Z * sd,
    submissionCount: k,
    blockCount: totalBlocks,
  };
}
