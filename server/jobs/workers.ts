import type { Config } from '../config/env';
import type { Db } from '../db/knex';
import { workMailQueue } from '../features/mail/send-mail.job';
import { workAnalysisQueue } from '../features/submissions/analyse-submission.job';
import type { Logger } from '../lib/logger';
import type { Queue } from './queue';

export interface WorkerDeps {
  queue: Queue;
  db: Db;
  logger: Logger;
  config: Config;
}

// Each feature's job handlers are registered here, once, for both the in-process
// worker and `npm run worker`.
export async function registerWorkers({ queue, db, logger, config }: WorkerDeps): Promise<void> {
  await workAnalysisQueue(queue, db, logger);
  await workMailQueue(queue, db, config, logger);
}
