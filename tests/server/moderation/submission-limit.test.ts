import { beforeAll, describe, expect, it } from 'vitest';
import { createCatalogue, type TestCatalogue } from '../support/catalogue-factory';
import { signedInAgent } from '../support/sign-in';
import { createTestContext } from '../support/test-app';
import { cleanPair } from '../submissions/fit-pairs';
import { uploadPair } from '../support/upload-pair';

const { app, db } = await createTestContext({ fakes: true, env: { SUBMISSIONS_PER_DAY: '2' } });

let catalogue: TestCatalogue;

beforeAll(async () => {
  catalogue = await createCatalogue(db);
});

const upload = (rider: Awaited<ReturnType<typeof signedInAgent>>, seed: number, files?: { a: Uint8Array; b: Uint8Array }) =>
  uploadPair(rider, catalogue, files ?? cleanPair(seed));

describe('the daily submission limit', () => {
  it('when a rider reaches SUBMISSIONS_PER_DAY, then the next upload is refused with 429 and a clear message; refused uploads do not count; other riders still submit', async () => {
    const rider = await signedInAgent(app, { handle: 'busy-rider' });
    const other = await signedInAgent(app, { handle: 'calm-rider' });
    const first = cleanPair(501);

    expect((await upload(rider, 501, first)).status).toBe(201);
    expect((await upload(rider, 0, first)).status).toBe(409); // the same files again: refused, not counted
    expect((await upload(rider, 502)).status).toBe(201);
    const third = await upload(rider, 503);

    expect(third.status).toBe(429);
    expect(third.body.error.code).toBe('daily_submission_limit');
    expect(third.body.error.message).toBe(
      'You have made 2 submissions in the last 24 hours, the most Crosswatt takes from one rider in a day. Please try again tomorrow.',
    );
    expect(await db('submissions').where({ rider_id: rider.user.id })).toHaveLength(2);
    expect((await upload(other, 504)).status).toBe(201);
  });
});
