import type { Knex } from 'knex';

// Mail is retried on a schedule of its own (server/features/mail/send-mail.job.ts):
// when the next attempt is due, and since when it has been retried (the clock for
// giving up, restarted when an admin sends a failed message again).
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('mail_messages', (t) => {
    t.timestamp('next_attempt_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('retrying_since', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['status', 'next_attempt_at']);
  });
  await knex('mail_messages').update({ retrying_since: knex.ref('created_at') });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('mail_messages', (t) => {
    t.dropIndex(['status', 'next_attempt_at']);
    t.dropColumn('next_attempt_at');
    t.dropColumn('retrying_since');
  });
}
