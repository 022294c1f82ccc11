/**
 * Fuzzing the public API from the OpenAPI document: every documented /v1 operation (so one registered
 * later is covered without a change here) receives random and adversarial requests — mutations of its
 * documented examples and of schema-shaped values, wrong types, huge and non-finite numbers, NaN-like
 * strings, deep nesting, unicode, missing and extra fields, arrays for objects, empty bodies, wrong
 * content types, malformed JSON, odd query strings, and broken or misplaced credentials.
 * Every answer: never a 5xx; a 4xx is a problem document; no secret in it; and a rejected call changes
 * nothing in the database (every table of the Drizzle schema, by row count and content fingerprint).
 * Seeded and bounded: the same cases on every run.
 */
import fc from 'fast-check';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildOpenApiDocument } from '../../server/openapi/document.ts';
import { createTestApp } from '../setup/app.ts';
import { createOrganization, createTestKey } from '../setup/fixtures.ts';
import { collectSecrets } from '../security/exposure.ts';
import { checkAnswer, listen, Tally, type Sent } from './fuzz-kit.ts';
import { changedTables, createIsolatedDatabase, databaseTables, schemaTables, snapshot, writableOnRejection, type Snapshot } from './isolated-database.ts';
import { bodyFor, listOperations, queryFor, wireBody, type OpenApiDocument, type Operation, type WireBody } from './openapi-arbitraries.ts';

const SEED = 20261210;
const RUNS = { post: 70, get: 20 };
const EMBED_ORIGIN = 'https://fuzz-shop.example';

const doc = buildOpenApiDocument() as unknown as OpenApiDocument;
const operations = listOperations(doc).filter((op) => op.path.startsWith('/v1/'));

let database: Awaited<ReturnType<typeof createIsolatedDatabase>>;
let t: ReturnType<typeof createTestApp>;
let http: Awaited<ReturnType<typeof listen>>;
let serverKey = '';
let embedKey = '';
let secrets: string[] = [];
let before: Snapshot;
const tally = new Tally();

beforeAll(async () => {
  database = await createIsolatedDatabase('fuzz_v1');
  // Abuse limits far above what the fuzzer sends: here the answers to bad input are under test, not the limits.
  t = createTestApp({ DATABASE_URL: database.url, ABUSE_KEY_FAILURES_PER_MINUTE: '1000000', ABUSE_KEY_READS_PER_MINUTE: '1000000', ABUSE_ADDRESS_FAILURES_PER_MINUTE: '1000000' });
  const org = await createOrganization(t.db, { customMonthlyQuotaCalls: 10_000_000, customRatePerMinuteCalls: 1_000_000 });
  serverKey = (await createTestKey(t.db, t.app.platform!.hashSecret, org.id)).secret;
  embedKey = (await createTestKey(t.db, t.app.platform!.hashSecret, org.id, { kind: 'embed', allowedOrigins: [EMBED_ORIGIN] })).secret;
  secrets = await collectSecrets(t.db, t.env);
  http = await listen(t.app);
  before = await snapshot(t.db);
}, 60_000);

afterAll(async () => {
  console.info(tally.summary(`/v1 (${operations.length} operations)`));
  await http?.close();
  await t?.close();
  await database?.drop();
});

/** Who the call claims to be: mostly the valid server key, sometimes nobody or something broken. */
const credentials: fc.Arbitrary<Record<string, string>> = fc.oneof(
  { weight: 14, arbitrary: fc.constant(null).map(() => ({ Authorization: `Bearer ${serverKey}` })) },
  { weight: 1, arbitrary: fc.constant({}) },
  {
    weight: 2,
    arbitrary: fc
      .constantFrom(
        'Bearer',
        'Bearer ',
        'Basic dXNlcjpwYXNzd29yZA==',
        `Bearer ohs_srv_${'A'.repeat(40)}`,
        'Bearer ohs_srv_short',
        `Bearer ${'x'.repeat(6000)}`,
        'Bearer ohs_srv_ÄÖÜ',
        'Bearer null',
        'Bearer ../../etc/passwd',
      )
      .map((Authorization) => ({ Authorization })),
  },
  { weight: 1, arbitrary: fc.constant(null).map(() => ({ Authorization: `Bearer ${serverKey}x` })) },
  { weight: 1, arbitrary: fc.constant(null).map(() => ({ Authorization: `Bearer ${embedKey}` })) },
  { weight: 1, arbitrary: fc.constant(null).map(() => ({ Authorization: `Bearer ${embedKey}`, Origin: EMBED_ORIGIN })) },
  { weight: 1, arbitrary: fc.constant(null).map(() => ({ Authorization: `Bearer ${serverKey}`, Origin: 'https://elsewhere.example' })) },
);

/** Sometimes an Idempotency-Key, from a small pool so that reuse (replay or refusal) happens too. */
const idempotency: fc.Arbitrary<Record<string, string>> = fc.oneof(
  { weight: 8, arbitrary: fc.constant({}) },
  { weight: 2, arbitrary: fc.constantFrom('k-1', 'k-2', '"quoted-key"', '', ' ', 'ключ', 'x'.repeat(300), '"').map((k) => ({ 'Idempotency-Key': k })) },
);

function caseFor(op: Operation): fc.Arbitrary<Sent> {
  const body: fc.Arbitrary<WireBody | undefined> =
    op.method === 'get' ? fc.option(wireBody(fc.jsonValue({ maxDepth: 2 })), { nil: undefined, freq: 4 }) : wireBody(bodyFor(doc, op));
  const headers =
    op.auth === 'api-key'
      ? fc.tuple(credentials, idempotency).map(([a, b]) => ({ ...a, ...b }))
      : // The Stripe webhook: unsigned, badly signed, or signed with a made-up secret.
        fc.constantFrom<Record<string, string>>({}, { 'Stripe-Signature': 't=1,v1=00' }, { 'Stripe-Signature': 'garbage' }, { 'Stripe-Signature': `t=${Math.floor(Date.now() / 1000)},v1=${'a'.repeat(64)}` });
  return fc.record({ query: queryFor(doc, op), headers, body }).map(({ query, headers, body }) => ({ method: op.method, path: `${op.path}${query}`, headers, ...(body ? { body } : {}) }));
}

describe('the fuzzers see every table', () => {
  it('when the database is migrated, then every table in it is in the Drizzle schema the row checks list', async () => {
    expect(await databaseTables(t.db)).toEqual(schemaTables);
    expect(schemaTables.length).toBeGreaterThan(writableOnRejection.size + 10);
  });
});

describe('fuzzing every documented /v1 operation', () => {
  it('when the document is read, then it lists the calculation, reference and usage operations', () => {
    expect(operations.length).toBeGreaterThanOrEqual(14);
  });

  it.each(operations.map((op) => [`${op.method.toUpperCase()} ${op.path}`, op] as const))(
    'when %s receives random and adversarial requests, then no 5xx, only problem documents, no secrets, and nothing written when refused',
    async (_name, op) => {
      await fc.assert(
        fc.asyncProperty(caseFor(op), async (sent) => {
          const res = await http.send(sent);
          tally.add(res.status);
          checkAnswer(sent, res, secrets);
          if (res.status >= 400) {
            const after = await snapshot(t.db);
            expect(changedTables(before, after), `refused ${sent.method} ${sent.path} (${res.status}) changed the database`).toEqual([]);
          } else {
            before = await snapshot(t.db);
          }
        }),
        { seed: SEED, numRuns: op.method === 'get' ? RUNS.get : RUNS.post, endOnFailure: true },
      );
    },
    60_000,
  );
});
