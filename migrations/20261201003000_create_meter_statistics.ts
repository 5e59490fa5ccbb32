import type { Knex } from 'knex';

// Sufficient statistics of accepted submissions, per model + firmware and per model
// over all its firmware (firmware_id null). Each accepted submission contributes
// both of its sides: side A as recorded, side B with the bias and the differences
// inverted. The rows are sums, so a moderation decision adds or subtracts one
// submission in its own transaction, and `npm run stats:recompute` rebuilds them.
// A scope is (model_id, firmware_id) with NULLS NOT DISTINCT, so one upsert key
// covers both levels (PostgreSQL 15+).
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('meter_statistics', (t) => {
    t.increments('id');
    t.integer('model_id').notNullable().references('models.id').onDelete('cascade');
    t.integer('firmware_id').references('firmware_versions.id').onDelete('cascade');
    // Evidence
    t.integer('submission_count').notNullable().defaultTo(0);
    t.integer('distinct_riders').notNullable().defaultTo(0);
    t.integer('like_for_like_count').notNullable().defaultTo(0);
    t.double('pedalling_hours').notNullable().defaultTo(0);
    // Bias: shared/statistics/weighted-bias.ts BiasSums (w = capped hours, x = bias %)
    t.integer('bias_count').notNullable().defaultTo(0);
    t.double('bias_hours').notNullable().defaultTo(0);
    t.double('sum_weight').notNullable().defaultTo(0);
    t.double('sum_weight_squared').notNullable().defaultTo(0);
    t.double('sum_weight_cubed').notNullable().defaultTo(0);
    t.double('sum_weighted_bias').notNullable().defaultTo(0);
    t.double('sum_weighted_bias_squared').notNullable().defaultTo(0);
    // Unweighted Σx and Σx², for Welch's test between firmware versions.
    t.double('sum_bias').notNullable().defaultTo(0);
    t.double('sum_bias_squared').notNullable().defaultTo(0);
    // Dropouts: events over pedalling hours of the same submissions.
    t.integer('power_dropouts').notNullable().defaultTo(0);
    t.integer('cadence_dropouts').notNullable().defaultTo(0);
    // Pooled limits of agreement (Bland & Altman 2007): k, N = Σn, Σn², Σ(n−1)s², Σn·d, Σn·d².
    t.integer('agreement_submissions').notNullable().defaultTo(0);
    t.integer('agreement_blocks').notNullable().defaultTo(0);
    t.double('agreement_blocks_squared').notNullable().defaultTo(0);
    t.double('agreement_within_ss').notNullable().defaultTo(0);
    t.double('agreement_sum_difference').notNullable().defaultTo(0);
    t.double('agreement_sum_difference_squared').notNullable().defaultTo(0);
    // Cadence lag: the median comes from cadence_lag_counts; kept here for sorting.
    t.integer('cadence_lag_count').notNullable().defaultTo(0);
    t.double('median_cadence_lag_seconds');
    // Sprints against the partner: peak % and seconds to 80 % of peak (own − partner's).
    t.integer('sprint_count').notNullable().defaultTo(0);
    t.double('sum_sprint_peak_percent').notNullable().defaultTo(0);
    t.integer('sprint_rise_count').notNullable().defaultTo(0);
    t.double('sum_sprint_rise_seconds').notNullable().defaultTo(0);
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });
  await knex.raw('alter table meter_statistics add constraint meter_statistics_scope unique nulls not distinct (model_id, firmware_id)');

  // How many contributions each rider has made to a scope: distinct riders is the number of rows.
  await knex.schema.createTable('meter_statistics_riders', (t) => {
    t.increments('id');
    t.integer('model_id').notNullable().references('models.id').onDelete('cascade');
    t.integer('firmware_id').references('firmware_versions.id').onDelete('cascade');
    t.integer('rider_id').notNullable().references('users.id').onDelete('cascade');
    t.integer('contribution_count').notNullable();
  });
  await knex.raw(
    'alter table meter_statistics_riders add constraint meter_statistics_riders_scope unique nulls not distinct (model_id, firmware_id, rider_id)',
  );

  // Cadence lag is whole seconds in a small range: a histogram gives the exact median.
  await knex.schema.createTable('cadence_lag_counts', (t) => {
    t.increments('id');
    t.integer('model_id').notNullable().references('models.id').onDelete('cascade');
    t.integer('firmware_id').references('firmware_versions.id').onDelete('cascade');
    t.integer('lag_seconds').notNullable();
    t.integer('submission_count').notNullable();
  });
  await knex.raw(
    'alter table cadence_lag_counts add constraint cadence_lag_counts_scope unique nulls not distinct (model_id, firmware_id, lag_seconds)',
  );

  // Dropouts split by a submission's tags (surface, indoor/outdoor, recording device,
  // recording mode, other meters on), to set each value's rate against the rest.
  await knex.schema.createTable('dropout_tag_statistics', (t) => {
    t.increments('id');
    t.integer('model_id').notNullable().references('models.id').onDelete('cascade');
    t.integer('firmware_id').references('firmware_versions.id').onDelete('cascade');
    t.text('tag').notNullable().checkIn(['surface', 'environment', 'recording_device', 'recording_mode', 'other_meters_on']);
    t.text('value').notNullable();
    t.integer('submission_count').notNullable().defaultTo(0);
    t.double('pedalling_hours').notNullable().defaultTo(0);
    t.integer('power_dropouts').notNullable().defaultTo(0);
    t.integer('cadence_dropouts').notNullable().defaultTo(0);
  });
  await knex.raw(
    'alter table dropout_tag_statistics add constraint dropout_tag_statistics_scope unique nulls not distinct (model_id, firmware_id, tag, value)',
  );

  // Consensus offsets are a fit over the whole network (cubic cost): refreshed in a
  // batch, not inside a decision. A decision on a like-for-like submission marks them stale.
  await knex.schema.createTable('consensus_offsets', (t) => {
    t.integer('firmware_id').primary().references('firmware_versions.id').onDelete('cascade');
    t.integer('model_id').notNullable().references('models.id').onDelete('cascade');
    t.integer('component').notNullable();
    t.double('offset_percent').notNullable();
    t.double('lower_percent');
    t.double('upper_percent');
    t.double('standard_error_log');
    t.integer('connected_to').notNullable();
    t.boolean('reportable').notNullable();
    t.timestamp('computed_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });
  await knex.schema.createTable('statistics_state', (t) => {
    t.integer('id').primary().checkIn(['1']);
    t.boolean('consensus_stale').notNullable().defaultTo(true);
    t.timestamp('consensus_computed_at', { useTz: true });
  });
  await knex('statistics_state').insert({ id: 1, consensus_stale: true });

  // Accepted submissions of a model are read for medians, recent lists and Welch tests.
  await knex.raw("create index submissions_accepted_idx on submissions (id) where status = 'accepted'");
  await knex.raw('create index submission_recordings_firmware_idx on submission_recordings (firmware_id, submission_id)');
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('drop index if exists submission_recordings_firmware_idx');
  await knex.raw('drop index if exists submissions_accepted_idx');
  await knex.schema.dropTable('statistics_state');
  await knex.schema.dropTable('consensus_offsets');
  await knex.schema.dropTable('dropout_tag_statistics');
  await knex.schema.dropTable('cadence_lag_counts');
  await knex.schema.dropTable('meter_statistics_riders');
  await knex.schema.dropTable('meter_statistics');
}
