// npm run bench:scoreboard — how the shoppers' pages hold up at scale.
// BENCHMARK DATA ONLY: a throwaway PostgreSQL cluster in a temporary folder is
// filled with synthetic, aggregate-ready rows (100,000 accepted submissions over
// 300 models and 1,500 firmware versions, no recordings' streams) that never reach
// the demo or any real database; the cluster is deleted at the end.
// The server runs in a child process of its own, as in production; the load generator,
// the decisions and PostgreSQL run beside it on the same machine.
// Prints: the load average, bulk fill and full recompute times, the consensus refit,
// p50/p95 of the scoreboard and model-page endpoints at 50 connections (autocannon),
// the same with a moderation decision every second, the cost of a page right after a
// decision (nothing kept in memory), the time to apply one moderation decision to the
// aggregates, and whether the goals of issue 6 are met.
import { type ChildProcess, fork } from 'node:child_process';
import fs from 'node:fs';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
// @ts-expect-error autocannon ships no type declarations
import autocannon from 'autocannon';
import { createApp } from '../server/app';
import { loadConfig } from '../server/config/env';
import { createDb } from '../server/db/knex';
import { runMigrations } from '../server/db/migrate';
import { recomputeAllAggregates, updateAggregatesForSubmission } from '../server/features/statistics/aggregates';
import { ensureConsensusFresh } from '../server/features/statistics/consensus.service';
import { createLogger } from '../server/lib/logger';
import { createObjectStore } from '../server/lib/object-store';
import { freePort } from './lib/port';
import { ensureDatabase, startCluster } from './lib/postgres-cluster';

const SUBMISSIONS = Number(process.env.BENCH_SUBMISSIONS ?? 100_000);
const MODELS = 300;
const FIRMWARE_PER_MODEL = 5;
const RIDERS = 2_000;
const CONNECTIONS = Number(process.env.BENCH_CONNECTIONS ?? 50);
const SECONDS = Number(process.env.BENCH_SECONDS ?? 10);
const DECISIONS = 200;
// Issue 6, "Performance".
const GOAL_PAGE_P95_MS = 50;
const GOAL_DECISION_P95_MS = 20;
const COLD_REQUESTS = 20;

const percentile = (sorted: number[], p: number) => sorted[Math.min(sorted.length - 1, Math.floor((p / 100) * sorted.length))];
const ms = (value: number) => `${value.toFixed(1)} ms`;
const loadAverage = () =>
  os
    .loadavg()
    .map((l) => l.toFixed(2))
    .join(', ');
const goals: { label: string; p95: number; goal: number }[] = [];

/** One moderation decision on a submission: in or out of the statistics, in its own transaction. */
async function decide(db: ReturnType<typeof createDb>, id: number, change: 'add' | 'remove'): Promise<number> {
  const started = performance.now();
  await db.transaction(async (trx) => {
    await trx('submissions')
      .where({ id })
      .update({ status: change === 'add' ? 'accepted' : 'withdrawn' });
    await updateAggregatesForSubmission(trx, id, change);
  });
  return performance.now() - started;
}

/** Takes a submission out of the statistics and puts it back: two decisions, as a moderator's would be. */
async function withdrawAndAccept(db: ReturnType<typeof createDb>, id: number): Promise<{ withdraw: number; accept: number }> {
  const withdraw = await decide(db, id, 'remove');
  return { withdraw, accept: await decide(db, id, 'add') };
}

async function timed<T>(label: string, run: () => Promise<T>): Promise<T> {
  const started = performance.now();
  const result = await run();
  console.log(`${label}: ${ms(performance.now() - started)}`);
  return result;
}

/** Server mode: the app over the benchmark database, reporting its port to the parent. */
async function serve(databaseUrl: string) {
  const config = loadConfig({ NODE_ENV: 'test', LOG_LEVEL: 'silent', DATABASE_URL: databaseUrl });
  const server = http.createServer(
    createApp({ config, db: createDb(databaseUrl), logger: createLogger(config), store: createObjectStore(config) }),
  );
  server.listen(0, '127.0.0.1', () => process.send!({ port: (server.address() as AddressInfo).port }));
  process.on('disconnect', () => process.exit(0));
}

async function bench() {
  const folder = fs.mkdtempSync(path.join(os.tmpdir(), 'crosswatt-bench-'));
  fs.chmodSync(folder, 0o755);
  const cluster = startCluster({ dataDir: path.join(folder, 'pg'), port: await freePort(), log: () => {} });
  const databaseUrl = cluster.urlFor('crosswatt_bench');
  const db = createDb(databaseUrl);
  let server: ChildProcess | undefined;

  console.log(`Load average at start (1, 5, 15 min; ${os.cpus().length} cores): ${loadAverage()}`);
  try {
    await ensureDatabase(cluster.urlFor('postgres'), 'crosswatt_bench');
    await runMigrations(db);

    await timed(
      `Bulk fill (benchmark data: ${SUBMISSIONS} submissions, ${MODELS} models, ${MODELS * FIRMWARE_PER_MODEL} firmware)`,
      async () => {
        await db.raw(
          `insert into makers (slug, name, status) select 'bench-maker-' || i, 'Bench maker ' || i, 'approved' from generate_series(1, 30) i`,
        );
        await db.raw(
          `insert into models (maker_id, slug, name, position, kind, status)
         select (select id from makers where slug = 'bench-maker-' || (1 + i % 30)), 'bench-model-' || i, 'Bench model ' || i,
                (array['left','right','dual','total'])[1 + i % 4], (array['crank_arm','pedal','spider','spindle','hub','trainer'])[1 + i % 6], 'approved'
         from generate_series(1, ${MODELS}) i`,
        );
        await db.raw(
          `insert into firmware_versions (model_id, version, version_order, released_on, status)
         select m.id, '1.' || v, array[1, v], date '2025-01-01' + v * 60, 'approved' from models m, generate_series(1, ${FIRMWARE_PER_MODEL}) v`,
        );
        await db.raw(
          `insert into recording_devices (slug, name, kind, status) select 'bench-device-' || i, 'Bench device ' || i, 'head_unit', 'approved' from generate_series(1, 8) i`,
        );
        await db.raw(
          `insert into users (handle, name, provider_id) select 'bench-rider-' || i, 'Bench rider ' || i, 'bench-' || i from generate_series(1, ${RIDERS}) i`,
        );
        await db.raw(
          `insert into submissions (rider_id, status, indoor, surface, a_sha256, b_sha256, ride_started_at, ride_ended_at, method_version, result,
           bias_percent, loa_lower_percent, loa_upper_percent, sum_a, sum_b, matched_seconds, pedalling_seconds, overlap_seconds, clock_offset_seconds,
           correlation, cadence_lag_seconds, like_for_like_mode, a_power_dropouts, a_cadence_dropouts, b_power_dropouts, b_cadence_dropouts)
         select (select min(id) from users) + (i % ${RIDERS}), 'accepted', i % 5 = 0, (array['smooth_road','rough_road','gravel','trainer'])[1 + i % 4],
           md5('a' || i), md5('b' || i), timestamptz '2026-01-01' + i * interval '7 minutes', timestamptz '2026-01-01' + i * interval '7 minutes' + interval '2 hours', 1,
           jsonb_build_object('agreement', jsonb_build_object('blockCount', 120, 'meanDifferencePercent', b.bias, 'sdPercent', 3), 'peaks', jsonb_build_object('sprints', '[]'::jsonb)),
           b.bias, b.bias - 6, b.bias + 6, 1e6 * (1 + b.bias / 100), 1e6, 3600 + i % 7200, 3600 + i % 7200, 3600 + i % 7200, 0,
           0.97, (i % 5) - 2, (array['direct','direct','mixed','via_balance','mixed'])[1 + i % 5], i % 3, i % 2, (i / 7) % 2, 0
         from generate_series(1, ${SUBMISSIONS}) i, lateral (select round((random() * 6 - 3)::numeric, 2)::float8 as bias) b`,
        );
        // Side A and B on two random firmware versions of different models.
        await db.raw(
          `insert into submission_recordings (submission_id, side, model_id, firmware_id, position, recording_device_id, recording_mode, zero_offset,
           other_meters_on, sha256, device_info, recording_stats, stream)
         select s.id, side.name, f.model_id, f.id, 'total', (select min(id) from recording_devices) + s.id % 8,
           case when s.id % 4 = 0 then 'change_only' else 'every_second' end, 'yes', s.id % 6 = 0, md5(side.name || s.id), '{}', '{}', ''::bytea
         from submissions s
         cross join (values ('a', 0), ('b', 1)) side(name, n)
         join lateral (select id, model_id from firmware_versions
                       order by id offset ((hashtext(s.id::text || side.name) & 2147483647) % ${MODELS * FIRMWARE_PER_MODEL}) limit 1) f on true`,
        );
        await db.raw('analyze');
      },
    );

    const recompute = await timed('Full recompute of the aggregates (npm run stats:recompute)', () => recomputeAllAggregates(db));
    console.log(`  ${recompute.scopes} scopes from ${recompute.submissions} accepted submissions`);
    await timed('Consensus refit over every like-for-like submission (cubic, outside decisions)', () => ensureConsensusFresh(db));
    // As autovacuum would have by the time shoppers come: otherwise it runs during the measurements.
    await timed('Vacuum and analyze after the fill', () => db.raw('vacuum analyze'));

    // The app as it serves shoppers, in a process of its own (as `npm start` runs it), on a free port;
    // decisions below are made from this process, so the server learns of them from the database only.
    server = fork(fileURLToPath(import.meta.url), [], {
      execArgv: process.execArgv,
      env: { ...process.env, BENCH_SERVER_DATABASE_URL: databaseUrl },
    });
    const port = await new Promise<number>((resolve, reject) => {
      server!.once('message', (message) => resolve((message as { port: number }).port));
      server!.once('exit', (code) => reject(new Error(`the benchmark server exited (${code})`)));
    });
    const base = `http://127.0.0.1:${port}`;

    const slugs = Array.from({ length: 20 }, (_, i) => `bench-model-${1 + i * 15}`);
    const targets: { label: string; paths: string[] }[] = [
      { label: 'GET /api/scoreboard (default sort)', paths: ['/api/scoreboard'] },
      {
        label: 'GET /api/scoreboard (filters, sorts, search, pages)',
        paths: [
          '/api/scoreboard?sort=bias&order=asc&kind=pedal',
          '/api/scoreboard?sort=dropouts&evidence=enough&page=3',
          '/api/scoreboard?q=model%2012&sort=scatter',
          '/api/scoreboard?position=left&sort=cadence_lag',
        ],
      },
      { label: 'GET /api/models/:slug (20 models in turn)', paths: slugs.map((slug) => `/api/models/${slug}`) },
      { label: 'GET /api/models/:slug/firmware/:version', paths: slugs.map((slug) => `/api/models/${slug}/firmware/1.3`) },
    ];
    // Submissions that are not like for like: deciding them leaves the consensus offsets fresh
    // (a like-for-like decision's refit is timed on its own below).
    const ids: number[] = (
      await db('submissions').where({ like_for_like_mode: 'mixed' }).orderByRaw('random()').limit(DECISIONS).select('id')
    ).map((row: { id: number }) => row.id);

    const measure = async (target: { label: string; paths: string[] }, during?: () => Promise<void>) => {
      const latencies: number[] = [];
      let next = 0;
      let errors = 0;
      const instance = autocannon({
        url: base,
        connections: CONNECTIONS,
        duration: SECONDS,
        requests: [
          { setupRequest: (request: Record<string, unknown>) => ({ ...request, path: target.paths[next++ % target.paths.length] }) },
        ],
      });
      instance.on('response', (_client: unknown, statusCode: number, _bytes: number, responseTime: number) => {
        latencies.push(responseTime);
        if (statusCode !== 200) errors += 1;
      });
      let running = true;
      const background = (async () => {
        while (during && running) await during();
      })();
      await instance;
      running = false;
      await background;
      latencies.sort((a, b) => a - b);
      const p95 = percentile(latencies, 95);
      goals.push({ label: target.label, p95, goal: GOAL_PAGE_P95_MS });
      console.log(
        `  ${target.label}: p50 ${ms(percentile(latencies, 50))}, p95 ${ms(p95)}, p99 ${ms(percentile(latencies, 99))}; ` +
          `${latencies.length} requests, ${(latencies.length / SECONDS).toFixed(0)} req/s, ${errors} non-200; load average ${loadAverage()}`,
      );
    };

    console.log(
      `\nHTTP, ${CONNECTIONS} connections, ${SECONDS} s each (the server in its own process; it, the load generator and PostgreSQL share this machine's ${os.cpus().length} cores):`,
    );
    for (const target of targets) await measure(target);

    // Moderators deciding once a second (far more than a team reviews): each decision makes every
    // page be computed afresh once, here the 20 model pages in turn.
    console.log(`\nThe same while a decision is applied every second (a withdrawal, then the acceptance again):`);
    let decided = 0;
    const decideEverySecond = async () => {
      const started = performance.now();
      await decide(db, ids[Math.floor(decided / 2) % ids.length], decided % 2 === 0 ? 'remove' : 'add');
      decided += 1;
      await new Promise((resolve) => setTimeout(resolve, Math.max(0, 1000 - (performance.now() - started))));
    };
    for (const target of [targets[0], targets[2]]) await measure({ ...target, label: `${target.label}, decisions` }, decideEverySecond);
    if (decided % 2 === 1) await decide(db, ids[Math.floor(decided / 2) % ids.length], 'add'); // leave it accepted

    // The cost of a page when nothing is kept: the first request after a decision, one at a time.
    console.log(
      `\nFirst request after a decision (one connection, ${COLD_REQUESTS} decisions each; not a goal, shows the computation behind a page):`,
    );
    for (const target of targets) {
      const times: number[] = [];
      for (let i = 0; i < COLD_REQUESTS; i += 1) {
        await withdrawAndAccept(db, ids[i]);
        const started = performance.now();
        const res = await fetch(base + target.paths[i % target.paths.length]);
        await res.text();
        times.push(performance.now() - started);
      }
      times.sort((a, b) => a - b);
      console.log(`  ${target.label}: p50 ${ms(percentile(times, 50))}, p95 ${ms(percentile(times, 95))}`);
    }

    // A like-for-like decision marks the consensus offsets stale: the next page view refits them.
    const likeForLike: { id: number } = await db('submissions').where({ like_for_like_mode: 'direct' }).first('id');
    await withdrawAndAccept(db, likeForLike.id);
    const started = performance.now();
    await (await fetch(`${base}/api/models/${slugs[0]}`)).text();
    console.log(`  GET /api/models/:slug after a like-for-like decision (consensus refit first): ${ms(performance.now() - started)}`);

    // One decision's aggregate update, inside its transaction, commit included.
    const adds: number[] = [];
    const removes: number[] = [];
    for (const id of ids) {
      const { withdraw, accept } = await withdrawAndAccept(db, id);
      removes.push(withdraw);
      adds.push(accept);
    }
    adds.sort((a, b) => a - b);
    removes.sort((a, b) => a - b);
    console.log(`\nOne decision applied to the aggregates (${DECISIONS} decisions, status change + update + commit):`);
    console.log(`  accept: p50 ${ms(percentile(adds, 50))}, p95 ${ms(percentile(adds, 95))}`);
    console.log(`  withdraw: p50 ${ms(percentile(removes, 50))}, p95 ${ms(percentile(removes, 95))}`);
    goals.push({ label: 'one decision (accept)', p95: percentile(adds, 95), goal: GOAL_DECISION_P95_MS });
    goals.push({ label: 'one decision (withdraw)', p95: percentile(removes, 95), goal: GOAL_DECISION_P95_MS });

    console.log(
      `\nGoals (issue 6: pages p95 < ${GOAL_PAGE_P95_MS} ms at ${CONNECTIONS} connections, a decision p95 < ${GOAL_DECISION_P95_MS} ms); load average ${loadAverage()}:`,
    );
    for (const goal of goals)
      console.log(`  ${goal.p95 < goal.goal ? 'met    ' : 'NOT MET'} ${goal.label}: p95 ${ms(goal.p95)} (goal < ${goal.goal} ms)`);
  } finally {
    server?.kill();
    await db.destroy();
    cluster.stop();
    fs.rmSync(folder, { recursive: true, force: true });
  }
}

if (process.env.BENCH_SERVER_DATABASE_URL) await serve(process.env.BENCH_SERVER_DATABASE_URL);
else await bench();
