import { createRequire } from 'node:module';
import pg from 'pg';
import PgBoss from 'pg-boss';
import type { Config } from '../config/env';
import { createMailQueue } from '../features/mail/send-mail.job';
import { createOriginalsSweepQueue } from '../features/originals/originals-sweep.job';
import { createConsensusQueue } from '../features/statistics/consensus-refit.job';
import { createReanalysisQueue } from '../features/reanalysis/reanalyse-submission.job';
import { createAnalysisQueue } from '../features/submissions/analyse-submission.job';
import type { Logger } from '../lib/logger';
import { JOB_SCHEMA } from './queue-schema';

export type Queue = PgBoss;
export type QueueConfig = Pick<Config, 'DATABASE_URL' | 'ANALYSIS_JOB_EXPIRE_SECONDS' | 'JOB_MAINTENANCE_SECONDS'>;

// Queues are created at start so that web processes can send before any worker runs.
// Maintenance (which fails jobs still active past their expiry, so they are retried)
// runs in one process at a time, every JOB_MAINTENANCE_SECONDS.
export async function startQueue(config: QueueConfig, logger: Logger): Promise<Queue> {
  const boss = new PgBoss({
    connectionString: config.DATABASE_URL,
    schema: JOB_SCHEMA,
    max: 4,
    maintenanceIntervalSeconds: config.JOB_MAINTENANCE_SECONDS,
  });
  boss.on('error', (err) => logger.error({ err }, 'job queue error'));
  await boss.start();
  await oneProcessAtATime(config.DATABASE_URL, async () => {
    await createAnalysisQueue(boss, config);
    await createMailQueue(boss);
    await createOriginalsSweepQueue(boss);
    await createConsensusQueue(boss);
    await createReanalysisQueue(boss);
  });
  return boss;
}

/**
 * pg-boss 10 records a finished job's outcome (complete or fail) without awaiting
 * it (timgit/pg-boss#577), so while PostgreSQL is down (restarted, failed over) the
 * rejection is unhandled and kills the worker process. Patched once, on pg-boss's
 * Manager, to emit it as the queue's 'error' (logged) instead: the job stays active,
 * expires (ANALYSIS_JOB_EXPIRE_SECONDS) and is retried, and every handler is
 * idempotent, so the retry finds its work done.
 */
function recordOutcomesWithoutCrashing() {
  const { prototype } = createRequire(import.meta.url)('pg-boss/src/manager.js') as {
    prototype: Record<string, unknown> & { emit(event: string, err: Error): void };
  };
  if (prototype.crosswattPatched) return;
  prototype.crosswattPatched = true;
  for (const [method, outcome] of [
    ['complete', 'completed'],
    ['fail', 'failed'],
  ] as const) {
    const record = prototype[method] as (this: typeof prototype, ...args: unknown[]) => Promise<unknown>;
    prototype[method] = function (this: typeof prototype, ...args: unknown[]) {
      return record.apply(this, args).catch((err: Error) => {
        this.emit(
          'error',
          new Error(`could not record a job of ${String(args[0])} as ${outcome} (it expires and is retried): ${err.message}`, {
            cause: err,
          }),
        );
      });
    };
  }
}
recordOutcomesWithoutCrashing();

/**
 * Processes that start together (npm run start:cluster's web processes and workers)
 * would create the same queues, and their tables, at once; PostgreSQL then aborts
 * one with "deadlock detected" and that process dies at start. A session advisory
 * lock makes them take turns; the lock goes with the connection.
 */
async function oneProcessAtATime(databaseUrl: string, work: () => Promise<void>): Promise<void> {
  const client = new pg.Client({ connectionString: databaseUrl });
  await client.connect();
  try {
    await client.query("select pg_advisory_lock(hashtext('crosswatt:define-queues'))");
    await work();
  } finally {
    await client.end();
  }
}
