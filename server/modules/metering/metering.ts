/**
 * Metered answers. A calculation handler computes its result, then calls `res.locals.sendMetered(body)`:
 * the call is counted through the group-commit batcher and only then answered 200 with the RateLimit
 * headers; over the monthly quota or the per-minute rate it is answered 429 instead and not counted.
 * Only successful calculations are counted; 4xx answers are not billed.
 *
 * Idempotency (draft-ietf-httpapi-idempotency-key-header): with an `Idempotency-Key`, the answer is
 * stored in the same transaction as the count. A retry with the same key and payload is answered again
 * from the store (`Idempotent-Replayed: true`) and not counted; the same key with another payload is 422;
 * while the first call is still in flight on this instance, 409. The payload is the method, the URL with its
 * query, the content type and the body (JSON or CSV text). Keys: 1–255 printable ASCII characters,
 * sent bare or as a quoted sf-string; kept 24 hours, per API key.
 */
import { createHash } from 'node:crypto';
import type { Request, RequestHandler, Response } from 'express';
import { and, eq, gt, sql } from 'drizzle-orm';
import type { Db } from '../../db/client.ts';
import { idempotencyRecords } from '../../db/schema/index.ts';
import { AppError } from '../../http/problem.ts';
import type { ResolvedKey } from '../keys/key-resolver.ts';
import type { MeterBatcher, MeterResult } from './meter-batcher.ts';
import { rateLimitHeaders, retryAfterSeconds } from './rate-limit-headers.ts';

declare global {
  namespace Express {
    interface Locals {
      sendMetered?: (body: unknown) => Promise<void>;
      idempotency?: { key: string; requestHash: string };
    }
  }
}

const IDEMPOTENCY_KEY = /^"?([\x21\x23-\x7e]{1,255})"?$/;
export const IDEMPOTENCY_TTL_HOURS = 24;

/** The endpoint a call is counted under: its path, e.g. "/v1/packs/energy" (the v1 API has no path parameters). */
export function endpointOf(req: Request): string {
  const path = `${req.baseUrl}${req.path}`;
  return path.length > 1 && path.endsWith('/') ? path.slice(0, -1) : path;
}

export interface MeteringHooks {
  /** Called after a granted call with the organization's new monthly total (quota e-mails). */
  onCounted?: (organizationId: string, monthCalls: number, monthlyQuotaCalls: number, monthStart: Date) => void;
}

/** The metering middlewares, sharing the database used to replay stored answers. */
export function createMetering(db: Db, batcher: MeterBatcher, hooks: MeteringHooks = {}) {
  return { meterCalls: meterCalls(db, batcher, hooks), idempotency: idempotency(db) };
}

function meterCalls(db: Db, batcher: MeterBatcher, hooks: MeteringHooks): RequestHandler {
  return (req, res, next) => {
    res.locals.sendMetered = (body: unknown) => {
      const key = res.locals.apiKey;
      if (!key) return Promise.reject(new Error('sendMetered called without an authenticated key'));
      const idem = res.locals.idempotency;
      return batcher
        .enqueue({
          organizationId: key.organizationId,
          apiKeyId: key.id,
          endpoint: endpointOf(req),
          monthlyQuotaCalls: key.monthlyQuotaCalls,
          ratePerMinuteCalls: key.ratePerMinuteCalls,
          ...(idem ? { idempotency: { key: idem.key, requestHash: idem.requestHash, status: 200, body } } : {}),
        })
        .then(
          (result) => answer(result, key, body),
          (error: unknown) => {
            req.log?.error({ err: error }, 'metering failed');
            throw new AppError('service-unavailable', 'The call could not be counted, so it was not answered. Retry shortly.', {
              headers: { 'Retry-After': '1' },
            });
          },
        );
    };

    /** Answers a counted call: 200 with the RateLimit headers, or 429, or a stored answer for a duplicate. */
    const answer = async (result: MeterResult, key: ResolvedKey, body: unknown): Promise<void> => {
      const state = { ...result, monthlyQuotaCalls: key.monthlyQuotaCalls, ratePerMinuteCalls: key.ratePerMinuteCalls, now: new Date() };
      const headers = rateLimitHeaders(state);
      if (result.outcome === 'quota' || result.outcome === 'rate') {
        const retryAfter = String(retryAfterSeconds(state, result.outcome));
        throw result.outcome === 'quota'
          ? new AppError('quota-exceeded', `This organization has used all ${key.monthlyQuotaCalls} calls of this month's quota. It resets at the start of the next UTC month.`, {
              headers: { ...headers, 'Retry-After': retryAfter },
              extensions: { 'violated-policies': ['monthly'] },
            })
          : new AppError('rate-limited', `More than ${key.ratePerMinuteCalls} calls in this minute for this organization. Retry after ${retryAfter} s.`, {
              headers: { ...headers, 'Retry-After': retryAfter },
              extensions: { 'violated-policies': ['minute'] },
            });
      }
      if (result.outcome === 'duplicate') {
        // Another instance stored an answer for this key first: answer with that one, uncounted.
        const idem = res.locals.idempotency!;
        await replayStored(db, res, idem.key, idem.requestHash);
        return;
      }
      hooks.onCounted?.(key.organizationId, result.monthCalls, key.monthlyQuotaCalls, result.monthStart);
      // The JSON answer written directly (what res.json() would send, without its content negotiation helpers).
      const json = Buffer.from(JSON.stringify(body));
      res.statusCode = 200;
      res.setHeader('RateLimit-Policy', headers['RateLimit-Policy']!);
      res.setHeader('RateLimit', headers.RateLimit!);
      res.setHeader('Content-Type', 'application/json; charset=utf-8');
      res.setHeader('Content-Length', json.length);
      res.end(json);
    };
    next();
  };
}

function requestHashOf(req: Request): string {
  const payload = typeof req.body === 'string' ? req.body : JSON.stringify(req.body ?? null);
  return createHash('sha256').update(`${req.method} ${req.originalUrl}\n${req.get('content-type') ?? ''}\n${payload}`).digest('hex');
}

async function findRecord(db: Db, apiKeyId: string, key: string) {
  const rows = await db
    .select()
    .from(idempotencyRecords)
    .where(
      and(
        eq(idempotencyRecords.apiKeyId, apiKeyId),
        eq(idempotencyRecords.idempotencyKey, key),
        gt(idempotencyRecords.createdAt, sql`now() - make_interval(hours => ${IDEMPOTENCY_TTL_HOURS})`),
      ),
    );
  return rows[0];
}

async function replayStored(db: Db, res: Response, key: string, requestHash: string): Promise<void> {
  const record = await findRecord(db, res.locals.apiKey!.id, key);
  if (!record) throw new AppError('conflict', 'A call with this Idempotency-Key is still being processed. Retry shortly.');
  if (record.requestHash !== requestHash) {
    throw new AppError('idempotency-key-reused', 'This Idempotency-Key was already used with a different request. Use a new key for a new request.');
  }
  res.setHeader('Idempotent-Replayed', 'true');
  res.status(record.status).json(record.body);
}

/**
 * Reads the Idempotency-Key of a metered call: replays a stored answer, refuses a reused or in-flight
 * key, or records the key for the metering step.
 */
function idempotency(db: Db): RequestHandler {
  const inFlight = new Set<string>();
  return (req, res, next) => {
    const header = req.get('idempotency-key');
    if (header === undefined) {
      next();
      return;
    }
    return withIdempotencyKey(header, req, res, next);
  };

  async function withIdempotencyKey(header: string, req: Request, res: Response, next: () => void) {
    const key = IDEMPOTENCY_KEY.exec(header.trim())?.[1];
    if (!key) {
      throw new AppError('malformed-request', 'Idempotency-Key must be 1–255 printable ASCII characters, bare or in double quotes.', {
        errors: [{ header: 'Idempotency-Key', detail: 'Invalid format.' }],
      });
    }
    const apiKeyId = res.locals.apiKey!.id;
    const requestHash = requestHashOf(req);
    const record = await findRecord(db, apiKeyId, key);
    if (record) {
      await replayStored(db, res, key, requestHash);
      return;
    }
    const slot = `${apiKeyId}:${key}`;
    if (inFlight.has(slot)) throw new AppError('conflict', 'A call with this Idempotency-Key is still being processed. Retry shortly.');
    inFlight.add(slot);
    res.on('close', () => inFlight.delete(slot));
    res.locals.idempotency = { key, requestHash };
    next();
  }
}
