/**
 * The catalog in the console: CSV import (all rows or none, problems named by row and column, size and type
 * limits), export that imports back unchanged, the forms' create/replace/delete with roles and tenants,
 * and the compatibility matrix of the catalog.
 */
import request from 'supertest';
import { and, eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { CSRF_HEADER, CSRF_HEADER_VALUE } from '#shared/schemas/accounts.ts';
import { computeCompatibility } from '#shared/calc/compatibility/compatibility.ts';
import { auditEvents, catalogHosts, catalogPacks } from '../../db/schema/index.ts';
import { createOrganizationWith, sessionCookie, startConsoleKit, type ConsoleKit } from '../console/console.test-kit.ts';
import { CSV_MAX_BYTES } from './catalog.csv.ts';
import { MAX_CATALOG_ITEMS } from './catalog.service.ts';

let kit: ConsoleKit;
type Org = Awaited<ReturnType<typeof createOrganizationWith>>;
const cookies: Record<string, string> = {};

async function freshOrg(label: string): Promise<Org> {
  const org = await createOrganizationWith(kit.db, label, ['owner', 'admin', 'developer', 'viewer']);
  for (const role of ['owner', 'admin', 'developer', 'viewer'] as const) cookies[`${label}:${role}`] = await sessionCookie(kit.db, org.members[role]!.id, org.org.id);
  return org;
}

beforeAll(async () => {
  kit = await startConsoleKit();
});
afterAll(() => kit.close());

const as = (who: string) => {
  const cookie = cookies[who]!;
  return {
    get: (path: string) => request(kit.app).get(`/console-api${path}`).set('Cookie', cookie),
    post: (path: string, body: object) => request(kit.app).post(`/console-api${path}`).set('Cookie', cookie).set(CSRF_HEADER, CSRF_HEADER_VALUE).send(body),
    put: (path: string, body: object) => request(kit.app).put(`/console-api${path}`).set('Cookie', cookie).set(CSRF_HEADER, CSRF_HEADER_VALUE).send(body),
    delete: (path: string) => request(kit.app).delete(`/console-api${path}`).set('Cookie', cookie).set(CSRF_HEADER, CSRF_HEADER_VALUE),
    upload: (kind: 'hosts' | 'packs', content: string | Buffer, filename = `${kind}.csv`, contentType = 'text/csv', query = '') =>
      request(kit.app)
        .post(`/console-api/catalog/${kind}/import${query}`)
        .set('Cookie', cookie)
        .set(CSRF_HEADER, CSRF_HEADER_VALUE)
        .attach('file', Buffer.isBuffer(content) ? content : Buffer.from(content), { filename, contentType }),
  };
};

const hostsCsv = [
  'sku,name,url,dcInputMinVoltageV,dcInputMaxVoltageV,dcInputMaxCurrentA,dcInputMaxPowerW,batteryChemistry,batterySeriesCells,batteryCapacityAh',
  'T-100,Test Unit 100,https://shop.example/t-100,12,28,10,200,lfp,4,50',
  'T-200,Test Unit 200,,12,60,15,500,lfp,16,30',
  'T-300,"Test Unit 300, battery only",,,,,,nmc,14,40',
].join('\r\n');

const packsHeader = 'sku,name,chemistry,seriesCells,capacityAh,maxContinuousDischargeA,cycleLife,priceAmount,priceCurrency';

describe('CSV import', () => {
  let org: Org;
  beforeAll(async () => {
    org = await freshOrg('csv');
  });

  it('when a good file is uploaded, then every row is imported, readable back with its fields, and audited', async () => {
    const res = await as('csv:developer').upload('hosts', hostsCsv);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body).toEqual({ kind: 'hosts', mode: 'merge', rows: 3, created: 3, updated: 0, deleted: 0 });
    const catalog = await as('csv:viewer').get('/catalog');
    expect(catalog.body.hosts.map((h: { sku: string }) => h.sku)).toEqual(['T-100', 'T-200', 'T-300']);
    expect(catalog.body.hosts[0]).toMatchObject({
      name: 'Test Unit 100',
      url: 'https://shop.example/t-100',
      dcInput: { minVoltageV: 12, maxVoltageV: 28, maxCurrentA: 10, maxPowerW: 200, efficiencyPct: 90 },
      battery: { chemistry: 'lfp', seriesCells: 4, capacityAh: 50 },
    });
    expect(catalog.body.hosts[2].dcInput).toBeUndefined();
    expect(catalog.body.hosts[2].name).toBe('Test Unit 300, battery only');
    const events = await kit.db.select().from(auditEvents).where(and(eq(auditEvents.organizationId, org.org.id), eq(auditEvents.action, 'catalog.imported')));
    expect(events).toHaveLength(1);
    expect(events[0]!.details).toMatchObject({ created: 3, rows: 3, file: 'hosts.csv' });
  });

  it('when one row is bad, then nothing is imported and the problem names its row, line and column', async () => {
    const file = [packsHeader, 'P-1,Pack one,lfp,16,100,100,4000,1390,USD', 'P-2,Pack two,lfp,sixteen,100,100,4000,1390,USD', 'P-3,Pack three,lfp,4,200,,,650,USD'].join('\n');
    const res = await as('csv:owner').upload('packs', file);
    expect(res.status).toBe(422);
    expect(res.headers['content-type']).toMatch(/problem\+json/);
    expect(res.body.rowErrors).toEqual([{ row: 2, line: 3, column: 'seriesCells', detail: expect.stringContaining('"sixteen" is not a number') }]);
    expect(res.body.errors[0]).toMatchObject({ pointer: '#/rows/2/seriesCells', detail: expect.stringMatching(/^row 2 \(line 3\), column seriesCells: /) });
    expect(res.body.detail).toMatch(/Nothing was imported/);
    expect(await kit.db.select().from(catalogPacks).where(eq(catalogPacks.organizationId, org.org.id))).toHaveLength(0);
  });

  it('when a value breaks the shared schema, then the column is the field\'s (nested fields included), for every bad row', async () => {
    const file = [packsHeader, 'P-1,Pack one,lithium,16,100,,,1390,USD', 'P-2,Pack two,lfp,16,100,,,1390,usd', 'P-1,Pack again,lfp,16,100,,,10,USD'].join('\n');
    const res = await as('csv:owner').upload('packs', file);
    expect(res.status).toBe(422);
    expect(res.body.rowErrors.map((e: { row: number; column: string }) => [e.row, e.column])).toEqual([
      [1, 'chemistry'],
      [2, 'priceCurrency'],
      [3, 'sku'],
    ]);
    expect(res.body.rowErrors[2].detail).toMatch(/already on row 1/);
  });

  it('when the header has an unknown column or lacks sku, then the header is named and nothing is imported', async () => {
    const res = await as('csv:owner').upload('packs', 'name,chemistry,seriesCells,capacityAh,voltage\nX,lfp,4,100,12\n');
    expect(res.status).toBe(422);
    expect(res.body.rowErrors).toEqual(
      expect.arrayContaining([expect.objectContaining({ row: 0, line: 1, column: 'voltage' }), expect.objectContaining({ row: 0, column: 'sku' })]),
    );
  });

  it('when a row has more cells than the header, then that row is named', async () => {
    const res = await as('csv:owner').upload('packs', `${packsHeader}\nP-1,Pack,lfp,16,100,,,1,USD,extra\n`);
    expect(res.status).toBe(422);
    expect(res.body.rowErrors[0]).toMatchObject({ row: 1, line: 2, column: null });
  });

  it('when the file is larger than the limit, then it is a 413 problem and nothing is imported', async () => {
    const row = 'P-X,Pack,lfp,16,100,,,1,USD\n';
    const big = `${packsHeader}\n${row.repeat(Math.ceil(CSV_MAX_BYTES / row.length) + 10)}`;
    const res = await as('csv:owner').upload('packs', big);
    expect(res.status).toBe(413);
    expect(res.body.type).toBe('/problems/payload-too-large');
    expect(res.body.detail).toMatch(/larger than 512 KiB/);
  });

  it('when the upload is not a CSV file (by type and name, or by content), then it is a 415 problem', async () => {
    const png = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0x00, 0x00, 0x00, 0x0d, 0x49, 0x48, 0x44, 0x52, 0xff, 0xfe]);
    const byType = await as('csv:owner').upload('packs', png, 'photo.png', 'image/png');
    expect(byType.status).toBe(415);
    expect(byType.body.detail).toMatch(/Only CSV files/);
    const renamed = await as('csv:owner').upload('packs', png, 'photo.csv', 'text/csv');
    expect(renamed.status).toBe(415);
    expect(renamed.body.detail).toMatch(/not UTF-8 text|binary/);
  });

  it('when the body is JSON instead of a multipart upload, then it is a 415 problem naming the field', async () => {
    const res = await as('csv:owner').post('/catalog/packs/import', { csv: 'sku,name' });
    expect(res.status).toBe(415);
    expect(res.body.detail).toMatch(/multipart\/form-data.*"file"/);
  });

  it('when a viewer uploads, or the CSRF header is missing, then it is a 403 and nothing is read', async () => {
    expect((await as('csv:viewer').upload('hosts', hostsCsv)).status).toBe(403);
    const res = await request(kit.app).post('/console-api/catalog/hosts/import').set('Cookie', cookies['csv:owner']!).attach('file', Buffer.from(hostsCsv), 'hosts.csv');
    expect(res.status).toBe(403);
    expect(res.body.reason).toBe('csrf');
  });

  it('when the catalog is exported, then the file imports back unchanged (every row an update), formulas neutralised', async () => {
    await as('csv:owner').post('/catalog/packs', { sku: 'P-EQ', name: '=HYPERLINK("x")', chemistry: 'lfp', seriesCells: 4, capacityAh: 100, price: { amount: 329.5, currency: 'USD' } });
    const exported = await as('csv:viewer').get('/catalog/packs/export');
    expect(exported.status).toBe(200);
    expect(exported.headers['content-type']).toMatch(/^text\/csv/);
    expect(exported.headers['content-disposition']).toMatch(/attachment; filename="catalog-packs.csv"/);
    expect(exported.text.split('\r\n')[0]).toBe('sku,name,url,chemistry,seriesCells,capacityAh,internalResistanceMOhm,maxContinuousDischargeA,maxChargeA,peakDischargeA,cycleLife,priceAmount,priceCurrency');
    expect(exported.text).toContain(`P-EQ,"'=HYPERLINK(""x"")",,lfp,4,100,,,,,,329.5,USD`);
    const back = await as('csv:owner').upload('packs', exported.text);
    expect(back.body).toMatchObject({ created: 0, updated: 1 });
    const [row] = await kit.db.select().from(catalogPacks).where(and(eq(catalogPacks.organizationId, org.org.id), eq(catalogPacks.sku, 'P-EQ')));
    expect(row).toMatchObject({ name: '=HYPERLINK("x")', priceAmount: 329.5, priceCurrency: 'USD' });
  });

  it('when mode=replace, then SKUs the file leaves out are deleted in the same transaction', async () => {
    const res = await as('csv:owner').upload('hosts', hostsCsv.split('\r\n').slice(0, 2).join('\n'), 'hosts.csv', 'text/csv', '?mode=replace');
    expect(res.body).toMatchObject({ mode: 'replace', created: 0, updated: 1, deleted: 2 });
    expect((await as('csv:owner').get('/catalog')).body.hosts.map((h: { sku: string }) => h.sku)).toEqual(['T-100']);
  });

  it('when an import would take the catalog past its limit, then the transaction rolls back and nothing of the file is kept', async () => {
    const rows = (from: number, n: number) => Array.from({ length: n }, (_, i) => `B-${from + i},Bulk ${from + i},lfp,4,100,,,,`).join('\n');
    const first = await as('csv:owner').upload('packs', `${packsHeader}\n${rows(0, 400)}`);
    expect(first.status).toBe(200);
    const before = (await kit.db.select().from(catalogPacks).where(eq(catalogPacks.organizationId, org.org.id))).length;
    const second = await as('csv:owner').upload('packs', `${packsHeader}\n${rows(1000, MAX_CATALOG_ITEMS - 400 + 50)}`);
    expect(second.status).toBe(409);
    expect(second.body.detail).toMatch(/Nothing was imported/);
    expect((await kit.db.select().from(catalogPacks).where(eq(catalogPacks.organizationId, org.org.id))).length).toBe(before);
  });
});

describe('forms: create, replace, delete', () => {
  let org: Org;
  beforeAll(async () => {
    org = await freshOrg('forms');
    await freshOrg('forms-other');
  });
  const host = { sku: 'H-1', name: 'Form Unit', dcInput: { minVoltageV: 12, maxVoltageV: 60, maxCurrentA: 15, maxPowerW: 500 } };

  it('when a developer adds a host, then it is listed and audited; the same SKU again is a 409 on #/sku', async () => {
    const res = await as('forms:developer').post('/catalog/hosts', host);
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ ...host, dcInput: { ...host.dcInput, efficiencyPct: 90 } });
    const again = await as('forms:admin').post('/catalog/hosts', host);
    expect(again.status).toBe(409);
    expect(again.body.errors[0].pointer).toBe('#/sku');
    const events = await kit.db.select().from(auditEvents).where(and(eq(auditEvents.organizationId, org.org.id), eq(auditEvents.action, 'catalog.item_created')));
    expect(events.map((e) => e.targetId)).toEqual([res.body.id]);
  });

  it('when the form leaves out both the DC input and the battery, then it is a 422 naming dcInput', async () => {
    const res = await as('forms:owner').post('/catalog/hosts', { sku: 'H-2', name: 'Nothing' });
    expect(res.status).toBe(422);
    expect(res.body.errors[0].pointer).toBe('#/dcInput');
  });

  it('when an item is replaced, then fields left out are cleared; a viewer may not; another tenant gets 404', async () => {
    const created = (await as('forms:owner').post('/catalog/packs', { sku: 'K-1', name: 'Pack', chemistry: 'lfp', seriesCells: 16, capacityAh: 50, cycleLife: 3000 })).body;
    expect((await as('forms:viewer').put(`/catalog/packs/${created.id}`, { ...created })).status).toBe(403);
    expect((await as('forms-other:owner').put(`/catalog/packs/${created.id}`, { sku: 'K-1', name: 'Mine now', chemistry: 'lfp', seriesCells: 16, capacityAh: 50 })).status).toBe(404);
    const res = await as('forms:admin').put(`/catalog/packs/${created.id}`, { sku: 'K-1', name: 'Pack, renamed', chemistry: 'lfp', seriesCells: 16, capacityAh: 60 });
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ name: 'Pack, renamed', capacityAh: 60 });
    expect(res.body.cycleLife).toBeUndefined();
  });

  it('when an item is deleted, then it is gone (204); deleting it again is 404', async () => {
    const [row] = await kit.db.select().from(catalogHosts).where(eq(catalogHosts.organizationId, org.org.id));
    expect((await as('forms-other:owner').delete(`/catalog/hosts/${row!.id}`)).status).toBe(404);
    expect((await as('forms:developer').delete(`/catalog/hosts/${row!.id}`)).status).toBe(204);
    expect((await as('forms:developer').delete(`/catalog/hosts/${row!.id}`)).status).toBe(404);
    expect((await as('forms:developer').delete('/catalog/hosts/not-a-uuid')).status).toBe(404);
  });
});

describe('the matrix of the catalog', () => {
  beforeAll(async () => {
    await freshOrg('matrix');
  });

  it('when the catalog has no packs, then the matrix is a 422 saying so', async () => {
    await as('matrix:owner').post('/catalog/hosts', { sku: 'M-H1', name: 'Unit one', dcInput: { minVoltageV: 12, maxVoltageV: 60, maxCurrentA: 15 } });
    const res = await as('matrix:viewer').get('/catalog/matrix');
    expect(res.status).toBe(422);
    expect(res.body.detail).toMatch(/no packs/);
  });

  it('when it has hosts and packs, then every pair carries the verdicts of the compatibility check itself', async () => {
    await as('matrix:owner').post('/catalog/hosts', { sku: 'M-H2', name: 'Unit two', dcInput: { minVoltageV: 32, maxVoltageV: 150, maxCurrentA: 15 }, battery: { chemistry: 'lfp', seriesCells: 16 } });
    const pack12 = { sku: 'M-P1', name: 'Pack 12 V', chemistry: 'lfp', seriesCells: 4, capacityAh: 100 } as const;
    const pack48 = { sku: 'M-P2', name: 'Pack 48 V', chemistry: 'lfp', seriesCells: 16, capacityAh: 100 } as const;
    await as('matrix:owner').post('/catalog/packs', pack12);
    await as('matrix:owner').post('/catalog/packs', pack48);
    const res = await as('matrix:viewer').get('/catalog/matrix');
    expect(res.status).toBe(200);
    const d = res.body.data;
    expect(d.hosts.map((h: { sku: string }) => h.sku)).toEqual(['M-H1', 'M-H2']);
    expect(d.packs.map((p: { sku: string }) => p.sku)).toEqual(['M-P1', 'M-P2']);
    expect(d.pairs).toHaveLength(4);
    // Each pair against the calculator called directly (the matrix must not compute its own verdicts).
    const hosts = [{ dcInput: { minVoltageV: 12, maxVoltageV: 60, maxCurrentA: 15, efficiencyPct: 90 } }, { dcInput: { minVoltageV: 32, maxVoltageV: 150, maxCurrentA: 15, efficiencyPct: 90 }, battery: { chemistry: 'lfp' as const, seriesCells: 16 } }];
    for (const pair of d.pairs) {
      const p = [pack12, pack48][pair.packIndex]!;
      const direct = computeCompatibility({ host: hosts[pair.hostIndex]!, external: { chemistry: p.chemistry, seriesCells: p.seriesCells, capacityAh: p.capacityAh, label: p.name, stateOfChargePct: 100 } });
      expect(pair.methods.map((m: { verdict: string }) => m.verdict)).toEqual(direct.data.methods.map((m) => m.verdict));
    }
    // 12 V pack: limited on the 12–60 V input (its cut-off, 10 V, is below 12 V), incompatible on 32–150 V;
    // 48 V pack: compatible on both, and by direct parallel on unit two (same chemistry and series count).
    const verdictOf = (h: number, p: number) => d.pairs.find((x: { hostIndex: number; packIndex: number }) => x.hostIndex === h && x.packIndex === p).verdict;
    expect([verdictOf(0, 0), verdictOf(0, 1), verdictOf(1, 0), verdictOf(1, 1)]).toEqual(['limited', 'compatible', 'incompatible', 'compatible']);
    expect(d.counts).toEqual({ compatible: 2, limited: 1, incompatible: 1 });
    expect(res.body.cautions.length).toBeGreaterThan(0);
  });
});
