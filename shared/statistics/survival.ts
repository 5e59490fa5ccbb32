import type { Interval } from './binomial';
import { chiSquareCdf, chiSquareQuantile, studentTTwoSidedP } from './distributions';

/** One battery (or any unit followed until an event): its time, and whether the event was seen or it was still running. */
export interface SurvivalObservation {
  time: number;
  /** true: the event happened at `time` (the battery ran flat); false: censored (still running, or changed early). */
  event: boolean;
}

export interface SurvivalStep extends Interval {
  time: number;
  atRisk: number;
  events: number;
  censored: number;
  /** The Kaplan–Meier estimate of S(time), just after the events at `time`. */
  survival: number;
  /** Greenwood's standard error of log S. */
  standardErrorOfLog: number;
}

export interface SurvivalCurve {
  steps: SurvivalStep[];
  count: number;
  events: number;
  /** The median time with its interval; null where the curve (or its bound) never reaches one half. */
  median: { estimate: number | null; lower: number | null; upper: number | null };
}

/**
 * Kaplan–Meier product-limit estimate (Kaplan & Meier, JASA 1958;53:457–481) with
 * Greenwood's variance and the log-log ("complementary log-log") interval of
 * Kalbfleisch & Prentice, which stays inside [0, 1]: for θ = log(−log S) with
 * se(θ) = se(log S) / |log S|, S lies in [exp(−exp(θ + z·se)), exp(−exp(θ − z·se))]
 * (R's survfit(..., conf.type = "log-log")).
 * The median is the first time the curve reaches 0.5 or less; its interval is
 * read off the band the same way (Brookmeyer & Crowley, Biometrics 1982;38:29–41).
 */
export function kaplanMeier(observations: SurvivalObservation[], confidence = 0.95): SurvivalCurve {
  for (const o of observations) {
    if (!Number.isFinite(o.time) || o.time < 0) throw new RangeError(`A survival time must be a finite number ≥ 0 (got ${o.time}).`);
  }
  const z = Math.sqrt(chiSquareQuantile(confidence, 1));
  const times = [...new Set(observations.map((o) => o.time))].sort((x, y) => x - y);
  let atRisk = observations.length;
  let survival = 1;
  let greenwood = 0;
  const steps: SurvivalStep[] = [];
  for (const time of times) {
    const here = observations.filter((o) => o.time === time);
    const events = here.filter((o) => o.event).length;
    const censored = here.length - events;
    if (events > 0) {
      survival *= 1 - events / atRisk;
      greenwood += atRisk > events ? events / (atRisk * (atRisk - events)) : Number.POSITIVE_INFINITY;
      steps.push({
        time,
        atRisk,
        events,
        censored,
        survival,
        standardErrorOfLog: Math.sqrt(greenwood),
        ...logLogBand(survival, Math.sqrt(greenwood), z),
      });
    } else if (steps.length > 0) {
      const last = steps[steps.length - 1]!;
      steps.push({ ...last, time, atRisk, events: 0, censored });
    } else {
      steps.push({ time, atRisk, events: 0, censored, survival: 1, standardErrorOfLog: 0, lower: 1, upper: 1 });
    }
    atRisk -= here.length;
  }
  const withEvents = steps.filter((s) => s.events > 0);
  const firstAtOrBelowHalf = (value: (s: SurvivalStep) => number) => withEvents.find((s) => value(s) <= 0.5)?.time ?? null;
  return {
    steps,
    count: observations.length,
    events: observations.filter((o) => o.event).length,
    median: {
      estimate: firstAtOrBelowHalf((s) => s.survival),
      // The lower band reaches one half first: that is the median's lower limit.
      lower: firstAtOrBelowHalf((s) => s.lower),
      upper: firstAtOrBelowHalf((s) => s.upper),
    },
  };
}

function logLogBand(survival: number, standardErrorOfLog: number, z: number): Interval {
  if (survival <= 0) return { lower: 0, upper: 0 };
  if (!Number.isFinite(standardErrorOfLog)) return { lower: 0, upper: 1 };
  const theta = Math.log(-Math.log(survival));
  const se = standardErrorOfLog / Math.abs(Math.log(survival));
  return { lower: Math.exp(-Math.exp(theta + z * se)), upper: Math.exp(-Math.exp(theta - z * se)) };
}

export interface LogRankTest {
  observed: [number, number];
  expected: [number, number];
  chiSquare: number;
  pValue: number;
}

/**
 * Two-sample log-rank test (Mantel, Cancer Chemother Rep 1966;50:163–170; Peto & Peto
 * 1972): at each event time the first group's events are compared with their
 * hypergeometric expectation; χ² = (O₁ − E₁)² / V on 1 degree of freedom (R's survdiff).
 */
export function logRankTest(first: SurvivalObservation[], second: SurvivalObservation[]): LogRankTest {
  const all = [...first.map((o) => ({ ...o, group: 0 })), ...second.map((o) => ({ ...o, group: 1 }))];
  const eventTimes = [...new Set(all.filter((o) => o.event).map((o) => o.time))].sort((x, y) => x - y);
  const observed: [number, number] = [0, 0];
  const expected: [number, number] = [0, 0];
  let variance = 0;
  for (const time of eventTimes) {
    const atRisk = all.filter((o) => o.time >= time);
    const n = atRisk.length;
    const n1 = atRisk.filter((o) => o.group === 0).length;
    const dying = atRisk.filter((o) => o.time === time && o.event);
    const d = dying.length;
    const d1 = dying.filter((o) => o.group === 0).length;
    observed[0] += d1;
    observed[1] += d - d1;
    expected[0] += (d * n1) / n;
    expected[1] += (d * (n - n1)) / n;
    if (n > 1) variance += (d * (n1 / n) * (1 - n1 / n) * (n - d)) / (n - 1);
  }
  const chiSquare = variance > 0 ? (observed[0] - expected[0]) ** 2 / variance : 0;
  return { observed, expected, chiSquare, pValue: variance > 0 ? 1 - chiSquareCdf(chiSquare, 1) : 1 };
}

export interface ClusteredObservation extends SurvivalObservation {
  /** Observations of one cluster (one rider's batteries) are alike; the test counts the cluster as the unit. */
  cluster: string | number;
}

export interface ClusteredLogRankTest {
  /** The log-rank score O − E of the second group. */
  score: number;
  robustVariance: number;
  chiSquare: number;
  /** From χ² on 1 degree of freedom, as R gives it. */
  pValue: number;
  /**
   * With few clusters the robust variance is too small and χ² too liberal: the
   * small-sample version scales the variance by G / (G − 1) and reads z against
   * Student's t on G − 1 degrees of freedom (common practice for cluster-robust
   * tests with few clusters, e.g. Cameron & Miller, J Human Resources 2015).
   */
  smallSamplePValue: number;
  clusters: number;
}

/**
 * The log-rank test with a cluster-robust variance: the Cox score test at β = 0
 * with Breslow ties, its variance summed over clusters of per-observation score
 * residuals (Lin & Wei, JASA 1989;84:1074–1078; Lee, Wei & Amato 1992), so that
 * several batteries of one rider do not count as independent evidence.
 * R: summary(coxph(Surv(time, status) ~ group + cluster(id), ties = "breslow"))$robscore.
 * Residual of observation j (x = 1 in the second group, x̄(t) the share of the
 * second group at risk at t, dN(t) the events at t, n(t) those at risk):
 * u_j = δ_j (x_j − x̄(t_j)) − Σ_{t ≤ t_j} (x_j − x̄(t)) dN(t) / n(t).
 */
export function clusteredLogRankTest(first: ClusteredObservation[], second: ClusteredObservation[]): ClusteredLogRankTest {
  const all = [...first.map((o) => ({ ...o, x: 0 })), ...second.map((o) => ({ ...o, x: 1 }))];
  const eventTimes = [...new Set(all.filter((o) => o.event).map((o) => o.time))].sort((p, q) => p - q);
  // Cumulative Σ dN/n and Σ x̄ dN/n up to each event time.
  const shareAt = new Map<number, number>();
  const cumulative: { time: number; hazard: number; weighted: number }[] = [];
  let hazard = 0;
  let weighted = 0;
  for (const time of eventTimes) {
    const atRisk = all.filter((o) => o.time >= time);
    const share = atRisk.filter((o) => o.x === 1).length / atRisk.length;
    const events = atRisk.filter((o) => o.time === time && o.event).length;
    hazard += events / atRisk.length;
    weighted += (share * events) / atRisk.length;
    shareAt.set(time, share);
    cumulative.push({ time, hazard, weighted });
  }
  const upTo = (time: number) => {
    let last = { hazard: 0, weighted: 0 };
    for (const c of cumulative) {
      if (c.time > time) break;
      last = c;
    }
    return last;
  };
  const byCluster = new Map<string | number, number>();
  let score = 0;
  for (const o of all) {
    const { hazard: h, weighted: w } = upTo(o.time);
    const u = (o.event ? o.x - shareAt.get(o.time)! : 0) - (o.x * h - w);
    score += u;
    byCluster.set(o.cluster, (byCluster.get(o.cluster) ?? 0) + u);
  }
  const robustVariance = [...byCluster.values()].reduce((sum, u) => sum + u * u, 0);
  const chiSquare = robustVariance > 0 ? (score * score) / robustVariance : 0;
  const g = byCluster.size;
  const smallSamplePValue = robustVariance > 0 && g > 1 ? studentTTwoSidedP(Math.sqrt(chiSquare * ((g - 1) / g)), g - 1) : 1;
  return {
    score,
    robustVariance,
    chiSquare,
    pValue: robustVariance > 0 ? 1 - chiSquareCdf(chiSquare, 1) : 1,
    smallSamplePValue,
    clusters: g,
  };
}
