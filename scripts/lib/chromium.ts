// Debian's Chromium for the browser tests (driven by playwright-core, which never
// downloads a browser of its own). Installed the way PostgreSQL is when missing.
import fs from 'node:fs';
import { type DebianPackageNeed, ensureDebianPackage } from './debian-package';

export const DEFAULT_CHROMIUM_PATH = '/usr/bin/chromium';

export function chromiumPath(env: Record<string, string | undefined> = process.env): string {
  return env.CHROMIUM_PATH ?? DEFAULT_CHROMIUM_PATH;
}

export interface ChromiumNeed extends Pick<DebianPackageNeed<string>, 'log' | 'isRoot' | 'runShell'> {
  executablePath?: string;
  /** Injectable for tests: does an executable exist at this path. */
  isExecutable?: (file: string) => boolean;
}

function isExecutableFile(file: string): boolean {
  try {
    fs.accessSync(file, fs.constants.X_OK);
    return fs.statSync(file).isFile();
  } catch {
    return false;
  }
}

/** The path of an executable Chromium, installing Debian's package as root when it is missing. */
export function ensureChromium({ executablePath = chromiumPath(), isExecutable = isExecutableFile, ...rest }: ChromiumNeed = {}): string {
  return ensureDebianPackage({
    packageName: 'chromium',
    label: `Chromium (${executablePath}, used by the browser tests)`,
    find: () => (isExecutable(executablePath) ? executablePath : undefined),
    ...rest,
  });
}
