import request from 'supertest';
import { describe, expect, it } from 'vitest';
import pkg from '../../package.json' with { type: 'json' };
import { createTestContext } from './support/test-app';

const { app } = await createTestContext();

describe('GET /api/health', () => {
  it('when the database is reachable, then it reports the app version and database up', async () => {
    const res = await request(app).get('/api/health');

    expect(res.status).toBe(200);
    expect(res.body).toEqual({ status: 'ok', version: pkg.version, database: 'up' });
  });
});

describe('unknown API paths', () => {
  it('when an endpoint does not exist, then the answer is a JSON 404 with a code and message', async () => {
    const res = await request(app).get('/api/no-such-thing?x=1');

    expect(res.status).toBe(404);
    expect(res.body.error).toEqual({ code: 'not_found', message: 'No such endpoint: GET /api/no-such-thing' });
  });
});
