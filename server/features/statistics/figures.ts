import { LIMITS_OF_AGREEMENT_Z } from '@shared/analysis/method';
import type { VerdictKind } from '@shared/schemas/battery';
import type { DropoutBreakdownRow, FirmwareComparison, MeterFigures, RateFigure, RateRatioFigure } from '@shared/schemas/statistics';
import { clusteredRate, clusteredRateRatio, type ClusteredRateSums } from '@shared/statistics/clustered-rate';
import { hasMinimumEvidence, MINIMUM_SUBMISSIONS } from '@shared/statistics/minimum-evidence';
import { holmAdjust } from '@shared/statistics/multiple-comparisons';
import { poissonRate, rateRatio } from '@shared/statistics/poisson';
import { comparisonVerdict } from '@shared/statistics/verdict';
import { summariseBiasSums, type BiasSums } from '@shared/statistics/weighted-bias';
import { welchTest } from '@shared/statistics/welch';
import type { StatisticsSums } from './contributions';
import { memoize } from './memo';
import type { RiderTerms } from './rider-sums';

// From a scope's sufficient statistics (a meter_statistics row) to the figures shoppers see.

export type StatisticsRow = StatisticsSums & RiderTerms & { distinct_riders: number; median_cadence_lag_seconds: number | null };

const summariseBiasSumsOnce = memoize((sums: BiasSums, evidence: { distinctRiders: number; medianBiasPercent: number | null }) =>
  summariseBiasSums(sums, evidence),
);
const welchTestOnce = memoize(welchTest);

/** The rides' sums: for the ride-to-ride scatter. */
function rideBiasSumsOf(row: StatisticsRow): BiasSums {
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

/**
 * The riders' sums: each rider's weighted mean bias is one observation with the
 * rider's weight (rider-sums.ts), so summariseBiasSums gives the two-stage estimate —
 * the weighted mean of rider means, its standard error from the spread between
 * riders, and a t interval on Satterthwaite's degrees of freedom, riders − 1 when the
 * weights are equal. Rides of one rider share the rider's unit, installation and
 * partner, so they are not independent evidence; riders are (the cluster is the unit
 * of sampling: Cochran, Sampling Techniques, 1977, ch. 9). With a rider-to-rider SD of
 * 1 % and a ride-to-ride SD of 0.7 %, ride-level intervals covered the truth 60–69 %
 * of the time in `npm run validate:statistics`; these cover ≥ 93 %.
 */
function riderBiasSumsOf(row: StatisticsRow): BiasSums {
  return {
    submissionCount: row.rider_bias_count,
    pedallingHours: row.bias_hours,
    sumWeight: row.rider_sum_weight,
    sumWeightSquared: row.rider_sum_weight_squared,
    sumWeightCubed: row.rider_sum_weight_cubed,
    sumWeightedBias: row.rider_sum_weighted_bias,
    sumWeightedBiasSquared: row.rider_sum_weighted_bias_squared,
  };
}

const finite = (value: number | null) => (value === null || !Number.isFinite(value) ? null : value);

/** Exact Poisson rate (for counts without per-rider sums, such as the dropout breakdown's rows). */
export const rateFigure = memoize(function rateFigure(events: number, hours: number): RateFigure | null {
  if (!(hours > 0)) return null;
  const rate = poissonRate(events, hours);
  return { events, perHour: rate.rate, lower: rate.lower, upper: rate.upper, method: 'poisson_exact' };
});

/** Exact conditional rate ratio with JSON-safe bounds: Infinity becomes null. */
export const rateRatioFigure = memoize(function rateRatioFigure(
  events1: number,
  hours1: number,
  events2: number,
  hours2: number,
): RateRatioFigure | null {
  if (!(hours1 > 0 && hours2 > 0)) return null;
  const ratio = rateRatio(events1, hours1, events2, hours2);
  return { ratio: finite(ratio.ratio), lower: ratio.lower, upper: finite(ratio.upper), pValue: ratio.pValue, method: 'poisson_exact' };
});

function dropoutSumsOf(row: StatisticsRow, kind: 'power' | 'cadence'): ClusteredRateSums {
  return {
    events: kind === 'power' ? row.power_dropouts : row.cadence_dropouts,
    exposure: row.pedalling_hours,
    clusters: row.rider_count,
    sumEventsSquared: kind === 'power' ? row.rider_sum_power_dropouts_squared : row.rider_sum_cadence_dropouts_squared,
    sumEventsExposure: kind === 'power' ? row.rider_sum_power_dropouts_hours : row.rider_sum_cadence_dropouts_hours,
    sumExposureSquared: row.rider_sum_hours_squared,
    sumEventsSquaredPerExposure:
      kind === 'power' ? row.rider_sum_power_dropouts_squared_per_hour : row.rider_sum_cadence_dropouts_squared_per_hour,
  };
}

/** A scope's dropout rate with the rider-clustered interval (never narrower than the exact one). */
function clusteredRateFigure(row: StatisticsRow, kind: 'power' | 'cadence'): RateFigure | null {
  if (!(row.pedalling_hours > 0)) return null;
  const sums = dropoutSumsOf(row, kind);
  const rate = clusteredRate(sums);
  return { events: sums.events, perHour: rate.rate, lower: rate.lower, upper: rate.upper, method: rate.method };
}

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

  const bias = summariseBiasSumsOnce(riderBiasSumsOf(row), { distinctRiders: row.rider_bias_count, medianBiasPercent });
  const rides = summariseBiasSumsOnce(rideBiasSumsOf(row), { distinctRiders: row.rider_bias_count, medianBiasPercent });
  return {
    evidence,
    enough,
    bias:
      bias.enough && rides.enough
        ? {
            meanPercent: bias.meanBiasPercent,
            lowerPercent: bias.lowerPercent,
            upperPercent: bias.upperPercent,
            standardErrorPercent: bias.standardErrorPercent,
            degreesOfFreedom: bias.degreesOfFreedom,
            riders: row.rider_bias_count,
            medianPercent: bias.medianBiasPercent,
            scatterPercent: rides.betweenSubmissionSdPercent,
          }
        : null,
    agreement: pooledAgreementFromSums(row),
    powerDropouts: clusteredRateFigure(row, 'power'),
    cadenceDropouts: clusteredRateFigure(row, 'cadence'),
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

export interface FirmwareOnPage {
  version: string;
  figures: MeterFigures;
  row?: StatisticsRow;
}

/**
 * Each firmware against its predecessor, for one model page. Both need the minimum
 * evidence. The bias difference is Welch's test on the two rider-level means: each
 * enters with n = ν + 1 and sd = SE·√n, so that sd²/n is its squared standard error
 * and n − 1 its degrees of freedom (between riders). The dropout ratio is the
 * rider-clustered one (clustered-rate.ts). Every p-value on the page (two per step) is
 * Holm-adjusted together, so that a page whose firmware changed nothing says "better"
 * or "worse" anywhere at most 5 % of the time, and each measure gets a verdict.
 */
export function compareFirmwareSteps(versions: FirmwareOnPage[]): FirmwareComparison[] {
  const raw = versions.slice(1).map((to, i) => rawComparison(versions[i]!, to));
  const adjusted = holmAdjust(raw.flatMap((c) => [c.bias?.pValue ?? null, c.dropouts?.pValue ?? null]));
  return raw.map((c, i) => {
    const biasJudgement = judgement(c.bias !== null, adjusted[2 * i] ?? null, c.biasCloserToZero);
    const dropoutJudgement = judgement(c.dropouts !== null, adjusted[2 * i + 1] ?? null, (c.dropouts?.ratio ?? 1) < 1);
    const verdict = stepVerdict(biasJudgement.verdict, dropoutJudgement.verdict);
    return {
      from: c.from,
      to: c.to,
      powerDropoutRatio: c.dropouts && { ...c.dropouts, ...dropoutJudgement },
      biasDifference: c.bias && { ...c.bias, ...biasJudgement },
      verdict,
      words: firmwareVerdictWords(biasJudgement.verdict, dropoutJudgement.verdict, c.from),
    };
  });
}

const judgement = (tested: boolean, adjustedPValue: number | null, newerIsBetter: boolean) => ({
  adjustedPValue: tested ? adjustedPValue : null,
  verdict: comparisonVerdict({ enough: tested, adjustedPValue: tested ? adjustedPValue : null, newerIsBetter }),
});

function rawComparison(from: FirmwareOnPage, to: FirmwareOnPage) {
  const comparison = {
    from: from.version,
    to: to.version,
    dropouts: null as RateRatioFigure | null,
    bias: null as Omit<NonNullable<FirmwareComparison['biasDifference']>, 'adjustedPValue' | 'verdict'> | null,
    biasCloserToZero: false,
  };
  if (!from.figures.enough || !to.figures.enough || !from.row || !to.row) return comparison;
  if (to.row.pedalling_hours > 0 && from.row.pedalling_hours > 0) {
    const ratio = clusteredRateRatio(dropoutSumsOf(to.row, 'power'), dropoutSumsOf(from.row, 'power'));
    comparison.dropouts = {
      ratio: finite(ratio.ratio),
      lower: ratio.lower,
      upper: finite(ratio.upper),
      pValue: ratio.pValue,
      method: ratio.method,
    };
  }
  const a = to.figures.bias;
  const b = from.figures.bias;
  if (a && b) {
    const group = (bias: NonNullable<MeterFigures['bias']>) => {
      const n = bias.degreesOfFreedom + 1;
      return { n, mean: bias.meanPercent, sd: bias.standardErrorPercent * Math.sqrt(n) };
    };
    const test = welchTestOnce(group(a), group(b));
    if (test) {
      comparison.bias = {
        differencePercent: test.difference,
        lowerPercent: test.lower,
        upperPercent: test.upper,
        pValue: test.pValue,
        degreesOfFreedom: test.degreesOfFreedom,
      };
      comparison.biasCloserToZero = Math.abs(a.meanPercent) < Math.abs(b.meanPercent);
    }
  }
  return comparison;
}

/** Worse on either measure makes the step worse (a shopper should hear of it); better needs one better and none worse. */
function stepVerdict(bias: VerdictKind, dropouts: VerdictKind): VerdictKind {
  const both = [bias, dropouts];
  if (both.includes('worse')) return 'worse';
  if (both.includes('better')) return 'better';
  if (both.includes('no_clear_difference')) return 'no_clear_difference';
  return 'not_enough';
}

export function firmwareVerdictWords(bias: VerdictKind, dropouts: VerdictKind, from: string): string {
  if (bias === 'not_enough' && dropouts === 'not_enough') return `Not enough riders yet to compare with ${from}.`;
  const dropoutWords: Record<VerdictKind, string> = {
    better: `fewer power dropouts than ${from}`,
    worse: `more power dropouts than ${from}`,
    no_clear_difference: `no clear change in power dropouts from ${from}`,
    not_enough: 'not enough riders yet for power dropouts',
  };
  const biasWords: Record<VerdictKind, string> = {
    better: 'bias closer to zero',
    worse: 'bias further from zero',
    no_clear_difference: 'no clear change in bias',
    not_enough: 'not enough riders yet for bias',
  };
  const sentence = `${dropoutWords[dropouts]}; ${biasWords[bias]}.`;
  return sentence.charAt(0).toUpperCase() + sentence.slice(1);
}

export interface DropoutTagRow {
  tag: DropoutBreakdownRow['tag'];
  value: string;
  submission_count: number;
  pedalling_hours: number;
  power_dropouts: number;
}

/** Each tag value's power dropout rate, and its rate ratio against the rest of the scope. */
export function dropoutBreakdown(
  scope: StatisticsRow | undefined,
  rows: DropoutTagRow[],
  labelOf: (row: DropoutTagRow) => string,
): DropoutBreakdownRow[] {
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
        enough && restEnough
          ? rateRatioFigure(row.power_dropouts, row.pedalling_hours, scope.power_dropouts - row.power_dropouts, restHours)
          : null,
    };
  });
}
