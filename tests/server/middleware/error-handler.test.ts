import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { signedInAgent } from '../support/sign-in';
import { createTestContext } from '../support/test-app';

const { app } = await createTestContext({ fakes: true });

// Ids are PostgreSQL `integer`s and text columns refuse NUL: values the schemas let
// through but the database cannot hold are the request's fault, not ours.
describe('values the database cannot hold', () => {
  it('when an id in the path is beyond the integer range, then the answer is 400 with a message, not 500', async () => {
    const moderator = await signedInAgent(app, { handle: 'range-mod', roles: ['moderator'] });
    const admin = await signedInAgent(app, { handle: 'range-admin', roles: ['admin'] });

    const answers = [
      await request(app).get('/api/submissions/99999999999'),
      await moderator.agent.get('/api/moderation/submissions/99999999999'),
      await moderator.agent
        .post('/api/moderation/submissions/99999999999/decision')
        .set('X-CSRF-Token', await moderator.csrf())
        .send({ decision: 'accept', expectedVersion: 1 }),
      await admin.agent
        .post('/api/admin/users/99999999999/roles')
        .set('X-CSRF-Token', await admin.csrf())
        .send({ role: 'moderator' }),
    ];

    for (const res of answers) {
      expect(res.status, JSON.stringify(res.body)).toBe(400);
      expect(res.body.error).toMatchObject({ code: 'bad_request', message: expect.stringMatching(/out of range|not valid/) });
    }
  });

  it('when a path carries a NUL character, then the answer is 400, not 500', async () => {
    const res = await request(app).get('/api/models/some-model/firmware/%00');

    expect(res.status, JSON.stringify(res.body)).toBe(400);
    expect(res.body.error.code).toBe('bad_request');
  });
});
