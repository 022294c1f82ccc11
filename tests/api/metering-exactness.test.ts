/**
 * Exact counting across instances: two real server processes on one database, concurrent metered calls,
 * and one process killed with SIGKILL midway. Every 2xx received must be counted; calls counted without
 * their 2xx reaching the client can only be those in flight on the killed process (at most one per open
 * connection to it). Without a kill, the two numbers are equal.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import http from 'node:http';
import { createServer } from 'node:net';
import { join } from 'node:path';
import { sql } from 'drizzle-orm';
import { afterAll, describe, expect, it } from 'vitest';
import { createTestApp } from '../setup/app.ts';
import { createOrganization, createTestKey } from '../setup/fixtures.ts';

const { app, db, close } = createTestApp();
afterAll(close);
const repo = join(import.meta.dirname, '..', '..');

async function freePort(): Promise<number> {
  return new Promise((resolve) => {
    const s = createServer().listen(0, '127.0.0.1', () => {
      const { port } = s.address() as { port: number };
      s.close(() => resolve(port));
    });
  });
}

async function startInstance(): Promise<{ proc: ChildProcess; port: number }> {
  const port = await freePort();
  const proc = spawn(process.execPath, ['--import', 'tsx', join(repo, 'server', 'index.ts')], {
    env: { ...process.env, PORT: String(port), LOG_LEVEL: 'silent', CONSOLE_DIST_DIR: '.data/no-console' },
    stdio: 'ignore',
  });
  for (let i = 0; i < 200; i += 1) {
    const up = await fetch(`http://127.0.0.1:${port}/healthz`).then((r) => r.ok).catch(() => false);
    if (up) return { proc, port };
    await new Promise((r) => setTimeout(r, 50));
  }
  throw new Error('instance did not start');
}

const body = JSON.stringify({ pack: { chemistry: 'lfp', seriesCells: 16, capacityAh: 100 } });

function call(agent: http.Agent, port: number, key: string): Promise<number> {
  return new Promise((resolve) => {
    const req = http.request(
      { host: '127.0.0.1', port, path: '/v1/packs/energy', method: 'POST', agent, headers: { Authorization: `Bearer ${key}`, 'Content-Type': 'application/json', 'Content-Length': Buffer.byteLength(body) } },
      (res) => {
        res.resume();
        res.on('end', () => resolve(res.statusCode ?? 0));
        res.on('error', () => resolve(0));
      },
    );
    req.on('error', () => resolve(0));
    req.end(body);
  });
}

async function countedFor(organizationId: string): Promise<number> {
  const { rows } = await db.execute<{ n: number }>(sql`select coalesce(sum(calls), 0)::int as n from usage_counters where organization_id = ${organizationId}`);
  return rows[0]!.n;
}

async function scenario(options: { kill: boolean }) {
  const org = await createOrganization(db, { customMonthlyQuotaCalls: 10_000_000, customRatePerMinuteCalls: 1_000_000 });
  const { secret } = await createTestKey(db, app.platform!.hashSecret, org.id);
  const a = await startInstance();
  const b = await startInstance();
  const connectionsPerInstance = 16;
  const agentA = new http.Agent({ keepAlive: true, maxSockets: connectionsPerInstance });
  const agentB = new http.Agent({ keepAlive: true, maxSockets: connectionsPerInstance });
  let ok = 0;
  let failed = 0;
  let bKilled = false;
  let sentToB = 0;
  let answeredByB = 0;
  const total = 1600;
  let next = 0;
  const worker = async (toB: boolean) => {
    while (next < total) {
      next += 1;
      if (toB && bKilled) return;
      const status = await call(toB ? agentB : agentA, toB ? b.port : a.port, secret);
      if (toB) sentToB += 1;
      if (status === 200) {
        ok += 1;
        if (toB) answeredByB += 1;
      } else failed += 1;
      if (options.kill && !bKilled && ok >= total / 3) {
        bKilled = true;
        b.proc.kill('SIGKILL');
      }
    }
  };
  await Promise.all([
    ...Array.from({ length: connectionsPerInstance }, () => worker(false)),
    ...Array.from({ length: connectionsPerInstance }, () => worker(true)),
  ]);
  agentA.destroy();
  agentB.destroy();
  a.proc.kill('SIGTERM');
  if (!bKilled) b.proc.kill('SIGTERM');
  await Promise.all([a, b].map(({ proc }) => (proc.exitCode === null && proc.signalCode === null ? new Promise((r) => proc.once('exit', r)) : undefined)));
  return { ok, failed, counted: await countedFor(org.id), connectionsPerInstance, sentToB, answeredByB };
}

describe('exact metering across two instances', () => {
  it('when two instances serve concurrent calls without faults, then every 2xx is counted and nothing else', async () => {
    const r = await scenario({ kill: false });
    if (process.env.OHMSTEAD_REPORT) console.info("exactness without kill", r);
    expect(r.failed).toBe(0);
    expect(r.ok).toBeGreaterThan(1000);
    expect(r.counted).toBe(r.ok);
  }, 120_000);

  it('when one instance is killed with SIGKILL midway, then counted − received is at most the calls in flight on it', async () => {
    const r = await scenario({ kill: true });
    if (process.env.OHMSTEAD_REPORT) console.info("exactness with kill", r);
    expect(r.failed).toBeGreaterThan(0); // the kill really hit calls in flight
    expect(r.counted).toBeGreaterThanOrEqual(r.ok); // no 2xx without a durable count
    expect(r.counted - r.ok).toBeLessThanOrEqual(r.connectionsPerInstance); // at most one per open connection
  }, 120_000);
});
