import { integer, pgTable, text, timestamp } from 'drizzle-orm/pg-core';

/**
 * Sign-in throttling state, shared by every server instance. One row per key: `account:<lower e-mail>`
 * (consecutive failures, growing delays) or `ip:<address or IPv6 /56>` (failures in a fixed window), and
 * `mail:<address>` for requests that send e-mail (sign-up, password reset, resend).
 */
export const authThrottles = pgTable('auth_throttles', {
  key: text().primaryKey(),
  failures: integer().notNull().default(0),
  windowStartedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  lastFailureAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
  /** Sign-in for this key is refused until then. */
  blockedUntil: timestamp({ withTimezone: true }),
});
