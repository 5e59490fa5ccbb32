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
  await createAnalysisQueue(boss, config);
  await createMailQueue(boss);
  await createOriginalsSweepQueue(boss);
  await createConsensusQueue(boss);
  await createReanalysisQueue(boss);
  return boss;
}
