import type { Server } from 'node:http';
import { createApp } from './app';
import { type Config, publicUrl } from './config/env';
import { createDb } from './db/knex';
import { startQueue } from './jobs/queue';
import { registerWorkers } from './jobs/workers';
import { closeRecordingTasks } from './features/submissions/recording-tasks';
import { createLogger } from './lib/logger';
import { createObjectStore } from './lib/object-store';

export interface RunningServer {
  url: string;
  server: Server;
  close(): Promise<void>;
}

// Wires the process together: database, job queue (+ in-process worker unless
// RUN_WORKER=false), HTTP app. Used by server/index.ts, npm start and the e2e tests.
export async function startServer(config: Config): Promise<RunningServer> {
  const logger = createLogger(config);
  const db = createDb(config.DATABASE_URL);
  const store = createObjectStore(config);
  const queue = await startQueue(config, logger);
  if (config.RUN_WORKER) await registerWorkers({ queue, db, logger, config, store });
  const app = createApp({ config, db, logger, queue, store });
  const server = await new Promise<Server>((resolve, reject) => {
    const s = app.listen(config.PORT, config.HOST, () => resolve(s));
    s.once('error', reject);
  });
  const address = server.address();
  const port = typeof address === 'object' && address ? address.port : config.PORT;
  const url = config.PUBLIC_URL ?? publicUrl({ ...config, PORT: port });
  return {
    url,
    server,
    async close() {
      await closeHttpServer(server);
      await queue.stop({ graceful: true, wait: true, timeout: 10_000 });
      await closeRecordingTasks();
      await db.destroy();
      store.close();
    },
  };
}

/** Stops taking connections, lets requests in flight finish for a few seconds, then cuts the rest. */
export async function closeHttpServer(server: Server, graceMs = 5_000): Promise<void> {
  const closed = new Promise<void>((resolve) => server.close(() => resolve()));
  server.closeIdleConnections();
  let timer: NodeJS.Timeout | undefined;
  const grace = new Promise<void>((resolve) => {
    timer = setTimeout(resolve, graceMs);
  });
  await Promise.race([closed, grace]);
  clearTimeout(timer);
  server.closeAllConnections();
  await closed;
}
