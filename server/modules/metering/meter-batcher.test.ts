import { and, eq, sql } from 'drizzle-orm';
import { afterAll, describe, expect, it } from 'vitest';
import { createDb } from '../../db/client.ts';
import { organizationMonthlyUsage, usageCounters } from '../../db/schema/index.ts';
import { createOrganization, createTestKey } from '../../../tests/setup/fixtures.ts';
import { MeterBatcher, type MeterItem } from './meter-batcher.ts';

const { db, pool } = createDb(process.env.DATABASE_URL!, { max: 6 });
const second = createDb(process.env.DATABASE_URL!, { max: 6 });
afterAll(async () => {
  await pool.end();
  await second.pool.end();
});

const SECRET = 'meter-batcher-test-secret-0000000000000';

async function setup(limits: { quota: number; rate: number }) {
  const org = await createOrganization(db);
  const { key } = await createTestKey(db, SECRET, org.id);
  const item = (endpoint = '/v1/packs/energy'): MeterItem => ({
    organizationId: org.id,
    apiKeyId: key.id,
    endpoint,
    monthlyQuotaCalls: limits.quota,
    ratePerMinuteCalls: limits.rate,
  });
  return { org, key, item };
}

async function countedFor(organizationId: string) {
  const [row] = await db
    .select({ total: sql<number>`coalesce(sum(${usageCounters.calls}), 0)::int` })
    .from(usageCounters)
    .where(eq(usageCounters.organizationId, organizationId));
  return row!.total;
}

describe('meter_batch through the batcher', () => {
  it('when 200 calls arrive at once, then they go out in few batches and every one is counted exactly once', async () => {
    const { org, item } = await setup({ quota: 1_000_000, rate: 1_000_000 });
    const batcher = new MeterBatcher(pool);
    const results = await Promise.all(Array.from({ length: 200 }, () => batcher.enqueue(item())));
    expect(results.every((r) => r.outcome === 'ok')).toBe(true);
    expect(await countedFor(org.id)).toBe(200);
    expect(batcher.stats.batches).toBeLessThan(20);
    // Each granted call sees a distinct running total: 1..200.
    expect(new Set(results.map((r) => r.monthCalls)).size).toBe(200);
  });

  it('when more calls arrive than the monthly quota allows, then exactly the quota is granted and counted', async () => {
    const { org, item } = await setup({ quota: 37, rate: 1_000_000 });
    const batcher = new MeterBatcher(pool);
    const results = await Promise.all(Array.from({ length: 100 }, () => batcher.enqueue(item())));
    expect(results.filter((r) => r.outcome === 'ok')).toHaveLength(37);
    expect(results.filter((r) => r.outcome === 'quota')).toHaveLength(63);
    expect(await countedFor(org.id)).toBe(37);
  });

  it('when more calls arrive in one minute than the rate allows, then the rest are refused as rate', async () => {
    const { org, item } = await setup({ quota: 1_000_000, rate: 10 });
    const batcher = new MeterBatcher(pool, { at: () => new Date('2026-12-02T10:15:30Z') });
    const results = await Promise.all(Array.from({ length: 25 }, () => batcher.enqueue(item())));
    expect(results.filter((r) => r.outcome === 'ok')).toHaveLength(10);
    expect(results.filter((r) => r.outcome === 'rate')).toHaveLength(15);
    expect(await countedFor(org.id)).toBe(10);
  });

  it('when two instances meter the same organization at once, then the totals are exact and the quota still holds', async () => {
    const { org, item } = await setup({ quota: 150, rate: 1_000_000 });
    const a = new MeterBatcher(pool);
    const b = new MeterBatcher(second.pool);
    const results = await Promise.all(Array.from({ length: 200 }, (_, i) => (i % 2 ? a : b).enqueue(item(i % 3 ? '/v1/runtime' : '/v1/packs/energy'))));
    expect(results.filter((r) => r.outcome === 'ok')).toHaveLength(150);
    expect(await countedFor(org.id)).toBe(150);
  });

  it('when the same Idempotency-Key is metered twice, then one is counted and the other is a duplicate', async () => {
    const { org, item } = await setup({ quota: 100, rate: 100 });
    const batcher = new MeterBatcher(pool);
    const idem = { key: 'retry-1', requestHash: 'h1', status: 200, body: { data: { x: 1 } } };
    const [first, again] = await Promise.all([batcher.enqueue({ ...item(), idempotency: idem }), batcher.enqueue({ ...item(), idempotency: idem })]);
    expect([first!.outcome, again!.outcome].sort()).toEqual(['duplicate', 'ok']);
    expect(await countedFor(org.id)).toBe(1);
  });

  it('when calls straddle midnight at the end of a month (UTC), then each month and day gets its own count', async () => {
    const { org, item } = await setup({ quota: 2, rate: 100 });
    const at = { value: new Date('2026-12-31T23:59:59.999Z') };
    const batcher = new MeterBatcher(pool, { at: () => at.value });
    expect((await batcher.enqueue(item())).outcome).toBe('ok');
    expect((await batcher.enqueue(item())).outcome).toBe('ok');
    expect((await batcher.enqueue(item())).outcome).toBe('quota');
    at.value = new Date('2027-01-01T00:00:00.000Z');
    const january = await batcher.enqueue(item());
    expect(january.outcome).toBe('ok');
    expect(january.monthStart.toISOString()).toBe('2027-01-01T00:00:00.000Z');
    const months = await db
      .select({ month: organizationMonthlyUsage.month, calls: organizationMonthlyUsage.calls })
      .from(organizationMonthlyUsage)
      .where(eq(organizationMonthlyUsage.organizationId, org.id))
      .orderBy(organizationMonthlyUsage.month);
    expect(months).toEqual([
      { month: '2026-12-01', calls: 2 },
      { month: '2027-01-01', calls: 1 },
    ]);
    const days = await db
      .select({ day: usageCounters.day, calls: usageCounters.calls })
      .from(usageCounters)
      .where(and(eq(usageCounters.organizationId, org.id)))
      .orderBy(usageCounters.day);
    expect(days).toEqual([
      { day: '2026-12-31', calls: 2 },
      { day: '2027-01-01', calls: 1 },
    ]);
  });

  it('when a leap day is metered, then it is counted on 29 February and in February', async () => {
    const { org, item } = await setup({ quota: 10, rate: 10 });
    const batcher = new MeterBatcher(pool, { at: () => new Date('2028-02-29T12:00:00Z') });
    const result = await batcher.enqueue(item());
    expect(result.monthStart.toISOString()).toBe('2028-02-01T00:00:00.000Z');
    const [row] = await db.select({ day: usageCounters.day }).from(usageCounters).where(eq(usageCounters.organizationId, org.id));
    expect(row!.day).toBe('2028-02-29');
  });

  it('when the database refuses the batch, then every call in it fails and none is answered as counted', async () => {
    const broken = createDb('postgres://postgres@127.0.0.1:1/none', { max: 1 });
    const batcher = new MeterBatcher(broken.pool);
    const { item } = await setup({ quota: 10, rate: 10 });
    await expect(Promise.all([batcher.enqueue(item()), batcher.enqueue(item())])).rejects.toThrow();
    await broken.pool.end();
  });
});
