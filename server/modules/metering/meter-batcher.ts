/**
 * Group commit for metering. Calls that are ready to be answered 2xx wait here; all calls that arrive
 * while one batch is being written go together into the next batch, which is counted in a single
 * statement (`meter_batch`, see drizzle/0002_meter_batch.sql) and committed before any of them is
 * answered. So no 2xx leaves without a durable count, nothing is counted twice, and under load the cost
 * is one round trip per batch rather than per call. A few batches per instance may be in flight at once
 * (`maxInFlight`, default 2): the next batch is on its way while the previous one commits, and batches of
 * one organization still serialize on its counter rows in the database, always locked in the same order.
 */
import type pg from 'pg';

export type MeterOutcome = 'ok' | 'quota' | 'rate' | 'duplicate';

export interface MeterItem {
  organizationId: string;
  apiKeyId: string;
  endpoint: string;
  monthlyQuotaCalls: number;
  ratePerMinuteCalls: number;
  /** With an Idempotency-Key: the key, the payload hash and the answer to store. */
  idempotency?: { key: string; requestHash: string; status: number; body: unknown };
}

export interface MeterResult {
  outcome: MeterOutcome;
  /** The organization's calls this month and in this minute, after this call (if granted). */
  monthCalls: number;
  windowCalls: number;
  monthStart: Date;
  windowStart: Date;
}

interface Pending {
  item: MeterItem;
  resolve: (r: MeterResult) => void;
  reject: (e: unknown) => void;
}

export class MeterBatcher {
  private queue: Pending[] = [];
  private inFlight = 0;
  private scheduled = false;
  private idle: Array<() => void> = [];
  /** Batches written and calls in them, for diagnostics and benchmarks. */
  readonly stats = { batches: 0, calls: 0, largestBatch: 0, flushMs: 0 };

  constructor(
    private readonly pool: pg.Pool,
    private readonly options: { maxBatch?: number; maxInFlight?: number; at?: () => Date | null } = {},
  ) {}

  private schedule(): void {
    if (this.scheduled || this.queue.length === 0 || this.inFlight >= (this.options.maxInFlight ?? 2)) return;
    this.scheduled = true;
    // Let the requests already being processed in this turn of the event loop join the batch.
    setImmediate(() => {
      this.scheduled = false;
      if (this.queue.length > 0) void this.flush();
    });
  }

  enqueue(item: MeterItem): Promise<MeterResult> {
    return new Promise((resolve, reject) => {
      this.queue.push({ item, resolve, reject });
      this.schedule();
    });
  }

  /** Resolves when nothing is queued or being written. */
  drain(): Promise<void> {
    if (this.inFlight === 0 && this.queue.length === 0) return Promise.resolve();
    return new Promise((resolve) => this.idle.push(resolve));
  }

  private async flush(): Promise<void> {
    this.inFlight += 1;
    const batch = this.queue.splice(0, this.options.maxBatch ?? 1000);
    const items = batch.map(({ item }, i) => ({
      i,
      org: item.organizationId,
      key: item.apiKeyId,
      endpoint: item.endpoint,
      quota: item.monthlyQuotaCalls,
      rate: item.ratePerMinuteCalls,
      ...(item.idempotency
        ? { idem: item.idempotency.key, hash: item.idempotency.requestHash, status: item.idempotency.status, body: item.idempotency.body }
        : {}),
    }));
    const started = performance.now();
    try {
      const at = this.options.at?.() ?? null;
      const { rows } = await this.pool.query<{
        i: number;
        outcome: MeterOutcome;
        month_calls: string;
        window_calls: number;
        month_start: string;
        window_start: Date;
      }>('select i, outcome, month_calls, window_calls, month_start::text as month_start, window_start from meter_batch($1::jsonb, $2::timestamptz)', [JSON.stringify(items), at]);
      this.stats.batches += 1;
      this.stats.flushMs += performance.now() - started;
      this.stats.calls += batch.length;
      this.stats.largestBatch = Math.max(this.stats.largestBatch, batch.length);
      for (const row of rows) {
        batch[row.i]!.resolve({
          outcome: row.outcome,
          monthCalls: Number(row.month_calls),
          windowCalls: row.window_calls,
          monthStart: new Date(`${row.month_start}T00:00:00Z`),
          windowStart: new Date(row.window_start),
        });
      }
      if (rows.length !== batch.length) throw new Error(`meter_batch answered ${rows.length} rows for ${batch.length} calls`);
    } catch (error) {
      for (const p of batch) p.reject(error);
    } finally {
      this.inFlight -= 1;
      if (this.queue.length > 0) this.schedule();
      else if (this.inFlight === 0) for (const resolve of this.idle.splice(0)) resolve();
    }
  }
}
