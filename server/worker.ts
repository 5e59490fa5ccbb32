// `npm run worker`: job handlers in a process of their own, so web servers and
// workers can be scaled independently.
import { loadConfig } from './config/env';
import { createDb } from './db/knex';
import { startQueue } from './jobs/queue';
import { registerWorkers } from './jobs/workers';
import { createLogger } from './lib/logger';

const config = loadConfig();
const logger = createLogger(config);
const db = createDb(config.DATABASE_URL);
const queue = await startQueue(config.DATABASE_URL, logger);
await registerWorkers({ queue, db, logger, config });
logger.info('Crosswatt worker is running');

const shutdown = async () => {
  await queue.stop({ graceful: true, wait: true, timeout: 10_000 });
  await db.destroy();
  process.exit(0);
};
process.once('SIGINT', shutdown);
process.once('SIGTERM', shutdown);
