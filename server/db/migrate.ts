import type { Db } from './knex';

export async function runMigrations(db: Db): Promise<void> {
  await db.migrate.latest();
}
