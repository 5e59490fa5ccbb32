// Production entry point: listen only. `npm start` (scripts/start.ts) wraps this
// with a private database and the local fakes for development and demos.
import { loadConfig } from './config/env';
import { startServer } from './start-server';

const config = loadConfig();
const running = await startServer(config);
const shutdown = () => void running.close().then(() => process.exit(0));
process.once('SIGINT', shutdown);
process.once('SIGTERM', shutdown);
