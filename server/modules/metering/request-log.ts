/**
 * The recent-calls log shown in the console (time, key, endpoint, status, duration). Entries are written
 * after the answer, in small batches (every 250 ms or 500 entries), off the request's path. It is a
 * diagnostic view, not the bill: usage_counters is. Entries older than 30 days are pruned.
 */
import type { RequestHandler } from 'express';
import { lt, sql } from 'drizzle-orm';
import type { Db } from '../../db/client.ts';
import { idempotencyRecords, rateWindows, requestLog } from '../../db/schema/index.ts';
import type { Logger } from '../../logger.ts';
import { endpointOf } from './metering.ts';

type Entry = typeof requestLog.$inferInsert;

export const REQUEST_LOG_RETENTION_DAYS = 30;

export class RequestLogWriter {
  private buffer: Entry[] = [];
  private timer: NodeJS.Timeout | undefined;
  private writing: Promise<void> = Promise.resolve();

  constructor(
    private readonly db: Db,
    private readonly logger: Logger,
  ) {}

  add(entry: Entry): void {
    this.buffer.push(entry);
    if (this.buffer.length >= 500) void this.flush();
    else if (!this.timer) {
      this.timer = setTimeout(() => void this.flush(), 250);
      this.timer.unref();
    }
  }

  flush(): Promise<void> {
    clearTimeout(this.timer);
    this.timer = undefined;
    const entries = this.buffer.splice(0);
    if (entries.length === 0) return this.writing;
    // One statement over column arrays: cheap to build and to plan, whatever the batch size.
    const col = <K extends keyof Entry>(k: K) => entries.map((e) => e[k] ?? null);
    this.writing = this.writing
      .then(() =>
        this.db.$client.query(
          `insert into request_log (organization_id, api_key_id, method, endpoint, status, duration_ms, request_id)
           select * from unnest($1::uuid[], $2::uuid[], $3::text[], $4::text[], $5::smallint[], $6::int[], $7::text[])`,
          [col('organizationId'), col('apiKeyId'), col('method'), col('endpoint'), col('status'), col('durationMs'), col('requestId')],
        ),
      )
      .then(
        () => undefined,
        (err: unknown) => this.logger.warn({ err, entries: entries.length }, 'request log entries dropped'),
      );
    return this.writing;
  }

  /** Middleware: logs every /v1 call made with a recognised key, once its answer is finished. */
  middleware(): RequestHandler {
    return (req, res, next) => {
      const started = process.hrtime.bigint();
      const endpoint = endpointOf(req);
      res.on('finish', () => {
        const key = res.locals.apiKey;
        if (!key) return;
        this.add({
          organizationId: key.organizationId,
          apiKeyId: key.id,
          method: req.method,
          endpoint,
          status: res.statusCode,
          durationMs: Math.round(Number(process.hrtime.bigint() - started) / 1e6),
          requestId: String(req.id ?? ''),
        });
      });
      next();
    };
  }
}

/** Deletes what has outlived its use: old request-log rows, idempotency records, rate windows. */
export async function pruneMeteringData(db: Db, at = new Date()): Promise<void> {
  await db.delete(requestLog).where(lt(requestLog.createdAt, sql`${at.toISOString()}::timestamptz - interval '${sql.raw(String(REQUEST_LOG_RETENTION_DAYS))} days'`));
  await db.delete(idempotencyRecords).where(lt(idempotencyRecords.createdAt, sql`${at.toISOString()}::timestamptz - interval '24 hours'`));
  await db.delete(rateWindows).where(lt(rateWindows.windowStart, sql`${at.toISOString()}::timestamptz - interval '1 hour'`));
}
