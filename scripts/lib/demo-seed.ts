import type { Config } from '../../server/config/env';
import type { Db } from '../../server/db/knex';
import { seedDemoWorld } from '../../seeds/demo-world/seed-demo';

// Loads the demo world into an empty database through the real pipeline
// (seeds/demo-world/); a database that already has makers is left alone.
export async function seedDemoIfEmpty(options: { db: Db; config: Config; log: (line: string) => void }) {
  await seedDemoWorld({ db: options.db, config: options.config, log: options.log });
}
