import type { Knex } from 'knex';

// A re-analysis run (issue 14): every stored submission analysed with an older
// method goes through the current one, one pg-boss job per submission. The run
// row carries the progress admins see; its items record each submission's
// outcome once, so a job that runs again (a retry, a resumed run) counts nothing
// twice. At most one run is running at a time (the partial unique index).
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('reanalysis_runs', (t) => {
    t.increments('id');
    t.integer('started_by').references('users.id').onDelete('set null');
    t.integer('method_version').notNullable();
    // 'originals': the stored original FIT files (issue 20), once they exist.
    t.text('source').notNullable().defaultTo('streams').checkIn(['streams', 'originals']);
    t.text('status').notNullable().defaultTo('running').checkIn(['running', 'finished', 'failed']);
    t.integer('total').notNullable().defaultTo(0);
    t.integer('done').notNullable().defaultTo(0);
    t.integer('failed').notNullable().defaultTo(0);
    t.integer('sent_back').notNullable().defaultTo(0);
    t.timestamp('started_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('finished_at', { useTz: true });
    t.text('last_error');
  });
  await knex.raw(`create unique index reanalysis_runs_one_running on reanalysis_runs ((true)) where status = 'running'`);
  await knex.schema.createTable('reanalysis_run_items', (t) => {
    t.integer('run_id').notNullable().references('reanalysis_runs.id').onDelete('cascade');
    t.integer('submission_id').notNullable().references('submissions.id').onDelete('cascade');
    t.primary(['run_id', 'submission_id']);
    // null while waiting; then what the job did with the submission.
    t.text('outcome').checkIn(['reanalysed', 'sent_back', 'skipped', 'failed']);
    t.integer('attempts').notNullable().defaultTo(0);
    t.text('error_message');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('reanalysis_run_items');
  await knex.schema.dropTable('reanalysis_runs');
}
