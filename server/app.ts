import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import compression from 'compression';
import cookieParser from 'cookie-parser';
import express from 'express';
import helmet from 'helmet';
import { pinoHttp } from 'pino-http';
import { authApiRouter, authRouter } from './auth/auth.routes';
import { createCsrf } from './auth/csrf';
import { createPassport } from './auth/passport';
import { sessionMiddleware } from './auth/session';
import type { Config } from './config/env';
import type { Db } from './db/knex';
import { adminRouter } from './features/admin/admin.routes';
import { batteryClaimRouter, modelConditionsRouter, myMetersRouter } from './features/battery/battery.routes';
import { catalogueRouter } from './features/catalogue/catalogue.routes';
import { healthRouter } from './features/health/health.routes';
import { scoreboardRouter } from './features/scoreboard/scoreboard.routes';
import { mailRouter } from './features/mail/mail.routes';
import { catalogueAliasRouter } from './features/moderation/curation.routes';
import { moderationRouter, submissionDecisionRouter } from './features/moderation/moderation.routes';
import { reanalysisRouter } from './features/reanalysis/reanalysis.routes';
import { mySubmissionsRouter, submissionsRouter } from './features/submissions/submissions.routes';
import { threadsRouter } from './features/threads/threads.routes';
import { accountRouter } from './features/users/users.routes';
import type { Logger } from './lib/logger';
import type { ObjectStore } from './lib/object-store';
import { errorHandler, notFound } from './middleware/error-handler';
import { addressWriteLimiter, writeLimiter } from './middleware/rate-limit';
import type { Queue } from './jobs/queue';

export interface AppDeps {
  config: Config;
  db: Db;
  logger: Logger;
  queue?: Queue;
  /** Where uploads' originals (location removed) are kept. */
  store: ObjectStore;
  /** The built client; default: dist/ of the checkout. */
  clientDist?: string;
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
  app.use(compression());
  app.use(pinoHttp({ logger, autoLogging: { ignore: (req) => !req.url?.startsWith('/api') } }));
  app.use(express.json({ limit: '200kb' }));
  app.use(express.urlencoded({ extended: false, limit: '50kb' }));

  // Health first: it must answer 503 while PostgreSQL is down, and the session store
  // (read for any request that carries a cookie) would turn that into a 500.
  app.use('/api/health', healthRouter(db));

  // Sign-in: cookies → session → passport → write rate limit → CSRF check on
  // every state-changing request (GETs and the OAuth callbacks are exempt).
  const passport = createPassport({ config: deps.config, db });
  const csrf = createCsrf(deps.config);
  app.use(['/api', '/auth'], cookieParser(), sessionMiddleware({ config: deps.config, db }), passport.initialize(), passport.session());
  app.use(['/api', '/auth'], writeLimiter(deps.config, db), addressWriteLimiter(deps.config, db));
  app.use(['/api', '/auth/logout'], csrf.requireCsrfToken);
  app.use('/auth', authRouter({ config: deps.config, db, passport, csrf }));
  app.use('/api', authApiRouter({ config: deps.config, db, passport, csrf }));
  app.use('/api/account', accountRouter({ db, store: deps.store, logger }));
  app.use('/api/admin/reanalysis', reanalysisRouter({ db, queue: deps.queue }));
  app.use('/api/admin', adminRouter({ db, store: deps.store }));
  app.use('/api/catalogue', catalogueRouter({ db }));
  app.use('/api/catalogue/aliases', catalogueAliasRouter({ db }));
  app.use('/api/submissions', submissionsRouter({ db, queue: deps.queue, config: deps.config, store: deps.store }));
  app.use('/api/me/submissions', mySubmissionsRouter({ db }));
  app.use('/api/submissions', submissionDecisionRouter({ db, queue: deps.queue, config: deps.config }));
  app.use('/api/me/meters', myMetersRouter({ db }));
  app.use('/api/moderation/models', batteryClaimRouter({ db }));
  app.use('/api/moderation', moderationRouter({ db, queue: deps.queue, config: deps.config }));
  app.use('/api/mail', mailRouter({ db, config: deps.config, queue: deps.queue }));
  app.use('/api', threadsRouter({ db, config: deps.config, queue: deps.queue }));

  app.use('/api/models', modelConditionsRouter({ db }));
  app.use('/api', scoreboardRouter({ db, queue: deps.queue }));
  app.use('/api', notFound);

  serveClient(app, deps.clientDist ?? clientDist);
  app.use(notFound);
  app.use(errorHandler);
  return app;
}

// The built client is served by the same process; unknown non-API paths get
// index.html so React Router can render them (including its own not-found page).
// Vite puts a content hash in every file name under assets/, so those are cached
// for a year and never revalidated; index.html and the other files are asked for
// again each time, so a deploy reaches everyone at once. Source maps are not
// served (the build does not write them; any left over are refused).
export const HASHED_ASSET_MAX_AGE_SECONDS = 365 * 24 * 3600;

function serveClient(app: express.Express, dist: string) {
  const indexHtml = path.join(dist, 'index.html');
  if (!fs.existsSync(indexHtml)) return;
  app.get(/^\/(?!api\/|auth\/).*\.map$/, notFound);
  app.use(
    express.static(dist, {
      index: false,
      setHeaders: (res, file) => {
        const hashed = path.relative(dist, file).startsWith(`assets${path.sep}`);
        res.setHeader('Cache-Control', hashed ? `public, max-age=${HASHED_ASSET_MAX_AGE_SECONDS}, immutable` : 'no-cache');
      },
    }),
  );
  app.get(/^\/(?!api\/|auth\/).*/, (_req, res) => res.sendFile(indexHtml, { headers: { 'Cache-Control': 'no-cache' } }));
}
