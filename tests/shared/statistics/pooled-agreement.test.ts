import { mean, sampleStandardDeviation, sumNthPowerDeviations } from 'simple-statistics';
import { describe, expect, it } from 'vitest';
import { createRandom } from '@shared/simulator/random';
import { pooledAgreement, type SubmissionAgreement } from '@shared/statistics/pooled-agreement';

function simulatedBlocks(seed: number, submissions: number, betweenSd: number, withinSd: number): number[][] {
  const random = createRandom(seed);
  return Array.from({ length: submissions }, () => {
    const submissionMean = 1 + betweenSd * random.normal();
    return Array.from({ length: random.integer(5, 40) }, () => submissionMean + withinSd * random.normal());
  });
}

const summaryOf = (blocks: number[]): SubmissionAgreement => ({
  meanDifference: mean(blocks),
  sd: blocks.length > 1 ? sampleStandardDeviation(blocks) : null,
  blockCount: blocks.length,
});

describe('pooled limits of agreement', () => {
  it('when pooled from per-submission summaries, then it equals the one-way analysis of variance of all blocks', () => {
    const blocks = simulatedBlocks(3, 7, 1.5, 2);
    const all = blocks.flat();
    const k = blocks.length;
    const n = all.length;
    // Brute force from the raw blocks: total sum of squares split into within and between.
    const within = blocks.reduce((sum, b) => sum + sumNthPowerDeviations(b, 2), 0);
    const between = sumNthPowerDeviations(all, 2) - within;
    const n0 = (n * n - blocks.reduce((sum, b) => sum + b.length ** 2, 0)) / ((k - 1) * n);
    const expectedVariance = (between / (k - 1) - within / (n - k)) / n0 + within / (n - k);

    const pooled = pooledAgreement(blocks.map(summaryOf))!;

    expect(pooled.meanDifference).toBeCloseTo(mean(all), 12);
    expect(pooled.sd).toBeCloseTo(Math.sqrt(expectedVariance), 10);
    expect(pooled.lower).toBeCloseTo(mean(all) - 1.96 * pooled.sd, 12);
    expect(pooled.upper).toBeCloseTo(mean(all) + 1.96 * pooled.sd, 12);
    expect(pooled.blockCount).toBe(n);
  });

  it('when submissions differ by a known between-SD, then the pooled SD approaches √(between² + within²)', () => {
    const blocks = simulatedBlocks(4, 600, 1, 2);

    const pooled = pooledAgreement(blocks.map(summaryOf))!;

    expect(pooled.betweenSubmissionSd).toBeGreaterThan(0.9);
    expect(pooled.betweenSubmissionSd).toBeLessThan(1.1);
    expect(pooled.withinSubmissionSd).toBeCloseTo(2, 1);
    expect(pooled.sd).toBeCloseTo(Math.sqrt(5), 1);
  });

  it('when every submission has the same mean difference, then only the within-submission spread remains', () => {
    const summaries = [
      { meanDifference: 2, sd: 3, blockCount: 10 },
      { meanDifference: 2, sd: 1, blockCount: 30 },
    ];

    const pooled = pooledAgreement(summaries)!;

    expect(pooled.betweenSubmissionSd).toBe(0);
    expect(pooled.sd).toBeCloseTo(Math.sqrt((9 * 9 + 29 * 1) / 38), 12);
  });

  it('when there is a single submission or no within-submission spread to estimate, then there are no pooled limits', () => {
    expect(pooledAgreement([{ meanDifference: 1, sd: 2, blockCount: 20 }])).toBeNull();
    expect(
      pooledAgreement([
        { meanDifference: 1, sd: null, blockCount: 1 },
        { meanDifference: 2, sd: null, blockCount: 1 },
      ]),
    ).toBeNull();
  });
});
