import { Router } from 'express';
import type { Db } from '../../db/knex';
import { APP_VERSION } from '../../lib/version';

export function healthRouter(db: Db) {
  const router = Router();
  router.get('/', async (_req, res) => {
    const database = await db
      .raw('select 1')
      .then(() => 'up' as const)
      .catch(() => 'down' as const);
    res.status(database === 'up' ? 200 : 503).json({ status: database === 'up' ? 'ok' : 'degraded', version: APP_VERSION, database });
  });
  return router;
}
