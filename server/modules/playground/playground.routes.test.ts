/**
 * The playground runs v1 calculations for a signed-in member under a chosen server key of the
 * organization: the same answer as /v1 gives, counted exactly like a /v1 call under the v1 endpoint and
 * that key, logged in the request log, refused for keys that /v1 would refuse (and for embed keys), and
 * held to the organization's quota.
 */
import { and, eq, sql } from 'drizzle-orm';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { capacityTestCsvExample } from '#shared/schemas/capacity-test.ts';
import { CSRF_HEADER, CSRF_HEADER_VALUE } from '#shared/schemas/accounts.ts';
import { createTestKey, setLimits } from '../../../tests/setup/fixtures.ts';
import { apiKeys, usageCounters } from '../../db/schema/index.ts';
import { createOrganizationWith, sessionCookie, startConsoleKit, type ConsoleKit } from '../console/console.test-kit.ts';
import { playgroundCalculations } from './playground.calcs.ts';

let kit: ConsoleKit;
beforeAll(async () => {
  kit = await startConsoleKit();
});
afterAll(() => kit.close());

/** A fresh organization with an owner, a developer and a viewer, a server key, and their sessions. */
async function organization() {
  const { org, members } = await createOrganizationWith(kit.db, 'pg', ['owner', 'developer', 'viewer']);
  const key = await createTestKey(kit.db, kit.app.platform!.hashSecret, org.id, { name: 'Playground key' });
  const cookie = async (role: 'owner' | 'developer' | 'viewer') => sessionCookie(kit.db, members[role]!.id, org.id);
  const cookies = { owner: await cookie('owner'), developer: await cookie('developer'), viewer: await cookie('viewer') };
  const play = (who: keyof typeof cookies, path: string, body: unknown) =>
    request(kit.app).post(`/console-api${path}`).set('Cookie', cookies[who]).set(CSRF_HEADER, CSRF_HEADER_VALUE).send(body as object);
  const v1 = (endpoint: string, body: unknown) => request(kit.app).post(endpoint).set('Authorization', `Bearer ${key.secret}`).send(body as object);
  return { org, key: key.key, secret: key.secret, cookies, play, v1 };
}

async function countedCalls(apiKeyId: string, endpoint?: string): Promise<number> {
  const [row] = await kit.db
    .select({ calls: sql<number>`coalesce(sum(${usageCounters.calls}), 0)::int` })
    .from(usageCounters)
    .where(endpoint ? and(eq(usageCounters.apiKeyId, apiKeyId), eq(usageCounters.endpoint, endpoint)) : eq(usageCounters.apiKeyId, apiKeyId));
  return row!.calls;
}

const calc = (endpoint: string) => playgroundCalculations.find((c) => c.endpoint === endpoint)!;

describe('running a calculation from the playground', () => {
  it('when a developer runs pack energy under a server key, then the answer is the v1 answer and it is counted once under /v1/packs/energy for that key', async () => {
    const o = await organization();
    const { path, exampleInput } = calc('/v1/packs/energy');
    const res = await o.play('developer', path, { keyId: o.key.id, input: exampleInput });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    // Worked example (schema example): 16 LFP cells × 3.2 V × 100 Ah = 5 120 Wh; × 90 % = 4 608 Wh usable.
    expect(res.body.data.energyWh).toBe(5120);
    expect(res.body.data.usableEnergyWh).toBe(4608);
    expect(res.headers['ratelimit']).toMatch(/r=\d+/);
    expect(res.body).toEqual((await o.v1('/v1/packs/energy', exampleInput)).body);
    // One playground call and one v1 call, both under the v1 endpoint and the same key.
    expect(await countedCalls(o.key.id, '/v1/packs/energy')).toBe(2);
    expect(await countedCalls(o.key.id)).toBe(2);
    const [row] = await kit.db.select().from(apiKeys).where(eq(apiKeys.id, o.key.id));
    expect(row!.lastUsedAt).not.toBeNull();
  });

  it('when every calculation runs its worked example, then each answers 200 with the envelope and each is counted under its own endpoint', async () => {
    const o = await organization();
    for (const c of playgroundCalculations) {
      const res = await o.play('owner', c.path, { keyId: o.key.id, input: c.exampleInput });
      expect(res.status, `${c.path}: ${JSON.stringify(res.body)}`).toBe(200);
      expect(Object.keys(res.body).sort()).toEqual(['basis', 'cautions', 'checks', 'data']);
      expect(await countedCalls(o.key.id, c.endpoint)).toBe(1);
    }
    expect(await countedCalls(o.key.id)).toBe(playgroundCalculations.length);
    const usage = await request(kit.app).get('/console-api/usage').set('Cookie', o.cookies.viewer);
    expect(usage.body.used).toBe(playgroundCalculations.length);
    expect(usage.body.byKey).toEqual([expect.objectContaining({ keyId: o.key.id, calls: playgroundCalculations.length })]);
  });

  it('when the input fails the schema, then it is a 422 pointing into input, not counted, but logged under the v1 endpoint like a failed /v1 call', async () => {
    const o = await organization();
    const res = await o.play('owner', '/playground/wires/size', { keyId: o.key.id, input: { currentA: -5, systemVoltageV: 48, oneWayLengthM: 3 } });
    expect(res.status).toBe(422);
    expect(res.headers['content-type']).toMatch(/^application\/problem\+json/);
    expect(res.body.errors.map((e: { pointer: string }) => e.pointer)).toContain('#/input/currentA');
    expect(await countedCalls(o.key.id)).toBe(0);
    await kit.app.platform!.requestLog.flush();
    const log = await request(kit.app).get(`/console-api/requests?keyId=${o.key.id}&status=4xx`).set('Cookie', o.cookies.viewer);
    expect(log.body.items).toEqual([expect.objectContaining({ endpoint: '/v1/wires/size', status: 422, method: 'POST', keyName: 'Playground key' })]);
  });

  it('when an unknown field is sent beside the input, then it is refused (the body is strict, like /v1)', async () => {
    const o = await organization();
    const res = await o.play('owner', '/playground/runtime', { keyId: o.key.id, input: calc('/v1/runtime').exampleInput, extra: 1 });
    expect(res.status).toBe(422);
    expect(await countedCalls(o.key.id)).toBe(0);
  });

  it('when the calculation cannot be solved, then it is the same 422 calculation-error /v1 gives, and not counted', async () => {
    const o = await organization();
    const input = { pack: { chemistry: 'lfp', seriesCells: 16, capacityAh: 100 }, fromPct: 20, toPct: 100, sources: [{ currentA: 0 }] };
    const [viaPlayground, viaV1] = [await o.play('owner', '/playground/charge/time', { keyId: o.key.id, input }), await o.v1('/v1/charge/time', input)];
    expect(viaV1.status).toBe(422);
    expect(viaPlayground.status).toBe(422);
    expect(viaPlayground.body.type).toBe(viaV1.body.type);
    expect(viaPlayground.body.detail).toBe(viaV1.body.detail);
    expect(await countedCalls(o.key.id)).toBe(0);
  });
});

describe('the key a playground call runs under', () => {
  const run = (o: Awaited<ReturnType<typeof organization>>, keyId: string) => o.play('owner', '/playground/packs/energy', { keyId, input: calc('/v1/packs/energy').exampleInput });

  it('when the key is revoked, expired or an embed key, then it is a 422 naming the reason, and nothing is counted', async () => {
    const o = await organization();
    const hash = kit.app.platform!.hashSecret;
    const revoked = await createTestKey(kit.db, hash, o.org.id, { name: 'Old key' });
    await kit.db.update(apiKeys).set({ revokedAt: new Date() }).where(eq(apiKeys.id, revoked.key.id));
    const expired = await createTestKey(kit.db, hash, o.org.id, { expiresAt: new Date(Date.now() - 1000) });
    const embed = await createTestKey(kit.db, hash, o.org.id, { kind: 'embed', allowedOrigins: ['https://blog.example'] });
    for (const [key, code] of [
      [revoked.key, 'key_revoked'],
      [expired.key, 'key_expired'],
      [embed.key, 'key_not_server'],
    ] as const) {
      const res = await run(o, key.id);
      expect(res.status, code).toBe(422);
      expect(res.body.errors).toEqual([expect.objectContaining({ pointer: '#/keyId', code })]);
      expect(await countedCalls(key.id)).toBe(0);
    }
  });

  it("when the key belongs to another organization, then it is 404 and the other organization's key is not used", async () => {
    const mine = await organization();
    const theirs = await organization();
    const res = await run(mine, theirs.key.id);
    expect(res.status).toBe(404);
    expect(await countedCalls(theirs.key.id)).toBe(0);
  });

  it('when keyId is missing or not an id, then it is a 422 pointing at keyId', async () => {
    const o = await organization();
    const res = await o.play('owner', '/playground/packs/energy', { input: calc('/v1/packs/energy').exampleInput });
    expect(res.status).toBe(422);
    expect(res.body.errors[0].pointer).toBe('#/keyId');
    expect((await run(o, 'not-a-key')).status).toBe(422);
  });

  it('when a viewer tries, then it is 403 (playground calls spend the quota), and nothing is counted', async () => {
    const o = await organization();
    const res = await o.play('viewer', '/playground/packs/energy', { keyId: o.key.id, input: calc('/v1/packs/energy').exampleInput });
    expect(res.status).toBe(403);
    expect(await countedCalls(o.key.id)).toBe(0);
  });

  it("when the organization's monthly quota is used up, then the next call is 429 quota-exceeded and the count stays at the quota", async () => {
    const o = await organization();
    await setLimits(kit.db, o.org.id, { monthly: 2 });
    kit.app.platform!.resolver.invalidate();
    expect((await run(o, o.key.id)).status).toBe(200);
    expect((await o.v1('/v1/packs/energy', calc('/v1/packs/energy').exampleInput)).status).toBe(200);
    const over = await run(o, o.key.id);
    expect(over.status).toBe(429);
    expect(over.body.type).toBe('/problems/quota-exceeded');
    expect(over.headers['retry-after']).toBeDefined();
    expect(await countedCalls(o.key.id)).toBe(2);
  });
});

describe('capacity tests from an uploaded CSV log', () => {
  it('when a CSV log is sent, then the answer equals the v1 text/csv answer for the same log', async () => {
    const o = await organization();
    const res = await o.play('owner', '/playground/capacity-tests/evaluate', { keyId: o.key.id, csv: { text: capacityTestCsvExample, ratedAh: 100, chemistry: 'lfp' } });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const v1 = await request(kit.app)
      .post('/v1/capacity-tests/evaluate?ratedAh=100&chemistry=lfp')
      .set('Authorization', `Bearer ${o.secret}`)
      .set('Content-Type', 'text/csv')
      .send(capacityTestCsvExample);
    expect(v1.status).toBe(200);
    expect(res.body).toEqual(v1.body);
    // Trapezoidal rule over the example log: 20 A for 3 600 s = 20 Ah of a rated 100 Ah.
    expect(res.body.data.measuredAh).toBeCloseTo(20, 9);
    expect(res.body.data.sampleCount).toBe(3);
    expect(await countedCalls(o.key.id, '/v1/capacity-tests/evaluate')).toBe(2);
  });

  it('when the log has bad rows, then it is a 422 listing each row, pointing at the log, and not counted', async () => {
    const o = await organization();
    const res = await o.play('owner', '/playground/capacity-tests/evaluate', { keyId: o.key.id, csv: { text: 'tS,currentA\n0,20\nsoon,20\n3600,20\n', ratedAh: 100 } });
    expect(res.status).toBe(422);
    expect(res.body.rows).toEqual([expect.objectContaining({ row: 3 })]);
    expect(res.body.errors[0].pointer).toBe('#/csv/text');
    expect(await countedCalls(o.key.id)).toBe(0);
  });

  it('when both a JSON input and a CSV log are sent, then it is a 422', async () => {
    const o = await organization();
    const res = await o.play('owner', '/playground/capacity-tests/evaluate', {
      keyId: o.key.id,
      input: calc('/v1/capacity-tests/evaluate').exampleInput,
      csv: { text: capacityTestCsvExample, ratedAh: 100 },
    });
    expect(res.status).toBe(422);
  });
});
