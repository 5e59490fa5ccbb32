import PgBoss from 'pg-boss';
import { createMailQueue } from '../features/mail/send-mail.job';
import { createOriginalsSweepQueue } from '../features/originals/originals-sweep.job';
import { createAnalysisQueue } from '../features/submissions/analyse-submission.job';
import type { Logger } from '../lib/logger';

export type Queue = PgBoss;

// pg-boss keeps its jobs in the same PostgreSQL database, in its own schema.
// Queues are created at start so that web processes can send before any worker runs.
export async function startQueue(databaseUrl: string, logger: Logger): Promise<Queue> {
  const boss = new PgBoss({ connectionString: databaseUrl, max: 4 });
  boss.on('error', (err) => logger.error({ err }, 'job queue error'));
  await boss.start();
  await createAnalysisQueue(boss);
  await createMailQueue(boss);
  await createOriginalsSweepQueue(boss);
  return boss;
}
