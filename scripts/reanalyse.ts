// npm run reanalyse [-- --no-worker] — re-analyses every stored submission analysed
// with an older method (DATABASE_URL from the environment) and prints the progress
// until the run ends. A run already running is followed (and resumed) instead of
// started again. Without --no-worker the re-analysis jobs are worked in this
// process; with it, a running `npm run worker` or server does the work.
import { METHOD_VERSION } from '../shared/analysis/method';
import { loadConfig } from '../server/config/env';
import { createDb } from '../server/db/knex';
import { startQueue } from '../server/jobs/queue';
import { workReanalysisQueue } from '../server/features/reanalysis/reanalyse-submission.job';
import { findRun, findRunningRun } from '../server/features/reanalysis/reanalysis.repository';
import { startReanalysis } from '../server/features/reanalysis/reanalysis.service';
import { closeRecordingTasks } from '../server/features/submissions/recording-tasks';
import { createLogger } from '../server/lib/logger';
import { createObjectStore } from '../server/lib/object-store';

const POLL_MS = 2000;

const config = loadConfig();
const logger = createLogger(config);
const db = createDb(config.DATABASE_URL);
const queue = await startQueue(config, logger);
// --from-originals: kept original files an older decoder read are decoded again (the store's S3_* settings from the environment).
const source = process.argv.includes('--from-originals') ? 'originals' : 'streams';
const store = createObjectStore(config);
let exitCode = 0;
try {
  const running = await findRunningRun(db);
  const runId = running ? running.id : (await startReanalysis({ db, queue, logger }, { actorId: null, source })).id;
  console.log(running ? `Following run ${runId}, already running.` : `Started run ${runId} with method version ${METHOD_VERSION}.`);
  if (!process.argv.includes('--no-worker')) await workReanalysisQueue(queue, db, logger, store);
  const started = performance.now();
  let lastLine = '';
  for (;;) {
    const run = (await findRun(db, runId))!;
    const line = `${run.done + run.failed} of ${run.total} (${run.failed} failed, ${run.sentBack} sent back to review)`;
    if (line !== lastLine) console.log(line);
    lastLine = line;
    if (run.status !== 'running') {
      const seconds = ((performance.now() - started) / 1000).toFixed(1);
      console.log(`Run ${run.id} ${run.status} in ${seconds} s${run.lastError ? `; last error: ${run.lastError}` : ''}.`);
      if (run.status === 'failed') exitCode = 1;
      break;
    }
    await new Promise((resolve) => setTimeout(resolve, POLL_MS));
  }
} finally {
  await queue.stop({ graceful: true, wait: true, timeout: 10_000 });
  await closeRecordingTasks();
  await db.destroy();
  store.close();
}
process.exit(exitCode);
