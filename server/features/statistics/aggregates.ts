import type { Knex } from 'knex';
import { contributionsOf, STATISTICS_SUM_COLUMNS, type RecordingRow, type SubmissionRow } from './contributions';
import { medianOfHistogram } from './cadence-median';
import { addRiderTerms, RIDER_TERM_COLUMNS, RIDER_TOTAL_COLUMNS, riderTerms, type RiderTotals } from './rider-sums';
import { accumulate, emptyDeltas, lagRow, riderRow, scopeKey, scopeRowsOf, tagRow, type Deltas, type Scope } from './scope-sums';

// Keeps the per-scope sufficient statistics (scope-sums.ts) in step with moderation decisions.

const SUBMISSION_COLUMNS = [
  's.id',
  's.rider_id',
  's.indoor',
  's.surface',
  's.bias_percent',
  's.sum_a',
  's.sum_b',
  's.pedalling_seconds',
  's.cadence_lag_seconds',
  's.like_for_like_mode',
  's.a_power_dropouts',
  's.a_cadence_dropouts',
  's.b_power_dropouts',
  's.b_cadence_dropouts',
];

function selectSubmissions(db: Knex) {
  return db('submissions as s').select(
    ...SUBMISSION_COLUMNS,
    db.raw(`(s.result->'agreement'->>'blockCount')::int as agreement_block_count`),
    db.raw(`(s.result->'agreement'->>'meanDifferencePercent')::float8 as agreement_mean_difference_percent`),
    db.raw(`(s.result->'agreement'->>'sdPercent')::float8 as agreement_sd_percent`),
    db.raw(`s.result->'peaks'->'sprints' as sprints`),
  );
}

const RECORDING_COLUMNS = ['submission_id', 'side', 'model_id', 'firmware_id', 'recording_device_id', 'recording_mode', 'other_meters_on'];

/**
 * Adds an accepted submission to the statistics, or removes one that is no longer
 * accepted. Call it inside the moderation decision's transaction, after the status
 * change, exactly once per change of accepted-ness.
 */
export async function updateAggregatesForSubmission(trx: Knex.Transaction, submissionId: number, change: 'add' | 'remove'): Promise<void> {
  const submission: SubmissionRow | undefined = await selectSubmissions(trx).where('s.id', submissionId).first();
  if (!submission) throw new Error(`submission ${submissionId} does not exist`);
  const recordings: RecordingRow[] = await trx('submission_recordings').where({ submission_id: submissionId }).select(RECORDING_COLUMNS);
  const deltas = emptyDeltas();
  accumulate(deltas, contributionsOf(submission, recordings), change === 'add' ? 1 : -1);
  await applyDeltas(trx, deltas, change);
}

async function applyDeltas(trx: Knex.Transaction, deltas: Deltas, change: 'add' | 'remove'): Promise<void> {
  if (deltas.stats.size === 0) return;

  // Riders first: a scope's distinct-rider count changes when a rider's count leaves or
  // reaches zero, and its rider terms change by terms(after) − terms(before).
  const riderChange = new Map<string, number>();
  const riderRowsLeft: number[] = [];
  if (deltas.riders.size > 0) {
    const riders = [...deltas.riders.values()];
    const returned: ({ id: number; model_id: number; firmware_id: number | null; rider_id: number } & RiderTotals)[] = await trx(
      'meter_statistics_riders',
    )
      .insert(riders.map(riderRow))
      .onConflict(['model_id', 'firmware_id', 'rider_id'])
      .merge(Object.fromEntries(RIDER_TOTAL_COLUMNS.map((c) => [c, trx.raw(`meter_statistics_riders.${c} + excluded.${c}`)])))
      .returning(['id', 'model_id', 'firmware_id', 'rider_id', ...RIDER_TOTAL_COLUMNS]);
    for (const row of returned) {
      if (row.contribution_count <= 0) riderRowsLeft.push(row.id);
      const key = scopeKey({ modelId: row.model_id, firmwareId: row.firmware_id });
      const delta = deltas.riders.get(`${key}:${row.rider_id}`)!.totals;
      const before = Object.fromEntries(RIDER_TOTAL_COLUMNS.map((c) => [c, row[c] - delta[c]])) as RiderTotals;
      const scopeTerms = deltas.stats.get(key)!.riderTerms;
      addRiderTerms(scopeTerms, riderTerms(row), 1);
      addRiderTerms(scopeTerms, riderTerms(before), -1);
      const change =
        before.contribution_count <= 0 && row.contribution_count > 0
          ? 1
          : before.contribution_count > 0 && row.contribution_count <= 0
            ? -1
            : 0;
      riderChange.set(key, (riderChange.get(key) ?? 0) + change);
    }
  }

  if (deltas.lags.size > 0) {
    await trx('cadence_lag_counts')
      .insert([...deltas.lags.values()].map(lagRow))
      .onConflict(['model_id', 'firmware_id', 'lag_seconds'])
      .merge({ submission_count: trx.raw('cadence_lag_counts.submission_count + excluded.submission_count') });
  }

  await trx('dropout_tag_statistics')
    .insert([...deltas.tags.values()].map(tagRow))
    .onConflict(['model_id', 'firmware_id', 'tag', 'value'])
    .merge(
      Object.fromEntries(
        ['submission_count', 'pedalling_hours', 'power_dropouts', 'cadence_dropouts'].map((c) => [
          c,
          trx.raw(`dropout_tag_statistics.${c} + excluded.${c}`),
        ]),
      ),
    );

  const statsRows = [...deltas.stats.entries()].map(([key, s]) => ({
    model_id: s.modelId,
    firmware_id: s.firmwareId,
    distinct_riders: riderChange.get(key) ?? 0,
    ...s.sums,
    ...s.riderTerms,
  }));
  await trx('meter_statistics')
    .insert(statsRows)
    .onConflict(['model_id', 'firmware_id'])
    .merge({
      ...Object.fromEntries(
        ['distinct_riders', ...STATISTICS_SUM_COLUMNS, ...RIDER_TERM_COLUMNS].map((c) => [
          c,
          trx.raw(`meter_statistics.${c} + excluded.${c}`),
        ]),
      ),
      updated_at: trx.fn.now(),
    });

  // A removal can empty a scope: drop its rows so that they look as a recompute leaves them.
  // (An addition only raises counts, so it has nothing to drop.)
  if (change === 'remove') {
    const modelIds = [...new Set([...deltas.stats.values()].map((s) => s.modelId))];
    // Riders are many per model: drop just the rows this decision brought to zero.
    if (riderRowsLeft.length > 0) await trx('meter_statistics_riders').whereIn('id', riderRowsLeft).delete();
    await trx('cadence_lag_counts').whereIn('model_id', modelIds).where('submission_count', '<=', 0).delete();
    await trx('dropout_tag_statistics').whereIn('model_id', modelIds).where('submission_count', '<=', 0).delete();
    await trx('meter_statistics').whereIn('model_id', modelIds).where('submission_count', '<=', 0).delete();
  }

  if (deltas.lags.size > 0) await refreshCadenceMedians(trx, [...deltas.stats.values()]);
  if (deltas.likeForLike) await trx('statistics_state').where({ id: 1 }).update({ consensus_stale: true });
}

async function refreshCadenceMedians(trx: Knex.Transaction, scopes: Scope[]): Promise<void> {
  const modelIds = [...new Set(scopes.map((s) => s.modelId))];
  const counts: { model_id: number; firmware_id: number | null; lag_seconds: number; submission_count: number }[] = await trx(
    'cadence_lag_counts',
  )
    .whereIn('model_id', modelIds)
    .select('model_id', 'firmware_id', 'lag_seconds', 'submission_count');
  const medians = scopes.map((scope) => {
    const histogram = counts
      .filter((c) => c.model_id === scope.modelId && c.firmware_id === scope.firmwareId)
      .map((c) => ({ value: c.lag_seconds, count: c.submission_count }));
    return [scope.modelId, scope.firmwareId, medianOfHistogram(histogram)];
  });
  // One statement for every scope the decision touched.
  await trx.raw(
    `update meter_statistics st set median_cadence_lag_seconds = v.median
     from (values ${medians.map(() => '(?::int, ?::int, ?::float8)').join(', ')}) as v(model_id, firmware_id, median)
     where st.model_id = v.model_id and st.firmware_id is not distinct from v.firmware_id`,
    medians.flat(),
  );
}

/**
 * Rebuilds every statistics table from the accepted submissions, in one transaction
 * (`npm run stats:recompute`). Gives the same figures as the decisions applied one by one.
 */
export async function recomputeAllAggregates(db: Knex): Promise<{ submissions: number; scopes: number }> {
  return db.transaction(async (trx) => {
    const deltas = emptyDeltas();
    const recordingsBySubmission = new Map<number, RecordingRow[]>();
    const recordings: (RecordingRow & { submission_id: number })[] = await trx('submission_recordings as r')
      .join('submissions as s', 's.id', 'r.submission_id')
      .where('s.status', 'accepted')
      .select(RECORDING_COLUMNS.map((c) => `r.${c}`));
    for (const recording of recordings) {
      const list = recordingsBySubmission.get(recording.submission_id) ?? [];
      list.push(recording);
      recordingsBySubmission.set(recording.submission_id, list);
    }
    const submissions: SubmissionRow[] = await selectSubmissions(trx).where('s.status', 'accepted');
    for (const submission of submissions) {
      accumulate(deltas, contributionsOf(submission, recordingsBySubmission.get(submission.id) ?? []), 1);
    }

    for (const table of ['meter_statistics_riders', 'cadence_lag_counts', 'dropout_tag_statistics', 'meter_statistics']) {
      await trx(table).delete();
    }
    const rows = scopeRowsOf(deltas);
    const chunk = 1000;
    const insertAll = async (table: string, tableRows: Record<string, unknown>[]) => {
      for (let i = 0; i < tableRows.length; i += chunk) await trx(table).insert(tableRows.slice(i, i + chunk));
    };
    await insertAll('meter_statistics', rows.statistics);
    await insertAll('meter_statistics_riders', rows.riders);
    await insertAll('cadence_lag_counts', rows.lags);
    await insertAll('dropout_tag_statistics', rows.tags);
    await trx('statistics_state').where({ id: 1 }).update({ consensus_stale: true });
    return { submissions: submissions.length, scopes: deltas.stats.size };
  });
}
