import { doubleCsrf } from 'csrf-csrf';
import type { RequestHandler } from 'express';
import type { Config } from '../config/env';
import { AppError } from '../lib/errors';

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

export class CsrfError extends AppError {
  constructor() {
    super(403, 'csrf_invalid', 'Your security token is missing or out of date. Reload the page and try again.');
  }
}

// Double-submit tokens (csrf-csrf) bound to the session id: the client fetches a
// token from GET /api/csrf-token and sends it as X-CSRF-Token on every write.
// A new session (sign-in, sign-out) makes old tokens invalid.
export function createCsrf(config: Config) {
  const production = config.NODE_ENV === 'production';
  const { generateCsrfToken, validateRequest } = doubleCsrf({
    getSecret: () => config.SESSION_SECRET,
    getSessionIdentifier: (req) => req.session?.id ?? '',
    cookieName: production ? '__Host-crosswatt.csrf' : 'crosswatt.csrf',
    cookieOptions: { sameSite: 'lax', secure: production, httpOnly: true, path: '/' },
    getCsrfTokenFromRequest: (req) => req.get('x-csrf-token'),
  });

  const issueToken: RequestHandler = (req, res) => {
    // Marks the session as worth keeping, so its id (the token's binding) stays.
    req.session.csrfIssued = true;
    res.set('Cache-Control', 'no-store').json({ token: generateCsrfToken(req, res) });
  };

  const requireCsrfToken: RequestHandler = (req, _res, next) => {
    if (SAFE_METHODS.has(req.method) || validateRequest(req)) return next();
    throw new CsrfError();
  };

  return { issueToken, requireCsrfToken };
}
