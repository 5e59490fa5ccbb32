import type { Request, RequestHandler } from 'express';
import { ipKeyGenerator, rateLimit } from 'express-rate-limit';
import type { Config } from '../config/env';
import type { Db } from '../db/knex';
import { messagePage } from '../lib/message-page';
import { PostgresRateLimitStore } from './postgres-rate-limit-store';

// Every limiter counts in PostgreSQL, so the budgets hold across web processes and
// restarts. The daily submission limit is counted from the submissions themselves
// (server/features/submissions/submissions.service.ts).

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

// Signed-in people are counted per account, visitors per address.
function personKey(req: Request): string {
  return req.user ? `user:${req.user.id}` : `ip:${ipKeyGenerator(req.ip ?? '')}`;
}

function addressKey(req: Request): string {
  return `ip:${ipKeyGenerator(req.ip ?? '')}`;
}

interface LimiterOptions {
  /** Names the budget in the shared table: one name per limiter. */
  name: string;
  windowMs: number;
  limit: number;
  message: string;
  skip?: (req: Request) => boolean;
  keyGenerator?: (req: Request) => string;
}

function limiter(db: Db, { name, windowMs, limit, message, skip, keyGenerator = personKey }: LimiterOptions): RequestHandler {
  return rateLimit({
    windowMs,
    limit,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    keyGenerator,
    skip,
    store: new PostgresRateLimitStore(db, `${name}:`),
    // With PostgreSQL unreachable the request goes on and fails (or answers 503) on its own.
    passOnStoreError: true,
    handler: (req, res, _next, options) => {
      res.status(options.statusCode);
      // A page the browser navigated to (a sign-in link, say) gets a page; fetches get JSON.
      if (req.accepts(['json', 'html']) === 'html') res.type('html').send(messagePage('Please wait a moment', message));
      else res.json({ error: { code: 'too_many_requests', message } });
    },
  });
}

const isRead = (req: Request) => SAFE_METHODS.has(req.method);

/**
 * One budget for every state-changing request (POST/PUT/PATCH/DELETE) of one
 * person. app.ts mounts one instance in front of all routers, so every write
 * route is covered, including ones added later.
 */
export function writeLimiter(config: Config, db: Db): RequestHandler {
  return limiter(db, {
    name: 'writes',
    windowMs: config.RATE_LIMIT_WINDOW_MS,
    limit: config.RATE_LIMIT_WRITES_PER_WINDOW,
    message: 'Too many changes in a short time. Wait a minute and try again.',
    skip: isRead,
  });
}

/**
 * A wider budget per network address, whoever is signed in: many accounts
 * writing from one address are limited together.
 */
export function addressWriteLimiter(config: Config, db: Db): RequestHandler {
  return limiter(db, {
    name: 'address-writes',
    windowMs: config.RATE_LIMIT_WINDOW_MS,
    limit: config.RATE_LIMIT_WRITES_PER_ADDRESS_PER_WINDOW,
    message: 'Too many changes from your network in a short time. Wait a minute and try again.',
    skip: isRead,
    keyGenerator: addressKey,
  });
}

/** Starting a sign-in (the provider's callback is not counted: one sign-in, one hit). */
export function signInLimiter(config: Config, db: Db): RequestHandler {
  return limiter(db, {
    name: 'sign-ins',
    windowMs: config.RATE_LIMIT_WINDOW_MS,
    limit: config.RATE_LIMIT_SIGNINS_PER_WINDOW,
    message: 'Too many sign-in attempts in a short time. Wait a minute and try again.',
  });
}

/** Starting threads, replying and editing posts; counted on top of the write budget. */
export function postingLimiter(config: Config, db: Db): RequestHandler {
  return limiter(db, {
    name: 'posts',
    windowMs: 10 * 60_000,
    limit: config.RATE_LIMIT_POSTS_PER_TEN_MINUTES,
    message: 'You have posted a lot in the last few minutes. Wait a little before posting again.',
    skip: isRead,
  });
}
