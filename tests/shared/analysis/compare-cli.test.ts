import { spawnSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { simulatePair } from '@shared/simulator/pair';

const CONTRACT_KEYS = [
  'methodVersion',
  'alignment',
  'bias',
  'agreement',
  'dropouts',
  'cadenceLagSeconds',
  'peaks',
  'powerBands',
  'cadenceBands',
  'steadySegments',
  'likeForLike',
  'smoothing',
  'flags',
];

function compare(...args: string[]) {
  const run = spawnSync(process.execPath, ['--import', 'tsx', 'scripts/compare.ts', ...args], { encoding: 'utf8', cwd: process.cwd() });
  return { status: run.status, stdout: run.stdout, stderr: run.stderr };
}

// Each case starts a Node process with tsx; on a busy machine that takes seconds, so the bound is generous.
describe('npm run compare', { timeout: 120_000 }, () => {
  const files = { a: '', b: '', text: '' };

  beforeAll(() => {
    const dir = mkdtempSync(join(tmpdir(), 'crosswatt-compare-'));
    const pair = simulatePair({ seed: 12, durationSeconds: 1800, a: { position: 'left', scale: 1.02 }, b: { position: 'dual' } });
    files.a = join(dir, 'a.fit');
    files.b = join(dir, 'b.fit');
    files.text = join(dir, 'notes.txt');
    writeFileSync(files.a, pair.a);
    writeFileSync(files.b, pair.b);
    writeFileSync(files.text, 'not a ride');
  }, 120_000);

  it('when two rides are compared with --json, then the result carries every contract key', () => {
    const { status, stdout } = compare(files.a, files.b, '--a-position', 'left', '--b-position', 'dual', '--json');

    expect(status).toBe(0);
    const result = JSON.parse(stdout);
    for (const key of CONTRACT_KEYS) expect(result).toHaveProperty(key);
    expect(result.likeForLike.mode).toBe('via_balance');
    expect(result.dropouts.a.power).toHaveProperty('ratePerHour');
  });

  it('when two rides are compared without --json, then a readable summary is printed', () => {
    const { status, stdout } = compare(files.a, files.b);

    expect(status).toBe(0);
    expect(stdout).toMatch(/Bias \(A vs B/);
    expect(stdout).toMatch(/Agreement/);
  });

  it('when a file is not FIT, then --json prints the error object and the exit code is 2', () => {
    const { status, stdout } = compare(files.a, files.text, '--json');

    expect(status).toBe(2);
    expect(JSON.parse(stdout)).toEqual({ error: { code: 'not_fit', message: expect.stringMatching(/second file \(B\)/) } });
  });

  it('when a position is unknown, then the exit code is 2 with a usage error', () => {
    const { status, stdout } = compare(files.a, files.b, '--a-position', 'spider', '--json');

    expect(status).toBe(2);
    expect(JSON.parse(stdout).error.code).toBe('invalid_position');
  });

  it('when a file is missing, then the exit code is 2 and the message names it', () => {
    const { status, stderr } = compare(files.a, '/nonexistent/ride.fit');

    expect(status).toBe(2);
    expect(stderr).toMatch(/ride\.fit/);
  });
});
