import { studentTQuantile } from './distributions';
import { hasMinimumEvidence, type Evidence } from './minimum-evidence';

/** One long ride counts as at most this many hours, so it cannot dominate a model's figure. */
export const WEIGHT_CAP_HOURS = 4;

export interface BiasRecord {
  biasPercent: number;
  pedallingHours: number;
  riderId: string | number;
}

/**
 * Sufficient statistics of a model + firmware's bias, kept in a database row and
 * updated by adding or subtracting one submission (w = capped hours, x = bias %).
 * The median and the number of distinct riders are not sums: they come from the
 * submission list (or a per-rider count) instead.
 */
export interface BiasSums {
  submissionCount: number;
  /** Uncapped, for the evidence column. */
  pedallingHours: number;
  /** Σw */
  sumWeight: number;
  /** Σw² */
  sumWeightSquared: number;
  /** Σw³ */
  sumWeightCubed: number;
  /** Σw·x */
  sumWeightedBias: number;
  /** Σw·x² */
  sumWeightedBiasSquared: number;
}

interface BiasEvidence extends Evidence {
  pedallingHours: number;
}

export type BiasSummary =
  | ({ enough: false } & BiasEvidence)
  | ({
      enough: true;
      meanBiasPercent: number;
      standardErrorPercent: number;
      /** Confidence interval of the weighted mean. */
      lowerPercent: number;
      upperPercent: number;
      degreesOfFreedom: number;
      /** Kish's (Σw)² / Σw². */
      effectiveSubmissions: number;
      /** Between-submission SD of the bias: how consistent the meter is from ride to ride. */
      betweenSubmissionSdPercent: number;
      /** Weighted median; null when summarised from the sums alone. */
      medianBiasPercent: number | null;
    } & BiasEvidence);

export const EMPTY_BIAS_SUMS: BiasSums = {
  submissionCount: 0,
  pedallingHours: 0,
  sumWeight: 0,
  sumWeightSquared: 0,
  sumWeightCubed: 0,
  sumWeightedBias: 0,
  sumWeightedBiasSquared: 0,
};

export function biasWeight(pedallingHours: number): number {
  if (!(pedallingHours > 0 && Number.isFinite(pedallingHours))) {
    throw new RangeError(`pedalling hours must be positive, got ${pedallingHours}`);
  }
  return Math.min(pedallingHours, WEIGHT_CAP_HOURS);
}

/**
 * A rider's weight in the between-rider pooling: their rides' weights (Σ capped hours),
 * capped again at RIDER_WEIGHT_CAP_HOURS. Once a rider has a few hours, the
 * rider-to-rider spread (their unit, installation, partner) dominates the uncertainty of
 * their mean, so more hours of the same rider say little more: near-equal weights are
 * near-optimal, and the cap keeps one prolific rider from standing for the model.
 */
export const RIDER_WEIGHT_CAP_HOURS = 4;

export function riderBiasWeight(sumOfRideWeights: number): number {
  return Math.min(sumOfRideWeights, RIDER_WEIGHT_CAP_HOURS);
}

export function addToBiasSums(sums: BiasSums, record: BiasRecord): BiasSums {
  return shiftSums(sums, record, 1);
}

export function removeFromBiasSums(sums: BiasSums, record: BiasRecord): BiasSums {
  if (sums.submissionCount < 1) throw new RangeError('cannot remove a submission from empty bias sums');
  return shiftSums(sums, record, -1);
}

export function biasSumsOf(records: BiasRecord[]): BiasSums {
  return records.reduce(addToBiasSums, EMPTY_BIAS_SUMS);
}

function shiftSums(sums: BiasSums, { biasPercent, pedallingHours }: BiasRecord, sign: 1 | -1): BiasSums {
  const w = biasWeight(pedallingHours);
  return {
    submissionCount: sums.submissionCount + sign,
    pedallingHours: sums.pedallingHours + sign * pedallingHours,
    sumWeight: sums.sumWeight + sign * w,
    sumWeightSquared: sums.sumWeightSquared + sign * w * w,
    sumWeightCubed: sums.sumWeightCubed + sign * w * w * w,
    sumWeightedBias: sums.sumWeightedBias + sign * w * biasPercent,
    sumWeightedBiasSquared: sums.sumWeightedBiasSquared + sign * w * biasPercent * biasPercent,
  };
}

/**
 * The weighted mean m = Σwx / Σw with its confidence interval from the sums.
 *
 * The submissions' biases are treated as independent draws with a common
 * between-submission variance σ², so Var(m) = σ²·Σw² / (Σw)² (Kish, Survey
 * Sampling, 1965: the effective n is (Σw)² / Σw²). σ² is estimated without bias
 * by s² = Σw(x − m)² / (Σw − Σw²/Σw) (the reliability-weights variance, as in the
 * GNU Scientific Library's gsl_stats_wvariance). s² is a quadratic form with
 * trace tr(A) = Σw − Σw²/Σw and tr(A²) = Σw² − 2Σw³/Σw + (Σw²)²/(Σw)², so the t
 * distribution takes Satterthwaite's ν = tr(A)² / tr(A²) degrees of freedom
 * (Satterthwaite, Biometrics Bulletin 1946;2:110–114), which is n − 1 when all
 * weights are equal and fewer when a few submissions carry most of the weight.
 */
export function summariseBiasSums(
  sums: BiasSums,
  { distinctRiders, medianBiasPercent = null }: { distinctRiders: number; medianBiasPercent?: number | null },
  confidence = 0.95,
): BiasSummary {
  const evidence = { submissionCount: sums.submissionCount, distinctRiders, pedallingHours: sums.pedallingHours };
  if (!hasMinimumEvidence(evidence)) return { enough: false, ...evidence };

  const { sumWeight: s1, sumWeightSquared: s2, sumWeightCubed: s3 } = sums;
  const meanBiasPercent = sums.sumWeightedBias / s1;
  // Clamped: after many additions and removals rounding can leave a tiny negative sum.
  const sumOfSquares = Math.max(0, sums.sumWeightedBiasSquared - sums.sumWeightedBias * meanBiasPercent);
  const traceA = s1 - s2 / s1;
  const traceA2 = s2 - (2 * s3) / s1 + (s2 * s2) / (s1 * s1);
  const variance = sumOfSquares / traceA;
  const standardErrorPercent = Math.sqrt((variance * s2) / (s1 * s1));
  const degreesOfFreedom = (traceA * traceA) / traceA2;
  const halfWidth = studentTQuantile(1 - (1 - confidence) / 2, degreesOfFreedom) * standardErrorPercent;
  return {
    enough: true,
    ...evidence,
    meanBiasPercent,
    standardErrorPercent,
    lowerPercent: meanBiasPercent - halfWidth,
    upperPercent: meanBiasPercent + halfWidth,
    degreesOfFreedom,
    effectiveSubmissions: (s1 * s1) / s2,
    betweenSubmissionSdPercent: Math.sqrt(variance),
    medianBiasPercent,
  };
}

/** The full summary from the list of accepted submissions, median included. */
export function summariseBias(records: BiasRecord[], confidence = 0.95): BiasSummary {
  const distinctRiders = new Set(records.map((record) => record.riderId)).size;
  return summariseBiasSums(biasSumsOf(records), { distinctRiders, medianBiasPercent: medianBias(records) }, confidence);
}

/** Median of the submissions' bias weighted like the mean; null with no submissions. */
export function medianBias(records: BiasRecord[]): number | null {
  if (records.length === 0) return null;
  return weightedMedian(
    records.map((record) => record.biasPercent),
    records.map((record) => biasWeight(record.pedallingHours)),
  );
}

/**
 * The value at which the cumulative weight reaches half the total, averaging the
 * two neighbours when it lands exactly on half so that equal weights give the
 * ordinary median (simple-statistics' weightedQuantile takes the lower one).
 * Needs the whole list: a median cannot be updated from running sums.
 */
export function weightedMedian(values: number[], weights: number[]): number {
  if (values.length === 0 || values.length !== weights.length) {
    throw new RangeError('weighted median needs as many weights as values, and at least one');
  }
  const order = values.map((_, i) => i).sort((i, j) => values[i] - values[j]);
  const half = weights.reduce((sum, w) => sum + w, 0) / 2;
  let cumulative = 0;
  for (let k = 0; k < order.length; k++) {
    cumulative += weights[order[k]];
    if (Math.abs(cumulative - half) <= 1e-12 * half && k + 1 < order.length) {
      return (values[order[k]] + values[order[k + 1]]) / 2;
    }
    if (cumulative > half) return values[order[k]];
  }
  return values[order[order.length - 1]];
}
