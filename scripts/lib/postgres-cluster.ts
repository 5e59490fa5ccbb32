// A private PostgreSQL cluster from Debian's packages, listening on loopback only.
// `npm start` keeps one in .data/postgres; the test run makes a throwaway one.
import { execFileSync, spawn, type SpawnSyncOptionsWithStringEncoding, spawnSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import pg from 'pg';
import { ensureDebianPackage, isRootUser, MissingPackageError } from './debian-package';

export const CLUSTER_SUPERUSER = 'crosswatt';

export interface ClusterOptions {
  dataDir: string;
  port: number;
  log?: (line: string) => void;
}

export interface Cluster {
  port: number;
  urlFor(database: string): string;
  stop(): void;
  /**
   * Stops the server (fast), waits `downForMs` and starts it again on the same port,
   * without blocking this process meanwhile (the soak keeps its load running).
   */
  restart(downForMs?: number): Promise<void>;
}

export class ClusterError extends Error {}

const isRoot = isRootUser;

function findBinDir(): string | undefined {
  const base = '/usr/lib/postgresql';
  if (fs.existsSync(base)) {
    const versions = fs
      .readdirSync(base)
      .filter((v) => fs.existsSync(path.join(base, v, 'bin', 'pg_ctl')))
      .sort((x, y) => Number(y) - Number(x));
    if (versions.length > 0) return path.join(base, versions[0], 'bin');
  }
  const found = spawnSync('sh', ['-c', 'command -v pg_ctl'], { encoding: 'utf8' }).stdout.trim();
  return found ? path.dirname(fs.realpathSync(found)) : undefined;
}

function ensureBinaries(log: (line: string) => void): string {
  try {
    return ensureDebianPackage({ packageName: 'postgresql', label: 'PostgreSQL', find: findBinDir, log });
  } catch (err) {
    throw err instanceof MissingPackageError ? new ClusterError(err.message) : err;
  }
}

// initdb and postgres refuse to run as root: run them as the `postgres` system user.
// `detached` gives the server a session of its own: a Ctrl-C or a SIGTERM to our process
// group must not reach PostgreSQL before the app has stopped using it.
function run(binDir: string, program: string, args: string[]) {
  const bin = path.join(binDir, program);
  const [file, argv] = isRoot() ? ['runuser', ['-u', 'postgres', '--', bin, ...args]] : [bin, args];
  // spawnSync honours `detached` (a new session, as spawn does) though its options type omits it.
  const options: SpawnSyncOptionsWithStringEncoding & { detached: boolean } = { encoding: 'utf8', detached: true };
  return spawnSync(file, argv, options);
}

/** `run` without blocking the event loop; resolves with the exit status. */
function runAsync(binDir: string, program: string, args: string[]): Promise<number | null> {
  const bin = path.join(binDir, program);
  const [file, argv] = isRoot() ? ['runuser', ['-u', 'postgres', '--', bin, ...args]] : [bin, args];
  return new Promise((resolve, reject) => {
    const child = spawn(file, argv, { detached: true, stdio: 'ignore' });
    child.once('error', reject);
    child.once('exit', (code) => resolve(code));
  });
}

function ownForCluster(dir: string) {
  if (isRoot()) execFileSync('chown', ['-R', 'postgres:postgres', dir]);
}

export function clusterIsRunning(dataDir: string): boolean {
  const binDir = findBinDir();
  if (!binDir || !fs.existsSync(path.join(dataDir, 'PG_VERSION'))) return false;
  return run(binDir, 'pg_ctl', ['status', '-D', dataDir]).status === 0;
}

export function startCluster({ dataDir, port, log = console.log }: ClusterOptions): Cluster {
  const binDir = ensureBinaries(log);
  const absolute = path.resolve(dataDir);
  if (!fs.existsSync(path.join(absolute, 'PG_VERSION'))) {
    // The parent must stay traversable by the cluster's user; the data folder itself is private.
    fs.mkdirSync(path.dirname(absolute), { recursive: true, mode: 0o755 });
    fs.mkdirSync(absolute, { recursive: true, mode: 0o700 });
    ownForCluster(absolute);
    const init = run(binDir, 'initdb', ['-D', absolute, '-U', CLUSTER_SUPERUSER, '--auth=trust', '--encoding=UTF8', '--no-instructions']);
    if (init.status !== 0) throw new ClusterError(`initdb failed: ${init.stderr || init.stdout}`);
  }
  const ownerFile = `${absolute}.owner`;
  const stopServer = () => {
    const fast = run(binDir, 'pg_ctl', ['stop', '-w', '-t', '20', '-m', 'fast', '-D', absolute]);
    if (fast.status !== 0 && run(binDir, 'pg_ctl', ['status', '-D', absolute]).status === 0) {
      run(binDir, 'pg_ctl', ['stop', '-w', '-t', '20', '-m', 'immediate', '-D', absolute]);
    }
  };
  let reused = false;
  if (run(binDir, 'pg_ctl', ['status', '-D', absolute]).status === 0) {
    reused = takeOverLeftover({ dataDir, ownerFile, port, postmaster: readPostmaster(absolute), stop: stopServer, log });
  }
  const logFile = path.join(absolute, 'server.log');
  const options = `-c listen_addresses=127.0.0.1 -p ${port} -k ${absolute} -c fsync=off`;
  const started = reused
    ? { status: 0, stderr: '', stdout: '' }
    : run(binDir, 'pg_ctl', ['start', '-w', '-t', '60', '-D', absolute, '-l', logFile, '-o', options]);
  if (started.status !== 0) {
    const tail = fs.existsSync(logFile) ? fs.readFileSync(logFile, 'utf8').split('\n').slice(-6).join('\n') : '';
    const busy = /could not bind|Address already in use/.test(tail);
    throw new ClusterError(
      busy
        ? `Port ${port} is busy: set CROSSWATT_PG_PORT to a free port.`
        : `PostgreSQL did not start: ${started.stderr || started.stdout}\n${tail}`,
    );
  }
  fs.writeFileSync(ownerFile, `${process.pid}\n`);
  let stopped = false;
  return {
    port,
    urlFor: (database) => `postgres://${CLUSTER_SUPERUSER}@127.0.0.1:${port}/${database}`,
    stop() {
      if (stopped) return;
      stopped = true;
      stopServer();
      fs.rmSync(ownerFile, { force: true });
    },
    async restart(downForMs = 0) {
      const down = await runAsync(binDir, 'pg_ctl', ['stop', '-w', '-t', '20', '-m', 'fast', '-D', absolute]);
      if (down !== 0) throw new ClusterError(`pg_ctl stop exited with ${down}`);
      await new Promise((resolve) => setTimeout(resolve, downForMs));
      const up = await runAsync(binDir, 'pg_ctl', ['start', '-w', '-t', '60', '-D', absolute, '-l', logFile, '-o', options]);
      if (up !== 0) throw new ClusterError(`pg_ctl start exited with ${up}; see ${logFile}`);
    },
  };
}

export interface Postmaster {
  pid: number;
  port: number;
}

/** postmaster.pid: the server's process id on line 1 and its port on line 4. */
export function readPostmaster(dataDir: string): Postmaster | undefined {
  try {
    const lines = fs.readFileSync(path.join(dataDir, 'postmaster.pid'), 'utf8').split('\n');
    const pid = Number(lines[0]);
    const port = Number(lines[3]);
    return Number.isInteger(pid) && Number.isInteger(port) ? { pid, port } : undefined;
  } catch {
    return undefined;
  }
}

function processIsAlive(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch (err) {
    return (err as NodeJS.ErrnoException).code === 'EPERM';
  }
}

/**
 * A cluster is already running on this data folder. When the Crosswatt that started it
 * is still alive, refuse; when it is gone (killed, crashed), reuse the cluster if it
 * listens on our port, else stop it so it starts again on ours. Returns true when reused.
 */
export function takeOverLeftover(options: {
  dataDir: string;
  ownerFile: string;
  port: number;
  postmaster: Postmaster | undefined;
  stop: () => void;
  log: (line: string) => void;
  isAlive?: (pid: number) => boolean;
}): boolean {
  const { dataDir, ownerFile, port, postmaster, stop, log, isAlive = processIsAlive } = options;
  const owner = fs.existsSync(ownerFile) ? Number(fs.readFileSync(ownerFile, 'utf8').trim()) : undefined;
  if (owner && owner !== process.pid && isAlive(owner)) {
    throw new ClusterError(`The database in ${dataDir} is in use by a running Crosswatt (process ${owner}): stop that one first.`);
  }
  const what = `PostgreSQL left running by an earlier Crosswatt on ${dataDir} (process ${postmaster?.pid ?? '?'}, port ${postmaster?.port ?? '?'})`;
  if (postmaster?.port === port) {
    log(`Reusing ${what}.`);
    return true;
  }
  log(`Stopping ${what}; starting it again on port ${port}.`);
  stop();
  return false;
}

export async function ensureDatabase(adminUrl: string, database: string, template?: string) {
  const client = new pg.Client({ connectionString: adminUrl });
  await client.connect();
  try {
    const { rowCount } = await client.query('select 1 from pg_database where datname = $1', [database]);
    if (!rowCount) {
      const from = template ? ` template "${template}"` : '';
      await client.query(`create database "${database}"${from}`);
    }
  } finally {
    await client.end();
  }
}
