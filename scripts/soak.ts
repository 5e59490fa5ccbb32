// `npm run soak -- --minutes N` (or `--quick`, half a minute): the configuration of
// `npm run start:cluster` on a throwaway database and free ports, under load while
// a worker, a web process, PostgreSQL and the mail service fail; then it prints what
// was lost or duplicated. Exits 1 when a goal (0 lost, 0 duplicated, 0 unexplained
// 5xx) is missed. DEVELOPERS.md, "A deployment that outgrows one process".
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { loadConfig } from '../server/config/env';
import { ensureUser } from '../server/features/users/users.service';
import { createShutdown } from '../server/lib/graceful-shutdown';
import { startCrosswattCluster } from './lib/crosswatt-cluster';
import { freePort } from './lib/port';
import { createSoakCatalogue } from './lib/soak-catalogue';
import { runFaults, within } from './lib/soak-faults';
import { Alternator, RequestTally, Session } from './lib/soak-http';
import { type Figures, readFigures, waitForDrain } from './lib/soak-ledger';
import { emptyAcknowledged, moderationLoop, readingLoop, threadLoop, uploadLoop } from './lib/soak-load';

function readMinutes(argv: string[]): number {
  if (argv.includes('--quick')) return 0.5;
  const at = argv.indexOf('--minutes');
  const minutes = at === -1 ? 3 : Number(argv[at + 1]);
  if (!Number.isFinite(minutes) || minutes <= 0 || minutes > 600) {
    console.error('Usage: npm run soak -- --minutes N (0 < N ≤ 600), or --quick for half a minute');
    process.exit(2);
  }
  return minutes;
}

// Limits far above the soak's load (the load is a handful of people from one address);
// retries, sweeps and job expiry in seconds, so the queues drain within the run.
const SOAK_SETTINGS = {
  NODE_ENV: 'development',
  LOG_LEVEL: 'warn',
  RATE_LIMIT_WRITES_PER_WINDOW: '100000',
  RATE_LIMIT_WRITES_PER_ADDRESS_PER_WINDOW: '100000',
  RATE_LIMIT_SIGNINS_PER_WINDOW: '10000',
  RATE_LIMIT_POSTS_PER_TEN_MINUTES: '10000',
  SUBMISSIONS_PER_DAY: '100000',
  MAIL_RETRY_FIRST_DELAY_SECONDS: '2',
  MAIL_RETRY_MAX_DELAY_SECONDS: '10',
  MAIL_SWEEP_SECONDS: '2',
  ANALYSIS_JOB_EXPIRE_SECONDS: '30',
  JOB_MAINTENANCE_SECONDS: '5',
};

const minutes = readMinutes(process.argv.slice(2));
const durationMs = minutes * 60_000;
const { DATABASE_URL: _notOurs, ...inherited } = process.env;
const env: Record<string, string | undefined> = { ...inherited, ...SOAK_SETTINGS };
const folder = fs.mkdtempSync(path.join(os.tmpdir(), 'crosswatt-soak-'));
fs.chmodSync(folder, 0o755);
const childLog = fs.createWriteStream(path.join(folder, 'processes.log'));
const shutdown = createShutdown();
shutdown.handleSignals();
// Added first, so it runs last: after PostgreSQL has stopped. The processes' log is kept beside.
const keptLog = path.join(os.tmpdir(), `crosswatt-soak-${process.pid}.log`);
shutdown.add('the soak folder', () => {
  childLog.end();
  fs.copyFileSync(path.join(folder, 'processes.log'), keptLog);
  fs.rmSync(folder, { recursive: true, force: true });
});

async function main(): Promise<boolean> {
  const [web1, web2, pgPort] = [await freePort(), await freePort(), await freePort()];
  console.log(`Soak: ${minutes} min against 2 web processes and 2 workers (processes' output: ${keptLog})`);
  const cluster = await startCrosswattCluster(shutdown, {
    env,
    dataDir: path.join(folder, 'postgres'),
    pgPort,
    webPorts: [web1, web2],
    workers: 2,
    objectStoreDir: path.join(folder, 'object-store'),
    seedDemo: false,
    log: console.log,
    childOutput: (name, line) => childLog.write(`${new Date().toISOString()} [${name}] ${line}\n`),
  });
  const { db } = cluster;
  const catalogue = await createSoakCatalogue(db);
  const tally = new RequestTally();
  const webs = new Alternator(cluster.webs.map((w) => w.url));
  const person = async (handle: string, roles: 'moderator'[] = []) => {
    const session = new Session(handle, tally);
    await session.signIn(webs);
    if (roles.length > 0) await ensureUser(db, { handle, name: handle, roles });
    return session;
  };
  const riders = await Promise.all([1, 2, 3, 4].map((n) => person(`soak-rider-${n}`)));
  const moderator = await person('soak-moderator', ['moderator']);
  const readers = await Promise.all([1, 2].map((n) => person(`soak-reader-${n}`)));
  const posters = await Promise.all([1, 2].map((n) => person(`soak-poster-${n}`)));
  const riderIds: number[] = (
    await db('users')
      .whereIn(
        'handle',
        riders.map((r) => r.handle),
      )
      .select('id')
  ).map((r: { id: number }) => r.id);
  const since = new Date(Date.now() - 1_000);
  console.log(
    `Signed in ${riders.length} riders, a moderator, ${readers.length} readers and ${posters.length} posters; load for ${minutes} min:`,
  );

  const startedAt = Date.now();
  const ctx = { webs, catalogue, until: startedAt + durationMs };
  const ack = emptyAcknowledged();
  const [faults] = await Promise.all([
    runFaults(cluster, { startedAt, durationMs, log: console.log }),
    ...riders.map((rider) => uploadLoop(rider, ctx, ack)),
    moderationLoop(moderator, ctx, ack),
    ...readers.map((reader) => readingLoop(reader, ctx, ack)),
    threadLoop([posters[0]!, posters[1]!], ctx, ack),
  ]);

  console.log('Load stopped; waiting for the queues to drain (at most 3 min)…');
  const scope = { riderIds, since, smtpFrom: loadConfig({ ...env, DATABASE_URL: cluster.databaseUrl }).SMTP_FROM };
  const drained = await waitForDrain(db, scope, 180_000, console.log);
  const figures = await readFigures(db, scope, ack);
  const explained5xx = tally.serverErrors.filter((e) => within(faults.databaseDown, e.at)).length;
  const explainedUnanswered = tally.unanswered.filter(
    (e) => within(faults.databaseDown, e.at) || faults.webDown.some((w) => w.web === e.web && within([w], e.at)),
  ).length;
  return printFigures({ figures, drained, tally, explained5xx, explainedUnanswered, ack });
}

function printFigures(r: {
  figures: Figures;
  drained: boolean;
  tally: RequestTally;
  explained5xx: number;
  explainedUnanswered: number;
  ack: ReturnType<typeof emptyAcknowledged>;
}): boolean {
  const { figures: f, tally, ack } = r;
  const rows: [string, string, number | boolean | null][] = [
    [
      'requests',
      `${tally.total} (${[...tally.byStatus]
        .sort(([a], [b]) => a - b)
        .map(([s, n]) => `${s}: ${n}`)
        .join(', ')})`,
      null,
    ],
    ['5xx', `${tally.serverErrors.length}, of which ${r.explained5xx} while PostgreSQL was down`, null],
    ['unexplained 5xx', `${tally.serverErrors.length - r.explained5xx}`, tally.serverErrors.length - r.explained5xx],
    [
      'no answer',
      `${tally.unanswered.length}, of which ${r.explainedUnanswered} to a killed web process or while PostgreSQL was down`,
      null,
    ],
    ['unexplained no answer', `${tally.unanswered.length - r.explainedUnanswered}`, tally.unanswered.length - r.explainedUnanswered],
    [
      'unexpected answers',
      ack.unexpected.size === 0 ? '0' : [...ack.unexpected].map(([k, n]) => `${k} ×${n}`).join('; '),
      ack.unexpected.size,
    ],
    [
      'submissions',
      `${f.submissions.uploaded} uploaded (${f.submissions.storedRows} rows), ${f.submissions.analysedOnce} analysed exactly once; ${ack.duplicatesRefused} duplicates and ${ack.badFilesRefused} bad files refused; ${f.submissions.restartedAnalyses} analyses restarted after a kill`,
      null,
    ],
    [
      '  lost',
      `${f.submissions.lost} (+ ${f.submissions.storedUnacknowledged} stored but never acknowledged)`,
      f.submissions.lost + f.submissions.storedUnacknowledged,
    ],
    ['  duplicated', `${f.submissions.duplicated}`, f.submissions.duplicated],
    [
      'decisions',
      `${f.decisions.acknowledged} acknowledged (+ ${f.decisions.unanswered} unanswered), ${f.decisions.decided} decided in the database, ${f.decisions.auditEntries} audit entries`,
      null,
    ],
    ['  lost', `${f.decisions.lost}`, f.decisions.lost],
    ['  duplicated', `${f.decisions.duplicated}`, f.decisions.duplicated],
    ['thread posts, page views', `${ack.posts} posts, ${ack.pageViews} page views`, null],
    ['mails', `${f.mail.queued} queued, ${f.mail.deliveredOnce} delivered exactly once`, null],
    ['  lost', `${f.mail.lost}`, f.mail.lost],
    ['  duplicated', `${f.mail.duplicated}`, f.mail.duplicated],
    ['statistics = full recompute', f.statistics.equal ? 'yes' : `no: ${f.statistics.differences.join('; ')}`, !f.statistics.equal],
    ['queues drained', r.drained ? 'yes' : 'no (within 3 min)', !r.drained],
  ];
  console.log('');
  let met = true;
  for (const [label, value, miss] of rows) {
    const goal = miss === null ? '' : miss === 0 || miss === false ? '   goal met (0)' : '   GOAL MISSED';
    if (miss !== null && miss !== 0 && miss !== false) met = false;
    console.log(`${label.padEnd(28)} ${value}${goal}`);
  }
  for (const e of tally.serverErrors.slice(0, 10)) console.log(`  5xx: ${new Date(e.at).toISOString()} ${e.web} ${e.what} → ${e.status}`);
  console.log(met ? '\nEvery goal met: 0 lost, 0 duplicated, 0 unexplained 5xx.' : '\nA goal was missed (above).');
  return met;
}

main().then(
  (met) => shutdown.stop(met ? 0 : 1),
  (err) => {
    console.error(err);
    void shutdown.stop(1);
  },
);
