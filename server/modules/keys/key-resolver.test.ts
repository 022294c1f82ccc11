import { afterAll, beforeEach, describe, expect, it } from 'vitest';
import { createDb } from '../../db/client.ts';
import { createOrganization, createTestKey } from '../../../tests/setup/fixtures.ts';
import { KeyResolver } from './key-resolver.ts';
import { revokeKey } from './keys.service.ts';

const SECRET = 'key-resolver-test-hash-secret-0000000000000';
const TTL_MS = 3_000;
const { db, pool } = createDb(process.env.DATABASE_URL!, { max: 4 });
/** Database reads, counted from the pool's own checkout events (the database itself is real). */
let checkouts = 0;
pool.on('acquire', () => (checkouts += 1));

let organizationId = '';
beforeEach(async () => {
  organizationId = (await createOrganization(db)).id;
});
afterAll(() => pool.end());

describe('KeyResolver', () => {
  it('when fifty calls present an uncached key at once, then one database read answers them all', async () => {
    const { secret, key } = await createTestKey(db, SECRET, organizationId);
    const resolver = new KeyResolver(db, SECRET, TTL_MS);
    const before = checkouts;
    const answers = await Promise.all(Array.from({ length: 50 }, () => resolver.resolve(secret)));
    expect(checkouts - before).toBe(1);
    expect(new Set(answers.map((a) => a?.id))).toEqual(new Set([key.id]));
  });

  it('when a hot key enters the last quarter of its TTL, then it is re-read in the background while calls are answered from the cache', async () => {
    const { secret, key } = await createTestKey(db, SECRET, organizationId);
    let now = 1_000_000;
    const resolver = new KeyResolver(db, SECRET, TTL_MS, () => now);
    await resolver.resolve(secret);
    now += 2_000; // two thirds of the TTL: answered from the cache, no read
    await revokeKey(db, organizationId, key.id);
    const before = checkouts;
    expect(resolver.resolveCached(secret)?.id).toBe(key.id);
    expect(checkouts).toBe(before);
    now += 400; // past three quarters: still answered (it is younger than the TTL) and re-read once
    expect(resolver.resolveCached(secret)?.revokedAt).toBeNull();
    expect(resolver.resolveCached(secret)?.revokedAt).toBeNull();
    await new Promise((r) => setTimeout(r, 200));
    expect(checkouts - before).toBe(1);
    // The re-read saw the revocation before the old entry's TTL ran out.
    expect(resolver.resolveCached(secret)?.revokedAt).toBeInstanceOf(Date);
  });

  it('when an entry is older than the TTL, then it is not answered from the cache (the bound on revocation holds)', async () => {
    const { secret } = await createTestKey(db, SECRET, organizationId);
    let now = 5_000_000;
    const resolver = new KeyResolver(db, SECRET, TTL_MS, () => now);
    await resolver.resolve(secret);
    now += TTL_MS;
    expect(resolver.resolveCached(secret)).toBeUndefined();
  });

  it('when the cache is invalidated while a read is in flight, then that read does not refill it', async () => {
    const { secret, key } = await createTestKey(db, SECRET, organizationId);
    const resolver = new KeyResolver(db, SECRET, TTL_MS);
    const reading = resolver.resolve(secret);
    resolver.invalidate();
    expect((await reading)?.id).toBe(key.id);
    expect(resolver.resolveCached(secret)).toBeUndefined();
  });
});
