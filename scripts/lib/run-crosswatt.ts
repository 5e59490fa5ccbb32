// What `npm start` and `npm run dev` share: the private PostgreSQL (unless
// DATABASE_URL is set), migrations, the local fakes, the server with its
// in-process worker, the demo seed into an empty database, and a clean stop.
import { ConfigError, loadConfig } from '../../server/config/env';
import { createDb } from '../../server/db/knex';
import { runMigrations } from '../../server/db/migrate';
import { startLocalFakes } from '../../server/fakes/start-fakes';
import { createShutdown, type Shutdown } from '../../server/lib/graceful-shutdown';
import { createLogger } from '../../server/lib/logger';
import { startServer } from '../../server/start-server';
import { seedDemoIfEmpty } from './demo-seed';
import { portIsFree } from './port';
import { type Cluster, ClusterError, ensureDatabase, startCluster } from './postgres-cluster';

export interface RunOptions {
  /** Runs after the database is ready and before the server starts (the client build). */
  beforeServer?: () => Promise<unknown>;
  /** Runs once everything is up; may return its own cleanup (the Vite dev server). */
  afterStart?: (apiUrl: string) => Promise<(() => unknown) | undefined>;
  /** The address people open, when it is not the API server's own (Vite in dev). */
  publicUrl?: string;
  /** Load the demo world into an empty database (default true). */
  seedDemo?: boolean;
}

// Captured at start: a Vite build later sets NODE_ENV=production in this process.
const env: Record<string, string | undefined> = { NODE_ENV: 'development', ...process.env };

/**
 * The private PostgreSQL of npm start and npm run start:cluster, with the database
 * `crosswatt` in it; stopping it is the shutdown's last step.
 */
export async function startPrivateDatabase(
  shutdown: Shutdown,
  options: { dataDir: string; port: number },
): Promise<{ cluster: Cluster; databaseUrl: string }> {
  const cluster = startCluster(options);
  // Last step of the shutdown, and a safety net: pg_ctl is synchronous, so it runs even in 'exit'.
  shutdown.add('PostgreSQL', () => cluster.stop(), 30_000);
  process.on('exit', () => cluster.stop());
  await ensureDatabase(cluster.urlFor('postgres'), 'crosswatt');
  console.log(`PostgreSQL is running on 127.0.0.1:${options.port} (data in ${options.dataDir})`);
  return { cluster, databaseUrl: cluster.urlFor('crosswatt') };
}

export function runCrosswatt(options: RunOptions = {}) {
  const port = Number(env.PORT ?? 3000);
  const pgPort = Number(env.CROSSWATT_PG_PORT ?? 54329);
  const dataDir = env.CROSSWATT_DATA_DIR ?? '.data/postgres';
  const shutdown = createShutdown();
  shutdown.handleSignals();
  process.on('uncaughtException', (err) => {
    console.error(err);
    void shutdown.stop(1);
  });

  async function main() {
    if (!(await portIsFree(port))) {
      throw new ClusterError(`Port ${port} is busy: is Crosswatt already running? Stop it, or set PORT to another port.`);
    }
    const databaseUrl = env.DATABASE_URL ?? (await startPrivateDatabase(shutdown, { dataDir, port: pgPort })).databaseUrl;
    const logger = createLogger({ LOG_LEVEL: (env.LOG_LEVEL as 'info') ?? 'warn' });
    const db = createDb(databaseUrl);
    shutdown.add('the database connections', () => db.destroy());
    await runMigrations(db);
    // The object store's fake keeps its files beside PostgreSQL's, unless S3_ENDPOINT names a real store.
    const objectStoreDir = env.CROSSWATT_OBJECT_STORE_DIR ?? '.data/object-store';
    const fakes = await startLocalFakes({ db, logger, objectStore: env.S3_ENDPOINT ? false : { directory: objectStoreDir } });
    shutdown.add('the local fakes', () => fakes.stop());
    await options.beforeServer?.();
    const config = loadConfig({
      LOG_LEVEL: 'warn',
      ...env,
      PORT: String(port),
      DATABASE_URL: databaseUrl,
      ...(options.publicUrl && { PUBLIC_URL: options.publicUrl }),
      ...fakes.env,
    });
    const running = await startServer(config);
    shutdown.add('the server and its worker', () => running.close(), 30_000);
    if (options.seedDemo !== false) await seedDemoIfEmpty({ db, config, log: console.log });
    const stopAfter = await options.afterStart?.(running.url);
    if (stopAfter) shutdown.add('the dev server', stopAfter);
    console.log(`\nCrosswatt is running at ${options.publicUrl ?? running.url}  (Ctrl-C to stop)`);
  }

  main().catch((err) => {
    console.error(err instanceof ClusterError || err instanceof ConfigError ? err.message : err);
    void shutdown.stop(1);
  });
}
