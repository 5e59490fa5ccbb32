import { gammaln } from 'simple-statistics';
import { betaQuantile } from './distributions';

export interface Interval {
  lower: number;
  upper: number;
}

export interface BinomialTest extends Interval {
  estimate: number;
  pValue: number;
}

/**
 * Exact (Clopper & Pearson, Biometrika 1934;26:404–413) confidence interval for a
 * binomial proportion from beta quantiles, as R's binom.test computes it.
 */
export function clopperPearsonInterval(successes: number, trials: number, confidence = 0.95): Interval {
  assertCounts(successes, trials);
  const alpha = 1 - confidence;
  return {
    lower: successes === 0 ? 0 : betaQuantile(alpha / 2, successes, trials - successes + 1),
    upper: successes === trials ? 1 : betaQuantile(1 - alpha / 2, successes + 1, trials - successes),
  };
}

/**
 * Exact two-sided binomial test: the p-value sums the probabilities of every
 * outcome no more likely than the one observed, with R's relative tolerance of
 * 1e-7 so that ties are not lost to rounding (R stats::binom.test).
 */
export function binomialTest(successes: number, trials: number, probability: number, confidence = 0.95): BinomialTest {
  assertCounts(successes, trials);
  if (!(probability > 0 && probability < 1)) throw new RangeError(`probability must be within (0, 1), got ${probability}`);
  const interval = clopperPearsonInterval(successes, trials, confidence);
  return { estimate: successes / trials, ...interval, pValue: twoSidedP(successes, trials, probability) };
}

function twoSidedP(successes: number, trials: number, probability: number): number {
  if (successes === trials * probability) return 1;
  const logOf = binomialLogProbabilities(trials, probability);
  const threshold = logOf(successes) + Math.log1p(1e-7);
  let sum = 0;
  for (let k = 0; k <= trials; k++) {
    const logProbability = logOf(k);
    if (logProbability <= threshold) sum += Math.exp(logProbability);
  }
  return Math.min(1, sum);
}

function binomialLogProbabilities(n: number, p: number): (k: number) => number {
  const logNFactorial = gammaln(n + 1);
  const logP = Math.log(p);
  const logQ = Math.log1p(-p);
  return (k) => logNFactorial - gammaln(k + 1) - gammaln(n - k + 1) + k * logP + (n - k) * logQ;
}

function assertCounts(successes: number, trials: number): void {
  if (!Number.isInteger(trials) || trials < 1) throw new RangeError(`trials must be a positive integer, got ${trials}`);
  if (!Number.isInteger(successes) || successes < 0 || successes > trials) {
    throw new RangeError(`successes must be an integer within [0, ${trials}], got ${successes}`);
  }
}
