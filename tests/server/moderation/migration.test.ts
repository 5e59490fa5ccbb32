import { describe, expect, it } from 'vitest';
import * as migration from '../../../migrations/20261201002000_create_moderation';
import { createTestContext } from '../support/test-app';

const { db } = await createTestContext();

describe('the moderation migration', () => {
  it('when it is rolled back and applied again, then its tables and columns go and come back, and the old status rules return meanwhile', async () => {
    await migration.down(db);

    expect(await db.schema.hasTable('mail_outbox')).toBe(false);
    expect(await db.schema.hasTable('catalogue_aliases')).toBe(false);
    expect(await db.schema.hasColumn('models', 'hidden_reason')).toBe(false);
    expect(await db.schema.hasColumn('submissions', 'decision_reason')).toBe(false);
    await expect(db('makers').insert({ slug: 'rejected-maker', name: 'Rejected Maker', status: 'rejected' })).rejects.toThrow(
      /makers_status_check/,
    );

    await migration.up(db);

    expect(await db.schema.hasTable('mail_outbox')).toBe(true);
    expect(await db.schema.hasColumn('models', 'merged_into_id')).toBe(true);
    await db('makers').insert({ slug: 'rejected-maker', name: 'Rejected Maker', status: 'rejected' });
  });
});
