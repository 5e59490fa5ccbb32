import { describe, expect, it } from 'vitest';
import * as migration from '../../../migrations/20261203200000_keep_stripped_originals';
import { ensureUser } from '../../../server/features/users/users.service';
import { submissionAwaitingReview } from '../moderation/moderation-fixtures';
import { createCatalogue } from '../support/catalogue-factory';
import { createTestContext } from '../support/test-app';

const { db } = await createTestContext();

const columns = async () => Object.keys(await db('submission_recordings').columnInfo());

describe('the migration that keeps originals', () => {
  it('when it is rolled back and applied again, then the columns go and come back, the streams stay, and a key without its size is refused', async () => {
    const catalogue = await createCatalogue(db);
    const rider = await ensureUser(db, { handle: 'migration-rider', name: 'Migration Rider' });
    const { id } = await submissionAwaitingReview(db, rider.id, catalogue);

    await migration.down(db);
    expect(await columns()).not.toEqual(expect.arrayContaining(['original_key']));
    expect(await db('submission_recordings').where({ submission_id: id })).toHaveLength(2);
    await migration.up(db);

    expect(await columns()).toEqual(expect.arrayContaining(['original_key', 'original_bytes', 'decoder_version']));
    const rows = await db('submission_recordings').where({ submission_id: id });
    expect(rows.map((r) => [r.original_key, r.decoder_version])).toEqual([
      [null, null],
      [null, null],
    ]);
    await expect(db('submission_recordings').where({ id: rows[0].id }).update({ original_key: 'originals/x.fit' })).rejects.toThrow(
      /original_kept_whole/,
    );
  });
});
