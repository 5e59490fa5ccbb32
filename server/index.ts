// Production entry point: listen only. `npm start` (scripts/start.ts) wraps this
// with a private database and the local fakes for development and demos.
import { loadConfig } from './config/env';
import { createShutdown } from './lib/graceful-shutdown';
import { startServer } from './start-server';

const config = loadConfig();
const shutdown = createShutdown();
shutdown.handleSignals();
const running = await startServer(config);
shutdown.add('the web server', () => running.close(), 30_000);
