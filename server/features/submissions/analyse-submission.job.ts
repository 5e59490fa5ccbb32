import type { Knex } from 'knex';
import { AnalysisError } from '@shared/analysis/errors';
import type { Config } from '../../config/env';
import type { Queue } from '../../jobs/queue';
import { defineQueue } from '../../jobs/queue-schema';
import type { Logger } from '../../lib/logger';
import { compareStoredSubmission } from './ride-comparison';
import * as submissions from './submissions.repository';

export const ANALYSE_SUBMISSION_QUEUE = 'analyse-submission';
/** Attempts before an unexpected error marks the submission failed. */
export const MAX_ANALYSIS_ATTEMPTS = 3;

// 'stately' with the submission id as singleton key: at most one job waiting and one
// running per submission. A job whose worker died stays active until it expires
// (ANALYSIS_JOB_EXPIRE_SECONDS, checked by pg-boss's maintenance), then is retried.
export async function createAnalysisQueue(queue: Queue, config: Pick<Config, 'ANALYSIS_JOB_EXPIRE_SECONDS'>) {
  await defineQueue(queue, ANALYSE_SUBMISSION_QUEUE, {
    policy: 'stately',
    retryLimit: MAX_ANALYSIS_ATTEMPTS,
    retryDelay: 1,
    retryBackoff: true,
    expireInSeconds: config.ANALYSIS_JOB_EXPIRE_SECONDS,
  });
}

export async function enqueueAnalysis(queue: Queue, submissionId: number) {
  await queue.send(ANALYSE_SUBMISSION_QUEUE, { submissionId }, { singletonKey: String(submissionId) });
}

/** How often a running worker looks for submissions whose job was lost, and how long they must have been idle. */
export const LOST_JOB_SWEEP = { everyMs: 60_000, idleSeconds: 120 };

export async function workAnalysisQueue(queue: Queue, db: Knex, logger: Logger, sweep = LOST_JOB_SWEEP) {
  await queue.work<{ submissionId: number }>(ANALYSE_SUBMISSION_QUEUE, { batchSize: 1, pollingIntervalSeconds: 0.5 }, async ([job]) => {
    await analyseSubmission(db, job.data.submissionId, logger);
  });
  const requeue = async (idleSeconds: number) => {
    for (const id of await submissions.findWaitingWithoutJob(db, ANALYSE_SUBMISSION_QUEUE, idleSeconds)) await enqueueAnalysis(queue, id);
  };
  // Submissions stored while no worker ran are queued at start; later, those whose job
  // was lost (say, queueing failed after the upload committed) are picked up by a sweep.
  // Only submissions without a live job: a restart must not queue a second one.
  await requeue(0);
  const timer = setInterval(() => {
    requeue(sweep.idleSeconds).catch((err) => logger.warn({ err }, 'sweep for lost analysis jobs failed'));
  }, sweep.everyMs);
  timer.unref();
  queue.once('stopped', () => clearInterval(timer));
}

/**
 * Runs the engine on a stored submission. Idempotent: a submission that has
 * moved on is left alone, and the result is stored only once. The engine's own
 * errors are the rider's to fix and end the job; anything else is retried.
 */
export async function analyseSubmission(db: Knex, id: number, logger?: Logger): Promise<void> {
  const stored = await submissions.findForAnalysis(db, id);
  if (!stored || !['received', 'analysing'].includes(stored.status)) return;
  const attempts = await submissions.markAnalysing(db, id);
  if (attempts === undefined) return;
  try {
    const result = await compareStoredSubmission(db, stored.recordings);
    await submissions.storeResult(db, id, result);
  } catch (err) {
    if (err instanceof AnalysisError) {
      await submissions.markFailed(db, id, err.code, err.message);
      return;
    }
    logger?.error({ err, submissionId: id, attempts }, 'analysis failed');
    if (attempts >= MAX_ANALYSIS_ATTEMPTS) {
      await submissions.markFailed(
        db,
        id,
        'analysis_error',
        'The analysis could not be completed. A moderator has been told; you do not need to upload again.',
      );
      return;
    }
    throw err;
  }
}
