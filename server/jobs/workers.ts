import type { Config } from '../config/env';
import type { Db } from '../db/knex';
import { workMailQueue } from '../features/mail/send-mail.job';
import { workOriginalsSweepQueue } from '../features/originals/originals-sweep.job';
import { workConsensusQueue } from '../features/statistics/consensus-refit.job';
import { workReanalysisQueue } from '../features/reanalysis/reanalyse-submission.job';
import { workAnalysisQueue } from '../features/submissions/analyse-submission.job';
import type { Logger } from '../lib/logger';
import type { ObjectStore } from '../lib/object-store';
import type { Queue } from './queue';

export interface WorkerDeps {
  queue: Queue;
  db: Db;
  logger: Logger;
  config: Config;
  store: ObjectStore;
}

// Each feature's job handlers are registered here, once, for both the in-process
// worker and `npm run worker`.
export async function registerWorkers({ queue, db, logger, config, store }: WorkerDeps): Promise<void> {
  await workAnalysisQueue(queue, db, logger);
  await workMailQueue(queue, db, config, logger);
  await workOriginalsSweepQueue(queue, { db, store, logger, graceHours: config.ORIGINALS_SWEEP_GRACE_HOURS });
  await workConsensusQueue(queue, db, logger);
  await workReanalysisQueue(queue, db, logger, store);
}
