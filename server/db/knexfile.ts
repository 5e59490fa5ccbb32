import path from 'node:path';
import { fileURLToPath } from 'node:url';
import type { Knex } from 'knex';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');

export function knexConfig(databaseUrl: string): Knex.Config {
  return {
    client: 'pg',
    connection: databaseUrl,
    pool: { min: 0, max: 10 },
    migrations: {
      directory: path.join(root, 'migrations'),
      loadExtensions: ['.ts'],
      tableName: 'knex_migrations',
    },
    seeds: { directory: path.join(root, 'seeds'), loadExtensions: ['.ts'] },
  };
}

export default knexConfig(process.env.DATABASE_URL ?? 'postgres://crosswatt@127.0.0.1:54329/crosswatt');
