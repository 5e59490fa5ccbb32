// Programs Crosswatt needs from Debian's packages (PostgreSQL for `npm start` and
// the tests, Chromium for the browser tests): found, or installed when we run as
// root, or a clear error naming the exact command to run.
import { execFileSync } from 'node:child_process';

export class MissingPackageError extends Error {}

export interface DebianPackageNeed<T> {
  /** The Debian package, as `apt-get install` names it. */
  packageName: string;
  /** What the program is, for messages ("PostgreSQL", "Chromium"). */
  label: string;
  /** Finds the installed program; undefined when it is missing. */
  find: () => T | undefined;
  log?: (line: string) => void;
  /** Injectable for tests: are we root, and how is a shell command run. */
  isRoot?: () => boolean;
  runShell?: (command: string) => void;
}

export const isRootUser = () => process.getuid?.() === 0;

function runShellInherit(command: string) {
  execFileSync('sh', ['-c', command], { stdio: 'inherit', env: { ...process.env, DEBIAN_FRONTEND: 'noninteractive' } });
}

export function installCommand(packageName: string): string {
  return `apt-get update && apt-get install -y --no-install-recommends ${packageName}`;
}

export function ensureDebianPackage<T>(need: DebianPackageNeed<T>): T {
  const { packageName, label, find, log = console.log, isRoot = isRootUser, runShell = runShellInherit } = need;
  const existing = find();
  if (existing !== undefined) return existing;
  const command = installCommand(packageName);
  if (!isRoot()) {
    throw new MissingPackageError(`${label} is not installed. Install it with: sudo sh -c '${command}'`);
  }
  log(`${label} is not installed; installing Debian's ${packageName} package…`);
  try {
    runShell(command);
  } catch (err) {
    throw new MissingPackageError(`Installing ${label} failed (${err instanceof Error ? err.message : String(err)}). Run: ${command}`);
  }
  const installed = find();
  if (installed === undefined) throw new MissingPackageError(`${packageName} was installed but ${label} was not found.`);
  return installed;
}
