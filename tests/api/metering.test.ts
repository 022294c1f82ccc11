/**
 * Metering seen from a client: RateLimit headers on every metered answer, 429 problems with Retry-After
 * for the per-minute rate, Idempotency-Key replays that are not counted again, and 4xx answers that are
 * not counted at all.
 */
import request from 'supertest';
import { sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp } from '../setup/app.ts';
import { createOrganization, createTestKey } from '../setup/fixtures.ts';

const { app, db, close } = createTestApp();
afterAll(close);
const body = { pack: { chemistry: 'lfp', seriesCells: 16, capacityAh: 100 } };

async function keyFor(limits: { monthly: number; perMinute: number }) {
  const org = await createOrganization(db, { customMonthlyQuotaCalls: limits.monthly, customRatePerMinuteCalls: limits.perMinute });
  const { secret } = await createTestKey(db, app.platform!.hashSecret, org.id);
  return { org, secret };
}
const energy = (key: string, headers: Record<string, string> = {}, payload: object = body) =>
  request(app).post('/v1/packs/energy').set('Authorization', `Bearer ${key}`).set(headers).send(payload);
async function counted(organizationId: string) {
  const { rows } = await db.execute<{ n: number }>(sql`select coalesce(sum(calls), 0)::int as n from usage_counters where organization_id = ${organizationId}`);
  return rows[0]!.n;
}

describe('rate-limit headers and the per-minute rate', () => {
  let key: { org: { id: string }; secret: string };
  beforeAll(async () => {
    // Keep these calls inside one fixed minute window: near a minute's end, wait for the next one.
    const s = new Date().getUTCSeconds();
    if (s >= 50) await new Promise((r) => setTimeout(r, (61 - s) * 1000));
    key = await keyFor({ monthly: 1000, perMinute: 3 });
  }, 20_000);

  it('when a metered call succeeds, then RateLimit-Policy and RateLimit announce both policies (draft-8 form)', async () => {
    const res = await energy(key.secret);
    expect(res.status).toBe(200);
    expect(res.headers['ratelimit-policy']).toMatch(/^"monthly";q=1000;w=\d+, "minute";q=3;w=60$/);
    expect(res.headers.ratelimit).toMatch(/^"monthly";r=999;t=\d+, "minute";r=2;t=\d+$/);
  });

  it('when the per-minute rate is exceeded, then it is a 429 rate-limited problem with Retry-After, and it is not counted', async () => {
    const statuses: number[] = [];
    let last: request.Response | undefined;
    for (let i = 0; i < 4; i += 1) {
      last = await energy(key.secret);
      statuses.push(last.status);
    }
    // The first call of this org was in the previous test: two more succeed, then the rate refuses.
    expect(statuses).toEqual([200, 200, 429, 429]);
    expect(last!.headers['content-type']).toMatch(/problem\+json/);
    expect(last!.body.type).toBe('/problems/rate-limited');
    expect(last!.body['violated-policies']).toEqual(['minute']);
    const retryAfter = Number(last!.headers['retry-after']);
    expect(retryAfter).toBeGreaterThanOrEqual(1);
    expect(retryAfter).toBeLessThanOrEqual(60);
    expect(await counted(key.org.id)).toBe(3);
  });
});

describe('Idempotency-Key', () => {
  it('when a call is retried with the same key and body, then the same answer comes back and it is counted once', async () => {
    const { org, secret } = await keyFor({ monthly: 100, perMinute: 100 });
    const first = await energy(secret, { 'Idempotency-Key': '"order-7781-energy"' });
    const again = await energy(secret, { 'Idempotency-Key': '"order-7781-energy"' });
    expect(first.status).toBe(200);
    expect(again.status).toBe(200);
    expect(again.body).toEqual(first.body);
    expect(again.headers['idempotent-replayed']).toBe('true');
    expect(await counted(org.id)).toBe(1);
  });

  it('when the same key comes with another body, then it is a 422 and nothing is counted', async () => {
    const { org, secret } = await keyFor({ monthly: 100, perMinute: 100 });
    expect((await energy(secret, { 'Idempotency-Key': 'k-1' })).status).toBe(200);
    const other = await energy(secret, { 'Idempotency-Key': 'k-1' }, { pack: { ...body.pack, capacityAh: 200 } });
    expect(other.status).toBe(422);
    expect(other.body.type).toBe('/problems/idempotency-key-reused');
    expect(await counted(org.id)).toBe(1);
  });

  it('when a CSV log is retried under the same key with other rows or another rating, then it is refused, not replayed', async () => {
    const { org, secret } = await keyFor({ monthly: 100, perMinute: 100 });
    const csv = (amps: number) => `tS,currentA\n0,${amps}\n3600,${amps}\n`;
    const post = (query: string, text: string) =>
      request(app).post(`/v1/capacity-tests/evaluate?${query}`).set('Authorization', `Bearer ${secret}`).set('Idempotency-Key', 'log-42').set('Content-Type', 'text/csv').send(text);
    const first = await post('ratedAh=20', csv(20));
    expect(first.status).toBe(200);
    expect(first.body.data.measuredAh).toBeCloseTo(20, 10);
    expect((await post('ratedAh=20', csv(18))).status).toBe(422);
    expect((await post('ratedAh=25', csv(20))).status).toBe(422);
    const replay = await post('ratedAh=20', csv(20));
    expect(replay.headers['idempotent-replayed']).toBe('true');
    expect(await counted(org.id)).toBe(1);
  });

  it('when the key is malformed, then it is a 400 naming the header', async () => {
    const { secret } = await keyFor({ monthly: 100, perMinute: 100 });
    const res = await energy(secret, { 'Idempotency-Key': 'has spaces in it' });
    expect(res.status).toBe(400);
    expect(res.body.errors[0].header).toBe('Idempotency-Key');
  });
});

describe('what is not counted', () => {
  it('when a call fails validation, then it is a 4xx and the organization is not charged for it', async () => {
    const { org, secret } = await keyFor({ monthly: 100, perMinute: 100 });
    const res = await energy(secret, {}, { pack: { chemistry: 'lfp', seriesCells: 0, capacityAh: 100 } });
    expect(res.status).toBe(422);
    expect(await counted(org.id)).toBe(0);
  });

  it('when reference data is read, then it needs a key but is not metered', async () => {
    const { org, secret } = await keyFor({ monthly: 100, perMinute: 100 });
    expect((await request(app).get('/v1/reference/chemistries')).status).toBe(401);
    const res = await request(app).get('/v1/reference/chemistries').set('Authorization', `Bearer ${secret}`);
    expect(res.status).toBe(200);
    // Not metered: no monthly or per-minute calculation policy; only the key's unmetered-read limit (abuse guard).
    expect(res.headers.ratelimit).toMatch(/^"key-reads";r=\d+;t=\d+$/);
    expect(await counted(org.id)).toBe(0);
  });
});
