import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { createThread } from '../../../server/features/threads/threads.service';
import { ensureUser } from '../../../server/features/users/users.service';
import { submissionAwaitingReview } from '../moderation/moderation-fixtures';
import { createCatalogue } from '../support/catalogue-factory';
import { signedInAgent } from '../support/sign-in';
import { routesOf } from '../support/route-table';
import { createTestContext } from '../support/test-app';

// Every state-changing route of the app × every kind of person → the expected
// answer. The routes come from the app's own route table, so a new write route
// that is missing here fails the first test: add it to `rules` below with who
// may use it. "Allowed" means the request gets past the guards (any status but
// 401/403, e.g. 400 for the deliberately thin bodies); everyone else gets 401
// (visitors) or 403 (signed in, wrong role).
//
// The fixture's thread and submission are about models of the maker-staff
// person's maker, and the rows that name a body send a valid one, so the rules
// checked past the guards (independence, authorship) are in the matrix too:
// `staffModerator` is a moderator who is also staff of that maker.

type Person = 'anonymous' | 'rider' | 'moderator' | 'makerStaff' | 'admin' | 'staffModerator';
const PEOPLE: Person[] = ['anonymous', 'rider', 'moderator', 'makerStaff', 'admin', 'staffModerator'];
const EVERYONE: Person[] = PEOPLE;
const SIGNED_IN: Person[] = ['rider', 'moderator', 'makerStaff', 'admin', 'staffModerator'];
const NOBODY_BUT_THE_AUTHOR: Person[] = [];
const ADMINS: Person[] = ['admin'];
const MODERATORS: Person[] = ['moderator'];
const THE_MAKERS_STAFF: Person[] = ['makerStaff', 'staffModerator'];

interface Fixture {
  targetUserId: number;
  makerId: number;
  /** A model of the maker-staff person's maker, a rider's thread about it and its opening post. */
  modelSlug: string;
  threadId: number;
  postId: number;
  /** Another model of the same maker, to move the thread to. */
  otherModelSlug: string;
  /** A rider's submission comparing that maker's models, awaiting review. */
  submissionId: number;
  submissionVersion: number;
}

interface Rule {
  allowed: Person[];
  /** The address to call, when the route has parameters. */
  path?: (f: Fixture) => string;
  body?: (f: Fixture) => object;
}

const rules: Record<string, Rule> = {
  // sign-in and account (issue 4)
  'POST /auth/logout': { allowed: EVERYONE },
  'PATCH /api/account': { allowed: SIGNED_IN, body: () => ({ notificationPrefs: { emailOnReply: true } }) },
  // A wrong confirmation: passes the guard, deletes nothing.
  'POST /api/account/deletion': { allowed: SIGNED_IN, body: () => ({ confirmHandle: 'someone-else' }) },
  // admin (issue 4)
  'POST /api/admin/users/:userId/roles': {
    allowed: ADMINS,
    path: (f) => `/api/admin/users/${f.targetUserId}/roles`,
    body: () => ({ role: 'moderator' }),
  },
  'DELETE /api/admin/users/:userId/roles/:role': { allowed: ADMINS, path: (f) => `/api/admin/users/${f.targetUserId}/roles/moderator` },
  'PUT /api/admin/users/:userId/maker-staff': {
    allowed: ADMINS,
    path: (f) => `/api/admin/users/${f.targetUserId}/maker-staff`,
    body: (f) => ({ makerId: f.makerId }),
  },
  'DELETE /api/admin/users/:userId/maker-staff': { allowed: ADMINS, path: (f) => `/api/admin/users/${f.targetUserId}/maker-staff` },
  // re-analysis (issue 14): the stored originals are not available yet, so the admin's call passes the guards and starts nothing
  'POST /api/admin/reanalysis': { allowed: ADMINS, body: () => ({ source: 'originals' }) },
  // catalogue
  'POST /api/catalogue/proposals': { allowed: SIGNED_IN, body: () => ({}) },
  // submissions
  'POST /api/submissions': { allowed: SIGNED_IN, body: () => ({}) },
  // moderation (issue 7): on a submission of the maker's models, its staff may not decide even as moderators
  'POST /api/moderation/submissions/:id/decision': {
    allowed: MODERATORS,
    path: (f) => `/api/moderation/submissions/${f.submissionId}/decision`,
    body: (f) => ({ decision: 'reject', reason: 'other', note: 'Matrix check', expectedVersion: f.submissionVersion }),
  },
  'POST /api/moderation/submissions/:id/tags': {
    allowed: MODERATORS,
    path: (f) => `/api/moderation/submissions/${f.submissionId}/tags`,
    body: (f) => ({ a: { zeroOffset: 'no' }, expectedVersion: f.submissionVersion }),
  },
  'PATCH /api/submissions/:id/tags': { allowed: SIGNED_IN, path: () => '/api/submissions/999999/tags' },
  // catalogue curation (issue 7): moderators who are not makers' staff
  'POST /api/moderation/catalogue/:type/:id': { allowed: MODERATORS, path: () => '/api/moderation/catalogue/model/999999' },
  'POST /api/moderation/catalogue/:type/:id/merge': { allowed: MODERATORS, path: () => '/api/moderation/catalogue/model/999999/merge' },
  'PUT /api/moderation/catalogue/:subject/:id/note': { allowed: MODERATORS, path: () => '/api/moderation/catalogue/model/999999/note' },
  'DELETE /api/moderation/catalogue/:subject/:id/note': { allowed: MODERATORS, path: () => '/api/moderation/catalogue/model/999999/note' },
  'PUT /api/moderation/catalogue/model/:id/hidden': { allowed: MODERATORS, path: () => '/api/moderation/catalogue/model/999999/hidden' },
  'DELETE /api/moderation/catalogue/model/:id/hidden': { allowed: MODERATORS, path: () => '/api/moderation/catalogue/model/999999/hidden' },
  // threads (issue 8): the maker's own staff answer for the maker; moderators hide, lock, move
  'POST /api/models/:slug/threads': { allowed: SIGNED_IN, path: (f) => `/api/models/${f.modelSlug}/threads` },
  'POST /api/threads/:id/posts': { allowed: SIGNED_IN, path: (f) => `/api/threads/${f.threadId}/posts` },
  'PUT /api/threads/:id/official-response': { allowed: THE_MAKERS_STAFF, path: (f) => `/api/threads/${f.threadId}/official-response` },
  'DELETE /api/threads/:id/official-response': { allowed: THE_MAKERS_STAFF, path: (f) => `/api/threads/${f.threadId}/official-response` },
  'PUT /api/threads/:id/status': { allowed: THE_MAKERS_STAFF, path: (f) => `/api/threads/${f.threadId}/status` },
  'PUT /api/threads/:id/follow': { allowed: SIGNED_IN, path: (f) => `/api/threads/${f.threadId}/follow` },
  'DELETE /api/threads/:id/follow': { allowed: SIGNED_IN, path: (f) => `/api/threads/${f.threadId}/follow` },
  'PUT /api/threads/:id/lock': {
    allowed: MODERATORS,
    path: (f) => `/api/threads/${f.threadId}/lock`,
    body: () => ({ locked: true, reason: 'Matrix check' }),
  },
  'POST /api/threads/:id/move': {
    allowed: MODERATORS,
    path: (f) => `/api/threads/${f.threadId}/move`,
    body: (f) => ({ modelSlug: f.otherModelSlug, reason: 'Matrix check' }),
  },
  // Staff and moderators do not edit riders' posts (moderators hide them instead).
  'PATCH /api/posts/:id': {
    allowed: NOBODY_BUT_THE_AUTHOR,
    path: (f) => `/api/posts/${f.postId}`,
    body: () => ({ body: 'Rewritten by someone else' }),
  },
  'PUT /api/posts/:id/visibility': {
    allowed: MODERATORS,
    path: (f) => `/api/posts/${f.postId}/visibility`,
    body: () => ({ hidden: true, reason: 'Matrix check' }),
  },
  'POST /api/notifications/read': { allowed: SIGNED_IN },
  // battery log (issue 18): riders' own meters (another's answer 404, past the guards); moderators who are not staff enter claims
  'POST /api/me/meters': { allowed: SIGNED_IN, body: () => ({}) },
  'DELETE /api/me/meters/:meterId': { allowed: SIGNED_IN, path: () => '/api/me/meters/999999' },
  'POST /api/me/meters/:meterId/battery-events': { allowed: SIGNED_IN, path: () => '/api/me/meters/999999/battery-events' },
  'DELETE /api/me/meters/:meterId/battery-events/:eventId': { allowed: SIGNED_IN, path: () => '/api/me/meters/999999/battery-events/1' },
  'POST /api/me/meters/:meterId/riding': { allowed: SIGNED_IN, path: () => '/api/me/meters/999999/riding' },
  'DELETE /api/me/meters/:meterId/riding/:ridingId': { allowed: SIGNED_IN, path: () => '/api/me/meters/999999/riding/1' },
  'PUT /api/moderation/models/:id/battery-claim': { allowed: MODERATORS, path: () => '/api/moderation/models/999999/battery-claim' },
  // mail (issue 19): admins send a failed message again
  'POST /api/mail/messages/:id/resend': { allowed: ADMINS, path: () => '/api/mail/messages/999999/resend' },
};

const WRITE_METHODS = ['post', 'put', 'patch', 'delete'] as const;

const { app, db, config } = await createTestContext({ fakes: true });
const catalogue = await createCatalogue(db);
const routes = routesOf(app, WRITE_METHODS);

describe('the permission matrix', () => {
  const fixture = {} as Fixture;
  beforeAll(async () => {
    const target = await ensureUser(db, { handle: 'matrix-target', name: 'Matrix Target' });
    fixture.targetUserId = target.id;
    fixture.makerId = catalogue.maker.id;
    const thread = await createThread({ db, config }, target, catalogue.spider.slug, {
      title: 'Matrix thread title',
      body: 'Matrix thread body',
    });
    const submission = await submissionAwaitingReview(db, target.id, catalogue);
    Object.assign(fixture, {
      modelSlug: catalogue.spider.slug,
      otherModelSlug: catalogue.pedals.slug,
      threadId: thread.id,
      postId: thread.postId,
      submissionId: submission.id,
      submissionVersion: submission.version,
    });
  });

  async function agentFor(person: Person) {
    if (person === 'anonymous') {
      const agent = request.agent(app);
      const token = (await agent.get('/api/csrf-token')).body.token as string;
      return { agent, token };
    }
    const roles =
      person === 'admin' ? (['admin'] as const) : person === 'moderator' || person === 'staffModerator' ? (['moderator'] as const) : [];
    const { agent, csrf } = await signedInAgent(app, {
      handle: `matrix-${person.toLowerCase()}`,
      roles: [...roles],
      makerSlug: person === 'makerStaff' || person === 'staffModerator' ? catalogue.maker.slug : undefined,
    });
    return { agent, token: await csrf() };
  }

  it('when the app is built, then every state-changing route has a rule in this table', () => {
    const missing = routes.filter((route) => !rules[route]);

    expect(routes.length).toBeGreaterThan(0);
    expect(missing, 'add these routes to `rules` in tests/server/auth/permission-matrix.test.ts').toEqual([]);
  });

  it('when a rule names a route, then the app has that route (no stale rows that check nothing)', () => {
    const stale = Object.keys(rules).filter((route) => !routes.includes(route));

    expect(stale, 'remove or rename these rows in `rules`').toEqual([]);
  });

  for (const route of routes) {
    const [method, pattern] = route.split(' ') as [string, string];
    const rule = rules[route];
    if (!rule) continue;

    it(`when ${route} comes without a CSRF token, then it is refused with 403 csrf_invalid`, async () => {
      const path = rule.path?.(fixture) ?? pattern;

      const res = await request(app)
        [method.toLowerCase() as 'post'](path)
        .send(rule.body?.(fixture) ?? {});

      expect(res.status).toBe(403);
      expect(res.body.error.code).toBe('csrf_invalid');
    });

    for (const person of PEOPLE) {
      const allowed = rule.allowed.includes(person);
      const expected = allowed ? 'passes the checks' : person === 'anonymous' ? 401 : 403;
      it(`when ${person} calls ${route}, then it ${allowed ? 'passes the checks' : `is refused with ${expected}`}`, async () => {
        const { agent, token } = await agentFor(person);
        const path = rule.path?.(fixture) ?? pattern;

        const res = await agent[method.toLowerCase() as 'post'](path)
          .set('X-CSRF-Token', token)
          .send(rule.body?.(fixture) ?? {});

        if (allowed) {
          expect([401, 403], `${res.status} ${JSON.stringify(res.body)}`).not.toContain(res.status);
          expect(res.status).toBeLessThan(500);
        } else {
          expect(res.status).toBe(expected);
          expect(res.body.error.message).toMatch(/\w+/);
        }
      });
    }
  }
});
