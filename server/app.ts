import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import express from 'express';
import helmet from 'helmet';
import { pinoHttp } from 'pino-http';
import type { Config } from './config/env';
import type { Db } from './db/knex';
import { healthRouter } from './features/health/health.routes';
import type { Logger } from './lib/logger';
import { errorHandler, notFound } from './middleware/error-handler';

import type { Queue } from './jobs/queue';

export interface AppDeps {
  config: Config;
  db: Db;
  logger: Logger;
  queue?: Queue;
}

const clientDist = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../dist');

export function createApp(deps: AppDeps) {
  const { db, logger } = deps;
  const app = express();
  app.disable('x-powered-by');
  app.set('trust proxy', 'loopback');
  app.use(
    helmet({
      contentSecurityPolicy: {
        directives: {
          'img-src': ["'self'", 'data:'],
          'upgrade-insecure-requests': null,
        },
      },
    }),
  );
  app.use(pinoHttp({ logger, autoLogging: { ignore: (req) => !req.url?.startsWith('/api') } }));
  app.use(express.json({ limit: '200kb' }));
  app.use(express.urlencoded({ extended: false, limit: '50kb' }));

  app.use('/api/health', healthRouter(db));
  app.use('/api', notFound);

  serveClient(app);
  app.use(notFound);
  app.use(errorHandler);
  return app;
}

// The built client is served by the same process; unknown non-API paths get
// index.html so React Router can render them (including its own not-found page).
function serveClient(app: express.Express) {
  const indexHtml = path.join(clientDist, 'index.html');
  if (!fs.existsSync(indexHtml)) return;
  app.use(express.static(clientDist, { index: false, maxAge: '1h' }));
  app.get(/^\/(?!api\/|auth\/).*/, (_req, res) => res.sendFile(indexHtml));
}
