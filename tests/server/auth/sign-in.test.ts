import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { signedInAgent, signInThroughFakeProvider } from '../support/sign-in';
import { createTestContext } from '../support/test-app';

const { app, db } = await createTestContext({ fakes: true });

function sessionIdFrom(res: request.Response): string | undefined {
  const cookies = ([] as string[]).concat(res.headers['set-cookie'] ?? []);
  const cookie = cookies.find((c) => c.startsWith('crosswatt.sid='));
  return cookie && decodeURIComponent(cookie.split(';')[0]!.slice('crosswatt.sid='.length));
}

// Starts a sign-in and lets the fake provider approve `handle`; returns the
// callback address the provider sends the browser back to.
async function startRoundTrip(agent: ReturnType<typeof request.agent>, handle: string) {
  const start = await agent.get(`/auth/github?login=${handle}`);
  const approval = await fetch(start.headers.location!, { redirect: 'manual' });
  return { start, callback: new URL(approval.headers.get('location')!) };
}

const countUsers = async () => Number((await db('users').count<{ count: string }[]>({ count: '*' }))[0]!.count);

describe('signing in through the OAuth provider', () => {
  it('when a new person completes the round trip, then they are a rider and /api/me returns them', async () => {
    const agent = request.agent(app);

    await signInThroughFakeProvider(agent, 'kestrel-rides');
    const me = await agent.get('/api/me');

    expect(me.status).toBe(200);
    expect(me.body).toMatchObject({
      handle: 'kestrel-rides',
      name: 'kestrel-rides',
      email: 'kestrel-rides@riders.crosswatt.test',
      roles: ['rider'],
      makerIds: [],
    });
    expect(me.body.notificationPrefs).toEqual({ emailOnDecision: true, emailOnReply: true });
  });

  it('when the app starts a sign-in, then it sends the browser to the provider with our client id, callback and a state', async () => {
    const res = await request(app).get('/auth/github');

    expect(res.status).toBe(302);
    const target = new URL(res.headers.location!);
    expect(target.pathname).toBe('/authorize');
    expect(target.searchParams.get('client_id')).toBe('crosswatt-local');
    expect(target.searchParams.get('redirect_uri')).toMatch(/\/auth\/github\/callback$/);
    expect(target.searchParams.get('state')).toMatch(/^\S{16,}$/);
  });

  it('when someone signs in again after the provider profile changed, then the account is updated, not duplicated', async () => {
    const agent = request.agent(app);
    await signInThroughFakeProvider(agent, 'heron-climbs');
    await db('fake_oauth_identities')
      .where({ login: 'heron-climbs' })
      .update({ name: 'Heron Climbs', email: 'heron@riders.crosswatt.test' });
    const before = await countUsers();

    await signInThroughFakeProvider(request.agent(app), 'heron-climbs');

    expect(await countUsers()).toBe(before);
    const user = await db('users').where({ handle: 'heron-climbs' }).first();
    expect(user).toMatchObject({ name: 'Heron Climbs', email: 'heron@riders.crosswatt.test' });
  });

  it('when a sign-in completes, then the session id changes', async () => {
    const agent = request.agent(app);
    const { start, callback } = await startRoundTrip(agent, 'swift-descent');

    const back = await agent.get(`${callback.pathname}${callback.search}`);

    const before = sessionIdFrom(start);
    const after = sessionIdFrom(back);
    expect(before).toBeDefined();
    expect(after).toBeDefined();
    expect(after).not.toBe(before);
    expect(([] as string[]).concat(back.headers['set-cookie'] ?? []).join(';')).toMatch(/crosswatt\.sid=.*HttpOnly.*SameSite=Lax/i);
  });

  it('when a returnTo path is given, then the person lands there after signing in', async () => {
    const agent = request.agent(app);
    const start = await agent.get('/auth/github?login=plover-sprints&returnTo=/account');
    const approval = await fetch(start.headers.location!, { redirect: 'manual' });
    const callback = new URL(approval.headers.get('location')!);

    const back = await agent.get(`${callback.pathname}${callback.search}`);

    expect(back.headers.location).toBe('/account');
  });

  it('when returnTo points at another site, then the sign-in is refused with a 400', async () => {
    const res = await request(app).get('/auth/github?returnTo=//elsewhere.example/x');

    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('validation_failed');
  });

  it('when the state does not match the one we issued, then an error page explains it and nobody is signed in', async () => {
    const agent = request.agent(app);
    const { callback } = await startRoundTrip(agent, 'curlew-gravel');
    callback.searchParams.set('state', 'forged-state-value');
    const before = await countUsers();

    const res = await agent.get(`${callback.pathname}${callback.search}`);

    expect(res.status).toBe(400);
    expect(res.type).toBe('text/html');
    expect(res.text).toContain('This sign-in could not be verified');
    expect(await countUsers()).toBe(before);
    expect((await agent.get('/api/me')).status).toBe(401);
  });

  it('when the provider refuses the token exchange, then a clear error page says so and no user is created', async () => {
    const agent = request.agent(app);
    const { callback } = await startRoundTrip(agent, 'godwit-tempo');
    callback.searchParams.set('code', 'not-a-code-the-provider-issued');
    const before = await countUsers();

    const res = await agent.get(`${callback.pathname}${callback.search}`);

    expect(res.status).toBe(502);
    expect(res.text).toContain('The sign-in service did not answer properly');
    expect(await countUsers()).toBe(before);
    expect(await db('users').where({ handle: 'godwit-tempo' }).first()).toBeUndefined();
  });

  it('when the person cancels on the provider page, then they see that the sign-in was cancelled', async () => {
    const agent = request.agent(app);
    const start = await agent.get('/auth/github');
    const state = new URL(start.headers.location!).searchParams.get('state')!;

    const res = await agent.get(`/auth/github/callback?error=access_denied&state=${state}`);

    expect(res.status).toBe(401);
    expect(res.text).toContain('Sign-in cancelled');
  });

  it('when nobody is signed in, then /api/me answers 401 with a clear message', async () => {
    const res = await request(app).get('/api/me');

    expect(res.status).toBe(401);
    expect(res.body.error).toEqual({ code: 'unauthenticated', message: 'Please sign in to do this.' });
  });
});

describe('when the provider is down', () => {
  it('when the provider stops answering mid-sign-in, then an error page explains it and no user is created', async () => {
    const context = await createTestContext({ fakes: true });
    const agent = request.agent(context.app);
    const start = await agent.get('/auth/github?login=dunlin-intervals');
    const approval = await fetch(start.headers.location!, { redirect: 'manual' });
    const callback = new URL(approval.headers.get('location')!);
    await context.fakes!.stop();
    const before = await countUsers();

    const res = await agent.get(`${callback.pathname}${callback.search}`);

    expect(res.status).toBe(502);
    expect(res.text).toContain('nothing was saved');
    expect(await countUsers()).toBe(before);
  });
});

describe('signing out', () => {
  it('when a signed-in person signs out with a CSRF token, then the session is gone', async () => {
    const { agent, csrf } = await signedInAgent(app, { handle: 'sanderling-base' });

    const res = await agent.post('/auth/logout').set('X-CSRF-Token', await csrf());

    expect(res.status).toBe(204);
    expect((await agent.get('/api/me')).status).toBe(401);
  });

  it('when a sign-out comes without a CSRF token, then it is refused and the session stays', async () => {
    const { agent } = await signedInAgent(app, { handle: 'whimbrel-base' });

    const res = await agent.post('/auth/logout');

    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('csrf_invalid');
    expect((await agent.get('/api/me')).status).toBe(200);
  });
});
