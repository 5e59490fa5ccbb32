// What `npm run start:cluster` and the soak share: one private PostgreSQL, the
// local fakes once, migrations and the demo seed once, then web processes
// (RUN_WORKER=false) and workers (`npm run worker`), each a child with its own
// environment. The shutdown stops the children, then the fakes, then PostgreSQL.
import { loadConfig } from '../../server/config/env';
import { createDb, type Db } from '../../server/db/knex';
import { runMigrations } from '../../server/db/migrate';
import { type LocalFakes, startLocalFakes } from '../../server/fakes/start-fakes';
import type { Shutdown } from '../../server/lib/graceful-shutdown';
import { createLogger } from '../../server/lib/logger';
import { seedDemoIfEmpty } from './demo-seed';
import { createNodeChild, type NodeChild } from './node-child';
import { portIsFree } from './port';
import { type Cluster, ClusterError } from './postgres-cluster';
import { startPrivateDatabase } from './run-crosswatt';

export interface ClusterSettings {
  /** The environment the children start from (the parent's, captured at start). */
  env: Record<string, string | undefined>;
  dataDir: string;
  pgPort: number;
  webPorts: number[];
  workers: number;
  objectStoreDir: string;
  seedDemo: boolean;
  log: (line: string) => void;
  /** Every line a child prints, with its name ("web 1", "worker 2"). */
  childOutput: (name: string, line: string) => void;
}

export interface WebChild extends NodeChild {
  url: string;
}

export interface RunningCluster {
  postgres: Cluster;
  databaseUrl: string;
  /** The parent's own connections (migrations, seed, the fakes, the soak's checks). */
  db: Db;
  fakes: LocalFakes;
  webs: WebChild[];
  workers: NodeChild[];
}

/** How long a child has to stop after SIGTERM before it is killed. */
const CHILD_STOP_GRACE_MS = 25_000;

export async function startCrosswattCluster(shutdown: Shutdown, settings: ClusterSettings): Promise<RunningCluster> {
  const { env, log } = settings;
  for (const port of settings.webPorts) {
    if (!(await portIsFree(port)))
      throw new ClusterError(`Port ${port} is busy: is Crosswatt already running? Stop it, or set PORT to another port.`);
  }
  const { cluster: postgres, databaseUrl } = await startPrivateDatabase(shutdown, { dataDir: settings.dataDir, port: settings.pgPort });
  const logger = createLogger({ LOG_LEVEL: (env.LOG_LEVEL as 'info') ?? 'warn' });
  const db = createDb(databaseUrl);
  shutdown.add('the database connections', () => db.destroy());
  await runMigrations(db);
  const fakes = await startLocalFakes({ db, logger, objectStore: { directory: settings.objectStoreDir } });
  shutdown.add('the local fakes', () => fakes.stop());

  const childEnv: Record<string, string | undefined> = { LOG_LEVEL: 'warn', ...env, DATABASE_URL: databaseUrl, ...fakes.env };
  if (settings.seedDemo) await seedDemoIfEmpty({ db, config: loadConfig(childEnv), log });

  const webs: WebChild[] = settings.webPorts.map((port, i) => {
    const url = `http://127.0.0.1:${port}`;
    const child = createNodeChild({
      name: `web ${i + 1}`,
      entry: 'server/index.ts',
      env: { ...childEnv, PORT: String(port), HOST: '127.0.0.1', PUBLIC_URL: url, RUN_WORKER: 'false' },
      ready: () => waitForHealth(url, 60_000),
      output: settings.childOutput,
    });
    return Object.assign(child, { url });
  });
  const workers = Array.from({ length: settings.workers }, (_, i) =>
    createNodeChild({ name: `worker ${i + 1}`, entry: 'server/worker.ts', env: childEnv, output: settings.childOutput }),
  );
  const children: NodeChild[] = [...webs, ...workers];
  // Web processes and workers stop together (each drains its own requests or jobs), before the fakes and PostgreSQL.
  shutdown.add(
    'the web processes and workers',
    () => Promise.all(children.map((c) => c.stop(CHILD_STOP_GRACE_MS))),
    CHILD_STOP_GRACE_MS + 5_000,
  );
  await Promise.all(children.map((c) => c.start()));
  return { postgres, databaseUrl, db, fakes, webs, workers };
}

/** Polls GET /api/health until it answers 200. */
export async function waitForHealth(url: string, timeoutMs: number): Promise<void> {
  const until = Date.now() + timeoutMs;
  for (;;) {
    const status = await fetch(`${url}/api/health`).then(
      (r) => r.status,
      () => 0,
    );
    if (status === 200) return;
    if (Date.now() > until)
      throw new ClusterError(`${url}/api/health did not answer 200 within ${timeoutMs / 1000} s (last: ${status || 'no answer'})`);
    await new Promise((resolve) => setTimeout(resolve, 200));
  }
}
