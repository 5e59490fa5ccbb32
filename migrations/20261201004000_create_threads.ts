import type { Knex } from 'knex';

// Discussion threads about a model (optionally one firmware version): riders
// report, the maker's verified staff answer. Posts keep their Markdown source
// and the sanitised HTML rendered from it; a post by staff of the model's maker
// remembers that maker, so the badge stays true to when it was written.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('threads', (t) => {
    t.increments('id');
    t.integer('model_id').notNullable().references('models.id').onDelete('restrict');
    t.integer('firmware_id').references('firmware_versions.id').onDelete('set null');
    t.integer('author_id').references('users.id').onDelete('set null');
    t.text('title').notNullable();
    t.text('status').notNullable().defaultTo('open').checkIn(['open', 'acknowledged', 'investigating', 'fixed']);
    t.integer('fixed_in_firmware_id').references('firmware_versions.id').onDelete('set null');
    t.integer('status_set_by').references('users.id').onDelete('set null');
    t.timestamp('status_set_at', { useTz: true });
    t.boolean('locked').notNullable().defaultTo(false);
    t.integer('moved_from_model_id').references('models.id').onDelete('set null');
    // First reply by staff of the model's maker: the "maker responded" filter.
    t.timestamp('maker_responded_at', { useTz: true });
    t.integer('reply_count').notNullable().defaultTo(0);
    t.timestamp('last_activity_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['model_id', 'last_activity_at']);
  });

  await knex.schema.createTable('posts', (t) => {
    t.increments('id');
    t.integer('thread_id').notNullable().references('threads.id').onDelete('cascade');
    t.integer('author_id').references('users.id').onDelete('set null');
    // The maker whose verified staff wrote this, for the staff badge.
    t.integer('staff_maker_id').references('makers.id').onDelete('set null');
    t.text('body_source').notNullable();
    t.text('body_html').notNullable();
    t.boolean('is_opening').notNullable().defaultTo(false);
    t.boolean('is_official_response').notNullable().defaultTo(false);
    t.text('hidden_reason');
    t.integer('hidden_by').references('users.id').onDelete('set null');
    t.timestamp('hidden_at', { useTz: true });
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('edited_at', { useTz: true });
    t.index(['thread_id', 'id']);
  });
  // One official response per thread.
  await knex.raw('create unique index posts_one_official_response on posts (thread_id) where is_official_response');

  await knex.schema.createTable('post_submissions', (t) => {
    t.integer('post_id').notNullable().references('posts.id').onDelete('cascade');
    t.integer('submission_id').notNullable().references('submissions.id').onDelete('cascade');
    t.primary(['post_id', 'submission_id']);
  });

  await knex.schema.createTable('thread_follows', (t) => {
    t.integer('thread_id').notNullable().references('threads.id').onDelete('cascade');
    t.integer('user_id').notNullable().references('users.id').onDelete('cascade');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.primary(['thread_id', 'user_id']);
    t.index(['user_id']);
  });

  await knex.schema.createTable('notifications', (t) => {
    t.increments('id');
    t.integer('user_id').notNullable().references('users.id').onDelete('cascade');
    t.integer('thread_id').notNullable().references('threads.id').onDelete('cascade');
    t.integer('post_id').references('posts.id').onDelete('cascade');
    t.text('kind').notNullable().checkIn(['reply', 'official_response', 'status']);
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('read_at', { useTz: true });
    t.index(['user_id', 'read_at']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('notifications');
  await knex.schema.dropTable('thread_follows');
  await knex.schema.dropTable('post_submissions');
  await knex.schema.dropTable('posts');
  await knex.schema.dropTable('threads');
}
