// `npm run migrate`: applies Knex migrations to DATABASE_URL.
import { loadConfig } from '../server/config/env';
import { createDb } from '../server/db/knex';
import { runMigrations } from '../server/db/migrate';

const db = createDb(loadConfig().DATABASE_URL);
await runMigrations(db);
await db.destroy();
console.log('Migrations are up to date.');
