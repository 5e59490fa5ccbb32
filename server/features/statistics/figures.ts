import { LIMITS_OF_AGREEMENT_Z } from '@shared/analysis/method';
import type { DropoutBreakdownRow, FirmwareComparison, MeterFigures, RateFigure, RateRatioFigure } from '@shared/schemas/statistics';
import { hasMinimumEvidence, MINIMUM_SUBMISSIONS } from '@shared/statistics/minimum-evidence';
import { poissonRate, rateRatio } from '@shared/statistics/poisson';
import { summariseBiasSums, type BiasSums } from '@shared/statistics/weighted-bias';
import { welchTest } from '@shared/statistics/welch';
import type { StatisticsSums } from './contributions';
import { memoize } from './memo';

// From a scope's sufficient statistics (a meter_statistics row) to the figures shoppers see.

export type StatisticsRow = StatisticsSums & { distinct_riders: number; median_cadence_lag_seconds: number | null };

const summariseBiasSumsOnce = memoize((sums: BiasSums, evidence: { distinctRiders: number; medianBiasPercent: number | null }) => summariseBiasSums(sums, evidence));
const welchTestOnce = memoize(welchTest);

function biasSumsOf(row: StatisticsRow): BiasSums {
  return {
    submissionCount: row.bias_count,
    pedallingHours: row.bias_hours,
    sumWeight: row.sum_weight,
    sumWeightSquared: row.sum_weight_squared,
    sumWeightCubed: row.sum_weight_cubed,
    sumWeightedBias: row.sum_weighted_bias,
    sumWeightedBiasSquared: row.sum_weighted_bias_squared,
  };
}

export const rateFigure = memoize(function rateFigure(events: number, hours: number): RateFigure | null {
  if (!(hours > 0)) return null;
  const rate = poissonRate(events, hours);
  return { events, perHour: rate.rate, lower: rate.lower, upper: rate.upper };
});

/** A rate ratio with JSON-safe bounds: Infinity becomes null. */
export const rateRatioFigure = memoize(function rateRatioFigure(events1: number, hours1: number, events2: number, hours2: number): RateRatioFigure | null {
  if (!(hours1 > 0 && hours2 > 0)) return null;
  const ratio = rateRatio(events1, hours1, events2, hours2);
  const finite = (value: number | null) => (value === null || !Number.isFinite(value) ? null : value);
  return { ratio: finite(ratio.ratio), lower: ratio.lower, upper: finite(ratio.upper), pValue: ratio.pValue };
});

/**
 * Pooled limits of agreement from running sums: the same one-way analysis of
 * variance as shared/statistics/pooled-agreement.ts (Bland & Altman 2007), with
 * Σnᵢd̄ᵢ² − (Σnᵢd̄ᵢ)²/N for the between-submission sum of squares.
 */
export function pooledAgreementFromSums(row: StatisticsRow): MeterFigures['agreement'] {
  const k = row.agreement_submissions;
  const total = row.agreement_blocks;
  if (k < 2 || total - k < 1) return null;
  const meanDifference = row.agreement_sum_difference / total;
  const betweenSumOfSquares = Math.max(0, row.agreement_sum_difference_squared - row.agreement_sum_difference * meanDifference);
  const withinMeanSquare = row.agreement_within_ss / (total - k);
  const betweenMeanSquare = betweenSumOfSquares / (k - 1);
  const divisor = (total * total - row.agreement_blocks_squared) / ((k - 1) * total);
  const betweenVariance = Math.max(0, (betweenMeanSquare - withinMeanSquare) / divisor);
  const sd = Math.sqrt(betweenVariance + withinMeanSquare);
  return {
    meanDifferencePercent: meanDifference,
    sdPercent: sd,
    lowerPercent: meanDifference - LIMITS_OF_AGREEMENT_Z * sd,
    upperPercent: meanDifference + LIMITS_OF_AGREEMENT_Z * sd,
    blockCount: total,
  };
}

export function meterFigures(row: StatisticsRow | undefined, medianBiasPercent: number | null = null): MeterFigures {
  if (!row) {
    return {
      evidence: { submissionCount: 0, distinctRiders: 0, pedallingHours: 0, likeForLikeShare: 0 },
      enough: false,
      bias: null,
      agreement: null,
      powerDropouts: null,
      cadenceDropouts: null,
      medianCadenceLagSeconds: null,
      sprints: null,
    };
  }
  const evidence = {
    submissionCount: row.submission_count,
    distinctRiders: row.distinct_riders,
    pedallingHours: row.pedalling_hours,
    likeForLikeShare: row.submission_count > 0 ? row.like_for_like_count / row.submission_count : 0,
  };
  const enough = hasMinimumEvidence(evidence);
  if (!enough) return { ...meterFigures(undefined), evidence };

  const bias = summariseBiasSumsOnce(biasSumsOf(row), { distinctRiders: row.distinct_riders, medianBiasPercent });
  return {
    evidence,
    enough,
    bias: bias.enough
      ? {
          meanPercent: bias.meanBiasPercent,
          lowerPercent: bias.lowerPercent,
          upperPercent: bias.upperPercent,
          standardErrorPercent: bias.standardErrorPercent,
          degreesOfFreedom: bias.degreesOfFreedom,
          medianPercent: bias.medianBiasPercent,
          scatterPercent: bias.betweenSubmissionSdPercent,
        }
      : null,
    agreement: pooledAgreementFromSums(row),
    powerDropouts: rateFigure(row.power_dropouts, row.pedalling_hours),
    cadenceDropouts: rateFigure(row.cadence_dropouts, row.pedalling_hours),
    medianCadenceLagSeconds: row.median_cadence_lag_seconds,
    sprints:
      row.sprint_count > 0 || row.sprint_rise_count > 0
        ? {
            count: row.sprint_count,
            meanPeakPercent: row.sprint_count > 0 ? row.sum_sprint_peak_percent / row.sprint_count : null,
            meanRiseSecondsVsPartner: row.sprint_rise_count > 0 ? row.sum_sprint_rise_seconds / row.sprint_rise_count : null,
          }
        : null,
  };
}

/**
 * Firmware `to` against firmware `from` of the same model. Both need the minimum
 * evidence. The bias difference is Welch's test on the two weighted means: each
 * group enters with n = ν + 1 and sd = SE·√n, so that sd²/n is its squared
 * standard error and n − 1 its Satterthwaite degrees of freedom (the weighted
 * form of Welch's test; it is the ordinary one when all weights are equal).
 */
export function compareFirmware(from: { version: string; figures: MeterFigures; row?: StatisticsRow }, to: { version: string; figures: MeterFigures; row?: StatisticsRow }): FirmwareComparison {
  const comparison: FirmwareComparison = { from: from.version, to: to.version, powerDropoutRatio: null, biasDifference: null };
  if (!from.figures.enough || !to.figures.enough || !from.row || !to.row) return comparison;
  comparison.powerDropoutRatio = rateRatioFigure(to.row.power_dropouts, to.row.pedalling_hours, from.row.power_dropouts, from.row.pedalling_hours);
  const a = to.figures.bias;
  const b = from.figures.bias;
  if (a && b) {
    const group = (bias: NonNullable<MeterFigures['bias']>) => {
      const n = bias.degreesOfFreedom + 1;
      return { n, mean: bias.meanPercent, sd: bias.standardErrorPercent * Math.sqrt(n) };
    };
    const test = welchTestOnce(group(a), group(b));
    if (test) {
      comparison.biasDifference = {
        differencePercent: test.difference,
        lowerPercent: test.lower,
        upperPercent: test.upper,
        pValue: test.pValue,
        degreesOfFreedom: test.degreesOfFreedom,
      };
    }
  }
  return comparison;
}

export interface DropoutTagRow {
  tag: DropoutBreakdownRow['tag'];
  value: string;
  submission_count: number;
  pedalling_hours: number;
  power_dropouts: number;
}

/** Each tag value's power dropout rate, and its rate ratio against the rest of the scope. */
export function dropoutBreakdown(scope: StatisticsRow | undefined, rows: DropoutTagRow[], labelOf: (row: DropoutTagRow) => string): DropoutBreakdownRow[] {
  if (!scope) return [];
  const scopeEnough = hasMinimumEvidence({ submissionCount: scope.submission_count, distinctRiders: scope.distinct_riders });
  return rows.map((row) => {
    const restCount = scope.submission_count - row.submission_count;
    const restHours = scope.pedalling_hours - row.pedalling_hours;
    const enough = scopeEnough && row.submission_count >= MINIMUM_SUBMISSIONS;
    const restEnough = restCount >= MINIMUM_SUBMISSIONS && restHours > 1e-9;
    return {
      tag: row.tag,
      value: row.value,
      label: labelOf(row),
      submissionCount: row.submission_count,
      pedallingHours: row.pedalling_hours,
      enough,
      powerDropouts: enough ? rateFigure(row.power_dropouts, row.pedalling_hours) : null,
      againstRest:
        enough && restEnough ? rateRatioFigure(row.power_dropouts, row.pedalling_hours, scope.power_dropouts - row.power_dropouts, restHours) : null,
    };
  });
}
