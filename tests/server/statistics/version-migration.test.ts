import { describe, expect, it } from 'vitest';
import * as migration from '../../../migrations/20261201005000_add_statistics_version';
import { createTestContext } from '../support/test-app';

const { db } = await createTestContext();

const triggerCount = async () =>
  Number((await db.raw("select count(*) as n from pg_trigger where tgname like '%bump_statistics_version'")).rows[0].n);
const indexExists = async (name: string) => (await db.raw('select to_regclass(?) as found', [name])).rows[0].found !== null;

describe('the statistics version migration', () => {
  it('when it is rolled back and applied again, then the version, its triggers and the index go and come back', async () => {
    await migration.down(db);

    expect(await db.schema.hasColumn('statistics_state', 'version')).toBe(false);
    expect(await triggerCount()).toBe(0);
    expect(await indexExists('submissions_accepted_decided_idx')).toBe(false);
    await db('models').where({ id: -1 }).update({ name: 'nothing' });

    await migration.up(db);

    expect(await db.schema.hasColumn('statistics_state', 'version')).toBe(true);
    expect(await triggerCount()).toBe(12);
    expect(await indexExists('submissions_accepted_decided_idx')).toBe(true);
  });
});
