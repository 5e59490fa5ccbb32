import type { Knex } from 'knex';
import { DECODER_VERSION } from '@shared/analysis/decode-fit';
import type { QualityFlag } from '@shared/analysis/types';
import type { ReanalysisSource, ReanalysisStatus } from '@shared/schemas/reanalysis';
import type { SubmissionStatus } from '@shared/schemas/submission';

type Db = Knex | Knex.Transaction;

export type ReanalysisOutcome = 'reanalysed' | 'sent_back' | 'skipped' | 'failed';

export interface ReanalysisRunRecord {
  id: number;
  startedBy: number | null;
  startedByHandle: string | null;
  startedByName: string | null;
  methodVersion: number;
  source: ReanalysisSource;
  status: ReanalysisStatus;
  total: number;
  done: number;
  failed: number;
  sentBack: number;
  startedAt: Date;
  finishedAt: Date | null;
  lastError: string | null;
}

const RUN_COLUMNS = [
  'r.id',
  'r.started_by as startedBy',
  'u.handle as startedByHandle',
  'u.name as startedByName',
  'r.method_version as methodVersion',
  'r.source',
  'r.status',
  'r.total',
  'r.done',
  'r.failed',
  'r.sent_back as sentBack',
  'r.started_at as startedAt',
  'r.finished_at as finishedAt',
  'r.last_error as lastError',
];

function runs(db: Db) {
  return db('reanalysis_runs as r').leftJoin('users as u', 'u.id', 'r.started_by');
}

export async function findRun(db: Db, id: number): Promise<ReanalysisRunRecord | undefined> {
  return runs(db).where('r.id', id).first(RUN_COLUMNS);
}

export async function findRunningRun(db: Db): Promise<ReanalysisRunRecord | undefined> {
  return runs(db).where('r.status', 'running').first(RUN_COLUMNS);
}

export async function listRuns(db: Db, limit: number): Promise<ReanalysisRunRecord[]> {
  return runs(db).select(RUN_COLUMNS).orderBy('r.id', 'desc').limit(limit);
}

/** Statuses whose stored result a re-analysis replaces (received/analysing are the analysis job's; failed ones have no result). */
const REANALYSABLE_STATUSES: SubmissionStatus[] = ['awaiting_review', 'accepted', 'rejected', 'sent_back', 'withdrawn'];

/** Submissions an older method analysed; from the originals, also those with a kept original an older decoder read. */
function outdated(db: Db, methodVersion: number, source: ReanalysisSource = 'streams') {
  return db('submissions')
    .whereIn('status', REANALYSABLE_STATUSES)
    .whereNotNull('result')
    .where((q) => {
      q.whereNull('method_version').orWhere('method_version', '<', methodVersion);
      if (source === 'originals') {
        q.orWhereExists((e) =>
          e
            .select(db.raw('1'))
            .from('submission_recordings as r')
            .whereRaw('r.submission_id = submissions.id')
            .whereNotNull('r.original_key')
            .where((d) => d.whereNull('r.decoder_version').orWhere('r.decoder_version', '<', DECODER_VERSION)),
        );
      }
    });
}

export async function countOutdatedSubmissions(db: Db, methodVersion: number): Promise<number> {
  const [{ count }] = await outdated(db, methodVersion).count<{ count: string }[]>({ count: '*' });
  return Number(count);
}

/**
 * Creates a running run with one item per submission analysed with an older
 * method. The partial unique index refuses a second running run: undefined then.
 */
export async function insertRun(
  trx: Knex.Transaction,
  run: { startedBy: number | null; methodVersion: number; source: ReanalysisSource },
): Promise<{ id: number; submissionIds: number[] } | undefined> {
  const inserted = await trx.raw(
    `insert into reanalysis_runs (started_by, method_version, source) values (?, ?, ?)
     on conflict do nothing returning id`,
    [run.startedBy, run.methodVersion, run.source],
  );
  const id: number | undefined = inserted.rows[0]?.id;
  if (id === undefined) return undefined;
  const ids: number[] = (await outdated(trx, run.methodVersion, run.source).orderBy('id').select('id')).map((r: { id: number }) => r.id);
  for (let i = 0; i < ids.length; i += 1000) {
    await trx('reanalysis_run_items').insert(ids.slice(i, i + 1000).map((submissionId) => ({ run_id: id, submission_id: submissionId })));
  }
  await trx('reanalysis_runs').where({ id }).update({ total: ids.length });
  return { id, submissionIds: ids };
}

/** Items of running runs that no job has finished: what a worker queues again when it starts. */
export async function findUnfinishedItems(db: Db): Promise<Array<{ runId: number; submissionId: number }>> {
  return db('reanalysis_run_items as i')
    .join('reanalysis_runs as r', 'r.id', 'i.run_id')
    .where('r.status', 'running')
    .whereNull('i.outcome')
    .select('i.run_id as runId', 'i.submission_id as submissionId');
}

/** Counts one more attempt at an item still waiting; undefined when it already has its outcome. */
export async function startItemAttempt(db: Db, runId: number, submissionId: number): Promise<number | undefined> {
  const [row] = await db('reanalysis_run_items')
    .where({ run_id: runId, submission_id: submissionId })
    .whereNull('outcome')
    .update({ attempts: db.raw('attempts + 1') })
    .returning('attempts');
  return row?.attempts;
}

/**
 * Records an item's outcome and counts it in its run, once: an item that already
 * has an outcome changes nothing (false).
 */
export async function recordItemOutcome(
  trx: Knex.Transaction,
  runId: number,
  submissionId: number,
  outcome: ReanalysisOutcome,
  errorMessage: string | null = null,
): Promise<boolean> {
  const updated = await trx('reanalysis_run_items')
    .where({ run_id: runId, submission_id: submissionId })
    .whereNull('outcome')
    .update({ outcome, error_message: errorMessage });
  if (updated === 0) return false;
  await trx('reanalysis_runs')
    .where({ id: runId })
    .update({
      done: trx.raw(outcome === 'failed' ? 'done' : 'done + 1'),
      failed: trx.raw(outcome === 'failed' ? 'failed + 1' : 'failed'),
      sent_back: trx.raw(outcome === 'sent_back' ? 'sent_back + 1' : 'sent_back'),
      ...(errorMessage !== null && { last_error: errorMessage }),
    });
  return true;
}

/** Locks a running run whose every item has its outcome; undefined when it is not (yet) complete or already closed. */
export async function lockCompleteRun(trx: Knex.Transaction, runId: number): Promise<{ id: number; total: number } | undefined> {
  return trx('reanalysis_runs').where({ id: runId, status: 'running' }).whereRaw('done + failed >= total').forUpdate().first('id', 'total');
}

export async function closeRun(db: Db, runId: number, status: 'finished' | 'failed', lastError?: string): Promise<void> {
  await db('reanalysis_runs')
    .where({ id: runId, status: 'running' })
    .update({ status, finished_at: db.fn.now(), ...(lastError !== undefined && { last_error: lastError }) });
}

export interface SubmissionForReanalysis {
  id: number;
  status: SubmissionStatus;
  methodVersion: number | null;
  flags: QualityFlag[];
  version: number;
}

/** Locks the submission's row until the transaction ends (moderators' decisions lock it too). */
export async function lockSubmissionForReanalysis(trx: Knex.Transaction, id: number): Promise<SubmissionForReanalysis | undefined> {
  return trx('submissions').where({ id }).forUpdate().first('id', 'status', 'method_version as methodVersion', 'flags', 'version');
}

export async function findSubmissionForReanalysis(db: Db, id: number): Promise<SubmissionForReanalysis | undefined> {
  return db('submissions').where({ id }).first('id', 'status', 'method_version as methodVersion', 'flags', 'version');
}
