import { beforeAll, describe, expect, it } from 'vitest';
import { createCatalogue, type TestCatalogue } from '../support/catalogue-factory';
import { signedInAgent } from '../support/sign-in';
import { createTestContext } from '../support/test-app';
import { reply, startThread } from '../support/thread-factory';

const POSTS_PER_TEN_MINUTES = 4;
const { app, db } = await createTestContext({ fakes: true, env: { RATE_LIMIT_POSTS_PER_TEN_MINUTES: String(POSTS_PER_TEN_MINUTES) } });

let catalogue: TestCatalogue;
beforeAll(async () => {
  catalogue = await createCatalogue(db);
});

describe('posting limits', () => {
  it(`when a rider posts more than ${POSTS_PER_TEN_MINUTES} times in ten minutes, then the next post is refused with 429 and a clear message, and others can still post`, async () => {
    const hasty = await signedInAgent(app, { handle: 'hasty-rider' });
    const calm = await signedInAgent(app, { handle: 'calm-rider' });
    const { body: created } = await startThread(hasty, catalogue.spider.slug);
    for (let i = 1; i < POSTS_PER_TEN_MINUTES; i++) expect((await reply(hasty, created.id, `Reply number ${i}`)).status).toBe(201);

    const res = await reply(hasty, created.id, 'One too many');
    const other = await reply(calm, created.id, 'A calm reply');

    expect(res.status).toBe(429);
    expect(res.body.error).toMatchObject({ code: 'too_many_requests', message: expect.stringMatching(/posted a lot/) });
    expect(other.status).toBe(201);
  });
});
