import { describe, expect, it } from 'vitest';
import { ensureChromium } from '../../scripts/lib/chromium';
import { installCommand, MissingPackageError } from '../../scripts/lib/debian-package';

// The machine running the tests has Chromium; these drive the same decision with an
// injected check instead of uninstalling it.
const missingPath = '/nonexistent/crosswatt-test/chromium';

describe('finding Chromium for the browser tests', () => {
  it('when Chromium exists, then its path is returned and nothing is installed', () => {
    const commands: string[] = [];

    const found = ensureChromium({
      executablePath: missingPath,
      isExecutable: () => true,
      isRoot: () => true,
      runShell: (c) => commands.push(c),
    });

    expect(found).toBe(missingPath);
    expect(commands).toEqual([]);
  });

  it('when Chromium is missing and we are not root, then the error names the exact command and nothing is run', () => {
    const commands: string[] = [];

    const attempt = () => ensureChromium({ executablePath: missingPath, isRoot: () => false, runShell: (c) => commands.push(c) });

    expect(attempt).toThrow(MissingPackageError);
    expect(attempt).toThrow(`sudo sh -c '${installCommand('chromium')}'`);
    expect(commands).toEqual([]);
  });

  it("when Chromium is missing and we are root, then Debian's chromium package is installed and its path returned", () => {
    const commands: string[] = [];
    let installed = false;

    const found = ensureChromium({
      executablePath: missingPath,
      isExecutable: () => installed,
      isRoot: () => true,
      runShell: (c) => {
        commands.push(c);
        installed = true;
      },
      log: () => {},
    });

    expect(found).toBe(missingPath);
    expect(commands).toEqual(['apt-get update && apt-get install -y --no-install-recommends chromium']);
  });

  it('when the installation fails, then the error says so and names the command', () => {
    const attempt = () =>
      ensureChromium({
        executablePath: missingPath,
        isRoot: () => true,
        runShell: () => {
          throw new Error('E: Unable to locate package chromium');
        },
        log: () => {},
      });

    expect(attempt).toThrow(/Installing Chromium .* failed \(E: Unable to locate package chromium\)\. Run: apt-get update/);
  });

  it('when the package installs but the program is still missing, then the error says the program was not found', () => {
    const attempt = () => ensureChromium({ executablePath: missingPath, isRoot: () => true, runShell: () => {}, log: () => {} });

    expect(attempt).toThrow(/chromium was installed but Chromium .* was not found/);
  });
});
