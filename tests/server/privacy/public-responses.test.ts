import express from 'express';
import request from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { seedDemoWorld, type SeedDemoReport } from '../../../seeds/demo-world/seed-demo';
import { type Finding, findPrivateData, findPrivateDataInCsv, type KnownSecrets } from '../support/private-data';
import { routesOf } from '../support/route-table';
import { createTestContext } from '../support/test-app';

// Every GET route of the app, walked as a visitor over HTTP against a demo world
// built through the real pipeline: no body may carry a serial number, an e-mail
// address, a device id, a file hash, a coordinate or a time finer than a day. The
// routes come from the app's own route table, so a new GET route that is missing
// from `ROUTES` fails the first test: say there whether visitors may use it and
// where its parameters come from.

const { app, db } = await createTestContext({ fakes: true });

/** A small demo world (about 20 rides) at a fixed date, as tests/server/demo/seed.test.ts builds it. */
const NOW = Date.UTC(2026, 10, 15, 12) / 1000;

type Visitor = 'public' | 'signed_in_only';
interface RouteRule {
  visitor: Visitor;
  /** The addresses to call; default: the route's own path. */
  paths?: (world: World) => string[];
}

interface World {
  modelSlugs: string[];
  firmware: Array<{ slug: string; version: string }>;
  submissionIds: number[];
  threadIds: number[];
}

const ROUTES: Record<string, RouteRule> = {
  'GET /api/admin/audit-log': { visitor: 'signed_in_only' },
  'GET /api/admin/makers': { visitor: 'signed_in_only' },
  'GET /api/admin/object-store': { visitor: 'signed_in_only' },
  'GET /api/admin/reanalysis': { visitor: 'signed_in_only' },
  'GET /api/admin/users': { visitor: 'signed_in_only' },
  'GET /api/catalogue': { visitor: 'public' },
  'GET /api/catalogue/aliases': {
    visitor: 'public',
    paths: (w) => w.modelSlugs.slice(0, 3).map((s) => `/api/catalogue/aliases?slug=${s}`),
  },
  'GET /api/csrf-token': { visitor: 'public' },
  'GET /api/health': { visitor: 'public' },
  'GET /api/mail/outbox': { visitor: 'signed_in_only' },
  'GET /api/mail/undelivered': { visitor: 'signed_in_only' },
  'GET /api/mail/unsubscribe': { visitor: 'public', paths: () => ['/api/mail/unsubscribe?token=not-a-token'] },
  'GET /api/me': { visitor: 'signed_in_only' },
  'GET /api/me/submissions': { visitor: 'signed_in_only' },
  'GET /api/me/meters': { visitor: 'signed_in_only' },
  'GET /api/methodology': { visitor: 'public' },
  'GET /api/models/:slug': { visitor: 'public', paths: (w) => w.modelSlugs.map((s) => `/api/models/${s}`) },
  'GET /api/models/:slug/firmware/:version': {
    visitor: 'public',
    paths: (w) => w.firmware.map((f) => `/api/models/${f.slug}/firmware/${encodeURIComponent(f.version)}`),
  },
  'GET /api/models/:slug/conditions': { visitor: 'public', paths: (w) => w.modelSlugs.map((s) => `/api/models/${s}/conditions`) },
  'GET /api/models/:slug/linkable-submissions': {
    visitor: 'signed_in_only',
    paths: (w) => [`/api/models/${w.modelSlugs[0]}/linkable-submissions`],
  },
  'GET /api/models/:slug/thread-summary': { visitor: 'public', paths: (w) => w.modelSlugs.map((s) => `/api/models/${s}/thread-summary`) },
  'GET /api/models/:slug/threads': { visitor: 'public', paths: (w) => w.modelSlugs.map((s) => `/api/models/${s}/threads`) },
  'GET /api/moderation/catalogue/pending': { visitor: 'signed_in_only' },
  'GET /api/moderation/queue': { visitor: 'signed_in_only' },
  'GET /api/moderation/submissions/:id': {
    visitor: 'signed_in_only',
    paths: (w) => w.submissionIds.slice(0, 3).map((id) => `/api/moderation/submissions/${id}`),
  },
  'GET /api/notifications': { visitor: 'signed_in_only' },
  'GET /api/scoreboard': { visitor: 'public' },
  'GET /api/scoreboard.csv': { visitor: 'public' },
  'GET /api/submissions.csv': { visitor: 'public' },
  // Not-yet-accepted submissions answer 404 to visitors; the accepted ones are public.
  'GET /api/submissions/:id': { visitor: 'public', paths: (w) => w.submissionIds.map((id) => `/api/submissions/${id}`) },
  'GET /api/submissions/:id/trace': {
    visitor: 'public',
    paths: (w) => w.submissionIds.slice(0, 3).map((id) => `/api/submissions/${id}/trace`),
  },
  'GET /api/submissions/:id/decision': { visitor: 'public', paths: (w) => w.submissionIds.map((id) => `/api/submissions/${id}/decision`) },
  'GET /api/threads/:id': { visitor: 'public', paths: (w) => w.threadIds.map((id) => `/api/threads/${id}`) },
  // Sign-in redirects: no body worth reading, but walked all the same.
  'GET /auth/github': { visitor: 'public' },
  'GET /auth/github/callback': { visitor: 'public' },
  // The built client (index.html for every other path).
  'GET /^\\/(?!api\\/|auth\\/).*': { visitor: 'public', paths: () => ['/', '/models/x'] },
  // Source maps of the built client are refused.
  'GET /^\\/(?!api\\/|auth\\/).*\\.map$': { visitor: 'public', paths: () => ['/assets/index.js.map'] },
};

let report: SeedDemoReport;
let world: World;
let secrets: KnownSecrets;

beforeAll(async () => {
  report = await seedDemoWorld({ db, now: NOW, scale: 0.03 });
  const models = await db('models').select('id', 'slug');
  const firmware = await db('firmware_versions as f').join('models as m', 'm.id', 'f.model_id').select('m.slug', 'f.version');
  world = {
    modelSlugs: models.map((m) => m.slug),
    firmware,
    submissionIds: report.submissionIds,
    threadIds: (await db('threads').select('id')).map((t) => t.id),
  };
  secrets = { serialNumbers: serialNumbersIn(report.plan) };
}, 180_000);

/** Every serial number the demo's FIT files were written with. */
function serialNumbersIn(value: unknown, found = new Set<number>()): Set<number> {
  if (Array.isArray(value)) {
    for (const v of value) serialNumbersIn(v, found);
  } else if (value && typeof value === 'object') {
    for (const [key, v] of Object.entries(value)) {
      if (key === 'serialNumber' && typeof v === 'number') found.add(v);
      else serialNumbersIn(v, found);
    }
  }
  return found;
}

/** The visitor's own CSRF token is random hex by design: the one value the hash check leaves alone. */
function withoutOwnCsrfToken(route: string, body: unknown) {
  return route === 'GET /api/csrf-token' && body && typeof body === 'object' ? { ...body, token: '(own token)' } : body;
}

interface Walk {
  findings: Finding[];
  /** Per route: the statuses its calls got. */
  statuses: Map<string, number[]>;
}

/** Calls every GET route of the app's route table as a visitor of `target` and reads every body. */
async function walkAsVisitor(target: express.Express): Promise<Walk> {
  const walk: Walk = { findings: [], statuses: new Map() };
  for (const route of routesOf(app, ['get'])) {
    const rule = ROUTES[route];
    if (!rule) continue;
    const paths = rule.paths?.(world) ?? [route.slice('GET '.length)];
    const statuses: number[] = [];
    for (const path of paths) {
      const res = await request(target).get(path).buffer(true);
      statuses.push(res.status);
      const text = res.text ?? '';
      const type = String(res.headers['content-type'] ?? '');
      if (type.includes('text/csv')) walk.findings.push(...findPrivateDataInCsv(text, secrets, path));
      else if (type.includes('json')) walk.findings.push(...findPrivateData(withoutOwnCsrfToken(route, JSON.parse(text)), secrets, path));
      else walk.findings.push(...findPrivateData(text, secrets, path));
      if (res.headers.location) walk.findings.push(...findPrivateData(String(res.headers.location), secrets, `${path} (Location)`));
    }
    walk.statuses.set(route, statuses);
  }
  return walk;
}

describe('what a visitor gets from the public routes', () => {
  let walk: Walk;
  beforeAll(async () => {
    walk = await walkAsVisitor(app);
  }, 180_000);

  it("when the app's GET routes are read from its route table, then every one is listed here with who may use it", () => {
    const missing = routesOf(app, ['get']).filter((route) => !ROUTES[route]);
    expect(missing, 'add these GET routes to ROUTES').toEqual([]);
  });

  it('when a visitor calls every public GET route, then each answers and at least one of every parametrised route is public', () => {
    for (const [route, statuses] of walk.statuses) {
      const rule = ROUTES[route]!;
      expect(statuses.length, route).toBeGreaterThan(0);
      expect(
        statuses.filter((s) => s >= 500),
        `${route} answered a 5xx`,
      ).toEqual([]);
      if (rule.visitor === 'signed_in_only')
        expect(
          statuses.every((s) => s === 401 || s === 403 || s === 404),
          route,
        ).toBe(true);
    }
    for (const route of [
      'GET /api/submissions/:id',
      'GET /api/models/:slug',
      'GET /api/models/:slug/firmware/:version',
      'GET /api/threads/:id',
      'GET /api/scoreboard.csv',
      'GET /api/submissions.csv',
    ]) {
      expect(walk.statuses.get(route)!.filter((s) => s === 200).length, route).toBeGreaterThan(0);
    }
  });

  it('when every body is read, keys and values, then none carries a serial number, e-mail, device id, file hash, coordinate or time finer than a day', () => {
    expect(secrets.serialNumbers.size).toBeGreaterThan(10);
    expect(walk.findings.map((f) => `${f.path}: ${f.what}`)).toEqual([]);
  });
});

describe('the privacy walk itself', () => {
  /** The real app behind a layer that puts one field back into one kind of public response. */
  function appThatLeaks(path: RegExp, leak: (body: Record<string, unknown>) => Record<string, unknown>) {
    const leaky = express();
    leaky.use((req, res, next) => {
      if (path.test(req.path)) {
        const json = res.json.bind(res);
        res.json = (body: Record<string, unknown>) => json(res.statusCode === 200 ? leak(body) : body);
      }
      next();
    });
    leaky.use(app);
    return leaky;
  }

  it("when a device's serial number is put back into a submission, under any name, then the walk finds it", async () => {
    const serial = [...secrets.serialNumbers][0]!;
    const leaky = appThatLeaks(/^\/api\/submissions\/\d+$/, (body) => ({ ...body, recordings: [{ meter: { sn: serial } }] }));

    const { findings } = await walkAsVisitor(leaky);

    expect(findings.some((f) => f.what === `serial number (${serial})`)).toBe(true);
  });

  it('when the exact start time of a ride is put back, as an ISO time or as Unix seconds, then the walk finds it', async () => {
    const leaky = appThatLeaks(/^\/api\/threads\/\d+$/, (body) => ({
      ...body,
      lastRide: '2026-11-14T07:42:10.000Z',
      clock: { at: 1_794_642_130 },
    }));

    const { findings } = await walkAsVisitor(leaky);

    expect(findings.some((f) => f.what.startsWith('time finer than a day'))).toBe(true);
    expect(findings.some((f) => f.what.startsWith('clock time'))).toBe(true);
  });

  it('when a CSV gets an e-mail column, then the walk finds it by its header and its cells', () => {
    const csv = 'model,rider_email\n"Marrow Spider, total",someone@example.test\n';

    const findings = findPrivateDataInCsv(csv, secrets);

    expect(findings.map((f) => f.what)).toEqual(['e-mail address (key "rider_email")', 'e-mail address (someone@example.test)']);
  });
});
