/**
 * The catalog and the matrix in the public API: `GET /v1/catalog` with a server key and with an embed key
 * from a listed origin (an unlisted origin or none is 403, and embed keys still cannot read other GETs);
 * `POST /v1/compatibility/matrix` over the catalog, over sent lists and over SKU filters, metered as one call.
 */
import request from 'supertest';
import { sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp } from '../../../tests/setup/app.ts';
import { createOrganization, createTestKey } from '../../../tests/setup/fixtures.ts';
import { demoCatalog, seedDemoCatalog } from './catalog.seed.ts';

const { app, db, close } = createTestApp();
afterAll(close);

const SHOP = 'https://shop.larkspur.example';
let org: { id: string };
let server: string;
let embed: string;

beforeAll(async () => {
  org = await createOrganization(db, { planId: 'builder', customMonthlyQuotaCalls: 100_000, customRatePerMinuteCalls: 100_000 });
  await db.transaction((tx) => seedDemoCatalog(tx, org.id));
  server = (await createTestKey(db, app.platform!.hashSecret, org.id)).secret;
  embed = (await createTestKey(db, app.platform!.hashSecret, org.id, { kind: 'embed', allowedOrigins: [SHOP] })).secret;
});

const get = (path: string, key: string, origin?: string) => {
  const r = request(app).get(path).set('Authorization', `Bearer ${key}`);
  return origin ? r.set('Origin', origin) : r;
};
const post = (path: string, key: string, body: object, origin?: string) => {
  const r = request(app).post(path).set('Authorization', `Bearer ${key}`);
  return (origin ? r.set('Origin', origin) : r).send(body);
};
async function counted(endpoint: string) {
  const { rows } = await db.execute<{ n: number }>(sql`select coalesce(sum(calls), 0)::int as n from usage_counters where organization_id = ${org.id} and endpoint = ${endpoint}`);
  return rows[0]!.n;
}

describe('GET /v1/catalog', () => {
  it('when read with a server key, then it is the organization\'s catalog in the envelope, not metered', async () => {
    const res = await get('/v1/catalog', server);
    expect(res.status).toBe(200);
    expect(res.body.data.hosts.map((h: { sku: string }) => h.sku).sort()).toEqual(demoCatalog.hosts.map((h) => h.sku).sort());
    expect(res.body.data.packs).toHaveLength(demoCatalog.packs.length);
    expect(res.body).toMatchObject({ checks: [], cautions: [] });
    expect(res.headers['cache-control']).toBe('private, max-age=60');
    expect(await counted('/v1/catalog')).toBe(0);
  });

  it('when read with an embed key from its listed origin, then it answers with CORS for that origin', async () => {
    const res = await get('/v1/catalog', embed, SHOP);
    expect(res.status).toBe(200);
    expect(res.headers['access-control-allow-origin']).toBe(SHOP);
    expect(res.body.data.packs[0]).toHaveProperty('price');
  });

  it('when the browser asks first (preflight), then a listed origin may GET with the Authorization header', async () => {
    const res = await request(app).options('/v1/catalog').set('Origin', SHOP).set('Access-Control-Request-Method', 'GET').set('Access-Control-Request-Headers', 'authorization');
    expect(res.status).toBe(204);
    expect(res.headers['access-control-allow-methods']).toContain('GET');
  });

  it('when the embed key is used from an unlisted origin or with no origin, then it is a 403 problem', async () => {
    const other = await get('/v1/catalog', embed, 'https://elsewhere.example');
    expect(other.status).toBe(403);
    expect(other.body.detail).toMatch(/not allowed from https:\/\/elsewhere\.example/);
    expect(other.headers['access-control-allow-origin']).toBeUndefined();
    expect((await get('/v1/catalog', embed)).status).toBe(403);
  });

  it('when a same-origin page reads it (browsers send no Origin on a same-origin GET), then Sec-Fetch-Site stands for the server\'s own origin', async () => {
    const own = (await createTestKey(db, app.platform!.hashSecret, org.id, { kind: 'embed', allowedOrigins: ['http://console.larkspur.example'] })).secret;
    const sameOrigin = (key: string) => request(app).get('/v1/catalog').set('Authorization', `Bearer ${key}`).set('Host', 'console.larkspur.example').set('Sec-Fetch-Site', 'same-origin');
    expect((await sameOrigin(own)).status).toBe(200);
    // The key must still list that origin; and without Sec-Fetch-Site there is no origin at all.
    expect((await sameOrigin(embed)).status).toBe(403);
    expect((await request(app).get('/v1/catalog').set('Authorization', `Bearer ${own}`).set('Host', 'console.larkspur.example')).status).toBe(403);
  });

  it('when an embed key reads any other GET (usage), then it is still refused: only the listed paths are open to it', async () => {
    const res = await get('/v1/usage', embed, SHOP);
    expect(res.status).toBe(403);
    expect(res.body.detail).toMatch(/Embed keys may only call calculation endpoints/);
  });

  it('when another organization reads its catalog, then it sees only its own (empty) catalog', async () => {
    const other = await createOrganization(db);
    const key = (await createTestKey(db, app.platform!.hashSecret, other.id)).secret;
    const res = await get('/v1/catalog', key);
    expect(res.body.data).toEqual({ hosts: [], packs: [] });
  });
});

describe('POST /v1/compatibility/matrix', () => {
  it('when the body is empty, then every catalog host × pack pair is checked, and the call is metered once', async () => {
    const before = await counted('/v1/compatibility/matrix');
    const res = await post('/v1/compatibility/matrix', server, {});
    expect(res.status).toBe(200);
    const { hosts, packs, pairs, counts } = res.body.data;
    expect(hosts).toHaveLength(3);
    expect(packs).toHaveLength(4);
    expect(pairs).toHaveLength(12);
    expect(counts.compatible + counts.limited + counts.incompatible).toBe(12);
    expect(res.headers['ratelimit-policy']).toBeDefined();
    expect(await counted('/v1/compatibility/matrix')).toBe(before + 1);
  });

  it('when a pair is checked alone with /v1/compatibility/check, then the matrix gives the same methods', async () => {
    const matrix = (await post('/v1/compatibility/matrix', server, { hostSkus: ['LPS-BW1500'], packSkus: ['LPS-CW48-50'] })).body.data;
    expect(matrix.pairs).toHaveLength(1);
    const host = demoCatalog.hosts.find((h) => h.sku === 'LPS-BW1500')!;
    const pack = demoCatalog.packs.find((p) => p.sku === 'LPS-CW48-50')!;
    const single = await post('/v1/compatibility/check', server, {
      host: { label: host.name, dcInput: host.dcInput, battery: host.battery },
      external: { label: pack.name, chemistry: pack.chemistry, seriesCells: pack.seriesCells, capacityAh: pack.capacityAh, internalResistanceMOhm: pack.internalResistanceMOhm, maxContinuousDischargeA: pack.maxContinuousDischargeA, maxChargeA: pack.maxChargeA, stateOfChargePct: 100 },
    });
    expect(single.status).toBe(200);
    expect(matrix.pairs[0].methods).toEqual(single.body.data.methods);
    expect(matrix.pairs[0]).toMatchObject({ verdict: 'compatible', method: 'dc_input' });
  });

  it('when lists are sent, then they are used instead of the catalog, and the best verdict is the pair\'s', async () => {
    const res = await post('/v1/compatibility/matrix', server, {
      hosts: [{ label: '12–28 V input', dcInput: { minVoltageV: 12, maxVoltageV: 28, maxCurrentA: 10 }, battery: { chemistry: 'lfp', seriesCells: 16 } }],
      packs: [{ label: '48 V LFP', chemistry: 'lfp', seriesCells: 16, capacityAh: 50 }],
    });
    expect(res.status).toBe(200);
    const [pair] = res.body.data.pairs;
    // 58.4 V full charge over a 28 V input: incompatible there; same chemistry and 16S: compatible in parallel.
    expect(pair.methods.map((m: { verdict: string }) => m.verdict)).toEqual(['incompatible', 'compatible']);
    expect(pair).toMatchObject({ verdict: 'compatible', method: 'direct_parallel' });
    expect(res.body.data.hosts[0]).toEqual({ label: '12–28 V input', sku: null, source: 'request' });
    expect(res.body.checks.map((c: { code: string }) => c.code)).toContain('matrix_danger_pairs');
  });

  it('when a SKU is not in the catalog, or lists and filters are mixed, then it is a 422 naming the field', async () => {
    const unknown = await post('/v1/compatibility/matrix', server, { packSkus: ['LPS-CW48-50', 'NOPE'] });
    expect(unknown.status).toBe(422);
    expect(unknown.body.errors[0].pointer).toBe('#/packSkus/1');
    const mixed = await post('/v1/compatibility/matrix', server, { packs: [{ label: 'x', chemistry: 'lfp', seriesCells: 4, capacityAh: 10 }], packSkus: ['LPS-CW48-50'] });
    expect(mixed.status).toBe(422);
    expect(mixed.body.errors[0].pointer).toBe('#/packSkus');
  });

  it('when more than 2000 pairs are asked for, then it is a 422 before any computing', async () => {
    const host = { label: 'h', dcInput: { minVoltageV: 12, maxVoltageV: 60, maxCurrentA: 10 } };
    const pack = { label: 'p', chemistry: 'lfp', seriesCells: 16, capacityAh: 10 };
    const res = await post('/v1/compatibility/matrix', server, { hosts: Array(50).fill(host), packs: Array(41).fill(pack) });
    expect(res.status).toBe(422);
    expect(res.body.errors[0].detail).toMatch(/At most 2000 pairs/);
  });

  it('when an embed key calls it from its listed origin, then it works like any calculation', async () => {
    const res = await post('/v1/compatibility/matrix', embed, { hostSkus: ['LPS-QF600'] }, SHOP);
    expect(res.status).toBe(200);
    expect(res.body.data.pairs).toHaveLength(4);
  });
});
