// npm run bench:ingest — what reading riders' FIT files costs (issue 13).
// 1. For FIT files from 0.1 MiB to the upload limit (scripts/lib/ingest-files.ts):
//    our decoder's throughput and peak memory, each file in a fresh process
//    (scripts/lib/decode-probe.ts), beside fit-file-parser's and @garmin/fitsdk's
//    decode times on the same files.
// 2. The real app (server in a child process, its job worker and worker-thread pool,
//    on a throwaway PostgreSQL cluster that is deleted at the end): /api/health
//    latency while a pair of two ~24 MiB files is uploaded and analysed.
// Prints each figure beside its goal.
import { type ChildProcess, fork, spawnSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { monitorEventLoopDelay } from 'node:perf_hooks';
import { fileURLToPath } from 'node:url';
import { loadConfig } from '../server/config/env';
import { createDb } from '../server/db/knex';
import { runMigrations } from '../server/db/migrate';
import { startLocalFakes } from '../server/fakes/start-fakes';
import { createLogger } from '../server/lib/logger';
import { tsxExecArgv } from '../server/lib/tsx-exec-argv';
import { startServer } from '../server/start-server';
import { createCatalogue, submissionMeta } from '../tests/server/support/catalogue-factory';
import type { ProbeDecoder, ProbeResult } from './lib/decode-probe';
import { signInAsRider } from './lib/fake-provider-session';
import { ingestFiles, largestPair } from './lib/ingest-files';
import { freePort } from './lib/port';
import { ensureDatabase, startCluster } from './lib/postgres-cluster';

// Issue 13, "Bounded cost".
const GOAL_MB_PER_S = 10;
const GOAL_MEMORY_MULTIPLE = 10;
const GOAL_HEALTH_MS = 100;
const OTHER_DECODER_TIME_LIMIT_MS = 120_000;
const HEALTH_INTERVAL_MS = 20;

const MB = 1e6;
const fmtMs = (ms: number) => (ms >= 1000 ? `${(ms / 1000).toFixed(2)} s` : `${ms.toFixed(1)} ms`);
const verdict = (ok: boolean) => (ok ? 'met' : 'MISSED');
const percentile = (sorted: number[], p: number) => sorted[Math.min(sorted.length - 1, Math.floor((p / 100) * sorted.length))];

function probe(decoder: ProbeDecoder, file: string, repeats: number): ProbeResult | { decoder: ProbeDecoder; outcome: string } {
  const script = fileURLToPath(new URL('./lib/decode-probe.ts', import.meta.url));
  const run = spawnSync(
    process.execPath,
    [...tsxExecArgv(), '--expose-gc', '--max-old-space-size=8192', script, decoder, file, String(repeats)],
    {
      encoding: 'utf8',
      timeout: OTHER_DECODER_TIME_LIMIT_MS,
    },
  );
  if (run.error || run.status !== 0) {
    const why = run.error
      ? `stopped after ${OTHER_DECODER_TIME_LIMIT_MS / 1000} s`
      : /heap out of memory/.test(run.stderr)
        ? 'ran out of memory (8 GB heap)'
        : `exited ${run.status}`;
    return { decoder, outcome: why };
  }
  return JSON.parse(run.stdout.trim().split('\n').at(-1)!) as ProbeResult;
}

function decodeBenchmark(folder: string) {
  console.log('Building the files…');
  const files = ingestFiles();
  const goals: boolean[] = [];
  console.log(
    `\nDecoding, each file in a fresh process (goals: ≥ ${GOAL_MB_PER_S} MB/s, peak memory growth ≤ ${GOAL_MEMORY_MULTIPLE} × the file)`,
  );
  console.log(
    `${'file'.padEnd(54)} ${'size'.padStart(9)}  ${'ours'.padStart(9)} ${'MB/s'.padStart(6)}  ${'peak'.padStart(8)} ${'×file'.padStart(6)}  ${'fit-file-parser'.padStart(16)}  ${'@garmin/fitsdk'.padStart(16)}  outcome`,
  );
  for (const [index, file] of files.entries()) {
    const where = path.join(folder, `ingest-${index}.fit`);
    fs.writeFileSync(where, file.bytes);
    // Small files decode in milliseconds: more repeats, so one scheduling hiccup does not set the median.
    const ours = probe('ours', where, file.bytes.length < 2 * MB ? 15 : 3);
    const others = (['fit-file-parser', 'fitsdk'] as const).map((decoder) => probe(decoder, where, 1));
    const mb = file.bytes.length / MB;
    if (!('medianMs' in ours)) {
      console.log(`${file.label.padEnd(54)} ${mb.toFixed(2).padStart(6)} MB  our decoder failed: ${ours.outcome}`);
      goals.push(false);
      continue;
    }
    const throughput = mb / (ours.medianMs / 1000);
    const multiple = ours.peakRssGrowthBytes / file.bytes.length;
    const expected = file.refusal ? ours.outcome === `refused: ${file.refusal}` : ours.outcome === 'read';
    const other = (r: (typeof others)[number]) =>
      ('medianMs' in r ? `${fmtMs(r.medianMs)}${r.outcome === 'read' ? '' : ' (refused)'}` : r.outcome).padStart(16);
    console.log(
      `${file.label.padEnd(54)} ${mb.toFixed(2).padStart(6)} MB  ${fmtMs(ours.medianMs).padStart(9)} ${throughput.toFixed(1).padStart(6)}  ${(ours.peakRssGrowthBytes / MB).toFixed(1).padStart(5)} MB ${multiple.toFixed(2).padStart(6)}  ${other(others[0])}  ${other(others[1])}  ${ours.outcome}${expected ? '' : ' (UNEXPECTED)'}`,
    );
    goals.push(expected && throughput >= GOAL_MB_PER_S && multiple <= GOAL_MEMORY_MULTIPLE);
  }
  console.log(
    '(ours: median of 15 decodes (files under 2 MB) or 3 after warming up; peak: growth of the resident set above its level before the first decode, an upper bound; the others: one decode)',
  );
  return goals.every(Boolean);
}

/** Server mode: the whole app as npm start runs it (job worker, local fakes), reporting its address to the parent. */
async function serve(databaseUrl: string) {
  const logger = createLogger({ LOG_LEVEL: 'silent' });
  const db = createDb(databaseUrl);
  const fakes = await startLocalFakes({ db, logger });
  const config = loadConfig({
    NODE_ENV: 'test',
    LOG_LEVEL: 'silent',
    DATABASE_URL: databaseUrl,
    PORT: String(await freePort()),
    ...fakes.env,
  });
  const running = await startServer(config);
  // The web process's own event-loop delay, to tell its stalls from the client's.
  const delay = monitorEventLoopDelay({ resolution: 10 });
  delay.enable();
  process.on('message', (message: string) => {
    if (message === 'reset') delay.reset();
    else process.send!({ loopDelayMs: { p99: delay.percentile(99) / 1e6, max: delay.max / 1e6 } });
  });
  process.send!({ url: running.url });
  process.on('disconnect', async () => {
    await running.close();
    await fakes.stop();
    await db.destroy();
    process.exit(0);
  });
}

async function healthBenchmark(folder: string): Promise<boolean> {
  const cluster = startCluster({ dataDir: path.join(folder, 'pg'), port: await freePort(), log: () => {} });
  let server: ChildProcess | undefined;
  try {
    await ensureDatabase(cluster.urlFor('postgres'), 'crosswatt_bench');
    const databaseUrl = cluster.urlFor('crosswatt_bench');
    const db = createDb(databaseUrl);
    await runMigrations(db);
    const catalogue = await createCatalogue(db);
    await db.destroy();
    server = fork(fileURLToPath(import.meta.url), [], {
      execArgv: process.execArgv,
      env: { ...process.env, BENCH_INGEST_DATABASE_URL: databaseUrl },
    });
    const url = await new Promise<string>((resolve, reject) => {
      server!.once('message', (m: { url: string }) => resolve(m.url));
      server!.once('exit', (code) => reject(new Error(`the server exited (${code})`)));
    });
    const rider = await signInAsRider(url, 'bench-rider');
    const pair = largestPair();
    console.log(
      `\n/api/health while a pair of ${(pair.a.length / MB).toFixed(1)} MB + ${(pair.b.length / MB).toFixed(1)} MB is uploaded and analysed (goal: every answer within ${GOAL_HEALTH_MS} ms)`,
    );

    const latencies: number[] = [];
    let polling = true;
    const poll = (async () => {
      while (polling) {
        const started = performance.now();
        const response = await fetch(`${url}/api/health`);
        await response.arrayBuffer();
        latencies.push(performance.now() - started);
        await new Promise((resolve) => setTimeout(resolve, HEALTH_INTERVAL_MS));
      }
    })();

    server.send('reset');
    const started = performance.now();
    const form = new FormData();
    form.append('meta', JSON.stringify(submissionMeta(catalogue)));
    form.append('fileA', new Blob([pair.a as Uint8Array<ArrayBuffer>]), 'a.fit');
    form.append('fileB', new Blob([pair.b as Uint8Array<ArrayBuffer>]), 'b.fit');
    const upload = await rider.fetch('/api/submissions', { method: 'POST', body: form });
    const uploadMs = performance.now() - started;
    const body = (await upload.json()) as { id?: number; error?: { message: string } };
    if (upload.status !== 201) throw new Error(`the upload was refused (${upload.status}): ${body.error?.message}`);
    let status = 'received';
    while (status === 'received' || status === 'analysing') {
      await new Promise((resolve) => setTimeout(resolve, 250));
      status = ((await (await rider.fetch(`/api/submissions/${body.id}`)).json()) as { status: string }).status;
    }
    const totalMs = performance.now() - started;
    polling = false;
    await poll;
    const loopDelay = new Promise<{ p99: number; max: number }>((resolve) =>
      server!.once('message', (m: { loopDelayMs: { p99: number; max: number } }) => resolve(m.loopDelayMs)),
    );
    server.send('report');
    const { p99: loopP99, max: loopMax } = await loopDelay;

    latencies.sort((x, y) => x - y);
    const max = latencies.at(-1)!;
    console.log(`upload answered 201 after ${fmtMs(uploadMs)}; analysis done (${status}) after ${fmtMs(totalMs)} in all`);
    console.log(
      `health: ${latencies.length} requests, p50 ${fmtMs(percentile(latencies, 50))}, p99 ${fmtMs(percentile(latencies, 99))}, max ${fmtMs(max)} — goal ≤ ${GOAL_HEALTH_MS} ms: ${verdict(max <= GOAL_HEALTH_MS)}`,
    );
    console.log(
      `the web process's event-loop delay meanwhile: p99 ${fmtMs(loopP99)}, max ${fmtMs(loopMax)} (the rest of a health answer's time is the network and the client)`,
    );
    return max <= GOAL_HEALTH_MS && status === 'awaiting_review';
  } finally {
    server?.disconnect();
    if (server) await new Promise((resolve) => server!.once('exit', resolve));
    cluster.stop();
  }
}

async function bench() {
  const folder = fs.mkdtempSync(path.join(os.tmpdir(), 'crosswatt-bench-ingest-'));
  fs.chmodSync(folder, 0o755);
  try {
    console.log(
      `Ingest benchmark on ${os.cpus().length} cores, load average ${os
        .loadavg()
        .map((l) => l.toFixed(2))
        .join(', ')}`,
    );
    const decoding = decodeBenchmark(folder);
    const health = await healthBenchmark(folder);
    console.log(
      `\nGoals: decoding throughput and memory at every size ${verdict(decoding)}; the record cap refuses before memory grows (see its peak above); health while ingesting ${verdict(health)}`,
    );
  } finally {
    fs.rmSync(folder, { recursive: true, force: true });
  }
}

if (process.env.BENCH_INGEST_DATABASE_URL) await serve(process.env.BENCH_INGEST_DATABASE_URL);
else await bench();
