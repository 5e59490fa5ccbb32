import request from 'supertest';
import { beforeEach, describe, expect, it } from 'vitest';
import { signedInAgent, signInThroughFakeProvider } from '../support/sign-in';
import { createTestContext } from '../support/test-app';

const { app, db } = await createTestContext({ fakes: true });

describe("a rider's account", () => {
  it('when a rider changes their name and notification preferences, then /api/me shows the change', async () => {
    const { agent, csrf } = await signedInAgent(app, { handle: 'lapwing-commutes' });

    const res = await agent
      .patch('/api/account')
      .set('X-CSRF-Token', await csrf())
      .send({ name: '  Lapwing <b>Commutes</b> ', notificationPrefs: { emailOnReply: false } });

    expect(res.status).toBe(200);
    const me = (await agent.get('/api/me')).body;
    // Stored as typed; the client renders it as text, never HTML.
    expect(me.name).toBe('Lapwing <b>Commutes</b>');
    expect(me.notificationPrefs).toEqual({ emailOnDecision: true, emailOnReply: false });
  });

  it('when the new name carries a control character, then it is refused and the name is unchanged', async () => {
    const { agent, csrf } = await signedInAgent(app, { handle: 'lapwing-bell' });
    const before = (await agent.get('/api/me')).body.name;

    const res = await agent
      .patch('/api/account')
      .set('X-CSRF-Token', await csrf())
      .send({ name: 'Lapwing\u0007 Bell' });

    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/one line of plain text/);
    expect((await agent.get('/api/me')).body.name).toBe(before);
  });

  it('when the name is empty or fields are unknown, then the answer is 400 naming the problem', async () => {
    const { agent, csrf } = await signedInAgent(app, { handle: 'stint-blank' });

    const empty = await agent
      .patch('/api/account')
      .set('X-CSRF-Token', await csrf())
      .send({ name: '   ' });
    const unknown = await agent
      .patch('/api/account')
      .set('X-CSRF-Token', await csrf())
      .send({ roles: ['admin'] });

    expect(empty.status).toBe(400);
    expect(empty.body.error.details.fields).toHaveProperty('name');
    expect(unknown.status).toBe(400);
  });

  it('when a rider deletes their account, then their row stays but says "deleted rider", and they are signed out', async () => {
    const { agent, csrf, user } = await signedInAgent(app, { handle: 'redshank-leaves' });

    const res = await agent
      .post('/api/account/deletion')
      .set('X-CSRF-Token', await csrf())
      .send({ confirmHandle: 'redshank-leaves' });

    expect(res.status).toBe(204);
    const row = await db('users').where({ id: user.id }).first();
    expect(row).toMatchObject({ name: 'deleted rider', handle: null, email: null, provider_id: null });
    expect(row.deleted_at).not.toBeNull();
    expect(await db('role_grants').where({ user_id: user.id })).toEqual([]);
    expect((await agent.get('/api/me')).status).toBe(401);
  });

  it('when a deleted rider signs in again, then they get a new, empty account', async () => {
    const { agent, csrf, user } = await signedInAgent(app, { handle: 'knot-returns' });
    await agent
      .post('/api/account/deletion')
      .set('X-CSRF-Token', await csrf())
      .send({ confirmHandle: 'knot-returns' });

    const again = request.agent(app);
    await signInThroughFakeProvider(again, 'knot-returns');
    const me = await again.get('/api/me');

    expect(me.status).toBe(200);
    expect(me.body.id).not.toBe(user.id);
    expect(me.body.handle).toBe('knot-returns');
  });

  it('when the confirmation does not match the handle, then nothing is deleted', async () => {
    const { agent, csrf, user } = await signedInAgent(app, { handle: 'ruff-stays' });

    const res = await agent
      .post('/api/account/deletion')
      .set('X-CSRF-Token', await csrf())
      .send({ confirmHandle: 'ruff-goes' });

    expect(res.status).toBe(400);
    expect((await db('users').where({ id: user.id }).first()).deleted_at).toBeNull();
  });
});

describe('CSRF protection', () => {
  it('when a write comes without the token, then it is refused with 403 csrf_invalid and nothing changes', async () => {
    const { agent } = await signedInAgent(app, { handle: 'csrf-no-token' });

    const res = await agent.patch('/api/account').send({ name: 'Changed' });

    expect(res.status).toBe(403);
    expect(res.body.error).toMatchObject({ code: 'csrf_invalid' });
    expect((await agent.get('/api/me')).body.name).toBe('csrf-no-token');
  });

  it("when a write carries another session's token, then it is refused", async () => {
    const { agent } = await signedInAgent(app, { handle: 'csrf-victim' });
    const { csrf: attackerCsrf } = await signedInAgent(app, { handle: 'csrf-attacker' });

    const res = await agent
      .patch('/api/account')
      .set('X-CSRF-Token', await attackerCsrf())
      .send({ name: 'Changed' });

    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('csrf_invalid');
  });
});

describe('rate limits', () => {
  // The budgets live in this file's database, shared by all its apps: each test starts from none used.
  beforeEach(async () => {
    await db('rate_limit_counters').delete();
  });

  it('when someone writes more often than the limit, then they get a JSON 429', async () => {
    const limited = await createTestContext({ fakes: true, env: { RATE_LIMIT_WRITES_PER_WINDOW: '2' } });
    const { agent, csrf } = await signedInAgent(limited.app, { handle: 'eager-writer' });
    const token = await csrf();

    const answers = [];
    for (let i = 0; i < 3; i++)
      answers.push(
        await agent
          .patch('/api/account')
          .set('X-CSRF-Token', token)
          .send({ notificationPrefs: { emailOnReply: i % 2 === 0 } }),
      );

    expect(answers.map((r) => r.status)).toEqual([200, 200, 429]);
    expect(answers[2]!.body.error).toEqual({
      code: 'too_many_requests',
      message: 'Too many changes in a short time. Wait a minute and try again.',
    });
  });

  it('when several accounts write from one address more often than its budget, then the next write gets a JSON 429', async () => {
    const limited = await createTestContext({ fakes: true, env: { RATE_LIMIT_WRITES_PER_ADDRESS_PER_WINDOW: '3' } });
    const people = [
      await signedInAgent(limited.app, { handle: 'shared-desk-1' }),
      await signedInAgent(limited.app, { handle: 'shared-desk-2' }),
    ];

    const answers = [];
    for (let i = 0; i < 4; i++) {
      const { agent, csrf } = people[i % 2]!;
      answers.push(
        await agent
          .patch('/api/account')
          .set('X-CSRF-Token', await csrf())
          .send({ notificationPrefs: { emailOnReply: true } }),
      );
    }

    expect(answers.map((r) => r.status)).toEqual([200, 200, 200, 429]);
    expect(answers[3]!.body.error.message).toMatch(/from your network/);
  });

  it('when someone starts sign-ins more often than the limit from a script, then they get a JSON 429', async () => {
    const limited = await createTestContext({ fakes: true, env: { RATE_LIMIT_SIGNINS_PER_WINDOW: '2' } });

    const answers = [];
    for (let i = 0; i < 3; i++) answers.push(await request(limited.app).get('/auth/github').set('Accept', 'application/json'));

    expect(answers.map((r) => r.status)).toEqual([302, 302, 429]);
    expect(answers[2]!.type).toBe('application/json');
    expect(answers[2]!.body.error).toEqual({
      code: 'too_many_requests',
      message: 'Too many sign-in attempts in a short time. Wait a minute and try again.',
    });
  });

  it('when the sign-in limit is 2, then two whole sign-ins (start and callback each) succeed: the callback is not counted', async () => {
    const limited = await createTestContext({ fakes: true, env: { RATE_LIMIT_SIGNINS_PER_WINDOW: '2' } });

    await signInThroughFakeProvider(request.agent(limited.app), 'counted-once-1');
    await signInThroughFakeProvider(request.agent(limited.app), 'counted-once-2');
    const third = await request(limited.app).get('/auth/github').set('Accept', 'application/json');

    expect(third.status).toBe(429);
  });

  it('when a browser navigates to a sign-in over the limit, then it gets a page with the message and a link home, not JSON', async () => {
    const limited = await createTestContext({ fakes: true, env: { RATE_LIMIT_SIGNINS_PER_WINDOW: '1' } });
    // What Chromium sends for a navigation (from memory of its request headers).
    const navigation = 'text/html,application/xhtml+xml,application/xml;q=0.9,image/avif,image/webp,*/*;q=0.8';

    await request(limited.app).get('/auth/github').set('Accept', navigation);
    const refused = await request(limited.app).get('/auth/github').set('Accept', navigation);

    expect(refused.status).toBe(429);
    expect(refused.type).toBe('text/html');
    expect(refused.text).toContain('Too many sign-in attempts in a short time. Wait a minute and try again.');
    expect(refused.text).toContain('<a href="/">Back to Crosswatt</a>');
  });
});
