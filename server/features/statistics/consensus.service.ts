import type { Knex } from 'knex';
import { fitConsensusOffsets, type ConsensusEdge } from '@shared/statistics/consensus';
import { biasWeight } from '@shared/statistics/weighted-bias';

// Consensus offsets are one least-squares fit over every like-for-like submission
// (cubic in the number of model + firmware combinations), so they are not updated
// inside a moderation decision: the decision marks them stale, and the next reader
// (or `npm run stats:recompute`) refits and stores them.

export async function refitConsensusOffsets(db: Knex): Promise<{ combinations: number; edges: number }> {
  const rows: { firmware_a: number; firmware_b: number; sum_a: number; sum_b: number; pedalling_seconds: number }[] = await db(
    'submissions as s',
  )
    .join('submission_recordings as ra', (j) => j.on('ra.submission_id', 's.id').andOnVal('ra.side', 'a'))
    .join('submission_recordings as rb', (j) => j.on('rb.submission_id', 's.id').andOnVal('rb.side', 'b'))
    .where('s.status', 'accepted')
    .whereIn('s.like_for_like_mode', ['direct', 'via_balance'])
    .where('s.sum_a', '>', 0)
    .where('s.sum_b', '>', 0)
    .where('s.pedalling_seconds', '>', 0)
    .select('ra.firmware_id as firmware_a', 'rb.firmware_id as firmware_b', 's.sum_a', 's.sum_b', 's.pedalling_seconds');
  // Weighted like the bias: capped pedalling hours.
  const edges: ConsensusEdge<number>[] = rows.map((row) => ({
    a: row.firmware_a,
    b: row.firmware_b,
    logRatio: Math.log(row.sum_a / row.sum_b),
    weight: biasWeight(row.pedalling_seconds / 3600),
  }));
  const fit = fitConsensusOffsets(edges);
  const modelOf = new Map<number, number>(
    (
      await db('firmware_versions')
        .whereIn(
          'id',
          fit.offsets.map((o) => o.comboId),
        )
        .select('id', 'model_id')
    ).map((r: { id: number; model_id: number }) => [r.id, r.model_id]),
  );
  await db.transaction(async (trx) => {
    await trx('consensus_offsets').delete();
    const stored = fit.offsets.map((o) => ({
      firmware_id: o.comboId,
      model_id: modelOf.get(o.comboId)!,
      component: o.component,
      offset_percent: o.offsetPercent,
      lower_percent: o.lowerPercent,
      upper_percent: o.upperPercent,
      standard_error_log: o.standardErrorLog,
      connected_to: o.connectedTo,
      reportable: o.reportable,
    }));
    for (let i = 0; i < stored.length; i += 1000) await trx('consensus_offsets').insert(stored.slice(i, i + 1000));
    await trx('statistics_state').where({ id: 1 }).update({ consensus_computed_at: trx.fn.now() });
  });
  return { combinations: fit.offsets.length, edges: edges.length };
}

let refitting: Promise<void> | null = null;

/**
 * Refits when a decision has marked the offsets stale. The stale flag is claimed
 * atomically, so one process refits; a decision during the fit marks it stale
 * again and the next reader refits once more.
 */
export async function ensureConsensusFresh(db: Knex): Promise<void> {
  if (refitting) return refitting;
  const claimed = await db('statistics_state').where({ id: 1, consensus_stale: true }).update({ consensus_stale: false });
  if (claimed === 0) return;
  refitting = refitConsensusOffsets(db)
    .then(() => undefined)
    .catch(async (error) => {
      await db('statistics_state').where({ id: 1 }).update({ consensus_stale: true });
      throw error;
    })
    .finally(() => {
      refitting = null;
    });
  return refitting;
}
