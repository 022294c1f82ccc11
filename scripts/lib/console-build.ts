import { existsSync, mkdirSync, readdirSync, readFileSync, renameSync, rmSync, statSync, writeFileSync } from 'node:fs';
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

/**
 * Runs `fn` while holding a lock folder, so concurrent processes (browser test files, a second npm start)
 * build one after the other instead of into the same folder. A lock older than ten minutes is stale.
 */
async function withBuildLock<T>(name: string, fn: () => Promise<T>): Promise<T> {
  const lock = join(repoRoot, '.data', `${name}.build-lock`);
  mkdirSync(join(repoRoot, '.data'), { recursive: true });
  for (;;) {
    try {
      mkdirSync(lock);
      break;
    } catch {
      const age = existsSync(lock) ? Date.now() - statSync(lock).mtimeMs : 0;
      if (age > 10 * 60_000) rmSync(lock, { recursive: true, force: true });
      else await new Promise((r) => setTimeout(r, 250));
    }
  }
  try {
    return await fn();
  } finally {
    rmSync(lock, { recursive: true, force: true });
  }
}

/**
 * Builds the console with Vite when dist/ is missing or older than its sources: into a fresh folder that is
 * then swapped in, under a lock, so a running server or a parallel build never sees half a build.
 */
export async function buildConsoleIfStale(log: (line: string) => void): Promise<void> {
  await withBuildLock('widgets', () => buildWidgetsIfStale(log));
  await withBuildLock('console', async () => {
    const dist = join(repoRoot, 'dist');
    const newest = String(Math.max(...inputs.map((p) => newestMtimeMs(join(repoRoot, p)))));
    if (existsSync(join(dist, '.source-mtime')) && existsSync(join(dist, 'index.html')) && readFileSync(join(dist, '.source-mtime'), 'utf8') === newest) {
      log('The console build is current.');
      return;
    }
    log('Building the console (vite build)…');
    const staging = join(repoRoot, '.data', `console-dist-${process.pid}-${Date.now()}`);
    const { build } = await import('vite');
    try {
      await build({ root: repoRoot, configFile: join(repoRoot, 'vite.config.ts'), logLevel: 'warn', build: { outDir: staging, emptyOutDir: true } });
    } catch (error) {
      rmSync(staging, { recursive: true, force: true });
      throw error;
    }
    writeFileSync(join(staging, '.source-mtime'), newest);
    const old = `${dist}.old-${process.pid}`;
    if (existsSync(dist)) renameSync(dist, old);
    renameSync(staging, dist);
    rmSync(old, { recursive: true, force: true });
  });
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
