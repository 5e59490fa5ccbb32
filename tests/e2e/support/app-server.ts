import { afterAll } from 'vitest';
import { testObjectStoreEnv } from '../../support/test-object-store';
import { buildClientIfStale } from '../../../scripts/lib/client-build';
import { freePort } from '../../../scripts/lib/port';
import { loadConfig } from '../../../server/config/env';
import { createDb } from '../../../server/db/knex';
import { startLocalFakes } from '../../../server/fakes/start-fakes';
import { createLogger } from '../../../server/lib/logger';
import { type RunningServer, startServer } from '../../../server/start-server';

// The whole app as `npm start` runs it (built client, job worker, local fakes),
// on this test file's own database and a free port; stopped after the file.
export async function startAppForBrowser(): Promise<RunningServer> {
  await buildClientIfStale(() => {});
  const logger = createLogger({ LOG_LEVEL: 'silent' });
  const db = createDb(process.env.DATABASE_URL!);
  // The object store is this test file's bucket (setup-database.ts), which the test's own uploads share.
  const fakes = await startLocalFakes({ db, logger, objectStore: false });
  const config = loadConfig({
    NODE_ENV: 'test',
    LOG_LEVEL: 'silent',
    DATABASE_URL: process.env.DATABASE_URL,
    ...testObjectStoreEnv(),
    PORT: String(await freePort()),
    ...fakes.env,
  });
  const running = await startServer(config);
  afterAll(async () => {
    await running.close();
    await fakes.stop();
    await db.destroy();
  });
  return running;
}
