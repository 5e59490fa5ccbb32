import { randomBytes } from 'node:crypto';
import pg from 'pg';
import pino from 'pino';
import { describe, expect, inject, it } from 'vitest';
import { SEND_MAIL_QUEUE } from '../../../server/features/mail/send-mail.job';
import { SWEEP_ORIGINALS_QUEUE } from '../../../server/features/originals/originals-sweep.job';
import { REFIT_CONSENSUS_QUEUE } from '../../../server/features/statistics/consensus-refit.job';
import { ANALYSE_SUBMISSION_QUEUE } from '../../../server/features/submissions/analyse-submission.job';
import { REANALYSE_SUBMISSION_QUEUE } from '../../../server/features/reanalysis/reanalyse-submission.job';
import { type Queue, startQueue } from '../../../server/jobs/queue';
import { createLogger } from '../../../server/lib/logger';
import { ensureDatabase } from '../../../scripts/lib/postgres-cluster';
import { testConfig } from '../support/test-app';
import { waitFor } from '../../support/wait-for';

// The soak found it: two web processes and two workers starting together on a new
// database created pg-boss's queues at once, and PostgreSQL killed one start with
// "deadlock detected". Each round uses an empty database of its own.
const adminUrl = inject('databaseAdminUrl');
const logger = createLogger({ LOG_LEVEL: 'silent' });

async function emptyDatabase(): Promise<{ name: string; url: string }> {
  const name = `queues_${randomBytes(6).toString('hex')}`;
  await ensureDatabase(adminUrl, name);
  return { name, url: adminUrl.replace(/\/postgres$/, `/${name}`) };
}

async function emptyDatabaseUrl(): Promise<string> {
  return (await emptyDatabase()).url;
}

describe('starting the job queue in several processes at once', { timeout: 120_000 }, () => {
  it('when four processes start their queues together on a database that has none, then every start succeeds', async () => {
    for (let round = 0; round < 3; round++) {
      const config = testConfig({ DATABASE_URL: await emptyDatabaseUrl() });
      const starts = await Promise.allSettled([1, 2, 3, 4].map(() => startQueue(config, logger)));
      const started = starts.flatMap((s) => (s.status === 'fulfilled' ? [s.value] : []));
      const queues = (await started[0]?.getQueues()) ?? [];
      await Promise.all(started.map((q: Queue) => q.stop({ graceful: false, wait: true })));

      expect(starts.filter((s) => s.status === 'rejected').map((s) => String((s as PromiseRejectedResult).reason))).toEqual([]);
      expect(
        queues
          .map((q) => q.name)
          .filter((name) => !name.startsWith('__pgboss'))
          .sort(),
      ).toEqual(
        [ANALYSE_SUBMISSION_QUEUE, REFIT_CONSENSUS_QUEUE, SEND_MAIL_QUEUE, SWEEP_ORIGINALS_QUEUE, REANALYSE_SUBMISSION_QUEUE].sort(),
      );
    }
  });

  it('when PostgreSQL refuses connections as a job finishes, then the process lives on and the job is retried once it is back', async () => {
    const database = await emptyDatabase();
    const warnings: string[] = [];
    const capturing = pino({ level: 'warn', base: undefined }, { write: (line: string) => warnings.push(line) });
    const queue = await startQueue(testConfig({ DATABASE_URL: database.url, JOB_MAINTENANCE_SECONDS: '1' }), capturing);
    const admin = new pg.Client({ connectionString: adminUrl });
    await admin.connect();
    try {
      await queue.createQueue('outage-probe', { name: 'outage-probe', expireInSeconds: 2, retryLimit: 3, retryDelay: 0 });
      let runs = 0;
      // The first run takes the database away as it ends: pg-boss's "complete" then fails.
      await queue.work('outage-probe', { pollingIntervalSeconds: 0.5 }, async () => {
        runs++;
        if (runs === 1) {
          await admin.query(`alter database "${database.name}" allow_connections false`);
          await admin.query('select pg_terminate_backend(pid) from pg_stat_activity where datname = $1', [database.name]);
        }
      });
      const id = (await queue.send('outage-probe', {}))!;

      await waitFor(() => warnings.some((w) => w.includes('could not record a job of outage-probe as completed')), {
        what: 'the failed completion logged',
      });
      await admin.query(`alter database "${database.name}" allow_connections true`);
      const job = await waitFor(
        async () => {
          const found = await queue.getJobById('outage-probe', id).catch(() => null);
          return found?.state === 'completed' && found;
        },
        { timeoutMs: 60_000, what: 'the job completed after its retry' },
      );

      expect(job.retryCount).toBeGreaterThanOrEqual(1);
      expect(runs).toBeGreaterThanOrEqual(2);
    } finally {
      await admin.query(`alter database "${database.name}" allow_connections true`);
      await queue.stop({ graceful: false, wait: true });
      await admin.end();
    }
  });
});
