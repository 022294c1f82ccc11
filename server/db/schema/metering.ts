import { bigint, bigserial, date, index, integer, jsonb, pgTable, primaryKey, smallint, text, timestamp, uuid } from 'drizzle-orm/pg-core';
import { apiKeys } from './api-keys.ts';
import { organizations } from './organizations.ts';

/** Calls per organization per UTC calendar month: the hot counter the monthly quota is checked against. */
export const organizationMonthlyUsage = pgTable(
  'organization_monthly_usage',
  {
    organizationId: uuid()
      .notNull()
      .references(() => organizations.id, { onDelete: 'cascade' }),
    month: date({ mode: 'string' }).notNull(),
    calls: bigint({ mode: 'number' }).notNull().default(0),
  },
  (t) => [primaryKey({ columns: [t.organizationId, t.month] })],
);

/** Calls per organization per one-minute window (fixed windows aligned to the minute, UTC). */
export const rateWindows = pgTable(
  'rate_windows',
  {
    organizationId: uuid()
      .notNull()
      .references(() => organizations.id, { onDelete: 'cascade' }),
    windowStart: timestamp({ withTimezone: true }).notNull(),
    calls: integer().notNull().default(0),
  },
  (t) => [primaryKey({ columns: [t.organizationId, t.windowStart] }), index('rate_windows_start_idx').on(t.windowStart)],
);

/**
 * Stored answers of metered calls made with an Idempotency-Key, written in the same transaction as the
 * count, so a retry is answered again without being counted again. Kept 24 hours.
 */
export const idempotencyRecords = pgTable(
  'idempotency_records',
  {
    apiKeyId: uuid()
      .notNull()
      .references(() => apiKeys.id, { onDelete: 'cascade' }),
    idempotencyKey: text().notNull(),
    /** SHA-256 of method, path and body: the same key with another payload is refused. */
    requestHash: text().notNull(),
    status: smallint().notNull(),
    body: jsonb().notNull(),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [primaryKey({ columns: [t.apiKeyId, t.idempotencyKey] }), index('idempotency_records_created_idx').on(t.createdAt)],
);

/** Recent calls for the console (time, key, endpoint, status, duration); pruned after 30 days. */
export const requestLog = pgTable(
  'request_log',
  {
    id: bigserial({ mode: 'number' }).primaryKey(),
    organizationId: uuid()
      .notNull()
      .references(() => organizations.id, { onDelete: 'cascade' }),
    // No foreign key: its check cost one lookup per logged call, and keys are only ever deleted with their
    // organization, whose rows here go with it (the usage queries left-join api_keys).
    apiKeyId: uuid(),
    method: text().notNull(),
    endpoint: text().notNull(),
    status: smallint().notNull(),
    durationMs: integer().notNull(),
    requestId: text(),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index('request_log_org_time_idx').on(t.organizationId, t.createdAt)],
);

/** Quota e-mails sent: at most one per organization, month and threshold (80 %, 100 %). */
export const quotaNotifications = pgTable(
  'quota_notifications',
  {
    organizationId: uuid()
      .notNull()
      .references(() => organizations.id, { onDelete: 'cascade' }),
    month: date({ mode: 'string' }).notNull(),
    thresholdPct: smallint().notNull(),
    sentAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    details: jsonb().$type<Record<string, unknown>>().notNull().default({}),
  },
  (t) => [primaryKey({ columns: [t.organizationId, t.month, t.thresholdPct] })],
);
