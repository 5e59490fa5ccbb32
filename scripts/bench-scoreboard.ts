// npm run bench:scoreboard — how the shoppers' pages hold up at scale.
// BENCHMARK DATA ONLY: a throwaway PostgreSQL cluster in a temporary folder is
// filled with synthetic, aggregate-ready rows (100,000 accepted submissions over
// 300 models and 1,500 firmware versions, no recordings' streams) that never reach
// the demo or any real database; the cluster is deleted at the end.
// Prints: bulk fill and full recompute times, the consensus refit, p50/p95 of the
// scoreboard and model-page endpoints at 50 connections (autocannon), and the time
// to apply one moderation decision to the aggregates.
import fs from 'node:fs';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import os from 'node:os';
import path from 'node:path';
// @ts-expect-error autocannon ships no type declarations
import autocannon from 'autocannon';
import { createApp } from '../server/app';
import { loadConfig } from '../server/config/env';
import { createDb } from '../server/db/knex';
import { runMigrations } from '../server/db/migrate';
import { recomputeAllAggregates, updateAggregatesForSubmission } from '../server/features/statistics/aggregates';
import { ensureConsensusFresh } from '../server/features/statistics/consensus.service';
import { createLogger } from '../server/lib/logger';
import { freePort } from './lib/port';
import { ensureDatabase, startCluster } from './lib/postgres-cluster';

const SUBMISSIONS = Number(process.env.BENCH_SUBMISSIONS ?? 100_000);
const MODELS = 300;
const FIRMWARE_PER_MODEL = 5;
const RIDERS = 2_000;
const CONNECTIONS = Number(process.env.BENCH_CONNECTIONS ?? 50);
const SECONDS = Number(process.env.BENCH_SECONDS ?? 10);
const DECISIONS = 200;

const percentile = (sorted: number[], p: number) => sorted[Math.min(sorted.length - 1, Math.floor((p / 100) * sorted.length))];
const ms = (value: number) => `${value.toFixed(1)} ms`;

async function timed<T>(label: string, run: () => Promise<T>): Promise<T> {
  const started = performance.now();
  const result = await run();
  console.log(`${label}: ${ms(performance.now() - started)}`);
  return result;
}

const folder = fs.mkdtempSync(path.join(os.tmpdir(), 'crosswatt-bench-'));
fs.chmodSync(folder, 0o755);
const cluster = startCluster({ dataDir: path.join(folder, 'pg'), port: await freePort(), log: () => {} });
const databaseUrl = cluster.urlFor('crosswatt_bench');
const db = createDb(databaseUrl);
let server: http.Server | undefined;

try {
  await ensureDatabase(cluster.urlFor('postgres'), 'crosswatt_bench');
  await runMigrations(db);

  await timed(`Bulk fill (benchmark data: ${SUBMISSIONS} submissions, ${MODELS} models, ${MODELS * FIRMWARE_PER_MODEL} firmware)`, async () => {
    await db.raw(`insert into makers (slug, name, status) select 'bench-maker-' || i, 'Bench maker ' || i, 'approved' from generate_series(1, 30) i`);
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
    await db.raw(`insert into recording_devices (slug, name, kind, status) select 'bench-device-' || i, 'Bench device ' || i, 'head_unit', 'approved' from generate_series(1, 8) i`);
    await db.raw(`insert into users (handle, name, provider_id) select 'bench-rider-' || i, 'Bench rider ' || i, 'bench-' || i from generate_series(1, ${RIDERS}) i`);
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
  });

  const recompute = await timed('Full recompute of the aggregates (npm run stats:recompute)', () => recomputeAllAggregates(db));
  console.log(`  ${recompute.scopes} scopes from ${recompute.submissions} accepted submissions`);
  await timed('Consensus refit over every like-for-like submission (cubic, outside decisions)', () => ensureConsensusFresh(db));

  // The app as it serves shoppers, on a free port.
  const config = loadConfig({ NODE_ENV: 'test', LOG_LEVEL: 'silent', DATABASE_URL: databaseUrl });
  server = http.createServer(createApp({ config, db, logger: createLogger(config) }));
  await new Promise<void>((resolve) => server!.listen(0, '127.0.0.1', resolve));
  const base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;

  const slugs = Array.from({ length: 20 }, (_, i) => `bench-model-${1 + i * 15}`);
  const targets: { label: string; paths: string[] }[] = [
    { label: 'GET /api/scoreboard (default sort)', paths: ['/api/scoreboard'] },
    {
      label: 'GET /api/scoreboard (filters, sorts, search, pages)',
      paths: ['/api/scoreboard?sort=bias&order=asc&kind=pedal', '/api/scoreboard?sort=dropouts&evidence=enough&page=3', '/api/scoreboard?q=model%2012&sort=scatter', '/api/scoreboard?position=left&sort=cadence_lag'],
    },
    { label: 'GET /api/models/:slug (20 models in turn)', paths: slugs.map((slug) => `/api/models/${slug}`) },
    { label: 'GET /api/models/:slug/firmware/:version', paths: slugs.map((slug) => `/api/models/${slug}/firmware/1.3`) },
  ];
  console.log(`\nHTTP, ${CONNECTIONS} connections, ${SECONDS} s each (server and load generator share this machine's cores):`);
  for (const target of targets) {
    const latencies: number[] = [];
    let next = 0;
    let errors = 0;
    const instance = autocannon({
      url: base,
      connections: CONNECTIONS,
      duration: SECONDS,
      requests: [{ setupRequest: (request: Record<string, unknown>) => ({ ...request, path: target.paths[next++ % target.paths.length] }) }],
    });
    instance.on('response', (_client: unknown, statusCode: number, _bytes: number, responseTime: number) => {
      latencies.push(responseTime);
      if (statusCode !== 200) errors += 1;
    });
    await instance;
    latencies.sort((a, b) => a - b);
    console.log(
      `  ${target.label}: p50 ${ms(percentile(latencies, 50))}, p95 ${ms(percentile(latencies, 95))}, p99 ${ms(percentile(latencies, 99))}; ` +
        `${latencies.length} requests, ${(latencies.length / SECONDS).toFixed(0)} req/s, ${errors} non-200`,
    );
  }

  // One decision's aggregate update, inside its transaction, commit included.
  const ids: number[] = (await db('submissions').orderByRaw('random()').limit(DECISIONS).select('id')).map((row: { id: number }) => row.id);
  const adds: number[] = [];
  const removes: number[] = [];
  for (const id of ids) {
    let started = performance.now();
    await db.transaction(async (trx) => {
      await trx('submissions').where({ id }).update({ status: 'withdrawn' });
      await updateAggregatesForSubmission(trx, id, 'remove');
    });
    removes.push(performance.now() - started);
    started = performance.now();
    await db.transaction(async (trx) => {
      await trx('submissions').where({ id }).update({ status: 'accepted' });
      await updateAggregatesForSubmission(trx, id, 'add');
    });
    adds.push(performance.now() - started);
  }
  adds.sort((a, b) => a - b);
  removes.sort((a, b) => a - b);
  console.log(`\nOne decision applied to the aggregates (${DECISIONS} decisions, status change + update + commit):`);
  console.log(`  accept: p50 ${ms(percentile(adds, 50))}, p95 ${ms(percentile(adds, 95))}`);
  console.log(`  withdraw: p50 ${ms(percentile(removes, 50))}, p95 ${ms(percentile(removes, 95))}`);
} finally {
  await new Promise((resolve) => (server ? server.close(resolve) : resolve(undefined)));
  await db.destroy();
  cluster.stop();
  fs.rmSync(folder, { recursive: true, force: true });
}
