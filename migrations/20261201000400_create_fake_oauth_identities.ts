import type { Knex } from 'knex';

// Identities of the local fake OAuth provider (server/fakes/fake-oauth.ts), kept
// so that people created on its page survive restarts. Unused in production.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('fake_oauth_identities', (t) => {
    t.increments('id');
    t.text('login').notNullable().unique();
    t.text('name').notNullable();
    t.text('email').notNullable();
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('fake_oauth_identities');
}
