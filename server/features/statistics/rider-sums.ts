import { riderBiasWeight } from '@shared/statistics/weighted-bias';
import type { StatisticsSums } from './contributions';

// The rider (strictly: the rider's unit, their installation and partner meter) is the
// unit of evidence: rides of one rider are alike, so a model's intervals are built
// from per-rider summaries. Each (scope, rider) keeps its running totals
// (meter_statistics_riders); the scope keeps sums over its riders of the per-rider
// terms below (meter_statistics.rider_*). A rider's terms are not additive in their
// rides, so a decision adds terms(after) − terms(before) of the riders it touches,
// and a recompute adds terms(totals) of every rider: the two give the same sums.

/** A rider's running totals in a scope: the columns of meter_statistics_riders besides the keys. */
export const RIDER_TOTAL_COLUMNS = [
  'contribution_count',
  'bias_count',
  'sum_weight',
  'sum_weighted_bias',
  'pedalling_hours',
  'power_dropouts',
  'cadence_dropouts',
] as const;
export type RiderTotals = Record<(typeof RIDER_TOTAL_COLUMNS)[number], number>;

/** Sums over a scope's riders (meter_statistics.rider_*). */
export const RIDER_TERM_COLUMNS = [
  'rider_count',
  'rider_bias_count',
  'rider_sum_weight',
  'rider_sum_weight_squared',
  'rider_sum_weight_cubed',
  'rider_sum_weighted_bias',
  'rider_sum_weighted_bias_squared',
  'rider_sum_hours_squared',
  'rider_sum_power_dropouts_squared',
  'rider_sum_power_dropouts_hours',
  'rider_sum_power_dropouts_squared_per_hour',
  'rider_sum_cadence_dropouts_squared',
  'rider_sum_cadence_dropouts_hours',
  'rider_sum_cadence_dropouts_squared_per_hour',
] as const;
export type RiderTerms = Record<(typeof RIDER_TERM_COLUMNS)[number], number>;

export const emptyRiderTerms = (): RiderTerms => Object.fromEntries(RIDER_TERM_COLUMNS.map((column) => [column, 0])) as RiderTerms;

/** What one side of one submission adds to its rider's totals. */
export function riderTotalsOf(sums: StatisticsSums): RiderTotals {
  return {
    contribution_count: sums.submission_count,
    bias_count: sums.bias_count,
    sum_weight: sums.sum_weight,
    sum_weighted_bias: sums.sum_weighted_bias,
    pedalling_hours: sums.pedalling_hours,
    power_dropouts: sums.power_dropouts,
    cadence_dropouts: sums.cadence_dropouts,
  };
}

/**
 * One rider's terms: their weighted mean bias bᵣ = Σwx / Σw with the rider's weight
 * Wᵣ (riderBiasWeight), and their dropouts Eᵣ and hours Tᵣ for the clustered rate.
 * A rider with nothing left contributes nothing.
 */
export function riderTerms(totals: RiderTotals): RiderTerms {
  const terms = emptyRiderTerms();
  if (!(totals.contribution_count > 0)) return terms;
  terms.rider_count = 1;
  if (totals.bias_count > 0 && totals.sum_weight > 0) {
    const w = riderBiasWeight(totals.sum_weight);
    const b = totals.sum_weighted_bias / totals.sum_weight;
    terms.rider_bias_count = 1;
    terms.rider_sum_weight = w;
    terms.rider_sum_weight_squared = w * w;
    terms.rider_sum_weight_cubed = w * w * w;
    terms.rider_sum_weighted_bias = w * b;
    terms.rider_sum_weighted_bias_squared = w * b * b;
  }
  const t = totals.pedalling_hours;
  terms.rider_sum_hours_squared = t * t;
  terms.rider_sum_power_dropouts_squared = totals.power_dropouts ** 2;
  terms.rider_sum_power_dropouts_hours = totals.power_dropouts * t;
  terms.rider_sum_cadence_dropouts_squared = totals.cadence_dropouts ** 2;
  terms.rider_sum_cadence_dropouts_hours = totals.cadence_dropouts * t;
  if (t > 0) {
    terms.rider_sum_power_dropouts_squared_per_hour = totals.power_dropouts ** 2 / t;
    terms.rider_sum_cadence_dropouts_squared_per_hour = totals.cadence_dropouts ** 2 / t;
  }
  return terms;
}

/** Adds `sign` × terms into `into`. */
export function addRiderTerms(into: RiderTerms, terms: RiderTerms, sign: number): void {
  for (const column of RIDER_TERM_COLUMNS) into[column] += sign * terms[column];
}
