import { binomialTest, type Interval } from './binomial';
import { gammaQuantile } from './distributions';

export interface RateEstimate extends Interval {
  rate: number;
}

export interface RateRatio extends Interval {
  /** (events1 / exposure1) / (events2 / exposure2); Infinity when the second group has no events, null when neither has. */
  ratio: number | null;
  /** Two-sided p-value for a ratio of 1. */
  pValue: number;
}

/**
 * Exact confidence interval for a Poisson count (Garwood, Biometrika 1936;28:437–442),
 * written with gamma quantiles: lower = G⁻¹(α/2; x), upper = G⁻¹(1 − α/2; x + 1),
 * which equal the usual χ²(2x)/2 and χ²(2x + 2)/2.
 */
export function poissonCountInterval(count: number, confidence = 0.95): Interval {
  assertCount(count, 'count');
  const alpha = 1 - confidence;
  return {
    lower: count === 0 ? 0 : gammaQuantile(alpha / 2, count),
    upper: gammaQuantile(1 - alpha / 2, count + 1),
  };
}

/** Events per unit of exposure (e.g. dropouts per pedalling hour) with the exact interval of the count scaled by the exposure. */
export function poissonRate(events: number, exposure: number, confidence = 0.95): RateEstimate {
  assertExposure(exposure);
  const count = poissonCountInterval(events, confidence);
  return { rate: events / exposure, lower: count.lower / exposure, upper: count.upper / exposure };
}

/**
 * Ratio of two Poisson rates with the exact conditional method: given the total
 * x1 + x2, x1 is binomial with p = t1 / (t1 + t2) when the rates are equal, so the
 * test is the exact binomial test and the interval is the Clopper–Pearson interval
 * for p mapped through ratio = p / (1 − p) · t2 / t1 (as R's poisson.test does).
 */
export function rateRatio(events1: number, exposure1: number, events2: number, exposure2: number, confidence = 0.95): RateRatio {
  assertCount(events1, 'events1');
  assertCount(events2, 'events2');
  assertExposure(exposure1);
  assertExposure(exposure2);
  const total = events1 + events2;
  if (total === 0) return { ratio: null, lower: 0, upper: Infinity, pValue: 1 };
  const test = binomialTest(events1, total, exposure1 / (exposure1 + exposure2), confidence);
  const toRatio = (p: number) => (p === 1 ? Infinity : (p / (1 - p)) * (exposure2 / exposure1));
  return {
    ratio: events2 === 0 ? Infinity : events1 / exposure1 / (events2 / exposure2),
    lower: toRatio(test.lower),
    upper: toRatio(test.upper),
    pValue: test.pValue,
  };
}

function assertCount(value: number, name: string): void {
  if (!Number.isInteger(value) || value < 0) throw new RangeError(`${name} must be a non-negative integer, got ${value}`);
}

function assertExposure(exposure: number): void {
  if (!(exposure > 0 && Number.isFinite(exposure))) throw new RangeError(`exposure must be positive, got ${exposure}`);
}
