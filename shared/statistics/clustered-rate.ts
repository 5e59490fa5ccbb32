import type { Interval } from './binomial';
import { studentTQuantile, studentTTwoSidedP } from './distributions';
import { poissonRate, rateRatio } from './poisson';

/**
 * A scope's events and exposure with the sums over riders (clusters) that the
 * rider-clustered variances need: G riders, Σ Eᵣ², Σ Eᵣ·Tᵣ, Σ Tᵣ² and Σ Eᵣ²/Tᵣ of each
 * rider's events Eᵣ and hours Tᵣ. Kept as running sums in meter_statistics.
 */
export interface ClusteredRateSums {
  events: number;
  exposure: number;
  clusters: number;
  sumEventsSquared: number;
  sumEventsExposure: number;
  sumExposureSquared: number;
  sumEventsSquaredPerExposure: number;
}

/** Which interval is shown: the rider-clustered one, or the exact Poisson one where the riders show no overdispersion. */
export type RateMethod = 'rider_clustered' | 'poisson_exact';

export interface ClusteredRate extends Interval {
  rate: number;
  method: RateMethod;
}

export interface ClusteredRateRatio extends Interval {
  /** Infinity when the second group has no events, null when neither has. */
  ratio: number | null;
  pValue: number;
  method: RateMethod;
}

interface LogRate {
  logRate: number;
  variance: number;
  degreesOfFreedom: number;
}

/**
 * The rate λ̂ = Σ Eᵣ / Σ Tᵣ on the log scale, with the larger of two variances that
 * both take the rider as the unit:
 * - the rider-clustered (sandwich) variance Var(λ̂) = G/(G − 1) · Σ (Eᵣ − λ̂Tᵣ)² / (Σ Tᵣ)²,
 *   the residuals summed within each rider (Liang & Zeger, Biometrika 1986;73:13–22,
 *   with the G/(G − 1) factor of Stata's CR1), which assumes nothing about how riders
 *   differ but is noisy and too small on average with few riders;
 * - the quasi-Poisson variance φ̂·λ̂ / Σ Tᵣ with the dispersion from the riders' Pearson
 *   residuals, φ̂ = Σ (Eᵣ − λ̂Tᵣ)² / (λ̂Tᵣ) / (G − 1) (McCullagh & Nelder, Generalized
 *   Linear Models, 2nd ed., §6.2), steadier but tied to variance ∝ mean.
 * The larger one guards against the other's failure; Var(log λ̂) = Var(λ̂)/λ̂² (delta
 * method) on G − 1 degrees of freedom (few clusters: Bell & McCaffrey, Survey
 * Methodology 2002;28:169–181). `npm run validate:statistics` checks the coverage. Null
 * without events or with fewer than two riders.
 */
function logRateOf(s: ClusteredRateSums): LogRate | null {
  if (!(s.events > 0 && s.exposure > 0 && s.clusters >= 2)) return null;
  const rate = s.events / s.exposure;
  const residualSquares = Math.max(0, s.sumEventsSquared - 2 * rate * s.sumEventsExposure + rate * rate * s.sumExposureSquared);
  const sandwich = ((s.clusters / (s.clusters - 1)) * residualSquares) / (s.exposure * s.exposure);
  // Σ (Eᵣ − λTᵣ)² / (λTᵣ) = Σ Eᵣ²/Tᵣ / λ − 2 Σ Eᵣ + λ Σ Tᵣ = Σ Eᵣ²/Tᵣ / λ − Σ Eᵣ.
  const pearson = Math.max(0, s.sumEventsSquaredPerExposure / rate - s.events);
  const quasiPoisson = ((pearson / (s.clusters - 1)) * rate) / s.exposure;
  const variance = Math.max(sandwich, quasiPoisson);
  return { logRate: Math.log(rate), variance: variance / (rate * rate), degreesOfFreedom: s.clusters - 1 };
}

/**
 * The rate with the wider of the rider-clustered and exact Poisson intervals on each
 * side: riders who differ widen it, but it is never narrower than the exact interval
 * (which is right when every hour is alike). The method says whether the clustered
 * interval widened it.
 */
export function clusteredRate(s: ClusteredRateSums, confidence = 0.95): ClusteredRate {
  const exact = poissonRate(s.events, s.exposure, confidence);
  const log = logRateOf(s);
  if (!log) return { ...exact, method: 'poisson_exact' };
  const halfWidth = studentTQuantile(1 - (1 - confidence) / 2, log.degreesOfFreedom) * Math.sqrt(log.variance);
  const lower = Math.exp(log.logRate - halfWidth);
  const upper = Math.exp(log.logRate + halfWidth);
  if (lower >= exact.lower && upper <= exact.upper) return { ...exact, method: 'poisson_exact' };
  return { rate: exact.rate, lower: Math.min(lower, exact.lower), upper: Math.max(upper, exact.upper), method: 'rider_clustered' };
}

/**
 * Rate of `a` over rate of `b`: the difference of the log rates with the two clustered
 * variances added (the groups' riders taken as independent, which is conservative when
 * the same riders rode both) on Welch–Satterthwaite degrees of freedom; the interval is
 * the wider of this and the exact conditional one on each side, the p-value the larger.
 */
export function clusteredRateRatio(a: ClusteredRateSums, b: ClusteredRateSums, confidence = 0.95): ClusteredRateRatio {
  const exact = rateRatio(a.events, a.exposure, b.events, b.exposure, confidence);
  const logA = logRateOf(a);
  const logB = logRateOf(b);
  if (!logA || !logB) return { ...exact, method: 'poisson_exact' };
  const variance = logA.variance + logB.variance;
  if (!(variance > 0)) return { ...exact, method: 'poisson_exact' };
  const degreesOfFreedom =
    (variance * variance) / (logA.variance ** 2 / logA.degreesOfFreedom + logB.variance ** 2 / logB.degreesOfFreedom);
  const logRatio = logA.logRate - logB.logRate;
  const halfWidth = studentTQuantile(1 - (1 - confidence) / 2, degreesOfFreedom) * Math.sqrt(variance);
  const lower = Math.exp(logRatio - halfWidth);
  const upper = Math.exp(logRatio + halfWidth);
  const pValue = studentTTwoSidedP(logRatio / Math.sqrt(variance), degreesOfFreedom);
  if (lower >= exact.lower && upper <= exact.upper && pValue <= exact.pValue) return { ...exact, method: 'poisson_exact' };
  return {
    ratio: exact.ratio,
    lower: Math.min(lower, exact.lower),
    upper: Math.max(upper, exact.upper),
    pValue: Math.max(pValue, exact.pValue),
    method: 'rider_clustered',
  };
}
