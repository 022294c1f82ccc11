/**
 * Resolves a presented API key to its row and organization limits, with a short per-instance cache
 * (API_KEY_CACHE_TTL_MS, default 3 s): a revoked or expired key stops working on every instance within
 * that time, while a hot key costs one map lookup per call. Unknown keys are cached too (negatively,
 * bounded), so garbage keys cannot turn into one query per request. Concurrent lookups of one key share one
 * query, and a hot key is re-read in the background during the last quarter of its lifetime, so its calls
 * never wait for the database (an answer is still never older than the TTL).
 */
import { effectiveLimits, type PlanId } from '#shared/plans.ts';
import type { Db } from '../../db/client.ts';
import { hashApiKey, hashesEqual, type ApiKeyKind } from './key-format.ts';
import { findKeyWithOrganizationByHash, listActiveEmbedOrigins } from './keys.queries.ts';

export interface ResolvedKey {
  id: string;
  organizationId: string;
  kind: ApiKeyKind;
  name: string;
  allowedOrigins: string[];
  revokedAt: Date | null;
  expiresAt: Date | null;
  planId: PlanId;
  monthlyQuotaCalls: number;
  ratePerMinuteCalls: number;
}

interface Entry {
  value: ResolvedKey | null;
  fetchedAtMs: number;
  /** A background re-read has been started for this entry. */
  refreshing?: boolean;
}

const MAX_ENTRIES = 10_000;

export class KeyResolver {
  private cache = new Map<string, Entry>();
  /**
   * The same entries by the presented key itself, so a hot key skips the HMAC too. It holds only keys
   * presented within the last TTL (they are in this process's memory while their requests run anyway).
   */
  private recent = new Map<string, Entry>();
  private origins: { value: Set<string>; fetchedAtMs: number } | undefined;
  private inFlight = new Map<string, Promise<ResolvedKey | null>>();
  /** Bumped by invalidate(): a read that started before it does not store what it found. */
  private generation = 0;

  constructor(
    private readonly db: Db,
    private readonly hashSecret: string,
    private readonly ttlMs: number,
    private readonly clock: () => number = Date.now,
  ) {}

  /**
   * The cached answer for a key, synchronously, when it is fresh; undefined when the database must be
   * asked (then call `resolve`). Keeps the hot path free of promises.
   */
  resolveCached(presentedKey: string): ResolvedKey | null | undefined {
    const hit = this.recent.get(presentedKey);
    if (!hit) return undefined;
    const age = this.clock() - hit.fetchedAtMs;
    if (age >= this.ttlMs) return undefined;
    if (age >= this.ttlMs * 0.75 && !hit.refreshing) {
      hit.refreshing = true;
      // Errors are left to the next lookup after the TTL, which asks the database itself.
      this.lookup(presentedKey, hashApiKey(presentedKey, this.hashSecret)).catch(() => undefined);
    }
    return hit.value;
  }

  async resolve(presentedKey: string): Promise<ResolvedKey | null> {
    const hash = hashApiKey(presentedKey, this.hashSecret);
    const hit = this.cache.get(hash);
    if (hit && this.clock() - hit.fetchedAtMs < this.ttlMs) {
      this.recent.set(presentedKey, hit);
      return hit.value;
    }
    return this.lookup(presentedKey, hash);
  }

  /** One database read per key at a time: concurrent callers share it. */
  private lookup(presentedKey: string, hash: string): Promise<ResolvedKey | null> {
    let pending = this.inFlight.get(hash);
    if (!pending) {
      pending = this.read(presentedKey, hash).finally(() => this.inFlight.delete(hash));
      this.inFlight.set(hash, pending);
    }
    return pending;
  }

  private async read(presentedKey: string, hash: string): Promise<ResolvedKey | null> {
    const now = this.clock();
    const generation = this.generation;
    const row = await findKeyWithOrganizationByHash(this.db, hash);
    // The row was found by its hash; compare again in constant time as the stored-secret check.
    const value: ResolvedKey | null =
      row && hashesEqual(row.key.keyHash, hash)
        ? {
            id: row.key.id,
            organizationId: row.key.organizationId,
            kind: row.key.kind,
            name: row.key.name,
            allowedOrigins: row.key.allowedOrigins,
            revokedAt: row.key.revokedAt,
            expiresAt: row.key.expiresAt,
            ...(() => {
              const limits = effectiveLimits(row.organization);
              return { planId: limits.plan.id, monthlyQuotaCalls: limits.monthlyQuotaCalls, ratePerMinuteCalls: limits.ratePerMinuteCalls };
            })(),
          }
        : null;
    if (generation !== this.generation) return value;
    if (this.cache.size >= MAX_ENTRIES) this.cache.clear();
    if (this.recent.size >= MAX_ENTRIES) this.recent.clear();
    const entry = { value, fetchedAtMs: now };
    this.cache.set(hash, entry);
    this.recent.set(presentedKey, entry);
    return value;
  }

  /** Origins listed on any active embed key (for CORS preflights, which carry no key). */
  async embedOrigins(): Promise<Set<string>> {
    const now = this.clock();
    if (this.origins && now - this.origins.fetchedAtMs < this.ttlMs) return this.origins.value;
    const value = new Set(await listActiveEmbedOrigins(this.db));
    this.origins = { value, fetchedAtMs: now };
    return value;
  }

  /** Drops cached entries (after a change made by this instance, so it applies here at once). */
  invalidate(): void {
    this.generation += 1;
    this.inFlight.clear();
    this.cache.clear();
    this.recent.clear();
    this.origins = undefined;
  }
}
