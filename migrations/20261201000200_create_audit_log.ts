import type { Knex } from 'knex';

// Every change to roles, memberships and (later) moderation decisions, with who
// made it and the state before and after. Admins read it; nothing deletes from it.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('audit_log', (t) => {
    t.bigIncrements('id');
    t.integer('actor_id').references('users.id').onDelete('SET NULL');
    t.text('action').notNullable();
    t.text('subject_type').notNullable();
    t.text('subject_id').notNullable();
    t.text('reason');
    t.jsonb('before');
    t.jsonb('after');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['subject_type', 'subject_id']);
    t.index(['created_at']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('audit_log');
}
