// Each test file gets its own database, copied from the migrated template, and its
// own bucket in the run's fake S3 service.
import { randomBytes } from 'node:crypto';
import { inject } from 'vitest';
import { loadConfig } from '../../server/config/env';
import { createObjectStore } from '../../server/lib/object-store';
import { ensureDatabase } from '../../scripts/lib/postgres-cluster';

const adminUrl = inject('databaseAdminUrl');
const suffix = randomBytes(6).toString('hex');
const name = `test_${suffix}`;
await ensureDatabase(adminUrl, name, 'crosswatt_template');
process.env.DATABASE_URL = adminUrl.replace(/\/postgres$/, `/${name}`);

const objectStoreEnv = { ...inject('objectStoreEnv'), S3_BUCKET: `test-${suffix}` };
Object.assign(process.env, objectStoreEnv);
const store = createObjectStore(loadConfig({ DATABASE_URL: process.env.DATABASE_URL, ...objectStoreEnv }));
await store.ensureBucket();
store.close();
