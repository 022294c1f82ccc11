/** Debian's Chromium for the browser tests: installed with apt when missing (never a downloaded browser). */
import { execFileSync } from 'node:child_process';
import { existsSync } from 'node:fs';

export const CHROMIUM_PATH = '/usr/bin/chromium';

export function ensureChromium(log: (line: string) => void = console.log): string {
  if (existsSync(CHROMIUM_PATH)) return CHROMIUM_PATH;
  log("Chromium is not installed: installing Debian's chromium package for the browser tests…");
  const isRoot = typeof process.getuid === 'function' && process.getuid() === 0;
  const prefix = isRoot ? [] : ['sudo', '-n'];
  const [file, ...args] = [...prefix, 'sh', '-c', 'apt-get update -qq && apt-get install -y -qq chromium >/dev/null'];
  execFileSync(file!, args, { stdio: 'inherit', env: { ...process.env, DEBIAN_FRONTEND: 'noninteractive' } });
  if (!existsSync(CHROMIUM_PATH)) throw new Error(`apt installed chromium but ${CHROMIUM_PATH} is missing`);
  return CHROMIUM_PATH;
}

/** Launch flags for a headless Chromium in a container (see DEVELOPERS.md). */
export const chromiumArgs = [
  '--no-sandbox',
  '--disable-gpu',
  '--disable-dev-shm-usage',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
  '--no-first-run',
  '--disable-quic',
];
