import type { Request, RequestHandler } from 'express';
import { ipKeyGenerator, rateLimit } from 'express-rate-limit';
import type { Config } from '../config/env';

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

// Signed-in people are counted per account, visitors per address.
function personKey(req: Request): string {
  return req.user ? `user:${req.user.id}` : `ip:${ipKeyGenerator(req.ip ?? '')}`;
}

function addressKey(req: Request): string {
  return `ip:${ipKeyGenerator(req.ip ?? '')}`;
}

function limiter(
  windowMs: number,
  limit: number,
  message: string,
  skip?: (req: Request) => boolean,
  keyGenerator: (req: Request) => string = personKey,
): RequestHandler {
  return rateLimit({
    windowMs,
    limit,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    keyGenerator,
    skip,
    handler: (_req, res, _next, options) => {
      res.status(options.statusCode).json({ error: { code: 'too_many_requests', message } });
    },
  });
}

/**
 * One budget for every state-changing request (POST/PUT/PATCH/DELETE) of one
 * person. app.ts mounts one instance in front of all routers, so every write
 * route is covered, including ones added later.
 */
export function writeLimiter(config: Config): RequestHandler {
  return limiter(
    config.RATE_LIMIT_WINDOW_MS,
    config.RATE_LIMIT_WRITES_PER_WINDOW,
    'Too many changes in a short time. Wait a minute and try again.',
    (req) => SAFE_METHODS.has(req.method),
  );
}

/**
 * A wider budget per network address, whoever is signed in: many accounts
 * writing from one address are limited together.
 */
export function addressWriteLimiter(config: Config): RequestHandler {
  return limiter(
    config.RATE_LIMIT_WINDOW_MS,
    config.RATE_LIMIT_WRITES_PER_ADDRESS_PER_WINDOW,
    'Too many changes from your network in a short time. Wait a minute and try again.',
    (req) => SAFE_METHODS.has(req.method),
    addressKey,
  );
}

/** Starting a sign-in and coming back from the provider. */
export function signInLimiter(config: Config): RequestHandler {
  return limiter(
    config.RATE_LIMIT_WINDOW_MS,
    config.RATE_LIMIT_SIGNINS_PER_WINDOW,
    'Too many sign-in attempts in a short time. Wait a minute and try again.',
  );
}

const DAY_MS = 24 * 60 * 60 * 1000;

/**
 * How many submissions one rider may make in 24 hours (SUBMISSIONS_PER_DAY).
 * Refused uploads (a bad file, a duplicate) do not count against it.
 */
export function submissionsPerDayLimiter(config: Config): RequestHandler {
  const perDay = config.SUBMISSIONS_PER_DAY;
  return rateLimit({
    windowMs: DAY_MS,
    limit: perDay,
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    keyGenerator: personKey,
    skipFailedRequests: true,
    handler: (_req, res, _next, options) => {
      res.status(options.statusCode).json({
        error: {
          code: 'daily_submission_limit',
          message: `You have made ${perDay} submissions in the last 24 hours, the most Crosswatt takes from one rider in a day. Please try again tomorrow.`,
        },
      });
    },
  });
}

/** Starting threads, replying and editing posts; counted on top of the write budget. */
export function postingLimiter(config: Config): RequestHandler {
  return limiter(
    10 * 60_000,
    config.RATE_LIMIT_POSTS_PER_TEN_MINUTES,
    'You have posted a lot in the last few minutes. Wait a little before posting again.',
    (req) => SAFE_METHODS.has(req.method),
  );
}
