import request from 'supertest';
import { expect } from 'vitest';
import type { Role } from '../../../shared/roles';
import type { CurrentUser } from '../../../shared/schemas/auth';
import { ensureUser } from '../../../server/features/users/users.service';
import { testContextOf } from './test-app';

export type TestAgent = ReturnType<typeof request.agent>;

/**
 * Follows the whole OAuth round trip against the fake provider without a browser:
 * app → provider (authorize with login=<handle>) → app callback. The agent keeps
 * the session cookie. Needs an app from createTestContext({ fakes: true }).
 */
export async function signInThroughFakeProvider(agent: TestAgent, handle: string): Promise<void> {
  const start = await agent.get(`/auth/github?login=${encodeURIComponent(handle)}`);
  expect(start.status, 'GET /auth/github should redirect to the provider').toBe(302);
  const approval = await fetch(start.headers.location!, { redirect: 'manual' });
  expect(approval.status, `the fake provider should approve ${handle}`).toBe(302);
  const callback = new URL(approval.headers.get('location')!);
  const back = await agent.get(`${callback.pathname}${callback.search}`);
  expect(back.status, `the callback should sign ${handle} in: ${back.text.slice(0, 200)}`).toBe(302);
}

/**
 * A supertest agent signed in as `handle` (created as a rider on first use), with
 * extra roles granted and, with makerSlug, verified as staff of that maker (the
 * maker is created if missing). csrf() fetches a token for this session:
 *
 *   const { agent, csrf } = await signedInAgent(app, { handle: 'mod-1', roles: ['moderator'] });
 *   await agent.post('/api/…').set('X-CSRF-Token', await csrf()).send({…});
 */
export async function signedInAgent(
  app: Parameters<typeof request.agent>[0],
  options: { handle: string; roles?: Role[]; makerSlug?: string },
): Promise<{ agent: TestAgent; csrf: () => Promise<string>; user: CurrentUser }> {
  const { db } = testContextOf(app as object);
  const agent = request.agent(app);
  await signInThroughFakeProvider(agent, options.handle);
  if (options.roles?.length || options.makerSlug) {
    await ensureUser(db, { handle: options.handle, name: options.handle, roles: options.roles, makerSlug: options.makerSlug });
  }
  const me = await agent.get('/api/me');
  expect(me.status).toBe(200);
  const csrf = async () => {
    const res = await agent.get('/api/csrf-token');
    expect(res.status).toBe(200);
    return res.body.token as string;
  };
  // Puts the CSRF cookie in the agent's jar now: supertest attaches cookies when
  // a request is created, so `agent.post(…).set('X-CSRF-Token', await csrf())`
  // only works if the cookie (which csrf() then reuses) is already there.
  await csrf();
  return { agent, csrf, user: me.body as CurrentUser };
}
