import { median, weightedMean, weightedVariance } from 'simple-statistics';
import { describe, expect, it } from 'vitest';
import { createRandom } from '@shared/simulator/random';
import {
  addToBiasSums,
  biasSumsOf,
  EMPTY_BIAS_SUMS,
  medianBias,
  removeFromBiasSums,
  summariseBias,
  summariseBiasSums,
  weightedMedian,
  type BiasRecord,
  type BiasSummary,
} from '@shared/statistics/weighted-bias';

const record = (biasPercent: number, pedallingHours: number, riderId: string): BiasRecord => ({ biasPercent, pedallingHours, riderId });

function randomRecords(seed: number, count: number): BiasRecord[] {
  const random = createRandom(seed);
  return Array.from({ length: count }, () => record(1.5 + 0.8 * random.normal(), random.uniform(0.3, 7), `rider-${random.integer(1, 6)}`));
}

function enough(summary: BiasSummary): Extract<BiasSummary, { enough: true }> {
  if (!summary.enough) throw new Error('expected enough evidence');
  return summary;
}

describe('weighted bias summary', () => {
  it("when hours are capped at 4, then the mean and spread match simple-statistics' weighted mean and variance", () => {
    const records = [record(2.0, 1, 'a'), record(1.0, 3, 'b'), record(3.5, 9, 'a'), record(-0.5, 2, 'c')];
    const weights = [1, 3, 4, 2];
    const biases = records.map((r) => r.biasPercent);

    const summary = enough(summariseBias(records));

    expect(summary.meanBiasPercent).toBeCloseTo(weightedMean(biases, weights), 12);
    // simple-statistics gives the population form Σw(x − m)²/Σw; ours divides by Σw − Σw²/Σw instead.
    const s1 = 10;
    const s2 = 1 + 9 + 16 + 4;
    expect(summary.betweenSubmissionSdPercent ** 2).toBeCloseTo((weightedVariance(biases, weights) * s1) / (s1 - s2 / s1), 12);
    expect(summary.effectiveSubmissions).toBeCloseTo((s1 * s1) / s2, 12);
    expect(summary.pedallingHours).toBe(15);
  });

  it('when all weights are equal, then the interval is the ordinary t interval with n − 1 degrees of freedom', () => {
    const records = [record(1.1, 5, 'a'), record(2.3, 4, 'b'), record(0.4, 6, 'c'), record(1.9, 4.5, 'a'), record(1.5, 8, 'b')];
    const biases = records.map((r) => r.biasPercent);
    const m = biases.reduce((a, b) => a + b) / 5;
    const sd = Math.sqrt(biases.reduce((a, b) => a + (b - m) ** 2, 0) / 4);

    const summary = enough(summariseBias(records));

    // t(0.975, 4) = 2.776445 (NIST/SEMATECH e-Handbook §1.3.6.7.2 tabulates 2.776).
    expect(summary.degreesOfFreedom).toBeCloseTo(4, 12);
    expect(summary.standardErrorPercent).toBeCloseTo(sd / Math.sqrt(5), 12);
    expect(summary.upperPercent - summary.meanBiasPercent).toBeCloseTo((2.776445 * sd) / Math.sqrt(5), 5);
    expect(summary.medianBiasPercent).toBe(median(biases));
  });

  it('when one submission carries most of the weight, then the degrees of freedom fall below n − 1', () => {
    const records = [record(1, 4, 'a'), record(2, 0.1, 'b'), record(3, 0.1, 'c'), record(2.5, 0.1, 'a')];

    const summary = enough(summariseBias(records));

    expect(summary.degreesOfFreedom).toBeLessThan(3);
    expect(summary.degreesOfFreedom).toBeGreaterThan(0);
  });

  it('when the weighted mean is replayed over many seeded samples, then its 95 % interval covers the true bias about 95 % of the time', () => {
    const random = createRandom(6);
    let covered = 0;
    const trials = 2000;
    for (let trial = 0; trial < trials; trial++) {
      const records = Array.from({ length: 8 }, (_, i) => record(1 + 0.5 * random.normal(), random.uniform(0.2, 6), `r${i % 3}`));
      const summary = enough(summariseBias(records));
      if (summary.lowerPercent <= 1 && summary.upperPercent >= 1) covered++;
    }

    expect(covered / trials).toBeGreaterThan(0.93);
    expect(covered / trials).toBeLessThan(0.97);
  });

  it.each([
    ['two submissions', [record(1, 1, 'a'), record(2, 1, 'b')]],
    ['one rider', [record(1, 1, 'a'), record(2, 1, 'a'), record(3, 1, 'a')]],
  ])('when there are only %s, then the summary says not enough data yet', (_, records) => {
    const summary = summariseBias(records);

    expect(summary).toEqual({
      enough: false,
      submissionCount: records.length,
      distinctRiders: new Set(records.map((r) => r.riderId)).size,
      pedallingHours: records.length,
    });
  });

  it('when pedalling hours are not positive, then the record is refused', () => {
    expect(() => summariseBias([record(1, 0, 'a')])).toThrow(RangeError);
  });
});

describe('incremental sufficient statistics', () => {
  it('when submissions are added and removed one by one, then the figures equal a recompute from scratch', () => {
    const kept = randomRecords(11, 40);
    const withdrawn = randomRecords(12, 15);
    const random = createRandom(13);
    const arrivals = [...kept, ...withdrawn].sort(() => random.next() - 0.5);

    let sums = EMPTY_BIAS_SUMS;
    for (const r of arrivals) sums = addToBiasSums(sums, r);
    for (const r of withdrawn) sums = removeFromBiasSums(sums, r);
    const distinctRiders = new Set(kept.map((r) => r.riderId)).size;
    const incremental = enough(summariseBiasSums(sums, { distinctRiders, medianBiasPercent: medianBias(kept) }));
    const fromScratch = enough(summariseBias(kept));

    expect(incremental.submissionCount).toBe(fromScratch.submissionCount);
    expect(incremental.distinctRiders).toBe(fromScratch.distinctRiders);
    expect(incremental.medianBiasPercent).toBe(fromScratch.medianBiasPercent);
    const figures = [
      'pedallingHours',
      'meanBiasPercent',
      'lowerPercent',
      'upperPercent',
      'betweenSubmissionSdPercent',
      'degreesOfFreedom',
      'effectiveSubmissions',
    ] as const;
    for (const key of figures) {
      // Equal to far more digits than are shown (bias is displayed to 0.1 %).
      expect(incremental[key], key).toBeCloseTo(fromScratch[key], 9);
    }
  });

  it('when every submission is removed again, then the sums return to empty', () => {
    const records = randomRecords(21, 10);
    let sums = biasSumsOf(records);

    for (const r of records) sums = removeFromBiasSums(sums, r);

    expect(sums.submissionCount).toBe(0);
    for (const value of Object.values(sums)) expect(value).toBeCloseTo(0, 9);
  });

  it('when a submission is removed from empty sums, then it is refused', () => {
    expect(() => removeFromBiasSums(EMPTY_BIAS_SUMS, record(1, 1, 'a'))).toThrow(RangeError);
  });
});

describe('weighted median', () => {
  it('when weights are equal, then it is the ordinary median for odd and even counts', () => {
    expect(weightedMedian([5, 1, 3], [2, 2, 2])).toBe(median([5, 1, 3]));
    expect(weightedMedian([4, 1, 3, 2], [1, 1, 1, 1])).toBe(median([4, 1, 3, 2]));
  });

  it('when one value carries more than half the weight, then it is the median', () => {
    expect(weightedMedian([1, 2, 10], [1, 1, 4])).toBe(10);
  });
});
