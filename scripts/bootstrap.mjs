// Runs before any dependency exists: Node built-ins only. Installs the locked npm packages when they are
// missing or out of date (a stamp in node_modules records the lockfile they were installed from), then
// lets the caller load TypeScript through tsx.
import { execFileSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { existsSync, readFileSync, writeFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

export const root = join(dirname(fileURLToPath(import.meta.url)), '..');

export function step(n, total, text) {
  console.log(`\x1b[38;5;173m[${n}/${total}]\x1b[0m ${text}`);
}

export function ensurePackages(log = console.log) {
  const lock = join(root, 'package-lock.json');
  const stamp = join(root, 'node_modules', '.ohmstead-lock-sha256');
  const want = createHash('sha256').update(readFileSync(lock)).digest('hex');
  if (existsSync(stamp) && readFileSync(stamp, 'utf8').trim() === want) {
    log('npm packages are installed and match the lockfile.');
    return;
  }
  log('Installing npm packages from the lockfile (npm ci)…');
  const npm = process.platform === 'win32' ? 'npm.cmd' : 'npm';
  execFileSync(npm, ['ci', '--no-audit', '--no-fund', '--loglevel=error'], { cwd: root, stdio: 'inherit' });
  writeFileSync(stamp, `${want}\n`);
}

export async function loadTypeScript() {
  const { register } = await import('tsx/esm/api');
  register();
}
