import { tTestTwoSample } from 'simple-statistics';
import { describe, expect, it } from 'vitest';
import { welchTest, welchTestFromSamples } from '@shared/statistics/welch';

describe("Welch's t-test", () => {
  it('when the NIST AUTO83B summary statistics are compared, then T and the degrees of freedom match the handbook', () => {
    // NIST/SEMATECH e-Handbook of Statistical Methods §1.3.5.3, AUTO83B data (US vs Japanese cars, mpg):
    // T = −12.946, ν = 136.87 for unequal variances.
    const result = welchTest({ n: 249, mean: 20.14458, sd: 6.4147 }, { n: 79, mean: 30.48101, sd: 6.10771 })!;

    expect(result.t).toBeCloseTo(-12.946, 3);
    expect(result.degreesOfFreedom).toBeCloseTo(136.87, 2);
    expect(result.pValue).toBeLessThan(1e-20);
  });

  it('when the R documentation samples are compared, then t, df, p and the interval match R', () => {
    // R t.test documentation example: t.test(1:10, y = c(7:20, 200)) gives t = −1.6329, df = 14.165,
    // p-value = 0.1245, 95 percent confidence interval −47.242900 6.376233.
    const first = Array.from({ length: 10 }, (_, i) => i + 1);
    const second = [...Array.from({ length: 14 }, (_, i) => i + 7), 200];

    const result = welchTestFromSamples(first, second)!;

    expect(result.t).toBeCloseTo(-1.6329, 4);
    expect(result.degreesOfFreedom).toBeCloseTo(14.165, 3);
    expect(result.pValue).toBeCloseTo(0.1245, 4);
    expect(result.lower).toBeCloseTo(-47.2429, 4);
    expect(result.upper).toBeCloseTo(6.376233, 5);
  });

  it("when both groups are the same size, then t equals simple-statistics' pooled t", () => {
    // With n1 = n2 Welch's and Student's statistics coincide (only the degrees of freedom differ).
    const first = [1.2, 0.4, 2.2, 1.9, 0.7, 1.1];
    const second = [2.0, 2.9, 1.4, 3.3, 2.6, 2.4];

    expect(welchTestFromSamples(first, second)!.t).toBeCloseTo(tTestTwoSample(first, second)!, 12);
  });

  it('when a group has a single value, then there is no test', () => {
    expect(welchTestFromSamples([1], [1, 2, 3])).toBeNull();
  });
});
