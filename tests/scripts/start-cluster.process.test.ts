import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { freePort } from '../../scripts/lib/port';
import { clusterIsRunning } from '../../scripts/lib/postgres-cluster';
import { spawnCrosswatt } from './support/crosswatt-process';

// The real `npm run start:cluster` entry on a data folder and ports of its own
// (the client build is skipped when it is up to date; the demo seed is switched
// off, it only takes time here). Each step waits for a state, never a fixed time.
let folder: string;

beforeAll(() => {
  folder = fs.mkdtempSync(path.join(os.tmpdir(), 'crosswatt-cluster-'));
  fs.chmodSync(folder, 0o755);
});

afterAll(() => {
  fs.rmSync(folder, { recursive: true, force: true });
});

function processIsAlive(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch {
    return false;
  }
}

describe('npm run start:cluster', { timeout: 300_000 }, () => {
  it('when it has started, then two web processes answer /api/health, and SIGTERM stops them, the workers and PostgreSQL', async () => {
    const dataDir = path.join(folder, 'postgres');
    const cluster = spawnCrosswatt('scripts/start-cluster.ts', {
      PORT: String(await freePort()),
      CROSSWATT_PG_PORT: String(await freePort()),
      CROSSWATT_DATA_DIR: dataDir,
      CROSSWATT_OBJECT_STORE_DIR: path.join(folder, 'object-store'),
      CROSSWATT_SEED_DEMO: 'false',
    });
    await cluster.waitForOutput(/Crosswatt is running at \S+ and \S+, with 2 workers/, 240_000);
    const [, first, second] = /Crosswatt is running at (\S+) and (\S+),/.exec(cluster.output())!;
    const children = childPids(cluster.child.pid!);

    const health = await Promise.all([first, second].map((url) => fetch(`${url}/api/health`).then((r) => r.status)));
    expect(first).not.toBe(second);
    expect(health).toEqual([200, 200]);
    expect(clusterIsRunning(dataDir)).toBe(true);
    expect(children).toHaveLength(4);

    cluster.signal('SIGTERM');

    expect(await cluster.exited).toBe(0);
    expect(clusterIsRunning(dataDir)).toBe(false);
    expect(children.filter(processIsAlive)).toEqual([]);
  });
});

/** The web processes and workers: the parent's children that run Node (`/proc` lists them). */
function childPids(parent: number): number[] {
  const pids: number[] = [];
  for (const entry of fs.readdirSync('/proc')) {
    if (!/^\d+$/.test(entry)) continue;
    try {
      const stat = fs.readFileSync(`/proc/${entry}/stat`, 'utf8');
      const ppid = Number(stat.slice(stat.lastIndexOf(')') + 2).split(' ')[1]);
      const cmdline = fs.readFileSync(`/proc/${entry}/cmdline`, 'utf8');
      if (ppid === parent && /server\/(index|worker)\.ts/.test(cmdline)) pids.push(Number(entry));
    } catch {
      // the process ended while we looked
    }
  }
  return pids;
}
