/**
 * Provisions the project's own PostgreSQL: Debian's server binaries, a project-local cluster that listens
 * only on 127.0.0.1 (no Unix socket), and databases inside it. Used by `npm start`, `npm test` and the
 * test global setup. When DATABASE_URL is set, nothing is installed or started: that server is used as is.
 */
import { execFileSync, spawnSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { existsSync, mkdirSync, readdirSync, appendFileSync, writeFileSync, readFileSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import pg from 'pg';

export const repoRoot = resolve(dirname(fileURLToPath(import.meta.url)), '..', '..');

export interface PostgresHandle {
  /** A connection URL for the named database on this server. */
  urlFor(database: string): string;
  /** True when this process started the server (and so should stop it). */
  startedHere: boolean;
  stop(): Promise<void>;
}

type Log = (line: string) => void;

const isRoot = typeof process.getuid === 'function' && process.getuid() === 0;

function run(cmd: string, args: string[], opts: { asPostgres?: boolean; allowFail?: boolean } = {}) {
  const [file, argv] = opts.asPostgres && isRoot ? ['runuser', ['-u', 'postgres', '--', cmd, ...args]] : [cmd, args];
  const result = spawnSync(file, argv, { encoding: 'utf8', stdio: ['ignore', 'pipe', 'pipe'] });
  if (result.status !== 0 && !opts.allowFail) {
    throw new Error(`${cmd} ${args.join(' ')} failed (${result.status}): ${result.stderr || result.stdout}`);
  }
  return result;
}

function findBinDir(): string | undefined {
  const base = '/usr/lib/postgresql';
  if (!existsSync(base)) return undefined;
  const majors = readdirSync(base)
    .filter((d) => existsSync(join(base, d, 'bin', 'initdb')))
    .sort((a, b) => Number(b) - Number(a));
  return majors[0] ? join(base, majors[0], 'bin') : undefined;
}

function installPostgres(log: Log) {
  log('PostgreSQL is not installed: installing Debian\'s postgresql package (needs root or passwordless sudo)…');
  const sudo = isRoot ? [] : ['sudo', '-n'];
  const sh = (script: string) => {
    const [file, ...rest] = [...sudo, 'sh', '-c', script];
    execFileSync(file!, rest, { stdio: 'inherit', env: { ...process.env, DEBIAN_FRONTEND: 'noninteractive' } });
  };
  // Install the cluster tooling first and tell it not to create and start a system-wide "main"
  // cluster: we run our own, and a stray server on 5432 is not ours to leave behind.
  sh('apt-get update -qq && apt-get install -y -qq postgresql-common >/dev/null');
  sh("mkdir -p /etc/postgresql-common && (grep -q '^create_main_cluster' /etc/postgresql-common/createcluster.conf 2>/dev/null && sed -i 's/^create_main_cluster.*/create_main_cluster = false/' /etc/postgresql-common/createcluster.conf || echo 'create_main_cluster = false' >> /etc/postgresql-common/createcluster.conf)");
  sh('apt-get install -y -qq postgresql >/dev/null');
}

/**
 * The data folder: `.data/<cluster>` in the checkout (`.data/pg` for the project's cluster), unless the
 * postgres user cannot reach it there.
 */
function chooseDataDir(cluster = 'pg'): string {
  const preferred = join(repoRoot, '.data', cluster);
  mkdirSync(preferred, { recursive: true });
  if (!isRoot) return preferred;
  run('chown', ['postgres:postgres', preferred]);
  if (run('test', ['-w', preferred], { asPostgres: true, allowFail: true }).status === 0) return preferred;
  // Every parent must be traversable by postgres; a checkout under a private home is not.
  const fallback = join('/var/tmp', `ohmstead-${cluster}-${createHash('sha1').update(repoRoot).digest('hex').slice(0, 10)}`);
  mkdirSync(fallback, { recursive: true });
  run('chown', ['postgres:postgres', fallback]);
  return fallback;
}

async function sleep(ms: number) {
  await new Promise((r) => setTimeout(r, ms));
}

/**
 * `cluster` names a separate cluster of its own (its own data folder, on its own port), for work that must
 * not disturb the project's shared one, such as restarting it (scripts/soak.ts). Default: the project's.
 */
export async function ensurePostgres(options: { port: number; log?: Log; cluster?: string }): Promise<PostgresHandle> {
  const log = options.log ?? (() => {});
  const external = process.env.DATABASE_URL;
  if (external) {
    log('Using the PostgreSQL server named by DATABASE_URL.');
    return {
      urlFor: (database) => {
        const url = new URL(external);
        url.pathname = `/${database}`;
        return url.toString();
      },
      startedHere: false,
      stop: async () => {},
    };
  }

  const port = options.port;
  const urlFor = (database: string) => `postgres://postgres@127.0.0.1:${port}/${database}`;
  let bin = findBinDir();
  if (!bin) {
    installPostgres(log);
    bin = findBinDir();
    if (!bin) throw new Error('PostgreSQL installation did not provide initdb under /usr/lib/postgresql/*/bin');
  }
  const ready = () => run(join(bin!, 'pg_isready'), ['-q', '-h', '127.0.0.1', '-p', String(port)], { allowFail: true }).status === 0;

  const dataDir = chooseDataDir(options.cluster);
  if (!existsSync(join(dataDir, 'PG_VERSION'))) {
    log(`Creating a local PostgreSQL cluster in ${dataDir}…`);
    run(join(bin, 'initdb'), ['-D', dataDir, '-U', 'postgres', '--auth=trust', '-E', 'UTF8', '--no-locale'], { asPostgres: true });
    // Loopback only, no Unix socket (avoids socket-path permission and length problems).
    appendFileSync(
      join(dataDir, 'postgresql.conf'),
      "\n# Ohmstead: local development and tests only\nlisten_addresses = '127.0.0.1'\nunix_socket_directories = ''\nfsync = on\nmax_connections = 200\n",
    );
  }

  if (ready()) {
    log(`PostgreSQL already running on 127.0.0.1:${port}.`);
    return { urlFor, startedHere: false, stop: async () => {} };
  }

  // After a kill -9 the old postmaster can look alive for a moment: wait until it is really gone.
  for (let i = 0; i < 50; i += 1) {
    if (run(join(bin, 'pg_ctl'), ['status', '-D', dataDir], { asPostgres: true, allowFail: true }).status !== 0) break;
    if (ready()) return { urlFor, startedHere: false, stop: async () => {} };
    await sleep(100);
  }

  log(`Starting PostgreSQL on 127.0.0.1:${port}…`);
  const logFile = join(dirname(dataDir), `postgres-${port}.log`);
  if (isRoot) {
    writeFileSync(logFile, '', { flag: 'a' });
    run('chown', ['postgres:postgres', logFile]);
  }
  const started = run(join(bin, 'pg_ctl'), ['start', '-D', dataDir, '-l', logFile, '-w', '-t', '60', '-o', `-p ${port}`], {
    asPostgres: true,
    allowFail: true,
  });
  if (started.status !== 0) {
    // Another process may have started it at the same moment.
    for (let i = 0; i < 50 && !ready(); i += 1) await sleep(100);
    if (!ready()) {
      const tail = existsSync(logFile) ? readFileSync(logFile, 'utf8').split('\n').slice(-15).join('\n') : '';
      throw new Error(`PostgreSQL did not start on port ${port}:\n${started.stderr}\n${tail}`);
    }
    return { urlFor, startedHere: false, stop: async () => {} };
  }
  return {
    urlFor,
    startedHere: true,
    stop: async () => {
      run(join(bin!, 'pg_ctl'), ['stop', '-D', dataDir, '-m', 'fast', '-w'], { asPostgres: true, allowFail: true });
    },
  };
}

/** Creates the database when missing. */
export async function ensureDatabase(handle: PostgresHandle, database: string): Promise<string> {
  const admin = new pg.Client({ connectionString: handle.urlFor('postgres') });
  await admin.connect();
  try {
    const { rowCount } = await admin.query('SELECT 1 FROM pg_database WHERE datname = $1', [database]);
    if (!rowCount) await admin.query(`CREATE DATABASE "${database.replaceAll('"', '""')}"`);
  } finally {
    await admin.end();
  }
  return handle.urlFor(database);
}

export async function dropDatabase(handle: PostgresHandle, database: string): Promise<void> {
  const admin = new pg.Client({ connectionString: handle.urlFor('postgres') });
  await admin.connect();
  try {
    await admin.query(`DROP DATABASE IF EXISTS "${database.replaceAll('"', '""')}" WITH (FORCE)`);
  } finally {
    await admin.end();
  }
}

/**
 * Restarts a cluster of this checkout (`pg_ctl restart -m fast`: open connections are cut, transactions in
 * progress roll back, committed ones stay) and waits until it accepts connections again. Only for a cluster
 * this project runs (never a server named by DATABASE_URL); meant for fault tests on a cluster of their own.
 */
export async function restartPostgres(options: { port: number; cluster?: string; log?: Log }): Promise<{ downMs: number }> {
  if (process.env.DATABASE_URL) throw new Error('restartPostgres: DATABASE_URL names a server this project does not run; it is not restarted.');
  const bin = findBinDir();
  if (!bin) throw new Error('restartPostgres: PostgreSQL is not installed');
  const dataDir = chooseDataDir(options.cluster);
  const started = Date.now();
  options.log?.(`Restarting PostgreSQL on 127.0.0.1:${options.port} (${dataDir})…`);
  // With its log file, as at start: otherwise the new server would hold pg_ctl's output pipe open.
  const logFile = join(dirname(dataDir), `postgres-${options.port}.log`);
  run(join(bin, 'pg_ctl'), ['restart', '-D', dataDir, '-l', logFile, '-m', 'fast', '-w', '-t', '60', '-o', `-p ${options.port}`], { asPostgres: true });
  const ready = () => run(join(bin, 'pg_isready'), ['-q', '-h', '127.0.0.1', '-p', String(options.port)], { allowFail: true }).status === 0;
  for (let i = 0; i < 300 && !ready(); i += 1) await sleep(100);
  if (!ready()) throw new Error(`PostgreSQL did not come back on port ${options.port}`);
  return { downMs: Date.now() - started };
}

/** Stops a cluster of this checkout if it runs (for a cluster of its own, such as the soak's). */
export function stopPostgres(options: { cluster?: string }): void {
  if (process.env.DATABASE_URL) return;
  const bin = findBinDir();
  if (!bin) return;
  run(join(bin, 'pg_ctl'), ['stop', '-D', chooseDataDir(options.cluster), '-m', 'fast', '-w'], { asPostgres: true, allowFail: true });
}
