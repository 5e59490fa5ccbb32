import type { Knex } from 'knex';

// The catalogue: models (with position and kind), their firmware versions, and
// recording devices (head units, watches, apps). Entries proposed by riders are
// 'pending' until a moderator approves them, but usable by their proposer at once.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('makers', (t) => {
    t.integer('proposed_by').references('users.id').onDelete('set null');
  });
  await knex.schema.createTable('models', (t) => {
    t.increments('id');
    t.integer('maker_id').notNullable().references('makers.id').onDelete('restrict');
    t.text('slug').notNullable().unique();
    t.text('name').notNullable();
    t.text('position').notNullable().checkIn(['left', 'right', 'dual', 'total']);
    t.text('kind').notNullable().checkIn(['crank_arm', 'pedal', 'spider', 'spindle', 'hub', 'trainer']);
    t.text('status').notNullable().defaultTo('approved').checkIn(['approved', 'pending', 'rejected']);
    t.integer('proposed_by').references('users.id').onDelete('set null');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.unique(['maker_id', 'name']);
  });
  await knex.schema.createTable('firmware_versions', (t) => {
    t.increments('id');
    t.integer('model_id').notNullable().references('models.id').onDelete('cascade');
    t.text('version').notNullable();
    // Numeric parts of the version, so versions sort as versions (1.10 after 1.9).
    t.specificType('version_order', 'integer[]').notNullable();
    t.date('released_on');
    t.boolean('beta').notNullable().defaultTo(false);
    t.text('status').notNullable().defaultTo('approved').checkIn(['approved', 'pending', 'rejected']);
    t.integer('proposed_by').references('users.id').onDelete('set null');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.unique(['model_id', 'version']);
  });
  await knex.schema.createTable('recording_devices', (t) => {
    t.increments('id');
    t.text('slug').notNullable().unique();
    t.text('name').notNullable().unique();
    t.text('kind').notNullable().checkIn(['head_unit', 'watch', 'app']);
    t.text('status').notNullable().defaultTo('approved').checkIn(['approved', 'pending', 'rejected']);
    t.integer('proposed_by').references('users.id').onDelete('set null');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('recording_devices');
  await knex.schema.dropTable('firmware_versions');
  await knex.schema.dropTable('models');
  await knex.schema.alterTable('makers', (t) => t.dropColumn('proposed_by'));
}
