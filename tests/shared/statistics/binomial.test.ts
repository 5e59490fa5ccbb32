import { describe, expect, it } from 'vitest';
import { binomialTest, clopperPearsonInterval } from '@shared/statistics/binomial';

// Check values: R's stats::binom.test output for these calls, as printed in the
// tutorial "r binom test confidence interval" (13 November 2020).
describe('exact binomial test', () => {
  it('when 9 successes in 24 trials are tested against 1/6, then p and the interval match R', () => {
    const result = binomialTest(9, 24, 1 / 6);

    // R: p-value = 0.01176; 95 percent confidence interval 0.1879929 0.5940636.
    expect(result.pValue).toBeCloseTo(0.01176, 5);
    expect(result.lower).toBeCloseTo(0.1879929, 7);
    expect(result.upper).toBeCloseTo(0.5940636, 7);
    expect(result.estimate).toBeCloseTo(0.375, 12);
  });

  it('when 1 success in 1497 trials is tested against 0.0033 at 90 %, then p and the interval match R', () => {
    const result = binomialTest(1, 1497, 0.0033, 0.9);

    // R: p-value = 0.1062; 90 percent confidence interval 3.426347e-05 3.164954e-03.
    expect(result.pValue).toBeCloseTo(0.1062, 4);
    expect(result.lower / 3.426347e-5).toBeCloseTo(1, 6);
    expect(result.upper / 3.164954e-3).toBeCloseTo(1, 6);
  });

  it('when there are no successes or only successes, then the interval reaches 0 or 1', () => {
    const none = clopperPearsonInterval(0, 20);
    const all = clopperPearsonInterval(20, 20);

    // Closed forms: upper = 1 − (α/2)^(1/n) with no successes, lower = (α/2)^(1/n) with all.
    expect(none.lower).toBe(0);
    expect(none.upper).toBeCloseTo(1 - 0.025 ** (1 / 20), 12);
    expect(all.lower).toBeCloseTo(0.025 ** (1 / 20), 12);
    expect(all.upper).toBe(1);
  });

  it('when the observed count equals its expectation, then the p-value is 1', () => {
    expect(binomialTest(5, 10, 0.5).pValue).toBe(1);
  });

  it('when the counts are not integers within range, then it refuses them', () => {
    expect(() => binomialTest(11, 10, 0.5)).toThrow(RangeError);
    expect(() => binomialTest(2.5, 10, 0.5)).toThrow(RangeError);
  });
});
