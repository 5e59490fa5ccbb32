import { randomBytes } from 'node:crypto';
import type { Server } from 'node:http';
import express, { type Request, type Response } from 'express';
import type { Knex } from 'knex';
import { fakeIdentityInput, handleSchema } from '../../shared/schemas/auth';
import { formatZodError } from '../middleware/validate';
import { ensureFakeIdentity, type FakeIdentity, findFakeIdentity, findFakeIdentityById, listFakeIdentities } from './fake-oauth-identities';
import { type AuthorizeRequest, authorizePage } from './fake-oauth-page';

export interface FakeOAuth {
  url: string;
  /** Settings that point the app at this provider. */
  env: Record<string, string>;
  stop(): Promise<void>;
}

interface Grant {
  identityId: number;
  clientId: string;
  redirectUri: string;
  expiresAt: number;
}

const CODE_LIFETIME_MS = 60_000;
const LOOPBACK_HOSTS = new Set(['127.0.0.1', 'localhost', '[::1]']);

// The provider's side of the OAuth web flow on loopback, with the response shapes
// passport-github2 reads: authorize (a page, or `login=<handle>` for scripts),
// token exchange, profile and e-mails. Identities live in the database; codes and
// tokens only in memory, as they are short-lived.
export async function startFakeOAuth(options: {
  db: Knex;
  host?: string;
  port?: number;
  clientId?: string;
  clientSecret?: string;
}): Promise<FakeOAuth> {
  const { db, host = '127.0.0.1' } = options;
  const clientId = options.clientId ?? 'crosswatt-local';
  const clientSecret = options.clientSecret ?? 'crosswatt-local-secret';
  const codes = new Map<string, Grant>();
  const tokens = new Map<string, number>();

  const app = express();
  app.disable('x-powered-by');
  app.use(express.urlencoded({ extended: false, limit: '10kb' }));
  app.use(express.json({ limit: '10kb' }));

  // Only our own client, and only sending people back to this machine.
  function readAuthorizeRequest(source: Record<string, unknown>): AuthorizeRequest | string {
    const request = {
      clientId: String(source.client_id ?? ''),
      redirectUri: String(source.redirect_uri ?? ''),
      state: String(source.state ?? ''),
    };
    if (request.clientId !== clientId) return 'Unknown client_id.';
    try {
      const target = new URL(request.redirectUri);
      if (!['http:', 'https:'].includes(target.protocol) || !LOOPBACK_HOSTS.has(target.hostname))
        return 'redirect_uri must be on this machine.';
    } catch {
      return 'redirect_uri is missing or not a URL.';
    }
    return request;
  }

  function sendBack(res: Response, request: AuthorizeRequest, params: Record<string, string>) {
    const target = new URL(request.redirectUri);
    for (const [key, value] of Object.entries(params)) target.searchParams.set(key, value);
    if (request.state) target.searchParams.set('state', request.state);
    res.redirect(302, target.toString());
  }

  function approve(res: Response, request: AuthorizeRequest, identity: FakeIdentity) {
    const code = randomBytes(20).toString('hex');
    codes.set(code, {
      identityId: identity.id,
      clientId: request.clientId,
      redirectUri: request.redirectUri,
      expiresAt: Date.now() + CODE_LIFETIME_MS,
    });
    sendBack(res, request, { code });
  }

  function badRequest(res: Response, message: string) {
    res.status(400).type('text/plain').send(`Local test provider: ${message}`);
  }

  app.get('/authorize', async (req, res) => {
    const request = readAuthorizeRequest(req.query);
    if (typeof request === 'string') return badRequest(res, request);
    if (typeof req.query.login === 'string') {
      const login = handleSchema.safeParse(req.query.login);
      if (!login.success) return badRequest(res, `login: ${formatZodError(login.error)}`);
      const identity = await ensureFakeIdentity(db, { login: login.data, name: login.data, email: `${login.data}@riders.crosswatt.test` });
      return approve(res, request, identity);
    }
    res.type('html').send(authorizePage(request, await listFakeIdentities(db)));
  });

  app.post('/authorize/approve', async (req, res) => {
    const request = readAuthorizeRequest(req.body);
    if (typeof request === 'string') return badRequest(res, request);
    const identity = await findFakeIdentity(db, String(req.body.login ?? ''));
    if (!identity)
      return res
        .status(400)
        .type('html')
        .send(authorizePage(request, await listFakeIdentities(db), 'That identity no longer exists.'));
    approve(res, request, identity);
  });

  app.post('/authorize/create', async (req, res) => {
    const request = readAuthorizeRequest(req.body);
    if (typeof request === 'string') return badRequest(res, request);
    const parsed = fakeIdentityInput.safeParse(req.body);
    const problem = !parsed.success
      ? formatZodError(parsed.error)
      : (await findFakeIdentity(db, parsed.data.login))
        ? `The handle ${parsed.data.login} is taken; pick it from the list or choose another.`
        : undefined;
    if (problem || !parsed.success)
      return res
        .status(400)
        .type('html')
        .send(authorizePage(request, await listFakeIdentities(db), problem));
    approve(res, request, await ensureFakeIdentity(db, parsed.data));
  });

  app.post('/authorize/deny', (req, res) => {
    const request = readAuthorizeRequest(req.body);
    if (typeof request === 'string') return badRequest(res, request);
    sendBack(res, request, { error: 'access_denied', error_description: 'The person cancelled the sign-in.' });
  });

  app.post('/token', (req, res) => {
    const code = String(req.body.code ?? '');
    const grant = codes.get(code);
    codes.delete(code);
    const refuse = (error: string, description: string) => res.status(400).json({ error, error_description: description });
    if (req.body.client_id !== clientId || req.body.client_secret !== clientSecret)
      return refuse('incorrect_client_credentials', 'The client_id or client_secret is wrong.');
    if (!grant || grant.expiresAt < Date.now() || grant.clientId !== req.body.client_id)
      return refuse('bad_verification_code', 'The code is wrong or expired.');
    if (req.body.redirect_uri && req.body.redirect_uri !== grant.redirectUri)
      return refuse('redirect_uri_mismatch', 'The redirect_uri does not match.');
    const token = randomBytes(24).toString('hex');
    tokens.set(token, grant.identityId);
    res.json({ access_token: token, token_type: 'bearer', scope: 'user:email' });
  });

  async function bearerIdentity(req: Request): Promise<FakeIdentity | undefined> {
    const match = /^(?:Bearer|token) (\S+)$/i.exec(req.get('authorization') ?? '');
    const identityId = match ? tokens.get(match[1]!) : undefined;
    return identityId === undefined ? undefined : findFakeIdentityById(db, identityId);
  }

  app.get('/user', async (req, res) => {
    const identity = await bearerIdentity(req);
    if (!identity) return res.status(401).json({ message: 'Bad credentials' });
    res.json({ id: identity.id, login: identity.login, name: identity.name, email: identity.email, avatar_url: null, html_url: null });
  });

  app.get('/user/emails', async (req, res) => {
    const identity = await bearerIdentity(req);
    if (!identity) return res.status(401).json({ message: 'Bad credentials' });
    res.json([{ email: identity.email, primary: true, verified: true, visibility: 'private' }]);
  });

  app.use((err: unknown, _req: Request, res: Response, _next: express.NextFunction) => {
    res
      .status(500)
      .type('text/plain')
      .send(`Local test provider failed: ${String(err)}`);
  });

  const server = await new Promise<Server>((resolve, reject) => {
    const s = app.listen(options.port ?? 0, host, () => resolve(s));
    s.once('error', reject);
  });
  const address = server.address();
  const url = `http://${host}:${typeof address === 'object' && address ? address.port : 0}`;
  let stopped: Promise<void> | undefined;
  return {
    url,
    env: {
      OAUTH_CLIENT_ID: clientId,
      OAUTH_CLIENT_SECRET: clientSecret,
      OAUTH_AUTHORIZE_URL: `${url}/authorize`,
      OAUTH_TOKEN_URL: `${url}/token`,
      OAUTH_PROFILE_URL: `${url}/user`,
      OAUTH_EMAILS_URL: `${url}/user/emails`,
      OAUTH_FAKE: 'true',
    },
    stop() {
      stopped ??= new Promise<void>((resolve) => {
        server.close(() => resolve());
        server.closeAllConnections();
      });
      return stopped;
    },
  };
}
