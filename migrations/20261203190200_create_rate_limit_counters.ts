import type { Knex } from 'knex';

// Rate-limit counters shared by every web process (server/middleware/postgres-rate-limit-store.ts):
// one row per limiter and person, counting hits in a fixed window that ends at reset_at.
// The daily submission limit counts the rider's submissions instead, by created_at.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('rate_limit_counters', (t) => {
    t.text('key').primary();
    t.integer('hits').notNullable();
    t.timestamp('reset_at', { useTz: true }).notNullable().index();
  });
  await knex.schema.alterTable('submissions', (t) => t.index(['rider_id', 'created_at']));
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('submissions', (t) => t.dropIndex(['rider_id', 'created_at']));
  await knex.schema.dropTable('rate_limit_counters');
}
