import { createRequire } from 'node:module';
import { pathToFileURL } from 'node:url';

/**
 * Node options for a worker thread or child process whose code is TypeScript: they
 * start plain Node, so they get tsx's loader, as the main process has (under `tsx`,
 * `node --import tsx` or vitest alike).
 */
export function tsxExecArgv(): string[] {
  if (process.execArgv.some((arg) => arg.includes('tsx'))) return process.execArgv;
  const loader = createRequire(import.meta.url).resolve('tsx');
  return ['--import', pathToFileURL(loader).href];
}
