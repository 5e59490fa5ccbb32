import type { Knex } from 'knex';
import type PgBoss from 'pg-boss';

/** pg-boss keeps its jobs in the same PostgreSQL database, in this schema. */
export const JOB_SCHEMA = 'pgboss';

/**
 * Creates a queue, or brings an existing one to these options: pg-boss's
 * createQueue leaves a queue made by an earlier version of the code as it was.
 */
export async function defineQueue(queue: PgBoss, name: string, options: Omit<PgBoss.Queue, 'name'>): Promise<void> {
  await queue.createQueue(name, { name, ...options });
  await queue.updateQueue(name, { name, ...options });
}

/**
 * SQL that is true when the row whose id is in `keyColumn` has a job in
 * `queueName` that is waiting, retrying or running (jobs are keyed by that id).
 * Sweeps for lost work use it, so a restart never queues a second job beside one
 * that is still alive.
 */
export function hasLiveJob(db: Knex, queueName: string, keyColumn: string): Knex.Raw {
  return db.raw(`exists (select 1 from ${JOB_SCHEMA}.job j where j.name = ? and j.singleton_key = (??)::text and j.state < 'completed')`, [
    queueName,
    keyColumn,
  ]);
}
