import { existsSync, readdirSync, readFileSync, statSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { repoRoot } from './postgres.ts';

const inputs = ['src', 'shared', 'index.html', 'vite.config.ts', 'package-lock.json', 'public'];

function newestMtimeMs(path: string): number {
  if (!existsSync(path)) return 0;
  const stat = statSync(path);
  if (!stat.isDirectory()) return stat.mtimeMs;
  let newest = stat.mtimeMs;
  for (const entry of readdirSync(path)) newest = Math.max(newest, newestMtimeMs(join(path, entry)));
  return newest;
}

/** Builds the console with Vite when dist/ is missing or older than its sources. */
export async function buildConsoleIfStale(log: (line: string) => void): Promise<void> {
  const stamp = join(repoRoot, 'dist', '.source-mtime');
  const newest = String(Math.max(...inputs.map((p) => newestMtimeMs(join(repoRoot, p)))));
  if (existsSync(stamp) && existsSync(join(repoRoot, 'dist', 'index.html')) && readFileSync(stamp, 'utf8') === newest) {
    log('The console build is current.');
    return;
  }
  log('Building the console (vite build)…');
  const { build } = await import('vite');
  await build({ root: repoRoot, configFile: join(repoRoot, 'vite.config.ts'), logLevel: 'warn' });
  writeFileSync(stamp, newest);
}
