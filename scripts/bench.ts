/**
 * `npm run bench`: throughput and p99 latency of a metered calculation (POST /v1/packs/energy, counted
 * exactly before each answer) against GET /healthz (no I/O) on the same server, at 50 connections, with
 * autocannon in its own process. Three alternating 10 s rounds each; medians and their ratios are printed,
 * and the calls counted in the database are checked against the 2xx answers autocannon received.
 *
 * Options (environment): BENCH_DURATION_S (10), BENCH_ROUNDS (3), BENCH_CONNECTIONS (50), BENCH_PORT (a free port).
 */
import { spawn, spawnSync } from 'node:child_process';
import { createServer } from 'node:net';
import { join } from 'node:path';
import pg from 'pg';
import { dropDatabase, ensurePostgres, repoRoot } from './lib/postgres.ts';
import { prepareLoadDatabase } from './lib/load-database.ts';
import { keyHashSecret } from '../server/modules/metering/platform.ts';

const durationS = Number(process.env.BENCH_DURATION_S ?? 10);
const rounds = Number(process.env.BENCH_ROUNDS ?? 3);
const connections = Number(process.env.BENCH_CONNECTIONS ?? 50);
const port =
  Number(process.env.BENCH_PORT ?? 0) ||
  (await new Promise<number>((resolve) => {
    const probe = createServer().listen(0, '127.0.0.1', () => {
      const { port: free } = probe.address() as { port: number };
      probe.close(() => resolve(free));
    });
  }));
const base = `http://127.0.0.1:${port}`;

const pgHandle = await ensurePostgres({ port: Number(process.env.OHMSTEAD_PG_PORT ?? 54329), log: console.log });
const dbName = 'ohmstead_bench';
const { databaseUrl, env, serverKey } = await prepareLoadDatabase(pgHandle, dbName);

const server = spawn(process.execPath, ['--import', 'tsx', join(repoRoot, 'server', 'index.ts')], {
  env: { ...process.env, DATABASE_URL: databaseUrl, PORT: String(port), LOG_LEVEL: 'warn', OHMSTEAD_KEY_HASH_SECRET: keyHashSecret(env), CONSOLE_DIST_DIR: '.data/no-console' },
  stdio: ['ignore', 'inherit', 'inherit'],
});
let up = false;
for (let i = 0; i < 150 && !up && server.exitCode === null; i += 1) {
  up = await fetch(`${base}/healthz`).then((r) => r.ok).catch(() => false);
  if (!up) await new Promise((r) => setTimeout(r, 100));
}
if (!up || server.exitCode !== null) {
  server.kill('SIGKILL');
  throw new Error('The server did not come up for the benchmark (see its output above).');
}
process.once('exit', () => server.kill('SIGKILL'));

const energyBody = JSON.stringify({ pack: { chemistry: 'lfp', seriesCells: 16, capacityAh: 100 }, depthOfDischargePct: 90, price: { amount: 1450, currency: 'USD' }, cycleLife: 4000 });

interface Run {
  rps: number;
  p99: number;
  ok: number;
  other: number;
}

function autocannon(args: string[], seconds = durationS): Run {
  const result = spawnSync(process.execPath, [join(repoRoot, 'node_modules', 'autocannon', 'autocannon.js'), '--json', '-c', String(connections), '-d', String(seconds), ...args], {
    encoding: 'utf8',
    maxBuffer: 64 * 1024 * 1024,
  });
  if (result.status !== 0 || !result.stdout.trim()) throw new Error(`autocannon failed (${result.status}): ${result.stderr.slice(-2000)}`);
  const json = JSON.parse(result.stdout) as { requests: { average: number }; latency: { p99: number }; '2xx': number; non2xx: number; errors: number };
  return { rps: json.requests.average, p99: json.latency.p99, ok: json['2xx'], other: json.non2xx + json.errors };
}

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)]!;
const health: Run[] = [];
const metered: Run[] = [];
// Warm up both paths (JIT, connection pools, caches) before measuring.
autocannon([`${base}/healthz`], 3);
const warm = autocannon(['-m', 'POST', '-H', `Authorization=Bearer ${serverKey}`, '-H', 'Content-Type=application/json', '-b', energyBody, `${base}/v1/packs/energy`], 3);
let metered2xx = warm.ok;
for (let r = 0; r < rounds; r += 1) {
  health.push(autocannon([`${base}/healthz`]));
  const m = autocannon(['-m', 'POST', '-H', `Authorization=Bearer ${serverKey}`, '-H', 'Content-Type=application/json', '-b', energyBody, `${base}/v1/packs/energy`]);
  metered2xx += m.ok;
  metered.push(m);
  console.log(`round ${r + 1}: healthz ${health[r]!.rps.toFixed(0)} req/s p99 ${health[r]!.p99} ms · metered ${m.rps.toFixed(0)} req/s p99 ${m.p99} ms (${m.other} non-2xx)`);
}

server.kill('SIGTERM');
await new Promise((r) => server.once('exit', r));

const client = new pg.Client({ connectionString: databaseUrl });
await client.connect();
const { rows } = await client.query<{ calls: string }>("select coalesce(sum(calls), 0) as calls from usage_counters where endpoint = '/v1/packs/energy'");
await client.end();
const counted = Number(rows[0]!.calls);

const h = { rps: median(health.map((x) => x.rps)), p99: median(health.map((x) => x.p99)) };
const m = { rps: median(metered.map((x) => x.rps)), p99: median(metered.map((x) => x.p99)) };
console.log(`\n${connections} connections, ${rounds} × ${durationS} s each, medians (Node ${process.version}):`);
console.log(`  GET /healthz            ${h.rps.toFixed(0).padStart(6)} req/s   p99 ${String(h.p99).padStart(4)} ms`);
console.log(`  POST /v1/packs/energy   ${m.rps.toFixed(0).padStart(6)} req/s   p99 ${String(m.p99).padStart(4)} ms   (metered)`);
console.log(`  ratio throughput ${(m.rps / h.rps).toFixed(2)} (target ≥ 0.60)   ratio p99 ${(m.p99 / h.p99).toFixed(2)} (target ≤ 1.50)`);
// autocannon stops each run with requests still in flight: those may be counted without their 2xx being
// read, at most one per connection per run. Nothing received may be uncounted.
const inFlightBound = connections * (rounds + 1);
const exact = counted >= metered2xx && counted - metered2xx <= inFlightBound;
console.log(`  exactness: ${metered2xx} 2xx received, ${counted} counted (${counted - metered2xx} in flight at run ends, bound ${inFlightBound}) → ${exact ? 'exact' : 'MISMATCH'}`);
await dropDatabase(pgHandle, dbName);
if (pgHandle.startedHere) await pgHandle.stop();
process.exit(exact ? 0 : 1);
