// One throwaway PostgreSQL cluster for the whole test run: a temporary folder, a
// free port, a migrated template database that each test file copies; and one fake
// S3 service in which each test file makes its own bucket. Removed afterwards, even
// when tests fail.
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { TestProject } from 'vitest/node';
import { register } from 'tsx/esm/api';
import { loadConfig } from '../server/config/env';
import { createDb } from '../server/db/knex';
import { startFakeS3 } from '../server/fakes/fake-s3';
import { runMigrations } from '../server/db/migrate';
import { startQueue } from '../server/jobs/queue';
import { createLogger } from '../server/lib/logger';
import { freePort } from '../scripts/lib/port';
import { ensureDatabase, startCluster } from '../scripts/lib/postgres-cluster';

// Knex imports the TypeScript migrations natively; teach this process to load them.
register();

export const TEMPLATE_DATABASE = 'crosswatt_template';

interface Shared {
  adminUrl: string;
  objectStoreEnv: Record<string, string>;
  users: number;
  teardown: () => void;
}

// The api and e2e projects both name this file; they share one cluster.
const state = globalThis as typeof globalThis & { crosswattTestCluster?: Promise<Shared> };

async function startShared(): Promise<Shared> {
  const folder = fs.mkdtempSync(path.join(os.tmpdir(), 'crosswatt-test-'));
  fs.chmodSync(folder, 0o755);
  const cluster = startCluster({ dataDir: path.join(folder, 'pg'), port: await freePort(), log: () => {} });
  const objectStore = await startFakeS3({ directory: path.join(folder, 's3') });
  const teardown = () => {
    void objectStore.stop();
    cluster.stop();
    fs.rmSync(folder, { recursive: true, force: true });
  };
  try {
    await ensureDatabase(cluster.urlFor('postgres'), TEMPLATE_DATABASE);
    const db = createDb(cluster.urlFor(TEMPLATE_DATABASE));
    await runMigrations(db);
    await db.destroy();
    // pg-boss creates its schema on first start; do it once in the template.
    const queue = await startQueue(loadConfig({ DATABASE_URL: cluster.urlFor(TEMPLATE_DATABASE) }), createLogger({ LOG_LEVEL: 'silent' }));
    await queue.stop({ graceful: true, wait: true, timeout: 5_000 });
  } catch (err) {
    teardown();
    throw err;
  }
  return { adminUrl: cluster.urlFor('postgres'), objectStoreEnv: objectStore.env, users: 0, teardown };
}

export default async function setup(project: TestProject) {
  state.crosswattTestCluster ??= startShared();
  const shared = await state.crosswattTestCluster;
  shared.users++;
  project.provide('databaseAdminUrl', shared.adminUrl);
  project.provide('objectStoreEnv', shared.objectStoreEnv);
  return () => {
    shared.users--;
    if (shared.users === 0) shared.teardown();
  };
}

declare module 'vitest' {
  export interface ProvidedContext {
    databaseAdminUrl: string;
    /** The S3_* settings of the run's fake S3 service (each file sets its own S3_BUCKET). */
    objectStoreEnv: Record<string, string>;
  }
}
