import type { Knex } from 'knex';
import { METHOD_VERSION } from '@shared/analysis/method';
import type { ReanalysisOverview, ReanalysisRunView, ReanalysisSource } from '@shared/schemas/reanalysis';
import type { Queue } from '../../jobs/queue';
import { ConflictError } from '../../lib/errors';
import type { Logger } from '../../lib/logger';
import { recordAudit } from '../audit/audit.repository';
import { enqueueReanalysis, finishRunIfComplete } from './reanalyse-submission.job';
import * as reanalysis from './reanalysis.repository';

/** How many runs the admin page lists. */
export const LISTED_RUNS = 10;

export function presentRun(run: reanalysis.ReanalysisRunRecord): ReanalysisRunView {
  return {
    id: run.id,
    methodVersion: run.methodVersion,
    source: run.source,
    status: run.status,
    startedBy: run.startedByHandle === null ? null : { handle: run.startedByHandle, name: run.startedByName ?? run.startedByHandle },
    total: run.total,
    done: run.done,
    failed: run.failed,
    sentBack: run.sentBack,
    startedAt: new Date(run.startedAt).toISOString(),
    finishedAt: run.finishedAt === null ? null : new Date(run.finishedAt).toISOString(),
    lastError: run.lastError,
  };
}

export async function getReanalysisOverview(db: Knex): Promise<ReanalysisOverview> {
  const [runs, outdatedSubmissions] = await Promise.all([
    reanalysis.listRuns(db, LISTED_RUNS),
    reanalysis.countOutdatedSubmissions(db, METHOD_VERSION),
  ]);
  return { currentMethodVersion: METHOD_VERSION, outdatedSubmissions, runs: runs.map(presentRun) };
}

/**
 * Starts a run over every stored submission analysed with an older method: the
 * run, its items and the audit entry in one transaction, then one job per
 * submission (without a queue, the next worker to start queues them). A run
 * already running is a conflict. A run with nothing to do closes at once (its
 * recompute changes no figure).
 */
export async function startReanalysis(
  deps: { db: Knex; queue?: Queue; logger?: Logger },
  command: { actorId: number | null; source: ReanalysisSource },
): Promise<ReanalysisRunView> {
  const { db, queue } = deps;
  const started = await db.transaction(async (trx) => {
    const run = await reanalysis.insertRun(trx, { startedBy: command.actorId, methodVersion: METHOD_VERSION, source: command.source });
    if (!run) {
      const active = await reanalysis.findRunningRun(trx);
      throw new ConflictError('A re-analysis is already running; wait for it to finish.', active ? { runId: active.id } : undefined);
    }
    await recordAudit(trx, {
      actorId: command.actorId,
      action: 'reanalysis.started',
      subjectType: 'reanalysis_run',
      subjectId: run.id,
      after: { methodVersion: METHOD_VERSION, source: command.source, total: run.submissionIds.length },
    });
    return run;
  });
  if (queue)
    await enqueueReanalysis(
      queue,
      started.submissionIds.map((submissionId) => ({ runId: started.id, submissionId })),
    );
  if (started.submissionIds.length === 0) await finishRunIfComplete(db, started.id, deps.logger);
  return presentRun((await reanalysis.findRun(db, started.id))!);
}
