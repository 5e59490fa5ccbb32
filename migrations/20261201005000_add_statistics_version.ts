import type { Knex } from 'knex';

// A version of everything the public statistics pages show, so that a server can
// keep whole responses in memory between changes (server/features/scoreboard/
// page-cache.ts). Each committed transaction that writes a table those pages read
// adds one to statistics_state.version, whichever code path wrote it: decisions,
// tag corrections, merges, hidden models, pinned notes, catalogue curation, the
// recompute and the consensus refit. Readers read the version before the data,
// so a response is never stored under a newer version than the data it shows.
//
// The triggers are deferred constraint triggers: the bump runs once, at commit, as
// the transaction's last statement, so the state row is locked only for the
// instant of the commit and cannot take part in a deadlock.

const TABLES = [
  'makers',
  'models',
  'firmware_versions',
  'recording_devices',
  'catalogue_aliases',
  'moderator_notes',
  'submission_recordings',
  'meter_statistics',
  'dropout_tag_statistics',
  'consensus_offsets',
];

export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('statistics_state', (t) => {
    t.bigInteger('version').notNullable().defaultTo(0);
  });
  await knex.raw(`
    create function bump_statistics_version() returns trigger language plpgsql as $$
    begin
      if current_setting('crosswatt.statistics_version_bumped', true) is distinct from 'on' then
        update statistics_state set version = version + 1 where id = 1;
        perform set_config('crosswatt.statistics_version_bumped', 'on', true);
      end if;
      return null;
    end $$`);
  for (const table of TABLES) {
    await knex.raw(`
      create constraint trigger ${table}_bump_statistics_version after insert or update or delete on ${table}
      deferrable initially deferred for each row execute function bump_statistics_version()`);
  }
  // Submissions count only once accepted (or when they stop being accepted).
  await knex.raw(`
    create constraint trigger submissions_bump_statistics_version after insert or delete on submissions
    deferrable initially deferred for each row execute function bump_statistics_version()`);
  await knex.raw(`
    create constraint trigger submissions_update_bump_statistics_version after update on submissions
    deferrable initially deferred for each row when (old.status = 'accepted' or new.status = 'accepted')
    execute function bump_statistics_version()`);

  // Accepted submissions, newest decision first: the recent rides on the model and
  // firmware pages walk this until they have found the model's latest few (2.6 ms
  // instead of sorting all of a model's sides, at 100,000 submissions).
  await knex.raw(
    "create index submissions_accepted_decided_idx on submissions (decided_at desc nulls last, id desc) where status = 'accepted'",
  );
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('drop index if exists submissions_accepted_decided_idx');
  await knex.raw('drop trigger if exists submissions_update_bump_statistics_version on submissions');
  await knex.raw('drop trigger if exists submissions_bump_statistics_version on submissions');
  for (const table of TABLES) await knex.raw(`drop trigger if exists ${table}_bump_statistics_version on ${table}`);
  await knex.raw('drop function if exists bump_statistics_version()');
  await knex.schema.alterTable('statistics_state', (t) => {
    t.dropColumn('version');
  });
}
