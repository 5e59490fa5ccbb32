import knex, { type Knex } from 'knex';
import { knexConfig } from './knexfile';

export type Db = Knex;

export function createDb(databaseUrl: string): Db {
  return knex(knexConfig(databaseUrl));
}
