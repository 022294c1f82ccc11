import { boolean, index, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core';
import { timestamps } from './columns.ts';
import { organizations } from './organizations.ts';

/**
 * One row per organization that has met billing: its Stripe customer and the state of its payments.
 * The row is also the lock every billing change of the organization takes (SELECT … FOR UPDATE), so
 * concurrent webhook deliveries for one organization apply one after the other.
 */
export const billingAccounts = pgTable('billing_accounts', {
  organizationId: uuid()
    .primaryKey()
    .references(() => organizations.id, { onDelete: 'cascade' }),
  /** The Stripe customer (cus_…) created for this organization; null until the first checkout. */
  stripeCustomerId: text().unique(),
  /** When a payment first failed and has not been made good since; null while payments are in order. */
  paymentFailedAt: timestamp({ withTimezone: true }),
  /** paymentFailedAt + BILLING_GRACE_DAYS: until then the paid plan keeps working. */
  graceEndsAt: timestamp({ withTimezone: true }),
  /** Set when the grace period ran out and the plan fell back to free; cleared when a payment succeeds. */
  graceExpiredAt: timestamp({ withTimezone: true }),
  ...timestamps,
});

/**
 * Our copy of each Stripe subscription, as last fetched from Stripe (never from an event's payload
 * alone, so deliveries in any order converge on Stripe's present state).
 */
export const billingSubscriptions = pgTable(
  'billing_subscriptions',
  {
    stripeSubscriptionId: text().primaryKey(),
    organizationId: uuid()
      .notNull()
      .references(() => organizations.id, { onDelete: 'cascade' }),
    stripeCustomerId: text().notNull(),
    /** Stripe's status: trialing, active, past_due, unpaid, canceled, incomplete, incomplete_expired, paused. */
    status: text().notNull(),
    stripePriceId: text(),
    /** The plan the price stands for; null for a price we do not sell. */
    planId: text(),
    cancelAtPeriodEnd: boolean().notNull().default(false),
    currentPeriodEnd: timestamp({ withTimezone: true }),
    canceledAt: timestamp({ withTimezone: true }),
    /** Stripe's `created` of the newest event that led to a sync of this row. */
    lastEventCreatedAt: timestamp({ withTimezone: true }).notNull(),
    /** When this row was last fetched from Stripe. */
    syncedAt: timestamp({ withTimezone: true }).notNull(),
    ...timestamps,
  },
  (t) => [index('billing_subscriptions_org_idx').on(t.organizationId)],
);

/**
 * Every Stripe event id we have processed, inserted in the same transaction as its effect: a second
 * delivery of the same event finds its id here and changes nothing.
 */
export const stripeEvents = pgTable('stripe_events', {
  id: text().primaryKey(),
  type: text().notNull(),
  /** The event's own `created` (Stripe's clock). */
  stripeCreatedAt: timestamp({ withTimezone: true }).notNull(),
  organizationId: uuid().references(() => organizations.id, { onDelete: 'set null' }),
  /** What processing did: applied, or why it was ignored. */
  outcome: text().notNull(),
  processedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
});
