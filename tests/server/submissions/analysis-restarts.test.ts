import { testObjectStore } from '../../support/test-object-store';
import { afterEach, beforeAll, describe, expect, it } from 'vitest';
import { ANALYSE_SUBMISSION_QUEUE, enqueueAnalysis } from '../../../server/features/submissions/analyse-submission.job';
import { createSubmission } from '../../../server/features/submissions/submissions.service';
import { markAnalysing } from '../../../server/features/submissions/submissions.repository';
import { type Queue, startQueue } from '../../../server/jobs/queue';
import { registerWorkers } from '../../../server/jobs/workers';
import { createLogger } from '../../../server/lib/logger';
import { createSubmissionInput } from '../../../shared/schemas/submission';
import { createCatalogue, submissionMeta, type TestCatalogue } from '../support/catalogue-factory';
import { signedInAgent } from '../support/sign-in';
import { createTestContext, testConfig } from '../support/test-app';
import { asBuffer, cleanPair } from './fit-pairs';
import { waitFor } from '../../support/wait-for';

// No worker in the context: each test starts (and "kills") its own, as processes do.
// A job still active 2 s after it started is expired by maintenance, which runs every second.
const workerEnv = { ANALYSIS_JOB_EXPIRE_SECONDS: '2', JOB_MAINTENANCE_SECONDS: '1' };
const { app, db } = await createTestContext({ fakes: true, env: workerEnv });
const config = testConfig(workerEnv);
const logger = createLogger(config);

let catalogue: TestCatalogue;
let riderId: number;
const running: Queue[] = [];

beforeAll(async () => {
  catalogue = await createCatalogue(db);
  riderId = (await signedInAgent(app, { handle: 'restart-rider' })).user.id;
});

afterEach(async () => {
  for (const queue of running.splice(0)) await queue.stop({ graceful: false, wait: true });
});

/** A stored submission with no job, as an upload leaves it when queueing fails or no worker runs. */
async function waitingSubmission(seed: number): Promise<number> {
  const pair = cleanPair(seed);
  const { id } = await createSubmission({ db, store: testObjectStore() }, riderId, createSubmissionInput.parse(submissionMeta(catalogue)), {
    a: { buffer: asBuffer(pair.a), originalName: 'a.fit' },
    b: { buffer: asBuffer(pair.b), originalName: 'b.fit' },
  });
  return id;
}

async function startWorker(): Promise<Queue> {
  const queue = await startQueue(config, logger);
  running.push(queue);
  await registerWorkers({ queue, db, logger, config, store: testObjectStore() });
  return queue;
}

function jobsOf(ids: number[]) {
  return db('pgboss.job')
    .where({ name: ANALYSE_SUBMISSION_QUEUE })
    .whereIn('singleton_key', ids.map(String))
    .select('singleton_key as key', 'state', 'retry_count as retryCount');
}

describe('analysis jobs across worker restarts', () => {
  it('when 20 submissions wait and a worker starts twice on one database, then there are exactly 20 jobs and each is analysed once', async () => {
    const ids: number[] = [];
    for (let i = 0; i < 20; i++) ids.push(await waitingSubmission(700 + i));

    await startWorker();
    await startWorker();

    await waitFor(
      async () =>
        (await db('submissions').whereIn('id', ids).where('status', 'awaiting_review').count<{ count: string }[]>({ count: '*' }))[0]!
          .count === '20',
      { timeoutMs: 120_000, what: 'all 20 analysed' },
    );
    const jobs = await jobsOf(ids);
    expect(jobs).toHaveLength(20);
    expect(new Set(jobs.map((j) => j.key)).size).toBe(20);
    expect(await db('submissions').whereIn('id', ids).max('attempts as most').first()).toEqual({ most: 1 });
  });

  it('when a worker is killed mid-analysis, then another worker retries the job once it expires, without a second job', async () => {
    const id = await waitingSubmission(730);
    // The doomed worker takes the job and starts the analysis, then dies without a word.
    const doomed = await startQueue(config, logger);
    await enqueueAnalysis(doomed, id);
    const [taken] = await doomed.fetch(ANALYSE_SUBMISSION_QUEUE);
    expect(taken?.data).toEqual({ submissionId: id });
    await markAnalysing(db, id);
    await doomed.stop({ graceful: false, wait: true });

    await startWorker();

    // The bound: expiry (2 s) + maintenance (1 s) + retry delay, with room for a slow machine;
    // pg-boss's default expiry would leave the job active for 15 minutes.
    await waitFor(() => db('submissions').where({ id, status: 'awaiting_review' }).first('id'), {
      timeoutMs: 60_000,
      what: 'the killed job retried',
    });
    const jobs = await jobsOf([id]);
    expect(jobs).toHaveLength(1);
    expect(jobs[0]).toMatchObject({ state: 'completed' });
    expect(jobs[0]!.retryCount).toBeGreaterThanOrEqual(1);
  });
});
