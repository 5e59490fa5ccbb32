import { medianOfHistogram } from './cadence-median';
import { emptySums, STATISTICS_SUM_COLUMNS, type SideContribution, type StatisticsSums } from './contributions';
import {
  addRiderTerms,
  emptyRiderTerms,
  RIDER_TOTAL_COLUMNS,
  riderTerms,
  riderTotalsOf,
  type RiderTerms,
  type RiderTotals,
} from './rider-sums';

// The per-scope sums of the statistics tables (meter_statistics and its companions; see
// the migration 20261201003000) as deltas of submissions' contributions. Pure: the
// moderation decision (aggregates.ts) applies one submission's deltas in its
// transaction, a recompute and the validation script build every row from all of them.
// A scope is a model + firmware, or a model over all firmware (firmware_id null).

export interface Scope {
  modelId: number;
  firmwareId: number | null;
}

export interface Deltas {
  /** The rides' sums, and the sums over riders of rider-level terms (rider-sums.ts). */
  stats: Map<string, Scope & { sums: StatisticsSums; riderTerms: RiderTerms }>;
  riders: Map<string, Scope & { riderId: number; totals: RiderTotals }>;
  lags: Map<string, Scope & { lagSeconds: number; count: number }>;
  tags: Map<
    string,
    Scope & { tag: string; value: string; submissionCount: number; pedallingHours: number; powerDropouts: number; cadenceDropouts: number }
  >;
  likeForLike: boolean;
}

export const scopeKey = ({ modelId, firmwareId }: Scope) => `${modelId}:${firmwareId ?? '*'}`;

export function emptyDeltas(): Deltas {
  return { stats: new Map(), riders: new Map(), lags: new Map(), tags: new Map(), likeForLike: false };
}

export function accumulate(deltas: Deltas, contributions: SideContribution[], sign: 1 | -1): void {
  for (const contribution of contributions) {
    if (contribution.sums.like_for_like_count > 0) deltas.likeForLike = true;
    for (const scope of [
      { modelId: contribution.modelId, firmwareId: contribution.firmwareId },
      { modelId: contribution.modelId, firmwareId: null },
    ]) {
      const key = scopeKey(scope);
      const stats = deltas.stats.get(key) ?? { ...scope, sums: emptySums(), riderTerms: emptyRiderTerms() };
      for (const column of STATISTICS_SUM_COLUMNS) stats.sums[column] += sign * contribution.sums[column];
      deltas.stats.set(key, stats);

      const totals = riderTotalsOf(contribution.sums);
      if (contribution.riderId !== null) {
        // The rider's terms follow from their totals once all are known (scopeRowsOf, or the decision's upsert).
        const riderKey = `${key}:${contribution.riderId}`;
        const rider = deltas.riders.get(riderKey) ?? { ...scope, riderId: contribution.riderId, totals: emptyRiderTotals() };
        for (const column of RIDER_TOTAL_COLUMNS) rider.totals[column] += sign * totals[column];
        deltas.riders.set(riderKey, rider);
      } else {
        // A ride whose rider deleted their account stands for a rider of its own.
        addRiderTerms(stats.riderTerms, riderTerms(totals), sign);
      }
      if (contribution.cadenceLagSeconds !== null) {
        const lagKey = `${key}:${contribution.cadenceLagSeconds}`;
        const lag = deltas.lags.get(lagKey) ?? { ...scope, lagSeconds: contribution.cadenceLagSeconds, count: 0 };
        lag.count += sign;
        deltas.lags.set(lagKey, lag);
      }
      for (const { tag, value } of contribution.tags) {
        const tagKey = `${key}:${tag}:${value}`;
        const row = deltas.tags.get(tagKey) ?? {
          ...scope,
          tag,
          value,
          submissionCount: 0,
          pedallingHours: 0,
          powerDropouts: 0,
          cadenceDropouts: 0,
        };
        row.submissionCount += sign;
        row.pedallingHours += sign * contribution.sums.pedalling_hours;
        row.powerDropouts += sign * contribution.sums.power_dropouts;
        row.cadenceDropouts += sign * contribution.sums.cadence_dropouts;
        deltas.tags.set(tagKey, row);
      }
    }
  }
}

const emptyRiderTotals = (): RiderTotals => Object.fromEntries(RIDER_TOTAL_COLUMNS.map((column) => [column, 0])) as RiderTotals;

export type DeltaRow<K extends keyof Deltas> = Deltas[K] extends Map<string, infer V> ? V : never;

export const riderRow = (r: DeltaRow<'riders'>) => ({ model_id: r.modelId, firmware_id: r.firmwareId, rider_id: r.riderId, ...r.totals });
export const lagRow = (l: DeltaRow<'lags'>) => ({
  model_id: l.modelId,
  firmware_id: l.firmwareId,
  lag_seconds: l.lagSeconds,
  submission_count: l.count,
});
export const tagRow = (t: DeltaRow<'tags'>) => ({
  model_id: t.modelId,
  firmware_id: t.firmwareId,
  tag: t.tag,
  value: t.value,
  submission_count: t.submissionCount,
  pedalling_hours: t.pedallingHours,
  power_dropouts: t.powerDropouts,
  cadence_dropouts: t.cadenceDropouts,
});

/** The rows of every statistics table from the deltas of all accepted submissions (as `stats:recompute` writes them). */
export function scopeRowsOf(deltas: Deltas) {
  const ridersPerScope = new Map<string, number>();
  for (const rider of deltas.riders.values()) {
    const key = scopeKey(rider);
    ridersPerScope.set(key, (ridersPerScope.get(key) ?? 0) + 1);
    addRiderTerms(deltas.stats.get(key)!.riderTerms, riderTerms(rider.totals), 1);
  }
  const lagsPerScope = new Map<string, { value: number; count: number }[]>();
  for (const lag of deltas.lags.values()) {
    const key = scopeKey(lag);
    lagsPerScope.set(key, [...(lagsPerScope.get(key) ?? []), { value: lag.lagSeconds, count: lag.count }]);
  }
  return {
    statistics: [...deltas.stats.entries()].map(([key, s]) => ({
      model_id: s.modelId,
      firmware_id: s.firmwareId,
      distinct_riders: ridersPerScope.get(key) ?? 0,
      median_cadence_lag_seconds: medianOfHistogram(lagsPerScope.get(key) ?? []),
      ...s.sums,
      ...s.riderTerms,
    })),
    riders: [...deltas.riders.values()].map(riderRow),
    lags: [...deltas.lags.values()].map(lagRow),
    tags: [...deltas.tags.values()].map(tagRow),
  };
}
