import connectPgSimple from 'connect-pg-simple';
import session from 'express-session';
import type { Config } from '../config/env';
import type { Db } from '../db/knex';

export const SESSION_COOKIE = 'crosswatt.sid';

export function sessionCookieOptions(config: Config) {
  return { httpOnly: true, sameSite: 'lax' as const, secure: config.NODE_ENV === 'production', path: '/' };
}

// Sessions live in the `sessions` table (see its migration). The store borrows
// connections from the app's own Knex pool, so closing the app's database
// closes the sessions too.
export function sessionMiddleware({ config, db }: { config: Config; db: Db }) {
  const PgStore = connectPgSimple(session);
  const pool = {
    async query(text: string, params?: unknown[]) {
      const connection = await db.client.acquireConnection();
      try {
        return await connection.query(text, params);
      } finally {
        await db.client.releaseConnection(connection);
      }
    },
  };
  const store = new PgStore({
    pool: pool as never,
    tableName: 'sessions',
    createTableIfMissing: false,
    pruneSessionInterval: config.NODE_ENV === 'test' ? false : 15 * 60,
  });
  return session({
    name: SESSION_COOKIE,
    secret: config.SESSION_SECRET,
    store,
    resave: false,
    saveUninitialized: false,
    cookie: { ...sessionCookieOptions(config), maxAge: 30 * 24 * 60 * 60 * 1000 },
  });
}
