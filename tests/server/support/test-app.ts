import { afterAll } from 'vitest';
import { createApp } from '../../../server/app';
import { type Config, loadConfig } from '../../../server/config/env';
import { createDb, type Db } from '../../../server/db/knex';
import { type Queue, startQueue } from '../../../server/jobs/queue';
import { createLogger } from '../../../server/lib/logger';

export interface TestContext {
  app: ReturnType<typeof createApp>;
  db: Db;
  config: Config;
  queue?: Queue;
}

export function testConfig(overrides: Record<string, string> = {}): Config {
  return loadConfig({ NODE_ENV: 'test', LOG_LEVEL: 'silent', DATABASE_URL: process.env.DATABASE_URL, ...overrides });
}

// The real app over the real database of this test file; closed after the file.
export async function createTestContext(options: { queue?: boolean; env?: Record<string, string> } = {}): Promise<TestContext> {
  const config = testConfig(options.env);
  const logger = createLogger(config);
  const db = createDb(config.DATABASE_URL);
  const queue = options.queue ? await startQueue(config.DATABASE_URL, logger) : undefined;
  const app = createApp({ config, db, logger, queue });
  afterAll(async () => {
    await queue?.stop({ graceful: false, wait: true });
    await db.destroy();
  });
  return { app, db, config, queue };
}
