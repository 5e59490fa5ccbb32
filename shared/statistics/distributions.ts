import { gammaln } from 'simple-statistics';

// simple-statistics has no incomplete gamma or beta function, no t or chi-square
// CDF and only a table-based normal CDF and a rough probit, so the continuous
// distributions the scoreboards need are built here on its log-gamma.

const MAX_ITERATIONS = 100_000;
const EPSILON = 1e-15;
const TINY = 1e-300;

/**
 * Regularised lower incomplete gamma function P(a, x): the series for x < a + 1,
 * otherwise 1 − Q from the continued fraction (Press et al., Numerical Recipes,
 * 3rd ed., 2007, §6.2, gser/gcf).
 */
export function regularizedGammaP(a: number, x: number): number {
  assertPositive(a, 'a');
  if (x <= 0) return 0;
  if (x === Infinity) return 1;
  return x < a + 1 ? gammaSeries(a, x) : 1 - gammaContinuedFraction(a, x);
}

/** Regularised upper incomplete gamma function Q(a, x) = 1 − P(a, x), accurate in the far upper tail. */
export function regularizedGammaQ(a: number, x: number): number {
  assertPositive(a, 'a');
  if (x <= 0) return 1;
  if (x === Infinity) return 0;
  return x < a + 1 ? 1 - gammaSeries(a, x) : gammaContinuedFraction(a, x);
}

function gammaSeries(a: number, x: number): number {
  let term = 1 / a;
  let sum = term;
  for (let n = 1; n < MAX_ITERATIONS; n++) {
    term *= x / (a + n);
    sum += term;
    if (Math.abs(term) < Math.abs(sum) * EPSILON) break;
  }
  return sum * Math.exp(-x + a * Math.log(x) - gammaln(a));
}

/** Q(a, x) by the modified Lentz method. */
function gammaContinuedFraction(a: number, x: number): number {
  let b = x + 1 - a;
  let c = 1 / TINY;
  let d = 1 / b;
  let h = d;
  for (let i = 1; i < MAX_ITERATIONS; i++) {
    const an = -i * (i - a);
    b += 2;
    d = an * d + b;
    if (Math.abs(d) < TINY) d = TINY;
    c = b + an / c;
    if (Math.abs(c) < TINY) c = TINY;
    d = 1 / d;
    const delta = d * c;
    h *= delta;
    if (Math.abs(delta - 1) < EPSILON) break;
  }
  return Math.exp(-x + a * Math.log(x) - gammaln(a)) * h;
}

/**
 * Regularised incomplete beta function I_x(a, b) by its continued fraction with
 * the modified Lentz method (Numerical Recipes, 3rd ed., §6.4, betai/betacf).
 */
export function regularizedBeta(x: number, a: number, b: number): number {
  assertPositive(a, 'a');
  assertPositive(b, 'b');
  if (x <= 0) return 0;
  if (x >= 1) return 1;
  const logFront = gammaln(a + b) - gammaln(a) - gammaln(b) + a * Math.log(x) + b * Math.log1p(-x);
  // The fraction converges fast only on this side of the mean; use the symmetry otherwise.
  if (x < (a + 1) / (a + b + 2)) return (Math.exp(logFront) * betaContinuedFraction(x, a, b)) / a;
  return 1 - (Math.exp(logFront) * betaContinuedFraction(1 - x, b, a)) / b;
}

function betaContinuedFraction(x: number, a: number, b: number): number {
  const qab = a + b;
  const qap = a + 1;
  const qam = a - 1;
  let c = 1;
  let d = 1 - (qab * x) / qap;
  if (Math.abs(d) < TINY) d = TINY;
  d = 1 / d;
  let h = d;
  for (let m = 1; m < MAX_ITERATIONS; m++) {
    const m2 = 2 * m;
    let aa = (m * (b - m) * x) / ((qam + m2) * (a + m2));
    d = 1 + aa * d;
    if (Math.abs(d) < TINY) d = TINY;
    c = 1 + aa / c;
    if (Math.abs(c) < TINY) c = TINY;
    d = 1 / d;
    h *= d * c;
    aa = (-(a + m) * (qab + m) * x) / ((a + m2) * (qap + m2));
    d = 1 + aa * d;
    if (Math.abs(d) < TINY) d = TINY;
    c = 1 + aa / c;
    if (Math.abs(c) < TINY) c = TINY;
    d = 1 / d;
    const delta = d * c;
    h *= delta;
    if (Math.abs(delta - 1) < EPSILON) break;
  }
  return h;
}

/** Lower-tail quantile of the gamma distribution with shape a and scale 1: the x with P(a, x) = p. */
export function gammaQuantile(p: number, a: number): number {
  assertPositive(a, 'a');
  assertProbability(p);
  if (p === 0) return 0;
  if (p === 1) return Infinity;
  const logDensity = (x: number) => (a - 1) * Math.log(x) - x - gammaln(a);
  // Solve on whichever tail is the smaller probability: 1 − p loses digits near 1.
  const excess = p <= 0.5 ? (x: number) => regularizedGammaP(a, x) - p : (x: number) => 1 - p - regularizedGammaQ(a, x);
  return solveIncreasing(excess, (x) => Math.exp(logDensity(x)), 0, Infinity, wilsonHilfertyStart(p, a));
}

/** Quantile of the chi-square distribution with k degrees of freedom. */
export function chiSquareQuantile(p: number, degreesOfFreedom: number): number {
  return 2 * gammaQuantile(p, degreesOfFreedom / 2);
}

/** Lower-tail CDF of the chi-square distribution with k degrees of freedom. */
export function chiSquareCdf(x: number, degreesOfFreedom: number): number {
  return regularizedGammaP(degreesOfFreedom / 2, x / 2);
}

/** Lower-tail quantile of the beta distribution: the x with I_x(a, b) = p. */
export function betaQuantile(p: number, a: number, b: number): number {
  assertPositive(a, 'a');
  assertPositive(b, 'b');
  assertProbability(p);
  if (p === 0) return 0;
  if (p === 1) return 1;
  // Upper half by symmetry, I_x(a, b) = 1 − I_{1−x}(b, a), so that p near 1 keeps its digits.
  if (p > 0.5) return 1 - betaQuantile(1 - p, b, a);
  const logBeta = gammaln(a) + gammaln(b) - gammaln(a + b);
  const density = (x: number) => Math.exp((a - 1) * Math.log(x) + (b - 1) * Math.log1p(-x) - logBeta);
  return solveIncreasing((x) => regularizedBeta(x, a, b) - p, density, 0, 1, a / (a + b));
}

/** CDF of Student's t distribution, from I_{ν/(ν+t²)}(ν/2, 1/2) (Abramowitz & Stegun 26.7.1). */
export function studentTCdf(t: number, degreesOfFreedom: number): number {
  assertPositive(degreesOfFreedom, 'degrees of freedom');
  if (Number.isNaN(t)) return NaN;
  const tail = studentTUpperTail(Math.abs(t), degreesOfFreedom);
  return t >= 0 ? 1 - tail : tail;
}

/** Quantile of Student's t distribution. */
export function studentTQuantile(p: number, degreesOfFreedom: number): number {
  assertPositive(degreesOfFreedom, 'degrees of freedom');
  assertProbability(p);
  if (p === 0.5) return 0;
  // Solve on the smaller tail: 1 − p would lose the digits of a tiny p.
  return p < 0.5 ? -studentTUpperQuantile(p, degreesOfFreedom) : studentTUpperQuantile(1 - p, degreesOfFreedom);
}

/** The t ≥ 0 with P(T > t) = q, for q ≤ 1/2. */
function studentTUpperQuantile(q: number, nu: number): number {
  if (q === 0) return Infinity;
  const logNormaliser = gammaln((nu + 1) / 2) - gammaln(nu / 2) - 0.5 * Math.log(nu * Math.PI);
  const density = (t: number) => Math.exp(logNormaliser - ((nu + 1) / 2) * Math.log1p((t * t) / nu));
  return solveIncreasing((t) => q - studentTUpperTail(t, nu), density, 0, Infinity, normalQuantileUpper(q));
}

/** Two-sided p-value of a t statistic. */
export function studentTTwoSidedP(t: number, degreesOfFreedom: number): number {
  return Math.min(1, 2 * studentTUpperTail(Math.abs(t), degreesOfFreedom));
}

/** P(T > t) for t ≥ 0. */
function studentTUpperTail(t: number, nu: number): number {
  if (t === Infinity) return 0;
  // Beyond ~10⁷ degrees of freedom t and the normal differ by less than 1e-7 and the fraction would be slow.
  if (nu > 1e7) return 0.5 * regularizedGammaQ(0.5, (t * t) / 2);
  return 0.5 * regularizedBeta(nu / (nu + t * t), nu / 2, 0.5);
}

/** Upper-tail standard normal quantile z with P(Z > z) = q, from Q(1/2, z²/2) = 2·P(Z > z) for z ≥ 0. */
function normalQuantileUpper(q: number): number {
  if (q >= 0.5) return 0;
  return Math.sqrt(2 * gammaQuantile(1 - 2 * q, 0.5));
}

/**
 * Starting point for the gamma quantile: Wilson & Hilferty's cube-root normal
 * approximation (Proc. Natl Acad. Sci. 1931;17:684–688), with the normal
 * quantile from Abramowitz & Stegun 26.2.22; Newton's method does the rest.
 */
function wilsonHilfertyStart(p: number, a: number): number {
  const tail = p < 0.5 ? p : 1 - p;
  const t = Math.sqrt(-2 * Math.log(tail));
  let z = t - (2.30753 + 0.27061 * t) / (1 + 0.99229 * t + 0.04481 * t * t);
  if (p < 0.5) z = -z;
  const cube = 1 - 1 / (9 * a) + z / (3 * Math.sqrt(a));
  return Math.max(1e-3, a * cube * cube * cube);
}

/**
 * Root of an increasing function on (lower, upper) by Newton's method kept inside
 * a shrinking bracket, falling back to bisection (or doubling while the upper end
 * is open) whenever a step would leave it.
 */
function solveIncreasing(f: (x: number) => number, derivative: (x: number) => number, lower: number, upper: number, start: number): number {
  let low = lower;
  let high = upper;
  let x = start > low && start < high ? start : Number.isFinite(high) ? (low + high) / 2 : low + 1;
  for (let i = 0; i < 1000; i++) {
    const value = f(x);
    if (value === 0) return x;
    if (value < 0) low = x;
    else high = x;
    let next = x - value / derivative(x);
    if (!(next > low && next < high)) next = Number.isFinite(high) ? (low + high) / 2 : Math.max(2 * x, x + 1);
    if (Math.abs(next - x) <= 4 * Number.EPSILON * Math.abs(next) || next === low || next === high) return next;
    x = next;
  }
  return x;
}

function assertPositive(value: number, name: string): void {
  if (!(value > 0)) throw new RangeError(`${name} must be positive, got ${value}`);
}

function assertProbability(p: number): void {
  if (!(p >= 0 && p <= 1)) throw new RangeError(`probability must be within [0, 1], got ${p}`);
}
