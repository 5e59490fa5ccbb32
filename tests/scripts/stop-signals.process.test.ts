import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { freePort } from '../../scripts/lib/port';
import { clusterIsRunning } from '../../scripts/lib/postgres-cluster';
import { spawnCrosswatt } from './support/crosswatt-process';

// Real processes, real signals: the runner `npm start` uses, on a data folder and
// ports of its own. Each step waits for a state (a printed line, an exit) with a
// generous bound, never for a fixed time.
const entry = 'tests/scripts/support/start-like-npm-start.ts';
const RUNNING = /Crosswatt is running at/;
let folder: string;
let dataDir: string;

async function start(extraEnv: Record<string, string> = {}) {
  const env = { PORT: String(await freePort()), CROSSWATT_PG_PORT: String(await freePort()), CROSSWATT_DATA_DIR: dataDir, ...extraEnv };
  const crosswatt = spawnCrosswatt(entry, env);
  return { crosswatt, env };
}

beforeAll(() => {
  folder = fs.mkdtempSync(path.join(os.tmpdir(), 'crosswatt-stop-'));
  fs.chmodSync(folder, 0o755);
  dataDir = path.join(folder, 'postgres');
});

afterAll(() => {
  if (clusterIsRunning(dataDir)) throw new Error('a test left PostgreSQL running');
  fs.rmSync(folder, { recursive: true, force: true });
});

describe('stopping npm start', { timeout: 240_000 }, () => {
  it('when Ctrl-C reaches the whole process group, then the server and PostgreSQL stop', async () => {
    const { crosswatt } = await start();
    await crosswatt.waitForOutput(RUNNING);
    expect(clusterIsRunning(dataDir)).toBe(true);

    crosswatt.signalGroup('SIGINT');

    expect(await crosswatt.exited).toBe(0);
    expect(clusterIsRunning(dataDir)).toBe(false);
  });

  it('when SIGTERM arrives twice and SIGINT after it, then the one shutdown still stops PostgreSQL', async () => {
    const { crosswatt } = await start();
    await crosswatt.waitForOutput(RUNNING);

    crosswatt.signalGroup('SIGTERM');
    crosswatt.signalGroup('SIGTERM');
    crosswatt.signalGroup('SIGINT');

    expect(await crosswatt.exited).toBe(0);
    expect(clusterIsRunning(dataDir)).toBe(false);
    expect(crosswatt.output()).toContain('Still stopping');
  });

  it('when a SIGTERM arrives while it is still starting, then it stops without leaving PostgreSQL running', async () => {
    const { crosswatt } = await start();
    await crosswatt.waitForOutput(/PostgreSQL is running on/);

    crosswatt.signalGroup('SIGTERM');

    expect(await crosswatt.exited).toBe(0);
    expect(clusterIsRunning(dataDir)).toBe(false);
  });

  it('when an earlier Crosswatt was killed with kill -9, then the next start reuses its PostgreSQL with one line and stops it on exit', async () => {
    const first = await start();
    await first.crosswatt.waitForOutput(RUNNING);
    first.crosswatt.signal('SIGKILL');
    await first.crosswatt.exited;
    expect(clusterIsRunning(dataDir)).toBe(true);

    const second = spawnCrosswatt(entry, { ...first.env, PORT: String(await freePort()) });
    await second.waitForOutput(RUNNING);
    const url = /Crosswatt is running at (\S+)/.exec(second.output())![1];
    const health = await fetch(`${url}/api/health`);

    expect(second.output()).toMatch(/Reusing PostgreSQL left running by an earlier Crosswatt on .* \(process \d+, port \d+\)\./);
    expect(health.status).toBe(200);
    second.signalGroup('SIGTERM');
    expect(await second.exited).toBe(0);
    expect(clusterIsRunning(dataDir)).toBe(false);
  });

  it('when the left-over PostgreSQL listens on another port, then it is stopped and started again on ours', async () => {
    const first = await start();
    await first.crosswatt.waitForOutput(RUNNING);
    first.crosswatt.signal('SIGKILL');
    await first.crosswatt.exited;

    const second = spawnCrosswatt(entry, { ...first.env, PORT: String(await freePort()), CROSSWATT_PG_PORT: String(await freePort()) });
    await second.waitForOutput(RUNNING);

    expect(second.output()).toMatch(/Stopping PostgreSQL left running by an earlier Crosswatt .*; starting it again on port \d+\./);
    second.signalGroup('SIGINT');
    expect(await second.exited).toBe(0);
    expect(clusterIsRunning(dataDir)).toBe(false);
  });

  it('when a Crosswatt is still running on the data folder, then a second one refuses with one line and leaves it alone', async () => {
    const first = await start();
    await first.crosswatt.waitForOutput(RUNNING);

    const second = spawnCrosswatt(entry, { ...first.env, PORT: String(await freePort()) });

    expect(await second.exited).toBe(1);
    expect(second.output()).toMatch(/is in use by a running Crosswatt \(process \d+\): stop that one first\./);
    expect(clusterIsRunning(dataDir)).toBe(true);
    first.crosswatt.signalGroup('SIGINT');
    expect(await first.crosswatt.exited).toBe(0);
    expect(clusterIsRunning(dataDir)).toBe(false);
  });
});
