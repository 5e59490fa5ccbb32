import type { Knex } from 'knex';

// Each recording's uploaded file, with every coordinate removed, is kept in the
// object store under the SHA-256 of the stripped bytes: original_key names it and
// original_bytes is its size. Recordings stored before this keep their streams
// only (original_key null: "original not kept"). decoder_version says which
// decoder built the stored stream (shared/analysis/decode-fit.ts, DECODER_VERSION),
// so recordings whose original is kept can be decoded again by a newer one. Rows
// already here leave it null: some were built by version 1, some by 2, and which
// is not recorded anywhere.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('submission_recordings', (t) => {
    t.text('original_key');
    t.integer('original_bytes');
    t.integer('decoder_version');
    t.index(['original_key']);
  });
  await knex.raw(`
    alter table submission_recordings
      add constraint submission_recordings_original_kept_whole
      check ((original_key is null) = (original_bytes is null))`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('submission_recordings', (t) => {
    t.dropChecks(['submission_recordings_original_kept_whole']);
    t.dropIndex(['original_key']);
    t.dropColumn('original_key');
    t.dropColumn('original_bytes');
    t.dropColumn('decoder_version');
  });
}
