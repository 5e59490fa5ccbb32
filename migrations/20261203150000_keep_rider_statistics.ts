import type { Knex } from 'knex';
import { recomputeAllAggregates } from '../server/features/statistics/aggregates';

// The rider is the unit of evidence (server/features/statistics/rider-sums.ts): each
// (scope, rider) keeps their running totals beside the contribution count, and each
// scope keeps sums over its riders of the per-rider terms that the rider-level bias and
// the rider-clustered dropout rates need. Existing rows are filled by one recompute,
// which also drops mixed comparisons' bias from the pool (contributions.ts).

const RIDER_TOTALS = ['bias_count', 'sum_weight', 'sum_weighted_bias', 'pedalling_hours', 'power_dropouts', 'cadence_dropouts'];
const RIDER_TERMS = [
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
];
const COUNTS = new Set(['bias_count', 'power_dropouts', 'cadence_dropouts', 'rider_count', 'rider_bias_count']);

export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('meter_statistics_riders', (t) => {
    for (const c of RIDER_TOTALS) (COUNTS.has(c) ? t.integer(c) : t.double(c)).notNullable().defaultTo(0);
  });
  await knex.schema.alterTable('meter_statistics', (t) => {
    for (const c of RIDER_TERMS) (COUNTS.has(c) ? t.integer(c) : t.double(c)).notNullable().defaultTo(0);
  });
  await recomputeAllAggregates(knex);
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('meter_statistics', (t) => {
    for (const c of RIDER_TERMS) t.dropColumn(c);
  });
  await knex.schema.alterTable('meter_statistics_riders', (t) => {
    for (const c of RIDER_TOTALS) t.dropColumn(c);
  });
}
