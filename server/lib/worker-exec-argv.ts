import { createRequire } from 'node:module';
import { pathToFileURL } from 'node:url';

/**
 * Node options for a worker thread whose code is TypeScript: worker threads start
 * plain Node, so they get tsx's loader, as the main process has (under `tsx`,
 * `node --import tsx` or vitest alike).
 */
export function workerExecArgv(): string[] {
  if (process.execArgv.some((arg) => arg.includes('tsx'))) return process.execArgv;
  const loader = createRequire(import.meta.url).resolve('tsx');
  return ['--import', pathToFileURL(loader).href];
}
