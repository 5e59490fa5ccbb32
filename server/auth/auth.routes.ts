import { type NextFunction, type Request, type Response, Router } from 'express';
import type { AuthenticateOptions } from 'passport';
import { signInQuerySchema } from '../../shared/schemas/auth';
import type { Config } from '../config/env';
import type { Db } from '../db/knex';
import { getCurrentUser } from '../features/users/users.service';
import { UnauthenticatedError } from '../lib/errors';
import { signInLimiter } from '../middleware/rate-limit';
import { validate } from '../middleware/validate';
import type { createCsrf } from './csrf';
import { requireUser } from './require-user';
import { type AppPassport, OAUTH_PROVIDER } from './passport';
import { SESSION_COOKIE, sessionCookieOptions } from './session';
import { signInProblemPage } from './sign-in-problem-page';

interface AuthDeps {
  config: Config;
  db: Db;
  passport: AppPassport;
  csrf: ReturnType<typeof createCsrf>;
}

// /auth/github → provider → /auth/github/callback → back into Crosswatt, signed in.
export function authRouter({ config, db, passport }: AuthDeps) {
  const router = Router();
  const limitSignIns = signInLimiter(config, db);

  router.get('/github', limitSignIns, validate(signInQuerySchema, 'query'), (req, res, next) => {
    const { login, returnTo } = res.locals.query as { login?: string; returnTo?: string };
    req.session.returnTo = returnTo;
    // `login` reaches the provider only through the fake's authorizationParams.
    const options = { login: config.OAUTH_FAKE ? login : undefined } as AuthenticateOptions;
    passport.authenticate(OAUTH_PROVIDER, options)(req, res, next);
  });

  // Not limited: the start of the sign-in was counted, and one sign-in is one hit.
  router.get('/github/callback', (req, res, next) => {
    passport.authenticate(OAUTH_PROVIDER, (err: unknown, user: Express.User | false, info?: { message?: string }) =>
      finishSignIn(req, res, next, err, user, info),
    )(req, res, next);
  });

  router.post('/logout', (req, res, next) => {
    req.session.destroy((err) => {
      if (err) return next(err);
      res.clearCookie(SESSION_COOKIE, sessionCookieOptions(config));
      res.status(204).end();
    });
  });
  return router;
}

function finishSignIn(
  req: Request,
  res: Response,
  next: NextFunction,
  err: unknown,
  user: Express.User | false,
  info?: { message?: string },
) {
  if (err) {
    // Token exchange refused, provider unreachable or answering nonsense.
    req.log.warn({ err }, 'sign-in failed at the provider');
    res
      .status(502)
      .type('html')
      .send(
        signInProblemPage(
          'The sign-in service did not answer properly',
          'We could not confirm who you are with the sign-in service, so you are not signed in and nothing was saved. Please try again in a moment.',
        ),
      );
    return;
  }
  if (!user) {
    const cancelled = req.query.error === 'access_denied';
    res
      .status(cancelled ? 401 : 400)
      .type('html')
      .send(
        cancelled
          ? signInProblemPage('Sign-in cancelled', 'You chose not to sign in. You can keep browsing without an account.')
          : signInProblemPage(
              'This sign-in could not be verified',
              `The answer from the sign-in service did not match a sign-in started here (${info?.message ?? 'unknown state'}). Start again from Crosswatt.`,
            ),
      );
    return;
  }
  const returnTo = req.session.returnTo ?? '/';
  // passport regenerates the session here: a new session id at sign-in.
  req.logIn(user, (loginErr) => {
    if (loginErr) return next(loginErr);
    res.redirect(returnTo);
  });
}

// GET /api/me and GET /api/csrf-token
export function authApiRouter({ db, csrf }: AuthDeps) {
  const router = Router();
  router.get('/csrf-token', csrf.issueToken);
  router.get('/me', requireUser, async (req, res) => {
    const me = await getCurrentUser(db, req.user!.id);
    if (!me) throw new UnauthenticatedError();
    res.set('Cache-Control', 'no-store').json(me);
  });
  return router;
}
