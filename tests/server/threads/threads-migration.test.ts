import { afterAll, describe, expect, it } from 'vitest';
import { createDb } from '../../../server/db/knex';
import * as migration from '../../../migrations/20261201004000_create_threads';

const db = createDb(process.env.DATABASE_URL!);
afterAll(() => db.destroy());

const TABLES = ['threads', 'posts', 'post_submissions', 'thread_follows', 'notifications'];

describe('the threads migration', () => {
  it('when it is rolled back and applied again, then its tables go and come back', async () => {
    await migration.down(db);
    const gone = await Promise.all(TABLES.map((t) => db.schema.hasTable(t)));

    await migration.up(db);
    const back = await Promise.all(TABLES.map((t) => db.schema.hasTable(t)));

    expect(gone).toEqual(TABLES.map(() => false));
    expect(back).toEqual(TABLES.map(() => true));
  });
});
