import type { Knex } from 'knex';
import { AnalysisError } from '@shared/analysis/errors';
import { METHOD_VERSION } from '@shared/analysis/method';
import type { ComparisonResult, QualityFlag } from '@shared/analysis/types';
import type { Queue } from '../../jobs/queue';
import type { Logger } from '../../lib/logger';
import type { ObjectStore } from '../../lib/object-store';
import { recordAudit } from '../audit/audit.repository';
import { recomputeAllAggregates } from '../statistics/aggregates';
import { ensureConsensusFresh } from '../statistics/consensus.service';
import { compareStoredSubmission } from '../submissions/ride-comparison';
import { findStoredRecordings, resultColumns } from '../submissions/submissions.repository';
import * as reanalysis from './reanalysis.repository';
import { decodesAgain, loadRecordingsForReanalysis, type ReanalysisRecording } from './recording-source';

export const REANALYSE_SUBMISSION_QUEUE = 'reanalyse-submission';
/** Attempts before an unexpected error counts the submission as failed in its run. */
export const MAX_REANALYSIS_ATTEMPTS = 3;

interface ReanalyseJob {
  runId: number;
  submissionId: number;
}

export async function createReanalysisQueue(queue: Queue) {
  // 'stately': one job per key waiting and one running, so queueing a run's items again (a resumed run) adds nothing.
  await queue.createQueue(REANALYSE_SUBMISSION_QUEUE, {
    name: REANALYSE_SUBMISSION_QUEUE,
    policy: 'stately',
    retryLimit: MAX_REANALYSIS_ATTEMPTS,
    retryDelay: 1,
    retryBackoff: true,
  });
}

export async function enqueueReanalysis(queue: Queue, items: ReanalyseJob[]): Promise<void> {
  for (let i = 0; i < items.length; i += 500) {
    await queue.insert(
      items
        .slice(i, i + 500)
        .map((item) => ({ name: REANALYSE_SUBMISSION_QUEUE, data: item, singletonKey: `${item.runId}:${item.submissionId}` })),
    );
  }
}

export async function workReanalysisQueue(queue: Queue, db: Knex, logger: Logger, store?: ObjectStore) {
  await queue.work<ReanalyseJob>(REANALYSE_SUBMISSION_QUEUE, { batchSize: 1, pollingIntervalSeconds: 0.5 }, async ([job]) => {
    await reanalyseSubmission(db, job.data.runId, job.data.submissionId, logger, store);
  });
  // A run whose jobs were lost (the queue's rows gone, a worker stopped for good) resumes when a worker starts.
  await enqueueReanalysis(queue, await reanalysis.findUnfinishedItems(db));
  // And a run whose last job ended before closing it (the close failed, the worker stopped) is closed now.
  const running = await reanalysis.findRunningRun(db);
  if (running) await finishRunIfComplete(db, running.id, logger);
}

/** The line moderators read on the review page, and the audit reason. */
export function sentBackReason(methodVersion: number, flags: QualityFlag[]): string {
  return `Re-analysed with method ${methodVersion}: ${flags.map((f) => f.message).join(' ')}`;
}

/** Severe flags of the new result that the stored one did not carry: what the moderator has not yet seen. */
function newSevereFlags(before: QualityFlag[], after: QualityFlag[]): QualityFlag[] {
  const seen = new Set(before.filter((f) => f.severity === 'severe').map((f) => `${f.code}\u0000${f.message}`));
  return after.filter((f) => f.severity === 'severe' && !seen.has(`${f.code}\u0000${f.message}`));
}

/**
 * Re-analyses one submission of a run with the current method. Idempotent: the
 * run's item takes its outcome once, a submission already at the current method
 * is skipped, and a submission the engine cannot compare keeps its stored result
 * (counted as failed). The moderator's decision stays, except that an accepted or
 * waiting ride whose new result raises a severe flag waits for review again, with
 * the reason in the audit log. Unexpected errors are retried; the job that
 * completes the run recomputes the statistics.
 */
export async function reanalyseSubmission(
  db: Knex,
  runId: number,
  submissionId: number,
  logger?: Logger,
  store?: ObjectStore,
): Promise<void> {
  const run = await reanalysis.findRun(db, runId);
  if (run?.status !== 'running') return;
  const attempts = await reanalysis.startItemAttempt(db, runId, submissionId);
  if (attempts !== undefined) {
    try {
      await reanalyseItem(db, run, submissionId, store);
    } catch (err) {
      logger?.error({ err, runId, submissionId, attempts }, 're-analysis failed');
      if (attempts < MAX_REANALYSIS_ATTEMPTS) throw err;
      const message = `Submission ${submissionId}: the re-analysis could not be completed (${err instanceof Error ? err.message : String(err)}).`;
      await db.transaction((trx) => reanalysis.recordItemOutcome(trx, runId, submissionId, 'failed', message));
    }
  }
  await finishRunIfComplete(db, runId, logger);
}

/** Current already: the method, and (for a run from the originals) every recording's decoder where an original is kept. */
async function upToDate(
  db: Knex,
  run: reanalysis.ReanalysisRunRecord,
  submissionId: number,
  methodVersion: number | null,
): Promise<boolean> {
  if (methodVersion !== METHOD_VERSION) return false;
  if (run.source !== 'originals') return true;
  return !(await findStoredRecordings(db, submissionId)).some(decodesAgain);
}

async function reanalyseItem(db: Knex, run: reanalysis.ReanalysisRunRecord, submissionId: number, store?: ObjectStore): Promise<void> {
  const stored = await reanalysis.findSubmissionForReanalysis(db, submissionId);
  if (!stored || (await upToDate(db, run, submissionId, stored.methodVersion))) {
    await db.transaction((trx) => reanalysis.recordItemOutcome(trx, run.id, submissionId, 'skipped'));
    return;
  }
  let result: ComparisonResult;
  let recordings: ReanalysisRecording[];
  try {
    recordings = await loadRecordingsForReanalysis(db, submissionId, run.source, store);
    // The same comparison as the analysis job: the engine in the worker pool, plus the tag check.
    result = await compareStoredSubmission(db, recordings);
  } catch (err) {
    if (!(err instanceof AnalysisError)) throw err;
    // The current method cannot compare these streams: the stored result and decision stay, and admins see why.
    await db.transaction((trx) =>
      reanalysis.recordItemOutcome(trx, run.id, submissionId, 'failed', `Submission ${submissionId}: ${err.message}`),
    );
    return;
  }
  await db.transaction(async (trx) => {
    const current = await reanalysis.lockSubmissionForReanalysis(trx, submissionId);
    if (!current || (current.methodVersion === METHOD_VERSION && !recordings.some((r) => r.redecoded))) {
      await reanalysis.recordItemOutcome(trx, run.id, submissionId, 'skipped');
      return;
    }
    // Streams decoded again from the originals replace the stored ones, with the decoder that built them.
    for (const r of recordings.filter((r) => r.redecoded)) {
      await trx('submission_recordings')
        .where({ submission_id: submissionId, side: r.side })
        .update({ stream: r.stream, decoder_version: r.decoderVersion });
    }
    const severe = newSevereFlags(current.flags, result.flags);
    const backToReview = severe.length > 0 && (current.status === 'accepted' || current.status === 'awaiting_review');
    const status = backToReview ? 'awaiting_review' : current.status;
    await trx('submissions')
      .where({ id: submissionId })
      .update({ ...resultColumns(trx, result), status, version: trx.raw('version + 1') });
    if (backToReview) {
      await recordAudit(trx, {
        actorId: run.startedBy,
        action: 'submission.sent_back_by_reanalysis',
        subjectType: 'submission',
        subjectId: submissionId,
        reason: sentBackReason(result.methodVersion, severe),
        before: { status: current.status, version: current.version, methodVersion: current.methodVersion },
        after: { status, version: current.version + 1, methodVersion: result.methodVersion, runId: run.id },
      });
    }
    await reanalysis.recordItemOutcome(trx, run.id, submissionId, backToReview ? 'sent_back' : 'reanalysed');
  });
}

/**
 * Closes the run when every item has its outcome: the statistics are rebuilt from
 * the accepted submissions (new results in, rides sent back out) and the run is
 * marked finished, in one transaction. The run's row lock makes this happen once.
 */
export async function finishRunIfComplete(db: Knex, runId: number, logger?: Logger): Promise<boolean> {
  let finished: boolean;
  try {
    finished = await db.transaction(async (trx) => {
      const run = await reanalysis.lockCompleteRun(trx, runId);
      if (!run) return false;
      await recomputeAllAggregates(trx);
      await reanalysis.closeRun(trx, runId, 'finished');
      return true;
    });
  } catch (err) {
    // The recompute rolled back: the statistics stay as they were and the run ends as failed, so an admin can start another.
    logger?.error({ err, runId }, 'closing the re-analysis run failed');
    await reanalysis.closeRun(
      db,
      runId,
      'failed',
      `The statistics could not be recomputed (${err instanceof Error ? err.message : String(err)}).`,
    );
    return false;
  }
  if (finished) {
    // The recompute marked the consensus stale: refit it now rather than on the next page view.
    await ensureConsensusFresh(db).catch((err) => logger?.warn({ err, runId }, 'consensus refit after re-analysis failed'));
  }
  return finished;
}
