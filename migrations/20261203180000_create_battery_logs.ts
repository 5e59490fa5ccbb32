import type { Knex } from 'knex';

// Battery life is told by riders: each meter they own, the days its battery was
// changed or recharged, and riding they add by hand. Hours between events come
// from their submissions of that model (and position) plus the hand-added riding.
// Moderators enter the maker's claim per model, with its source.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('rider_meters', (t) => {
    t.increments('id');
    t.integer('rider_id').notNullable().references('users.id').onDelete('cascade');
    t.integer('model_id').notNullable().references('models.id').onDelete('cascade');
    t.text('position').notNullable().checkIn(['left', 'right', 'dual', 'total']);
    t.text('nickname').notNullable();
    t.text('battery_type').notNullable().checkIn(['coin_cell', 'aaa', 'aa', 'rechargeable']);
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.unique(['rider_id', 'nickname']);
    t.index(['model_id']);
  });
  await knex.schema.createTable('battery_events', (t) => {
    t.increments('id');
    t.integer('rider_meter_id').notNullable().references('rider_meters.id').onDelete('cascade');
    // The battery that went in on this day, and the firmware the meter ran then.
    t.date('occurred_on').notNullable();
    t.text('kind').notNullable().checkIn(['changed', 'recharged']);
    // Why the battery before it came out: only a flat (or warning) battery is an observed end.
    t.text('previous_ended').notNullable().checkIn(['ran_flat', 'low_warning', 'replaced_early', 'first_battery']);
    t.integer('firmware_id').notNullable().references('firmware_versions.id').onDelete('cascade');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.unique(['rider_meter_id', 'occurred_on']);
  });
  await knex.schema.createTable('self_reported_riding', (t) => {
    t.increments('id');
    t.integer('rider_meter_id').notNullable().references('rider_meters.id').onDelete('cascade');
    t.date('ridden_on').notNullable();
    t.double('hours').notNullable();
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.check('?? > 0 and ?? <= 1000', ['hours', 'hours'], 'self_reported_riding_hours_range');
  });
  await knex.schema.alterTable('models', (t) => {
    t.double('battery_claim_hours');
    t.text('battery_claim_source');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('models', (t) => {
    t.dropColumn('battery_claim_hours');
    t.dropColumn('battery_claim_source');
  });
  await knex.schema.dropTable('self_reported_riding');
  await knex.schema.dropTable('battery_events');
  await knex.schema.dropTable('rider_meters');
}
