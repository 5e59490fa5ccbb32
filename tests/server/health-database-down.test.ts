import { createHmac } from 'node:crypto';
import request from 'supertest';
import { afterAll, describe, expect, it } from 'vitest';
import { freePort } from '../../scripts/lib/port';
import { createApp } from '../../server/app';
import { SESSION_COOKIE } from '../../server/auth/session';
import { createDb } from '../../server/db/knex';
import { createLogger } from '../../server/lib/logger';
import { createObjectStore } from '../../server/lib/object-store';
import { testConfig } from './support/test-app';

// PostgreSQL is down: nothing listens on this port.
const config = testConfig({ DATABASE_URL: `postgres://crosswatt@127.0.0.1:${await freePort()}/gone` });
const db = createDb(config.DATABASE_URL);
const app = createApp({ config, db, logger: createLogger(config), store: createObjectStore(config) });
afterAll(() => db.destroy());

/** A validly signed session cookie, as express-session writes it (cookie-signature: "s:" + id + "." + HMAC-SHA256, base64 without padding). */
function sessionCookie(sessionId: string): string {
  const mac = createHmac('sha256', config.SESSION_SECRET).update(sessionId).digest('base64').replace(/=+$/, '');
  return `${SESSION_COOKIE}=${encodeURIComponent(`s:${sessionId}.${mac}`)}`;
}

describe('GET /api/health while PostgreSQL is down', () => {
  it('when the request carries no cookie, then it answers 503 with its body', async () => {
    const res = await request(app).get('/api/health');

    expect(res.status).toBe(503);
    expect(res.body).toMatchObject({ status: 'degraded', database: 'down' });
  });

  it('when the request carries a signed session cookie, then it still answers 503 with its body (not a 500 from the session store)', async () => {
    const res = await request(app).get('/api/health').set('Cookie', sessionCookie('a-session-from-before-the-outage'));

    expect(res.status).toBe(503);
    expect(res.body).toMatchObject({ status: 'degraded', database: 'down' });
  });
});
