import { existsSync, readdirSync, readFileSync, renameSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { repoRoot } from './postgres.ts';

const inputs = ['src', 'shared', 'index.html', 'vite.config.ts', 'package-lock.json', 'public'];

function newestMtimeMs(path: string, skip: readonly string[] = []): number {
  if (!existsSync(path)) return 0;
  const stat = statSync(path);
  if (!stat.isDirectory()) return stat.mtimeMs;
  // With folders to skip, only files count: adding or swapping a skipped folder changes its parent's time.
  let newest = skip.length ? 0 : stat.mtimeMs;
  for (const entry of readdirSync(path)) if (!skip.includes(entry)) newest = Math.max(newest, newestMtimeMs(join(path, entry), skip));
  return newest;
}

/** Builds the console with Vite when dist/ is missing or older than its sources. */
export async function buildConsoleIfStale(log: (line: string) => void): Promise<void> {
  await buildWidgetsIfStale(log);
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

// ── The widget bundle (widgets/vite.config.ts), built beside the console ─────────────────────────────────
const widgetInputs = ['widgets', 'shared', 'package-lock.json'];

/**
 * Builds the embeddable widget bundle into widgets/dist/ when it is missing or older than its sources
 * (its own output folders excluded). It builds into a fresh folder and swaps it in, so a server reading the
 * bundle, or a second build running at the same moment, never sees half a build.
 */
export async function buildWidgetsIfStale(log: (line: string) => void): Promise<void> {
  const dist = join(repoRoot, 'widgets', 'dist');
  const newest = String(Math.max(...widgetInputs.map((p) => newestMtimeMs(join(repoRoot, p), ['dist', 'node_modules', ...readdirSync(join(repoRoot, 'widgets')).filter((e) => e.startsWith('.dist-'))]))));
  const stampOf = (dir: string) => join(dir, '.source-mtime');
  if (existsSync(stampOf(dist)) && existsSync(join(dist, 'manifest.json')) && readFileSync(stampOf(dist), 'utf8') === newest) {
    log('The widget bundle is current.');
    return;
  }
  log('Building the widget bundle (vite build -c widgets/vite.config.ts)…');
  const staging = join(repoRoot, 'widgets', `.dist-${process.pid}-${Date.now()}`);
  const { build } = await import('vite');
  try {
    await build({ configFile: join(repoRoot, 'widgets', 'vite.config.ts'), logLevel: 'warn', build: { outDir: staging } });
  } catch (error) {
    rmSync(staging, { recursive: true, force: true });
    throw error;
  }
  writeFileSync(stampOf(staging), newest);
  rmSync(dist, { recursive: true, force: true });
  try {
    renameSync(staging, dist);
  } catch (error) {
    // Another build swapped its copy in first: same sources, same bundle.
    rmSync(staging, { recursive: true, force: true });
    if (!existsSync(join(dist, 'manifest.json'))) throw error;
  }
}
