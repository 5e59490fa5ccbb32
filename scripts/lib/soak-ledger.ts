// After the soak: waits for the queues to drain, then reads the database to check
// what the servers acknowledged against what happened: each submission analysed
// exactly once, each decision audited once, each mail received once, and the
// statistics equal to a full recompute.
import type { Knex } from 'knex';
import type { Db } from '../../server/db/knex';
import { mailMessageId, SEND_MAIL_QUEUE } from '../../server/features/mail/send-mail.job';
import { ANALYSE_SUBMISSION_QUEUE } from '../../server/features/submissions/analyse-submission.job';
import { recomputeAllAggregates } from '../../server/features/statistics/aggregates';
import type { Acknowledged } from './soak-load';

const WAITING_STATUSES = ['received', 'analysing'];
const LIVE_JOB_STATES = ['created', 'retry', 'active'];

export interface DrainScope {
  riderIds: number[];
  /** Mail stored from this time on is the soak's. */
  since: Date;
  /** The sender the workers write, whose domain is in each Message-ID. */
  smtpFrom: string;
}

async function waitingWork(db: Db, scope: DrainScope) {
  const [submissions] = await db('submissions')
    .whereIn('rider_id', scope.riderIds)
    .whereIn('status', WAITING_STATUSES)
    .count<{ count: string }[]>({ count: '*' });
  const [mail] = await db('mail_messages')
    .where('created_at', '>=', scope.since)
    .where({ status: 'queued' })
    .count<{ count: string }[]>({ count: '*' });
  const [jobs] = await db('pgboss.job')
    .whereIn('name', [ANALYSE_SUBMISSION_QUEUE, SEND_MAIL_QUEUE])
    .whereIn('state', LIVE_JOB_STATES)
    .count<{ count: string }[]>({ count: '*' });
  return { submissions: Number(submissions!.count), mail: Number(mail!.count), jobs: Number(jobs!.count) };
}

/** Polls until no submission waits for analysis, no mail waits to be sent and no job is live; false when `timeoutMs` passes first. */
export async function waitForDrain(db: Db, scope: DrainScope, timeoutMs: number, log: (line: string) => void): Promise<boolean> {
  const until = Date.now() + timeoutMs;
  let last = '';
  for (;;) {
    const waiting = await waitingWork(db, scope).catch(() => undefined);
    if (waiting && waiting.submissions + waiting.mail + waiting.jobs === 0) return true;
    const line = waiting
      ? `waiting for ${waiting.submissions} analyses, ${waiting.mail} mails, ${waiting.jobs} live jobs`
      : 'the database does not answer';
    if (line !== last) log(`  ${line}…`);
    last = line;
    if (Date.now() > until) return false;
    await new Promise((resolve) => setTimeout(resolve, 1_000));
  }
}

export interface Figures {
  submissions: {
    uploaded: number;
    storedRows: number;
    analysedOnce: number;
    lost: number;
    duplicated: number;
    storedUnacknowledged: number;
    restartedAnalyses: number;
  };
  decisions: { acknowledged: number; unanswered: number; decided: number; auditEntries: number; lost: number; duplicated: number };
  mail: { queued: number; deliveredOnce: number; lost: number; duplicated: number };
  statistics: { equal: boolean; differences: string[] };
}

function countBy(rows: { key: string | number; count: string | number }[]): Map<string, number> {
  return new Map(rows.map((r) => [String(r.key), Number(r.count)]));
}

export async function readFigures(db: Db, scope: DrainScope, ack: Acknowledged): Promise<Figures> {
  // Submissions: every acknowledged one analysed (no longer waiting) by exactly one completed job.
  const rows: { id: number; status: string; attempts: number }[] = await db('submissions')
    .whereIn('rider_id', scope.riderIds)
    .select('id', 'status', 'attempts');
  const byId = new Map(rows.map((r) => [r.id, r]));
  const completed = countBy(
    (
      await db.raw(
        `select singleton_key as key, count(*) as count from (
           select singleton_key from pgboss.job where name = ? and state = 'completed'
           union all select singleton_key from pgboss.archive where name = ? and state = 'completed') j
         group by singleton_key`,
        [ANALYSE_SUBMISSION_QUEUE, ANALYSE_SUBMISSION_QUEUE],
      )
    ).rows,
  );
  let analysedOnce = 0;
  let lost = 0;
  let duplicated = 0;
  for (const id of ack.submissions) {
    const row = byId.get(id);
    const jobs = completed.get(String(id)) ?? 0;
    if (!row || WAITING_STATUSES.includes(row.status) || jobs === 0) lost++;
    else if (jobs > 1) duplicated++;
    else analysedOnce++;
  }

  // Decisions: each acknowledged one, and each submission decided in the database, has exactly one audit entry.
  const decidedIds = rows.filter((r) => r.status === 'accepted' || r.status === 'rejected').map((r) => r.id);
  const audits = countBy(
    await db('audit_log')
      .where({ subject_type: 'submission' })
      .whereIn('action', ['submission.accepted', 'submission.rejected'])
      .whereIn(
        'subject_id',
        rows.map((r) => String(r.id)),
      )
      .groupBy('subject_id')
      .select({ key: 'subject_id' })
      .count({ count: '*' }),
  );
  const decisionIds = new Set([...ack.decisions.keys(), ...decidedIds]);
  let decisionsLost = 0;
  let decisionsDuplicated = 0;
  for (const id of decisionIds) {
    const entries = audits.get(String(id)) ?? 0;
    const status = byId.get(id)?.status;
    if (entries === 0 || (ack.decisions.has(id) && ack.decisions.get(id) !== status)) decisionsLost++;
    else if (entries > 1) decisionsDuplicated++;
  }

  // Mail: each stored message sent and received by the mail service exactly once (by its Message-ID).
  const messages: { id: number; status: string }[] = await db('mail_messages')
    .where('created_at', '>=', scope.since)
    .select('id', 'status');
  const received = countBy(
    await db('mail_outbox')
      .where('received_at', '>=', scope.since)
      .groupByRaw("headers->>'message-id'")
      .select(db.raw("headers->>'message-id' as key"))
      .count({ count: '*' }),
  );
  const config = { SMTP_FROM: scope.smtpFrom };
  let mailOnce = 0;
  let mailLost = 0;
  let mailDuplicated = 0;
  for (const message of messages) {
    const copies = received.get(mailMessageId(config, message.id)) ?? 0;
    if (copies === 0 || message.status !== 'sent') mailLost++;
    else if (copies > 1) mailDuplicated++;
    else mailOnce++;
  }

  return {
    submissions: {
      uploaded: ack.submissions.size,
      storedRows: rows.length,
      analysedOnce,
      lost,
      duplicated,
      storedUnacknowledged: rows.filter((r) => !ack.submissions.has(r.id)).length,
      restartedAnalyses: rows.filter((r) => r.attempts > 1).length,
    },
    decisions: {
      acknowledged: ack.decisions.size,
      unanswered: ack.decisionsUnanswered.size,
      decided: decidedIds.length,
      auditEntries: [...audits.values()].reduce((a, b) => a + b, 0),
      lost: decisionsLost,
      duplicated: decisionsDuplicated,
    },
    mail: { queued: messages.length, deliveredOnce: mailOnce, lost: mailLost, duplicated: mailDuplicated },
    statistics: await compareWithRecompute(db),
  };
}

const STATISTICS_TABLES = ['meter_statistics', 'meter_statistics_riders', 'cadence_lag_counts', 'dropout_tag_statistics'];
const IGNORED_COLUMNS = new Set(['id', 'created_at', 'updated_at']);

async function snapshot(trx: Knex.Transaction): Promise<Map<string, Record<string, unknown>[]>> {
  const tables = new Map<string, Record<string, unknown>[]>();
  for (const table of STATISTICS_TABLES) {
    const rows: Record<string, unknown>[] = await trx(table).select('*');
    const kept = rows.map((row) => Object.fromEntries(Object.entries(row).filter(([column]) => !IGNORED_COLUMNS.has(column))));
    tables.set(
      table,
      kept.sort((x, y) => rowKey(x).localeCompare(rowKey(y))),
    );
  }
  return tables;
}

/** Sorts rows by their values rounded to 6 significant digits, so sums added in another order still line up. */
function rowKey(row: Record<string, unknown>): string {
  return JSON.stringify(Object.values(row).map((v) => (typeof v === 'number' ? Number(v.toPrecision(6)) : v)));
}

function sameValue(x: unknown, y: unknown): boolean {
  const [a, b] = [
    typeof x === 'string' && x !== '' && !Number.isNaN(Number(x)) ? Number(x) : x,
    typeof y === 'string' && y !== '' && !Number.isNaN(Number(y)) ? Number(y) : y,
  ];
  if (typeof a === 'number' && typeof b === 'number') return Math.abs(a - b) <= 1e-9 * Math.max(1, Math.abs(a), Math.abs(b));
  return JSON.stringify(a) === JSON.stringify(b);
}

/** The statistics as the decisions left them, against `recomputeAllAggregates` in a transaction that is rolled back. */
export async function compareWithRecompute(db: Db): Promise<{ equal: boolean; differences: string[] }> {
  const differences: string[] = [];
  const rollback = new Error('soak: roll the recompute back');
  await db
    .transaction(async (trx) => {
      const before = await snapshot(trx);
      await recomputeAllAggregates(trx);
      const after = await snapshot(trx);
      for (const table of STATISTICS_TABLES) {
        const [x, y] = [before.get(table)!, after.get(table)!];
        if (x.length !== y.length) differences.push(`${table}: ${x.length} rows, a recompute gives ${y.length}`);
        else {
          const row = x.findIndex((r, i) => Object.keys(r).some((column) => !sameValue(r[column], y[i]![column])));
          if (row !== -1) differences.push(`${table}: ${JSON.stringify(x[row])} ≠ ${JSON.stringify(y[row])}`);
        }
      }
      throw rollback;
    })
    .catch((err) => {
      if (err !== rollback) throw err;
    });
  return { equal: differences.length === 0, differences };
}
