import type { Knex } from 'knex';

export interface StatisticsState {
  /** Goes up with each committed change to what the statistics pages show (migration 20261201005000). */
  version: number;
  consensusStale: boolean;
}

/** One primary-key read: cheap enough for every public statistics request. */
export async function readStatisticsState(db: Knex): Promise<StatisticsState> {
  const row: { version: string | number; consensus_stale: boolean } = await db('statistics_state')
    .where({ id: 1 })
    .first('version', 'consensus_stale');
  return { version: Number(row.version), consensusStale: row.consensus_stale };
}
