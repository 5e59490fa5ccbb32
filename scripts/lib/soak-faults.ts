// The soak's failures, spread over the run: a worker killed with SIGKILL and
// restarted, then a web process, then PostgreSQL stopped and started again, then
// the mail service taken down for a while. Each is logged with its time, and the
// PostgreSQL outage (plus a short grace while connections come back) is the window
// in which a 5xx is "explained".
import type { RunningCluster } from './crosswatt-cluster';

export interface Window {
  from: number;
  to: number;
  why: string;
}

export interface FaultReport {
  /** When PostgreSQL was down: 5xx here are explained. */
  databaseDown: Window[];
  /** When a web process was killed and not yet back: requests to it got no answer. */
  webDown: (Window & { web: string })[];
  events: string[];
}

/** After PostgreSQL answers again, pools still hold dead connections for a moment. */
const RECONNECT_GRACE_MS = 10_000;
const POSTGRES_DOWN_MS = 8_000;

const pause = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

export async function runFaults(
  cluster: RunningCluster,
  options: { startedAt: number; durationMs: number; log: (line: string) => void },
): Promise<FaultReport> {
  const { startedAt, durationMs, log } = options;
  const report: FaultReport = { databaseDown: [], webDown: [], events: [] };
  const note = (line: string) => {
    const stamped = `  ${((Date.now() - startedAt) / 1000).toFixed(0).padStart(4)} s  ${line}`;
    report.events.push(stamped);
    log(stamped);
  };
  const at = (fraction: number) => pause(Math.max(0, startedAt + fraction * durationMs - Date.now()));

  await at(0.12);
  const worker = cluster.workers[0]!;
  note(`kill -9 ${worker.name} (process ${worker.pid()})`);
  await worker.kill('SIGKILL');
  await pause(3_000);
  await worker.start();
  note(`${worker.name} started again (process ${worker.pid()})`);

  await at(0.27);
  const web = cluster.webs[1]!;
  const webFrom = Date.now();
  note(`kill -9 ${web.name} (process ${web.pid()})`);
  await web.kill('SIGKILL');
  await pause(3_000);
  await web.start();
  report.webDown.push({ web: web.url, from: webFrom, to: Date.now() + 1_000, why: `${web.name} killed` });
  note(`${web.name} answers again (process ${web.pid()})`);

  await at(0.42);
  const dbFrom = Date.now();
  note(`PostgreSQL stopped, for ${POSTGRES_DOWN_MS / 1000} s`);
  await cluster.postgres.restart(POSTGRES_DOWN_MS);
  note('PostgreSQL started again');
  report.databaseDown.push({ from: dbFrom, to: Date.now() + RECONNECT_GRACE_MS, why: 'PostgreSQL restart' });

  await at(0.55);
  const smtpDownMs = Math.max(15_000, 0.15 * durationMs);
  note(`the mail service stopped, for ${(smtpDownMs / 1000).toFixed(0)} s`);
  await cluster.fakes.smtp.stop();
  await pause(smtpDownMs);
  await cluster.fakes.smtp.start();
  note('the mail service started again');
  return report;
}

export function within(windows: Window[], at: number): boolean {
  return windows.some((w) => at >= w.from && at <= w.to);
}
