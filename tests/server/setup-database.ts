// Each test file gets its own database, copied from the migrated template.
import { randomBytes } from 'node:crypto';
import { inject } from 'vitest';
import { ensureDatabase } from '../../scripts/lib/postgres-cluster';

const adminUrl = inject('databaseAdminUrl');
const name = `test_${randomBytes(6).toString('hex')}`;
await ensureDatabase(adminUrl, name, 'crosswatt_template');
process.env.DATABASE_URL = adminUrl.replace(/\/postgres$/, `/${name}`);
