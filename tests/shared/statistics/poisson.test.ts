import { describe, expect, it } from 'vitest';
import { poissonCountInterval, poissonRate, rateRatio } from '@shared/statistics/poisson';

describe('exact Poisson interval for a count (Garwood 1936)', () => {
  // Garwood, Biometrika 1936;28:437–442; the same figures as R's poisson.test(x)$conf.int.
  it.each([
    [0, 0, 3.688879],
    [1, 0.025318, 5.571643],
    [5, 1.623486, 11.668332],
    [10, 4.795389, 18.390356],
  ])('when %i events are counted, then the 95 %% interval is %f to %f', (count, lower, upper) => {
    const interval = poissonCountInterval(count);

    expect(interval.lower).toBeCloseTo(lower, 6);
    expect(interval.upper).toBeCloseTo(upper, 6);
  });

  it('when 25 events are counted, then the interval is 16.18 to 36.90', () => {
    // GraphPad's published example of the exact Poisson confidence interval for a count of 25.
    const interval = poissonCountInterval(25);

    expect(interval.lower).toBeCloseTo(16.18, 2);
    expect(interval.upper).toBeCloseTo(36.9, 2);
  });
});

describe('exact Poisson rate', () => {
  it('when 137 events occur in 24.19893 units, then the rate and interval match R', () => {
    // R poisson.test documentation example: poisson.test(137, 24.19893) gives rate 5.661407,
    // 95 percent confidence interval 4.753125 6.692709.
    const result = poissonRate(137, 24.19893);

    expect(result.rate).toBeCloseTo(5.661407, 6);
    expect(result.lower).toBeCloseTo(4.753125, 6);
    expect(result.upper).toBeCloseTo(6.692709, 6);
  });

  it('when the exposure is not positive, then it refuses it', () => {
    expect(() => poissonRate(3, 0)).toThrow(RangeError);
  });
});

describe('ratio of two Poisson rates (conditional exact test)', () => {
  it('when 11 events over 800 are compared with 21 over 3011, then ratio, interval and p match R', () => {
    // R poisson.test documentation example: poisson.test(c(11, 6 + 8 + 7), c(800, 1083 + 1050 + 878))
    // gives rate ratio 1.971488, 95 percent confidence interval 0.8584264 4.2772659, p-value = 0.07967.
    const result = rateRatio(11, 800, 21, 3011);

    expect(result.ratio).toBeCloseTo(1.971488, 6);
    expect(result.lower).toBeCloseTo(0.8584264, 7);
    expect(result.upper).toBeCloseTo(4.2772659, 7);
    expect(result.pValue).toBeCloseTo(0.07967, 5);
  });

  it('when the two groups are swapped, then the ratio and limits invert and p is unchanged', () => {
    const forward = rateRatio(11, 800, 21, 3011);
    const backward = rateRatio(21, 3011, 11, 800);

    expect(backward.ratio).toBeCloseTo(1 / forward.ratio!, 12);
    expect(backward.lower).toBeCloseTo(1 / forward.upper, 10);
    expect(backward.upper).toBeCloseTo(1 / forward.lower, 10);
    expect(backward.pValue).toBeCloseTo(forward.pValue, 12);
  });

  it('when the second group has no events, then the ratio and its upper limit are unbounded', () => {
    const result = rateRatio(4, 10, 0, 10);

    expect(result.ratio).toBe(Infinity);
    expect(result.upper).toBe(Infinity);
    expect(result.lower).toBeGreaterThan(0);
  });

  it('when neither group has events, then there is no ratio and p is 1', () => {
    expect(rateRatio(0, 10, 0, 20)).toEqual({ ratio: null, lower: 0, upper: Infinity, pValue: 1 });
  });
});
