import type { Knex } from 'knex';

// A submission is one ride recorded by two meters: the ride's tags, the two
// recordings (normalised streams only: never the original files, never location)
// and, once the job has run, the analysis result and its headline figures.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('submissions', (t) => {
    t.increments('id');
    t.integer('rider_id').references('users.id').onDelete('set null');
    t.text('status')
      .notNullable()
      .defaultTo('received')
      .checkIn(['received', 'analysing', 'awaiting_review', 'sent_back', 'accepted', 'rejected', 'withdrawn', 'failed']);
    t.boolean('indoor').notNullable();
    t.text('surface').notNullable().checkIn(['smooth_road', 'rough_road', 'gravel', 'trainer']);
    t.text('notes').notNullable().defaultTo('');
    // The pair of file hashes identifies an upload: the same two files are refused.
    t.text('a_sha256').notNullable();
    t.text('b_sha256').notNullable();
    t.unique(['a_sha256', 'b_sha256']);
    t.timestamp('ride_started_at', { useTz: true }).notNullable();
    t.timestamp('ride_ended_at', { useTz: true }).notNullable();
    t.integer('method_version');
    t.jsonb('result');
    t.jsonb('flags').notNullable().defaultTo('[]');
    t.integer('flag_severity').notNullable().defaultTo(0);
    t.text('error_code');
    t.text('error_message');
    t.integer('attempts').notNullable().defaultTo(0);
    // Headline figures, copied out of the result for lists and aggregation.
    t.double('bias_percent');
    t.double('loa_lower_percent');
    t.double('loa_upper_percent');
    t.double('sum_a');
    t.double('sum_b');
    t.integer('matched_seconds');
    t.integer('pedalling_seconds');
    t.integer('overlap_seconds');
    t.integer('clock_offset_seconds');
    t.double('correlation');
    t.integer('cadence_lag_seconds');
    t.text('like_for_like_mode');
    t.integer('a_power_dropouts');
    t.integer('a_cadence_dropouts');
    t.integer('b_power_dropouts');
    t.integer('b_cadence_dropouts');
    t.integer('version').notNullable().defaultTo(1);
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('analysed_at', { useTz: true });
    t.index(['status', 'flag_severity']);
    t.index(['rider_id']);
  });
  await knex.schema.createTable('submission_recordings', (t) => {
    t.increments('id');
    t.integer('submission_id').notNullable().references('submissions.id').onDelete('cascade');
    t.text('side').notNullable().checkIn(['a', 'b']);
    t.unique(['submission_id', 'side']);
    t.integer('model_id').notNullable().references('models.id');
    t.integer('firmware_id').notNullable().references('firmware_versions.id');
    t.text('position').notNullable().checkIn(['left', 'right', 'dual', 'total']);
    t.integer('recording_device_id').notNullable().references('recording_devices.id');
    t.text('recording_device_firmware').notNullable().defaultTo('');
    t.text('recording_mode').notNullable().checkIn(['every_second', 'change_only']);
    t.text('zero_offset').notNullable().checkIn(['yes', 'no', 'unsure']);
    t.boolean('other_meters_on').notNullable();
    t.text('sha256').notNullable();
    t.jsonb('device_info').notNullable();
    t.jsonb('recording_stats').notNullable();
    t.binary('stream').notNullable();
    t.index(['model_id', 'firmware_id']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('submission_recordings');
  await knex.schema.dropTable('submissions');
}
