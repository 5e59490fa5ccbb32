// `npm run start:cluster`: Crosswatt the way a deployment that outgrows one process
// runs it: two web processes (RUN_WORKER=false) on PORT and PORT + 1 and two
// workers, on one private PostgreSQL, with the local fakes and the demo data.
import { ConfigError } from '../server/config/env';
import { createShutdown } from '../server/lib/graceful-shutdown';
import { buildClientIfStale } from './lib/client-build';
import { startCrosswattCluster } from './lib/crosswatt-cluster';
import { ClusterError } from './lib/postgres-cluster';

// Captured at start: a Vite build later sets NODE_ENV=production in this process.
const env: Record<string, string | undefined> = { NODE_ENV: 'development', ...process.env };
const port = Number(env.PORT ?? 3000);
const shutdown = createShutdown();
shutdown.handleSignals();
process.on('uncaughtException', (err) => {
  console.error(err);
  void shutdown.stop(1);
});

async function main() {
  if (env.DATABASE_URL)
    throw new ClusterError(
      'npm run start:cluster runs its own PostgreSQL: unset DATABASE_URL, or start the web processes and workers yourself (DEVELOPERS.md).',
    );
  await buildClientIfStale();
  const cluster = await startCrosswattCluster(shutdown, {
    env,
    dataDir: env.CROSSWATT_DATA_DIR ?? '.data/postgres',
    pgPort: Number(env.CROSSWATT_PG_PORT ?? 54329),
    webPorts: [port, port + 1],
    workers: 2,
    objectStoreDir: env.CROSSWATT_OBJECT_STORE_DIR ?? '.data/object-store',
    seedDemo: env.CROSSWATT_SEED_DEMO !== 'false',
    log: console.log,
    childOutput: (name, line) => console.log(`[${name}] ${line}`),
  });
  console.log(
    `\nCrosswatt is running at ${cluster.webs.map((w) => w.url).join(' and ')}, with ${cluster.workers.length} workers  (Ctrl-C to stop)`,
  );
}

main().catch((err) => {
  console.error(err instanceof ClusterError || err instanceof ConfigError ? err.message : err);
  void shutdown.stop(1);
});
