import { type ChildProcess, spawn } from 'node:child_process';
import { waitFor } from '../../support/wait-for';

export interface CrosswattProcess {
  child: ChildProcess;
  output: () => string;
  exited: Promise<number | null>;
  /** Sends a signal to the whole process group, as a terminal's Ctrl-C does. */
  signalGroup(signal: NodeJS.Signals): void;
  /** Sends a signal to the process alone (kill -9 of the app). */
  signal(signal: NodeJS.Signals): void;
  waitForOutput(pattern: RegExp, timeoutMs?: number): Promise<void>;
}

/** Starts a Node entry point the way package.json's scripts do, in a process group of its own. */
export function spawnCrosswatt(entry: string, env: Record<string, string>): CrosswattProcess {
  // The test file's own database is not theirs: they start their own PostgreSQL.
  const { DATABASE_URL: _testDatabase, ...inherited } = process.env;
  const child = spawn(process.execPath, ['--import', 'tsx', entry], {
    cwd: process.cwd(),
    env: { ...inherited, LOG_LEVEL: 'warn', NODE_ENV: 'development', ...env },
    detached: true,
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let text = '';
  child.stdout!.on('data', (chunk) => (text += chunk));
  child.stderr!.on('data', (chunk) => (text += chunk));
  const exited = new Promise<number | null>((resolve) => child.once('exit', (code) => resolve(code)));
  let done = false;
  void exited.then(() => (done = true));
  return {
    child,
    output: () => text,
    exited,
    signalGroup: (signal) => process.kill(-child.pid!, signal),
    signal: (signal) => process.kill(child.pid!, signal),
    async waitForOutput(pattern, timeoutMs = 120_000) {
      try {
        await waitFor(() => pattern.test(text) || (done && Promise.reject(new Error(`it exited before printing ${pattern}`))), {
          timeoutMs,
          what: `${pattern} in the output`,
        });
      } catch (err) {
        throw new Error(`${(err as Error).message}; output so far:\n${text}`);
      }
    },
  };
}
