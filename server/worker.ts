// `npm run worker`: job handlers in a process of their own, so web servers and
// workers can be scaled independently.
import { loadConfig } from './config/env';
import { createDb } from './db/knex';
import { closeRecordingTasks } from './features/submissions/recording-tasks';
import { startQueue } from './jobs/queue';
import { registerWorkers } from './jobs/workers';
import { createShutdown } from './lib/graceful-shutdown';
import { createLogger } from './lib/logger';
import { createObjectStore } from './lib/object-store';

const config = loadConfig();
const logger = createLogger(config);
const shutdown = createShutdown({ log: (line) => logger.info(line) });
shutdown.handleSignals();
const db = createDb(config.DATABASE_URL);
shutdown.add('the database connections', () => db.destroy());
// Runs after the queue has stopped (steps run newest first): the jobs' decoding and analysis threads.
shutdown.add('the worker threads', () => closeRecordingTasks(), 20_000);
const queue = await startQueue(config, logger);
shutdown.add('the job queue', () => queue.stop({ graceful: true, wait: true, timeout: 10_000 }), 20_000);
const store = createObjectStore(config);
shutdown.add('the object store client', () => store.close());
await registerWorkers({ queue, db, logger, config, store });
logger.info('Crosswatt worker is running');
