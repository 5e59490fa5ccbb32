import type { Knex } from 'knex';

// People, their roles (with who granted them), the makers (minimal here; the
// catalogue extends them) and verified maker staff memberships.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('users', (t) => {
    t.increments('id');
    t.text('provider').notNullable().defaultTo('github');
    // Cleared when the account is deleted, so signing in again starts afresh.
    t.text('provider_id');
    t.text('handle').unique();
    t.text('name').notNullable();
    t.text('email');
    t.text('avatar_url');
    t.boolean('email_on_decision').notNullable().defaultTo(true);
    t.boolean('email_on_reply').notNullable().defaultTo(true);
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('last_sign_in_at', { useTz: true });
    t.timestamp('deleted_at', { useTz: true });
    t.unique(['provider', 'provider_id']);
  });

  await knex.schema.createTable('role_grants', (t) => {
    t.increments('id');
    t.integer('user_id').notNullable().references('users.id').onDelete('CASCADE');
    t.text('role').notNullable();
    t.integer('granted_by').references('users.id').onDelete('SET NULL');
    t.timestamp('granted_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.unique(['user_id', 'role']);
    t.check("role in ('rider', 'moderator', 'admin')", [], 'role_grants_role_check');
  });

  await knex.schema.createTable('makers', (t) => {
    t.increments('id');
    t.text('slug').notNullable().unique();
    t.text('name').notNullable();
    t.text('status').notNullable().defaultTo('approved');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.check("status in ('approved', 'pending')", [], 'makers_status_check');
  });

  await knex.schema.createTable('maker_staff', (t) => {
    t.increments('id');
    // A staff member speaks for exactly one maker.
    t.integer('user_id').notNullable().unique().references('users.id').onDelete('CASCADE');
    t.integer('maker_id').notNullable().references('makers.id').onDelete('CASCADE');
    t.integer('verified_by').references('users.id').onDelete('SET NULL');
    t.timestamp('verified_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['maker_id']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('maker_staff');
  await knex.schema.dropTable('makers');
  await knex.schema.dropTable('role_grants');
  await knex.schema.dropTable('users');
}
