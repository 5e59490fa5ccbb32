// One Crosswatt process (a web server or a worker) run as a child of
// `npm run start:cluster` or the soak: its own environment, its output passed on
// line by line, a bounded stop, and a restart after a kill.
import { type ChildProcess, spawn } from 'node:child_process';
import readline from 'node:readline';

export interface NodeChild {
  name: string;
  pid(): number | undefined;
  isRunning(): boolean;
  /** Starts the process (again) and resolves once `ready` says so. */
  start(): Promise<void>;
  /** Sends `signal` and resolves when the process has exited (kill -9 in the soak). */
  kill(signal: NodeJS.Signals): Promise<void>;
  /** SIGTERM, then SIGKILL if it has not exited within `graceMs`. */
  stop(graceMs?: number): Promise<void>;
}

export interface NodeChildOptions {
  name: string;
  /** A TypeScript entry point, run the way package.json's scripts run them. */
  entry: string;
  env: Record<string, string | undefined>;
  /** Resolves once the process can do its work (its health answers); default: at once. */
  ready?: (child: NodeChild) => Promise<void>;
  output: (name: string, line: string) => void;
}

export function createNodeChild(options: NodeChildOptions): NodeChild {
  let current: ChildProcess | undefined;
  let exited: Promise<void> = Promise.resolve();

  const child: NodeChild = {
    name: options.name,
    pid: () => current?.pid,
    isRunning: () => current !== undefined,
    async start() {
      if (current) return;
      // A process group of its own: a Ctrl-C reaches only the parent, which stops the
      // children in order. The IPC channel stops a child whose parent is killed
      // (server/lib/graceful-shutdown.ts).
      const proc = spawn(process.execPath, ['--import', 'tsx', options.entry], {
        cwd: process.cwd(),
        env: options.env,
        detached: true,
        stdio: ['ignore', 'pipe', 'pipe', 'ipc'],
      });
      current = proc;
      for (const stream of [proc.stdout!, proc.stderr!]) {
        readline.createInterface({ input: stream }).on('line', (line) => options.output(options.name, line));
      }
      exited = new Promise<void>((resolve) => {
        proc.once('exit', (code, signal) => {
          if (current === proc) current = undefined;
          options.output(options.name, `exited (${signal ?? `code ${code}`})`);
          resolve();
        });
      });
      const gone = exited.then(() => Promise.reject(new Error(`${options.name} exited while starting`)));
      gone.catch(() => undefined);
      await Promise.race([options.ready?.(child) ?? Promise.resolve(), gone]);
    },
    async kill(signal) {
      if (!current) return;
      current.kill(signal);
      await exited;
    },
    async stop(graceMs = 25_000) {
      if (!current) return;
      const proc = current;
      proc.kill('SIGTERM');
      const timer = setTimeout(() => proc.kill('SIGKILL'), graceMs);
      await exited;
      clearTimeout(timer);
    },
  };
  return child;
}
