import { chiSquaredDistributionTable } from 'simple-statistics';
import { describe, expect, it } from 'vitest';
import {
  betaQuantile,
  chiSquareCdf,
  chiSquareQuantile,
  gammaQuantile,
  regularizedBeta,
  regularizedGammaP,
  regularizedGammaQ,
  studentTCdf,
  studentTQuantile,
  studentTTwoSidedP,
} from '@shared/statistics/distributions';

const relativeError = (actual: number, expected: number) => Math.abs(actual - expected) / Math.abs(expected);

describe('incomplete gamma function', () => {
  it('when the shape is 1, then P(1, x) is the exponential CDF 1 − e^−x', () => {
    for (const x of [0.01, 0.5, 1, 3, 10, 40]) {
      expect(regularizedGammaP(1, x)).toBeCloseTo(-Math.expm1(-x), 14);
    }
  });

  it('when the shape is 1/2, then P(1/2, x²) is erf(x)', () => {
    // Abramowitz & Stegun, Handbook of Mathematical Functions, Table 7.1: erf(0.5) = 0.5204998778, erf(1) = 0.8427007929, erf(2) = 0.9953222650.
    expect(regularizedGammaP(0.5, 0.25)).toBeCloseTo(0.5204998778, 10);
    expect(regularizedGammaP(0.5, 1)).toBeCloseTo(0.8427007929, 10);
    expect(regularizedGammaP(0.5, 4)).toBeCloseTo(0.995322265, 9);
  });

  it('when the upper tail is tiny, then Q keeps its relative accuracy', () => {
    // Q(1, x) = e^−x exactly.
    expect(relativeError(regularizedGammaQ(1, 60), Math.exp(-60))).toBeLessThan(1e-12);
    // Q(2, x) = (1 + x)e^−x exactly.
    expect(relativeError(regularizedGammaQ(2, 50), 51 * Math.exp(-50))).toBeLessThan(1e-12);
  });
});

describe('incomplete beta function', () => {
  it('when one parameter is 1, then it matches the closed forms x^a and 1 − (1 − x)^b', () => {
    for (const x of [0.001, 0.2, 0.5, 0.9, 0.999]) {
      expect(regularizedBeta(x, 3.5, 1)).toBeCloseTo(x ** 3.5, 13);
      expect(regularizedBeta(x, 1, 7)).toBeCloseTo(1 - (1 - x) ** 7, 13);
    }
  });

  it('when a equals b, then the distribution is symmetric about one half', () => {
    expect(regularizedBeta(0.5, 40, 40)).toBeCloseTo(0.5, 13);
    expect(regularizedBeta(0.3, 6, 6) + regularizedBeta(0.7, 6, 6)).toBeCloseTo(1, 13);
  });
});

describe('quantiles', () => {
  it('when quantiles are fed back to their CDFs, then the probability comes back', () => {
    for (const p of [1e-8, 0.001, 0.025, 0.3, 0.5, 0.8, 0.975, 0.999999]) {
      for (const shape of [0.3, 1, 5.5, 200, 1e5]) {
        expect(relativeError(regularizedGammaP(shape, gammaQuantile(p, shape)), p)).toBeLessThan(1e-9);
      }
      for (const [a, b] of [
        [0.5, 0.5],
        [1, 40],
        [11, 22],
        [500, 3],
      ]) {
        expect(relativeError(regularizedBeta(betaQuantile(p, a, b), a, b), p)).toBeLessThan(1e-9);
      }
      for (const df of [1, 3.7, 30, 5000]) {
        expect(relativeError(studentTCdf(studentTQuantile(p, df), df), p)).toBeLessThan(1e-9);
      }
    }
  });

  it('when the chi-square has 2 degrees of freedom, then the quantile is −2 ln(1 − p)', () => {
    for (const p of [0.01, 0.5, 0.975]) {
      expect(chiSquareQuantile(p, 2)).toBeCloseTo(-2 * Math.log1p(-p), 12);
    }
  });

  it("when compared with simple-statistics' chi-square table, then every entry agrees within one unit of its last decimal", () => {
    // Not half a unit: nine of its entries are rounded the wrong way (e.g. df 6, upper tail 0.10: 10.65 for 10.6446).
    for (const [df, row] of Object.entries(chiSquaredDistributionTable)) {
      for (const [upperTail, tabled] of Object.entries(row)) {
        const ours = chiSquareQuantile(1 - Number(upperTail), Number(df));
        expect(Math.abs(ours - tabled), `df ${df}, upper tail ${upperTail}`).toBeLessThanOrEqual(0.01);
      }
    }
  });

  it('when the chi-square CDF is evaluated at a NIST critical value, then it gives the tabled probability', () => {
    // NIST/SEMATECH e-Handbook §1.3.6.7.4: upper 5 % critical value of χ² with 10 df is 18.307.
    expect(chiSquareCdf(18.307, 10)).toBeCloseTo(0.95, 4);
  });
});

describe("Student's t distribution", () => {
  it('when there is 1 degree of freedom, then it is the Cauchy distribution', () => {
    for (const t of [-30, -1, 0.3, 4]) expect(studentTCdf(t, 1)).toBeCloseTo(0.5 + Math.atan(t) / Math.PI, 13);
    // tan(0.475π) = 12.706204736…
    expect(studentTQuantile(0.975, 1)).toBeCloseTo(Math.tan(0.475 * Math.PI), 9);
  });

  it('when there are 2 degrees of freedom, then the CDF is 1/2 + t / (2√(2 + t²))', () => {
    for (const t of [-5, -0.2, 1, 9]) expect(studentTCdf(t, 2)).toBeCloseTo(0.5 + t / (2 * Math.sqrt(2 + t * t)), 13);
    expect(studentTQuantile(0.975, 2)).toBeCloseTo(0.95 / Math.sqrt(2 * 0.975 * 0.025), 10);
  });

  it('when compared with the NIST table of critical values, then the 97.5 % quantiles agree', () => {
    // NIST/SEMATECH e-Handbook §1.3.6.7.2, upper critical values of the t distribution (α = 0.025).
    expect(studentTQuantile(0.975, 10)).toBeCloseTo(2.228, 3);
    expect(studentTQuantile(0.975, 30)).toBeCloseTo(2.042, 3);
    expect(studentTQuantile(0.975, 100)).toBeCloseTo(1.984, 3);
  });

  it('when the degrees of freedom are huge, then the quantile is the normal 1.959964', () => {
    // Abramowitz & Stegun Table 26.5: the normal 97.5 % point is 1.959963985.
    expect(studentTQuantile(0.975, 1e9)).toBeCloseTo(1.959963985, 8);
    expect(studentTQuantile(0.975, 5e6)).toBeCloseTo(1.959964, 5);
  });

  it('when the statistic is at the 97.5 % quantile, then the two-sided p-value is 0.05', () => {
    expect(studentTTwoSidedP(studentTQuantile(0.975, 17.3), 17.3)).toBeCloseTo(0.05, 12);
    expect(studentTTwoSidedP(-studentTQuantile(0.975, 17.3), 17.3)).toBeCloseTo(0.05, 12);
  });
});
