// One way out for every Crosswatt process (npm start, the web server, the worker):
// steps run once, newest first (server, then worker and queue, then the database),
// each within its own bound, whatever signals arrive and however many.
//
// Handlers stay installed (`process.on`, never `once`): Ctrl-C reaches every
// process of the group and launchers relay it again, so a process sees the same
// signal two or three times; with a one-shot handler the second one would kill
// it before PostgreSQL is stopped.

export interface ShutdownStep {
  name: string;
  run: () => unknown;
  /** How long this step may take before the next one runs anyway. */
  timeoutMs?: number;
}

export interface Shutdown {
  /** Adds a step; steps run in the reverse order of adding. */
  add(name: string, run: () => unknown, timeoutMs?: number): void;
  /** Runs every step once and exits with `code`; later calls return the same promise. */
  stop(code?: number): Promise<void>;
  /** Installs handlers for SIGINT, SIGTERM and SIGHUP (and the parent's IPC channel closing) that call stop(0). */
  handleSignals(signals?: NodeJS.Signals[]): void;
}

export const SHUTDOWN_SIGNALS: NodeJS.Signals[] = ['SIGINT', 'SIGTERM', 'SIGHUP'];
const DEFAULT_STEP_TIMEOUT_MS = 15_000;

export function createShutdown({
  log = (line: string) => console.log(line),
  exit = (code: number) => process.exit(code),
}: {
  log?: (line: string) => void;
  exit?: (code: number) => void;
} = {}): Shutdown {
  const steps: ShutdownStep[] = [];
  let stopping: Promise<void> | undefined;

  async function runStep(step: ShutdownStep) {
    const timeoutMs = step.timeoutMs ?? DEFAULT_STEP_TIMEOUT_MS;
    let timer: NodeJS.Timeout | undefined;
    const timedOut = new Promise<'timeout'>((resolve) => {
      timer = setTimeout(() => resolve('timeout'), timeoutMs);
    });
    try {
      const outcome = await Promise.race([Promise.resolve().then(step.run), timedOut]);
      if (outcome === 'timeout') log(`${step.name} did not stop within ${timeoutMs / 1000} s; going on.`);
    } catch (err) {
      log(`Stopping ${step.name} failed: ${err instanceof Error ? err.message : String(err)}`);
    } finally {
      clearTimeout(timer);
    }
  }

  const shutdown: Shutdown = {
    add(name, run, timeoutMs) {
      steps.push({ name, run, timeoutMs });
    },
    stop(code = 0) {
      stopping ??= (async () => {
        for (const step of [...steps].reverse()) await runStep(step);
        exit(code);
      })();
      return stopping;
    },
    handleSignals(signals = SHUTDOWN_SIGNALS) {
      let received = 0;
      for (const signal of signals) {
        process.on(signal, () => {
          received++;
          if (received === 1) log(`Stopping (${signal})…`);
          else if (received === 2) log(`Still stopping (${signal} again): the database stops last.`);
          void shutdown.stop(0);
        });
      }
      // A child started with an IPC channel (npm run start:cluster's web processes and
      // workers) stops when the channel closes: its parent is gone, even after a kill -9.
      if (process.channel) {
        process.channel.unref();
        process.once('disconnect', () => {
          log('The process that started this one is gone: stopping.');
          void shutdown.stop(0);
        });
      }
    },
  };
  return shutdown;
}
