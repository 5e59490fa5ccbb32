import type { Knex } from 'knex';

// The table connect-pg-simple expects (its table.sql), under our own name.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('sessions', (t) => {
    t.string('sid').primary();
    t.json('sess').notNullable();
    t.timestamp('expire', { precision: 6 }).notNullable();
    t.index(['expire'], 'sessions_expire_index');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('sessions');
}
