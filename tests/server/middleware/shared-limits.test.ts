import { beforeAll, describe, expect, it } from 'vitest';
import { createCatalogue, type TestCatalogue } from '../support/catalogue-factory';
import { lockRiderSubmissions } from '../../../server/features/submissions/submissions.repository';
import { signedInAgent } from '../support/sign-in';
import { createTestContext } from '../support/test-app';
import { cleanPair } from '../submissions/fit-pairs';
import { uploadPair } from '../support/upload-pair';
import { waitFor } from '../../support/wait-for';

// Two web processes on one database, as a deployment with more than one runs them
// (a new process after a restart is the same case: it starts with nothing in memory).
const env = { SUBMISSIONS_PER_DAY: '2', RATE_LIMIT_WRITES_PER_WINDOW: '5' };
const one = await createTestContext({ fakes: true, env });
const other = await createTestContext({ fakes: true, env });

let catalogue: TestCatalogue;

beforeAll(async () => {
  catalogue = await createCatalogue(one.db);
});

type Rider = Awaited<ReturnType<typeof signedInAgent>>;

const upload = (rider: Rider, seed: number) => uploadPair(rider, catalogue, cleanPair(seed));

describe('limits shared by every web process', () => {
  it('when a rider limited to 2 submissions a day has made 2 through one app, then a third through the other app is refused', async () => {
    const onFirst = await signedInAgent(one.app, { handle: 'two-process-rider' });
    const onSecond = await signedInAgent(other.app, { handle: 'two-process-rider' });

    expect((await upload(onFirst, 601)).status).toBe(201);
    expect((await upload(onFirst, 602)).status).toBe(201);
    const third = await upload(onSecond, 603);

    expect(third.status).toBe(429);
    expect(third.body.error.code).toBe('daily_submission_limit');
    expect(await one.db('submissions').where({ rider_id: onFirst.user.id })).toHaveLength(2);
  });

  it("when another process is storing the rider's last submission of the day, then an upload through this app waits for it and is refused", async () => {
    const onFirst = await signedInAgent(one.app, { handle: 'racing-rider' });
    const onSecond = await signedInAgent(other.app, { handle: 'racing-rider' });
    expect((await upload(onFirst, 611)).status).toBe(201);
    // The other process, mid-upload: it holds the rider's lock and has stored, not yet committed, the second.
    const storing = await one.db.transaction();
    await lockRiderSubmissions(storing, onFirst.user.id);
    await storing('submissions').insert({
      rider_id: onFirst.user.id,
      indoor: false,
      surface: 'smooth_road',
      a_sha256: 'a'.repeat(64),
      b_sha256: 'b'.repeat(64),
      ride_started_at: new Date('2026-11-01T08:00:00Z'),
      ride_ended_at: new Date('2026-11-01T09:00:00Z'),
    });

    const answer = upload(onSecond, 612).then((r) => r);
    await waitFor(() => one.db('pg_locks').where({ locktype: 'advisory', granted: false }).first('pid'), {
      what: 'the upload waiting for the lock',
    });
    await storing.commit();

    const refused = await answer;
    expect(refused.status).toBe(429);
    expect(await one.db('submissions').where({ rider_id: onFirst.user.id })).toHaveLength(2);
  });

  it('when a person uses up the write budget on one app, then the other app refuses their next write too', async () => {
    const onFirst = await signedInAgent(one.app, { handle: 'busy-writer' });
    const onSecond = await signedInAgent(other.app, { handle: 'busy-writer' });
    const write = async (rider: Rider) =>
      rider.agent
        .post('/api/notifications/read')
        .set('X-CSRF-Token', await rider.csrf())
        .send({ all: true });

    for (let i = 0; i < 5; i++) expect((await write(i % 2 === 0 ? onFirst : onSecond)).status).toBe(200);
    const refused = await write(onSecond);

    expect(refused.status).toBe(429);
    expect(refused.body.error).toEqual({
      code: 'too_many_requests',
      message: 'Too many changes in a short time. Wait a minute and try again.',
    });
  });
});
