import type { Knex } from 'knex';

// Moderation: who decided on a submission and why; catalogue curation (rejected
// and merged entries, aliases that keep old names findable, a moderator's pinned
// note on a model or firmware, a model hidden from the scoreboard with a reason);
// and e-mail (messages waiting for the mail job, and the fake SMTP service's outbox).
const CATALOGUE_TABLES = ['models', 'firmware_versions', 'recording_devices'] as const;

export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('submissions', (t) => {
    t.text('decision_reason');
    t.text('decision_note');
    t.integer('decided_by').references('users.id').onDelete('set null');
    t.timestamp('decided_at', { useTz: true });
    t.index(['ride_started_at', 'ride_ended_at']);
  });

  // A merged entry stays (threads and old links point at it) but is no longer listed.
  await knex.raw('alter table makers drop constraint makers_status_check');
  await knex.raw("alter table makers add constraint makers_status_check check (status in ('approved', 'pending', 'rejected', 'merged'))");
  for (const table of ['makers', ...CATALOGUE_TABLES]) {
    if (table !== 'makers') {
      await knex.raw(`alter table ${table} drop constraint ${table}_status_check`);
      await knex.raw(
        `alter table ${table} add constraint ${table}_status_check check (status in ('approved', 'pending', 'rejected', 'merged'))`,
      );
    }
    await knex.schema.alterTable(table, (t) => {
      t.integer('merged_into_id').references(`${table}.id`).onDelete('set null');
    });
  }

  // Read by the scoreboard: a hidden model is left out, with the reason shown on its page.
  await knex.schema.alterTable('models', (t) => {
    t.text('hidden_reason');
    t.integer('hidden_by').references('users.id').onDelete('set null');
    t.timestamp('hidden_at', { useTz: true });
  });

  // At most one pinned note per model and per firmware version, shown on its page.
  await knex.schema.createTable('moderator_notes', (t) => {
    t.increments('id');
    t.integer('model_id').unique().references('models.id').onDelete('cascade');
    t.integer('firmware_id').unique().references('firmware_versions.id').onDelete('cascade');
    t.text('body').notNullable();
    t.integer('pinned_by').references('users.id').onDelete('set null');
    t.timestamp('pinned_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.check('(model_id is null) <> (firmware_id is null)', [], 'moderator_notes_one_subject');
  });

  // Old names of renamed or merged entries; a search for one finds the entry it now is.
  await knex.schema.createTable('catalogue_aliases', (t) => {
    t.increments('id');
    t.text('entry_type').notNullable().checkIn(['maker', 'model', 'firmware', 'recording_device']);
    t.integer('entry_id').notNullable();
    t.text('name').notNullable();
    t.text('slug');
    t.integer('created_by').references('users.id').onDelete('set null');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['entry_type', 'entry_id']);
    t.index(['entry_type', 'slug']);
  });

  // Every e-mail Crosswatt means to send; the mail job sends it and records the outcome.
  await knex.schema.createTable('mail_messages', (t) => {
    t.increments('id');
    t.integer('user_id').references('users.id').onDelete('set null');
    t.text('kind').notNullable();
    t.text('to_address').notNullable();
    t.text('subject').notNullable();
    t.text('text_body').notNullable();
    t.text('unsubscribe_url');
    t.text('status').notNullable().defaultTo('queued').checkIn(['queued', 'sent', 'failed']);
    t.integer('attempts').notNullable().defaultTo(0);
    t.text('last_error');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('sent_at', { useTz: true });
    t.index(['status']);
  });

  // What the local fake SMTP service received (server/fakes/fake-smtp.ts). Unused in production.
  await knex.schema.createTable('mail_outbox', (t) => {
    t.increments('id');
    t.text('mail_from').notNullable();
    t.specificType('recipients', 'text[]').notNullable();
    t.text('subject').notNullable().defaultTo('');
    t.text('text_body').notNullable().defaultTo('');
    t.jsonb('headers').notNullable().defaultTo('{}');
    t.text('raw').notNullable();
    t.timestamp('received_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('mail_outbox');
  await knex.schema.dropTable('mail_messages');
  await knex.schema.dropTable('catalogue_aliases');
  await knex.schema.dropTable('moderator_notes');
  await knex.schema.alterTable('models', (t) => {
    t.dropColumn('hidden_at');
    t.dropColumn('hidden_by');
    t.dropColumn('hidden_reason');
  });
  for (const table of ['makers', ...CATALOGUE_TABLES]) {
    await knex.schema.alterTable(table, (t) => t.dropColumn('merged_into_id'));
    // Entries rejected or merged meanwhile go back to pending, which every version allows.
    await knex(table)
      .whereIn('status', ['rejected', 'merged'])
      .modify((q) => {
        if (table !== 'makers') q.where('status', 'merged');
      })
      .update({ status: 'pending' });
    await knex.raw(`alter table ${table} drop constraint ${table}_status_check`);
    const allowed = table === 'makers' ? "'approved', 'pending'" : "'approved', 'pending', 'rejected'";
    await knex.raw(`alter table ${table} add constraint ${table}_status_check check (status in (${allowed}))`);
  }
  await knex.schema.alterTable('submissions', (t) => {
    t.dropIndex(['ride_started_at', 'ride_ended_at']);
    t.dropColumn('decided_at');
    t.dropColumn('decided_by');
    t.dropColumn('decision_reason');
    t.dropColumn('decision_note');
  });
}
