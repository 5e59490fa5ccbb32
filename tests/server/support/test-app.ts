import { afterAll } from 'vitest';
import { testObjectStoreEnv } from '../../support/test-object-store';
import { createApp } from '../../../server/app';
import { type Config, loadConfig } from '../../../server/config/env';
import { createDb, type Db } from '../../../server/db/knex';
import { type LocalFakes, startLocalFakes } from '../../../server/fakes/start-fakes';
import { type Queue, startQueue } from '../../../server/jobs/queue';
import { registerWorkers } from '../../../server/jobs/workers';
import { createLogger } from '../../../server/lib/logger';
import { createObjectStore, type ObjectStore } from '../../../server/lib/object-store';

export interface TestContext {
  app: ReturnType<typeof createApp>;
  db: Db;
  config: Config;
  queue?: Queue;
  /** This test file's bucket in the run's fake S3 service. */
  store: ObjectStore;
  /** With `fakes: true`: the local fake OAuth provider (and other fakes). */
  fakes?: LocalFakes;
}

// signedInAgent(app, …) finds the database of an app made here.
const contexts = new WeakMap<object, TestContext>();
export function testContextOf(app: object): TestContext {
  const context = contexts.get(app);
  if (!context) throw new Error('This app was not made by createTestContext()');
  return context;
}

export function testConfig(overrides: Record<string, string> = {}): Config {
  return loadConfig({
    NODE_ENV: 'test',
    LOG_LEVEL: 'silent',
    DATABASE_URL: process.env.DATABASE_URL,
    // This file's bucket in the run's fake S3 service (tests/server/setup-database.ts).
    ...testObjectStoreEnv(),
    // Tests sign in and write far faster than people; rate-limit tests lower these.
    RATE_LIMIT_WRITES_PER_WINDOW: '10000',
    RATE_LIMIT_WRITES_PER_ADDRESS_PER_WINDOW: '10000',
    RATE_LIMIT_SIGNINS_PER_WINDOW: '10000',
    RATE_LIMIT_POSTS_PER_TEN_MINUTES: '10000',
    ...overrides,
  });
}

// The real app over the real database of this test file; closed after the file.
export async function createTestContext(
  /** queue: a real pg-boss queue; worker: plus the job handlers, as `npm start` runs them. */
  options: { queue?: boolean; worker?: boolean; fakes?: boolean; env?: Record<string, string> } = {},
): Promise<TestContext> {
  const bootConfig = testConfig(options.env);
  const logger = createLogger(bootConfig);
  const db = createDb(bootConfig.DATABASE_URL);
  // Every test file has its own bucket already (setup-database.ts): no fake store of its own.
  const fakes = options.fakes ? await startLocalFakes({ db, logger, objectStore: false }) : undefined;
  const config = fakes ? testConfig({ ...fakes.env, ...options.env }) : bootConfig;
  const queue = options.queue || options.worker ? await startQueue(config, logger) : undefined;
  const store = createObjectStore(config);
  if (queue && options.worker) await registerWorkers({ queue, db, logger, config, store });
  const app = createApp({ config, db, logger, queue, store });
  afterAll(async () => {
    await queue?.stop({ graceful: false, wait: true });
    await fakes?.stop();
    store.close();
    await db.destroy();
  });
  const context = { app, db, config, queue, store, fakes };
  contexts.set(app, context);
  return context;
}
