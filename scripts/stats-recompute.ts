// npm run stats:recompute — rebuilds every statistics table from the accepted
// submissions and refits the consensus offsets (DATABASE_URL from the environment).
import { loadConfig } from '../server/config/env';
import { createDb } from '../server/db/knex';
import { recomputeAllAggregates } from '../server/features/statistics/aggregates';
import { ensureConsensusFresh } from '../server/features/statistics/consensus.service';

const db = createDb(loadConfig().DATABASE_URL);
try {
  const started = performance.now();
  const aggregates = await recomputeAllAggregates(db);
  // The recompute marked the consensus stale: this refits it now rather than on the next page view.
  await ensureConsensusFresh(db);
  const offsets = await db('consensus_offsets').count({ n: '*' }).first();
  console.log(
    `Recomputed ${aggregates.scopes} scopes from ${aggregates.submissions} accepted submissions; ` +
      `consensus offsets for ${offsets?.n ?? 0} model + firmware combinations; ` +
      `${Math.round(performance.now() - started)} ms.`,
  );
} finally {
  await db.destroy();
}
