/**
 * Fuzzing the console API from the OpenAPI document: every documented operation outside /v1 (console
 * routes, and the operational ones), including those registered later, called as the owner of a fresh
 * organization with a session cookie and the CSRF header, with random and adversarial bodies (mutated
 * documented examples, schema-shaped values, wrong types, huge numbers, NaN-like strings, deep nesting,
 * unicode, missing and extra fields such as role/organizationId/planId, wrong content types, empty bodies),
 * odd query strings and path parameters. Every answer: never a 5xx; a 4xx is a problem document; no secret
 * in it; and a refused call changes nothing in the database. After a call that succeeds, the next one
 * starts from a fresh organization again (a success may sign out, transfer ownership or delete).
 */
import fc from 'fast-check';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { CSRF_HEADER, CSRF_HEADER_VALUE } from '#shared/schemas/accounts.ts';
import { invitations } from '../../server/db/schema/index.ts';
import { hashToken, randomToken } from '../../server/modules/auth/tokens.ts';
import { startBillingFake, type BillingFake } from '../../server/modules/billing/billing.test-kit.ts';
import { createOrganizationWith, sessionCookie, startConsoleKit, uniqueEmail, type ConsoleKit } from '../../server/modules/console/console.test-kit.ts';
import { buildOpenApiDocument } from '../../server/openapi/document.ts';
import { createTestKey } from '../setup/fixtures.ts';
import { collectSecrets } from '../security/exposure.ts';
import { checkAnswer, listen, Tally, type Sent } from './fuzz-kit.ts';
import { changedTables, createIsolatedDatabase, snapshot, type Snapshot } from './isolated-database.ts';
import { bodyFor, listOperations, multipartBody, pathFor, queryFor, wireBody, type OpenApiDocument, type Operation, type WireBody } from './openapi-arbitraries.ts';

const SEED = 20261211;
const RUNS = { withBody: 30, withoutBody: 10 };

const doc = buildOpenApiDocument() as unknown as OpenApiDocument;
const operations = listOperations(doc).filter((op) => !op.path.startsWith('/v1/'));

let database: Awaited<ReturnType<typeof createIsolatedDatabase>>;
let billing: BillingFake;
let kit: ConsoleKit;
let http: Awaited<ReturnType<typeof listen>>;
let secrets: string[] = [];
const tally = new Tally();

beforeAll(async () => {
  database = await createIsolatedDatabase('fuzz_console');
  billing = await startBillingFake();
  kit = await startConsoleKit({
    DATABASE_URL: database.url,
    ...billing.env,
    ABUSE_KEY_FAILURES_PER_MINUTE: '1000000',
    ABUSE_KEY_READS_PER_MINUTE: '1000000',
    ABUSE_ADDRESS_FAILURES_PER_MINUTE: '1000000',
    ABUSE_CONSOLE_REQUESTS_PER_MINUTE: '1000000',
  });
  http = await listen(kit.app);
}, 60_000);

afterAll(async () => {
  console.info(tally.summary(`console and operations (${operations.length} operations)`));
  await http?.close();
  await kit?.close();
  await billing?.close();
  await database?.drop();
});

/** A fresh organization: its owner signed in, a developer, an open invitation and a server key. */
async function freshWorld() {
  const db = kit.db;
  const { org, members } = await createOrganizationWith(db, 'fuzz', ['owner', 'developer']);
  const [invitation] = await db
    .insert(invitations)
    .values({ organizationId: org.id, email: uniqueEmail('fuzz-invitee'), role: 'viewer', tokenHash: hashToken(randomToken()), invitedByUserId: members.owner!.id, expiresAt: new Date(Date.now() + 86_400_000) })
    .returning();
  const { key } = await createTestKey(db, kit.app.platform!.hashSecret, org.id);
  const cookie = await sessionCookie(db, members.owner!.id, org.id);
  secrets = await collectSecrets(db, kit.env);
  // Names of path parameters and the objects of this world they address.
  const known = { userId: members.developer!.id, invitationId: invitation!.id, keyId: key.id, organizationId: org.id };
  return { cookie, known, before: await snapshot(db) };
}

function caseFor(op: Operation, known: Record<string, string>): fc.Arbitrary<Sent> {
  const hasBody = op.bodyTypes.length > 0;
  const body: fc.Arbitrary<WireBody | undefined> = op.bodyTypes.includes('multipart/form-data')
    ? fc.oneof({ weight: 4, arbitrary: multipartBody() }, { weight: 1, arbitrary: wireBody(fc.jsonValue({ maxDepth: 2 })) })
    : hasBody
    ? wireBody(bodyFor(doc, op))
    : fc.oneof({ weight: 3, arbitrary: fc.constant(undefined) }, { weight: 1, arbitrary: wireBody(fc.jsonValue({ maxDepth: 2 })) });
  return fc
    .record({ path: pathFor(op, known), query: queryFor(doc, op), body })
    .map(({ path, query, body }) => ({ method: op.method, path: `${path}${query}`, ...(body ? { body } : {}) }));
}

describe('fuzzing every documented console and operational route', () => {
  it('when the document is read, then it lists the console routes', () => {
    expect(operations.filter((op) => op.path.startsWith('/console-api/')).length).toBeGreaterThanOrEqual(40);
  });

  it.each(operations.map((op) => [`${op.method.toUpperCase()} ${op.path}`, op] as const))(
    'when %s is called by an owner with random and adversarial input, then no 5xx, only problem documents, no secrets, and nothing written when refused',
    async (_name, op) => {
      let world = await freshWorld();
      // The property's cases are drawn against the world's ids; a success replaces the world for the next case.
      const known = () => world.known;
      await fc.assert(
        fc.asyncProperty(fc.nat(), fc.context(), async (draw, ctx) => {
          const [sent] = fc.sample(caseFor(op, known()), { seed: SEED + draw, numRuns: 1 });
          const request: Sent = { ...sent!, headers: { Cookie: world.cookie, [CSRF_HEADER]: CSRF_HEADER_VALUE } };
          ctx.log(`${request.method} ${request.path} ${request.body?.label ?? ''}`);
          const res = await http.send(request);
          tally.add(res.status);
          checkAnswer(request, res, secrets, { allowApiKeySecret: res.status < 300 && /\/keys(\/|$)/.test(op.path) });
          if (res.status >= 400) {
            expect(changedTables(world.before, await snapshot(kit.db)), `refused ${request.method} ${request.path} (${res.status}) changed the database`).toEqual([]);
          } else {
            world = await freshWorld();
          }
        }),
        { seed: SEED, numRuns: op.bodyTypes.length > 0 ? RUNS.withBody : RUNS.withoutBody, endOnFailure: true },
      );
    },
    60_000,
  );
});
