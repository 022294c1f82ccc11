/**
 * `npm run soak`: exact metering under load and faults. Two server instances on loopback share one
 * PostgreSQL; a keep-alive load generator sends metered calculations (POST /v1/packs/energy) to both for the
 * whole run; partway, instance A is killed with SIGKILL (and started again a few seconds later), and later
 * the database is restarted once (`pg_ctl restart -m fast`: every connection is cut). At the end every 2xx
 * received is compared with the calls counted in usage_counters (the bill):
 *   - counted ≥ received: no answered call went uncounted;
 *   - counted − received ≤ calls in flight on A at the kill: a call can be counted without its 2xx only
 *     when its answer died with the process (and, in principle, when the database committed a batch but the
 *     restart cut its acknowledgement: the calls in flight at the restart are printed as that bound).
 * The run uses a PostgreSQL cluster of its own (SOAK_PG_PORT, data under .data/pg-soak), so restarting it
 * disturbs nothing else. Not part of `npm test`.
 *
 * Options (environment): SOAK_DURATION_S (180), SOAK_CONNECTIONS per instance (16), SOAK_KILL_AT and
 * SOAK_DB_RESTART_AT as fractions of the run (0.35, 0.65), SOAK_RESTART_KILLED_AFTER_S (5),
 * SOAK_PG_PORT (54339), SOAK_PORT_A / SOAK_PORT_B (3911, 3912).
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { mkdirSync, openSync } from 'node:fs';
import http from 'node:http';
import { join } from 'node:path';
import pg from 'pg';
import { dropDatabase, ensurePostgres, repoRoot, stopPostgres } from './lib/postgres.ts';
import { prepareLoadDatabase } from './lib/load-database.ts';
import { keyHashSecret } from '../server/modules/metering/platform.ts';

const durationS = Number(process.env.SOAK_DURATION_S ?? 180);
const connections = Number(process.env.SOAK_CONNECTIONS ?? 16);
const killAtS = durationS * Number(process.env.SOAK_KILL_AT ?? 0.35);
const dbRestartAtS = durationS * Number(process.env.SOAK_DB_RESTART_AT ?? 0.65);
const restartKilledAfterS = Number(process.env.SOAK_RESTART_KILLED_AFTER_S ?? 5);
const pgPort = Number(process.env.SOAK_PG_PORT ?? 54339);
const ports = { A: Number(process.env.SOAK_PORT_A ?? 3911), B: Number(process.env.SOAK_PORT_B ?? 3912) };
const CLUSTER = 'pg-soak';
const log = (line: string) => console.log(`[soak ${((Date.now() - t0) / 1000).toFixed(1).padStart(6)} s] ${line}`);
let t0 = Date.now();

// --- database: a cluster of our own, a fresh database, the demo organization with high limits and a key
const pgHandle = await ensurePostgres({ port: pgPort, cluster: CLUSTER, log: (l) => console.log(l) });
const dbName = 'ohmstead_soak';
const { databaseUrl, env, serverKey, organizationId } = await prepareLoadDatabase(pgHandle, dbName);
const canRestartDb = !process.env.DATABASE_URL;

// --- instances
type Name = keyof typeof ports;
mkdirSync(join(repoRoot, '.data'), { recursive: true });
const logPath = join(repoRoot, '.data', 'soak-instances.log');
const logFile = openSync(logPath, 'w');
const procs: Partial<Record<Name, ChildProcess>> = {};
async function startInstance(name: Name): Promise<void> {
  const proc = spawn(process.execPath, ['--import', 'tsx', join(repoRoot, 'server', 'index.ts')], {
    env: {
      ...process.env,
      NODE_ENV: 'development',
      DATABASE_URL: databaseUrl,
      PORT: String(ports[name]),
      LOG_LEVEL: 'error',
      OHMSTEAD_KEY_HASH_SECRET: keyHashSecret(env),
      CONSOLE_DIST_DIR: '.data/no-console',
      SHUTDOWN_GRACE_MS: '5000',
    },
    // The instances' own logs (errors only: the faults make some) go to a file, not into the figures.
    stdio: ['ignore', logFile, logFile],
  });
  procs[name] = proc;
  for (let i = 0; i < 200; i += 1) {
    if (proc.exitCode !== null) throw new Error(`instance ${name} exited while starting`);
    if (await fetch(`http://127.0.0.1:${ports[name]}/healthz`).then((r) => r.ok).catch(() => false)) return;
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error(`instance ${name} did not come up on port ${ports[name]}`);
}
const exited = (p: ChildProcess) => (p.exitCode !== null || p.signalCode !== null ? Promise.resolve() : new Promise<void>((r) => p.once('exit', () => r())));
process.once('exit', () => {
  for (const p of Object.values(procs)) p?.kill('SIGKILL');
});

await startInstance('A');
await startInstance('B');

// --- load
const body = JSON.stringify({ pack: { chemistry: 'lfp', seriesCells: 16, capacityAh: 100 }, depthOfDischargePct: 90 });
interface Tally {
  sent: number;
  ok: number;
  inFlight: number;
  connectionErrors: number;
  statuses: Map<number, number>;
}
const tally: Record<Name, Tally> = {
  A: { sent: 0, ok: 0, inFlight: 0, connectionErrors: 0, statuses: new Map() },
  B: { sent: 0, ok: 0, inFlight: 0, connectionErrors: 0, statuses: new Map() },
};
const latenciesMs: number[] = [];
const perSecond = new Map<number, number>();
const agents: Record<Name, http.Agent> = {
  A: new http.Agent({ keepAlive: true, maxSockets: connections }),
  B: new http.Agent({ keepAlive: true, maxSockets: connections }),
};

function call(name: Name): Promise<number> {
  return new Promise((resolve) => {
    const started = performance.now();
    const req = http.request(
      {
        host: '127.0.0.1',
        port: ports[name],
        path: '/v1/packs/energy',
        method: 'POST',
        agent: agents[name],
        headers: { Authorization: `Bearer ${serverKey}`, 'Content-Type': 'application/json', 'Content-Length': Buffer.byteLength(body) },
      },
      (res) => {
        res.resume();
        res.on('end', () => {
          if (res.statusCode === 200) {
            latenciesMs.push(performance.now() - started);
            const second = Math.floor((Date.now() - t0) / 1000);
            perSecond.set(second, (perSecond.get(second) ?? 0) + 1);
          }
          resolve(res.statusCode ?? 0);
        });
        res.on('error', () => resolve(0));
      },
    );
    req.on('error', () => resolve(0));
    req.end(body);
  });
}

let running = true;
async function worker(name: Name) {
  const t = tally[name];
  while (running) {
    t.sent += 1;
    t.inFlight += 1;
    const status = await call(name);
    t.inFlight -= 1;
    if (status === 0) {
      t.connectionErrors += 1;
      // The instance (or its socket) is gone: wait a little before trying again.
      await new Promise((r) => setTimeout(r, 100));
      continue;
    }
    t.statuses.set(status, (t.statuses.get(status) ?? 0) + 1);
    if (status === 200) t.ok += 1;
    else await new Promise((r) => setTimeout(r, 20));
  }
}

function restartDatabase(): Promise<number> {
  // In a child process, so the load goes on while the database is down.
  const code = `import('./scripts/lib/postgres.ts').then((m) => m.restartPostgres({ port: ${pgPort}, cluster: '${CLUSTER}' })).then((r) => console.log(JSON.stringify(r)))`;
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, ['--import', 'tsx', '--input-type=module', '--eval', code], { cwd: repoRoot, stdio: ['ignore', 'pipe', 'inherit'] });
    let out = '';
    child.stdout.on('data', (c: Buffer) => (out += c.toString()));
    child.once('exit', (status) => (status === 0 ? resolve((JSON.parse(out.trim().split('\n').at(-1)!) as { downMs: number }).downMs) : reject(new Error(`restart failed (${status})`))));
  });
}

t0 = Date.now();
log(`load: ${connections} keep-alive connections to each of A (:${ports.A}) and B (:${ports.B}) for ${durationS} s`);
const workers = [...Array.from({ length: connections }, () => worker('A')), ...Array.from({ length: connections }, () => worker('B'))];

const events: { inFlightOnAAtKill?: number; okBeforeKill?: number; inFlightAtDbRestart?: number; dbDownMs?: number; aBackAfterS?: number } = {};
const at = (s: number) => new Promise((r) => setTimeout(r, Math.max(0, t0 + s * 1000 - Date.now())));

const faults = (async () => {
  await at(killAtS);
  events.inFlightOnAAtKill = tally.A.inFlight;
  events.okBeforeKill = tally.A.ok + tally.B.ok;
  procs.A!.kill('SIGKILL');
  log(`SIGKILL instance A with ${events.inFlightOnAAtKill} calls in flight on it`);
  await exited(procs.A!);
  await at(killAtS + restartKilledAfterS);
  const back = Date.now();
  await startInstance('A');
  events.aBackAfterS = (Date.now() - t0) / 1000 - killAtS;
  log(`instance A started again (${((Date.now() - back) / 1000).toFixed(1)} s to come up)`);
  await at(dbRestartAtS);
  if (!canRestartDb) {
    log('DATABASE_URL is set: that server is not this project\'s to restart; the database restart is skipped');
    return;
  }
  events.inFlightAtDbRestart = tally.A.inFlight + tally.B.inFlight;
  log(`restarting PostgreSQL with ${events.inFlightAtDbRestart} calls in flight`);
  events.dbDownMs = await restartDatabase();
  log(`PostgreSQL is back after ${(events.dbDownMs / 1000).toFixed(1)} s`);
})();

await at(durationS);
running = false;
await Promise.all(workers);
await faults;
log('load stopped; stopping the instances gracefully');
for (const name of ['A', 'B'] as const) procs[name]?.kill('SIGTERM');
await Promise.all((['A', 'B'] as const).map((n) => exited(procs[n]!)));
for (const agent of Object.values(agents)) agent.destroy();

// --- the bill against what was received
const client = new pg.Client({ connectionString: databaseUrl });
await client.connect();
const { rows } = await client.query<{ calls: string }>('select coalesce(sum(calls), 0) as calls from usage_counters where organization_id = $1', [organizationId]);
await client.end();
const counted = Number(rows[0]!.calls);
const received = tally.A.ok + tally.B.ok;
const excess = counted - received;
const inFlightAtKill = events.inFlightOnAAtKill ?? 0;
const inFlightAtRestart = events.inFlightAtDbRestart ?? 0;

const sorted = [...latenciesMs].sort((a, b) => a - b);
const pct = (p: number) => sorted[Math.min(sorted.length - 1, Math.floor((p / 100) * sorted.length))]?.toFixed(1) ?? '–';
const statusLine = (t: Tally) => [...t.statuses].sort(([a], [b]) => a - b).map(([s, n]) => `${s}×${n}`).join(' ');
const rates = [...perSecond.values()];
const lowest = Math.min(...[...Array(Math.floor(durationS)).keys()].map((s) => perSecond.get(s) ?? 0));

console.log(`\nSoak: ${durationS} s, ${connections} connections per instance, Node ${process.version}`);
console.log(`  instance A: ${tally.A.sent} sent, ${tally.A.ok} 2xx, ${tally.A.connectionErrors} connection errors, statuses ${statusLine(tally.A)}`);
console.log(`  instance B: ${tally.B.sent} sent, ${tally.B.ok} 2xx, ${tally.B.connectionErrors} connection errors, statuses ${statusLine(tally.B)}`);
console.log(`  throughput: ${(received / durationS).toFixed(0)} 2xx/s on average, ${Math.max(...rates)} in the best second, ${lowest} in the worst; 2xx latency p50 ${pct(50)} ms, p99 ${pct(99)} ms`);
console.log(`  faults: SIGKILL of A at ${killAtS.toFixed(0)} s with ${inFlightAtKill} calls in flight on it (A serving again ${events.aBackAfterS?.toFixed(1) ?? '–'} s later); database restart at ${dbRestartAtS.toFixed(0)} s with ${inFlightAtRestart} in flight, down ${events.dbDownMs ? (events.dbDownMs / 1000).toFixed(1) : '–'} s`);
console.log(`  instance logs: ${logPath}`);
console.log(`  counted in usage_counters: ${counted}; 2xx received: ${received}; counted − received: ${excess}`);
const everyAnswerCounted = counted >= received;
const withinKill = excess <= inFlightAtKill;
const withinBoth = excess <= inFlightAtKill + inFlightAtRestart;
console.log(`  every 2xx counted (counted ≥ received): ${everyAnswerCounted ? 'yes' : 'NO'}`);
console.log(`  counted − received ≤ in flight at the kill (${inFlightAtKill}): ${withinKill ? 'yes' : 'no'}${withinKill ? '' : ` (≤ kill + restart in-flight bound ${inFlightAtKill + inFlightAtRestart}: ${withinBoth ? 'yes' : 'NO'})`}`);

await dropDatabase(pgHandle, dbName);
// The soak's cluster is its own: stopped whoever started it.
stopPostgres({ cluster: CLUSTER });
process.exit(everyAnswerCounted && withinBoth ? 0 : 1);
