import fs from 'node:fs';
import path from 'node:path';

const root = path.resolve(import.meta.dirname, '../..');
const sources = ['src', 'shared', 'public', 'index.html', 'vite.config.ts', 'tailwind.config.ts', 'package.json'];

function newestMtime(target: string): number {
  if (!fs.existsSync(target)) return 0;
  const stat = fs.statSync(target);
  if (!stat.isDirectory()) return stat.mtimeMs;
  return fs.readdirSync(target).reduce((newest, entry) => Math.max(newest, newestMtime(path.join(target, entry))), stat.mtimeMs);
}

export function clientBuildIsStale(): boolean {
  const built = path.join(root, 'dist', 'index.html');
  if (!fs.existsSync(built)) return true;
  const builtAt = fs.statSync(built).mtimeMs;
  return sources.some((s) => newestMtime(path.join(root, s)) > builtAt);
}

// Builds the client with Vite when the build is missing or older than its sources.
export async function buildClientIfStale(log: (line: string) => void = console.log): Promise<boolean> {
  if (!clientBuildIsStale()) return false;
  log('Building the client…');
  const { build } = await import('vite');
  await build({ root, logLevel: 'warn', configFile: path.join(root, 'vite.config.ts') });
  return true;
}
