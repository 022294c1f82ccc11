/** SQL for billing: accounts (and their row lock), subscriptions, processed events, the organization's plan. */
import { and, asc, desc, eq, isNull, lte } from 'drizzle-orm';
import type { Db } from '../../db/client.ts';
import { billingAccounts, billingSubscriptions, memberships, organizations, stripeEvents, users } from '../../db/schema/index.ts';
import type { Executor } from '../auth/auth.types.ts';
import type { PaymentState } from './billing.rules.ts';

export type BillingAccountRow = typeof billingAccounts.$inferSelect;
export type BillingSubscriptionRow = typeof billingSubscriptions.$inferSelect;

export async function findAccount(db: Executor, organizationId: string): Promise<BillingAccountRow | undefined> {
  const [row] = await db.select().from(billingAccounts).where(eq(billingAccounts.organizationId, organizationId));
  return row;
}

export async function findAccountByCustomer(db: Executor, stripeCustomerId: string): Promise<BillingAccountRow | undefined> {
  const [row] = await db.select().from(billingAccounts).where(eq(billingAccounts.stripeCustomerId, stripeCustomerId));
  return row;
}

/**
 * The organization's billing account, created when missing, locked FOR UPDATE until the transaction ends:
 * every billing change of one organization runs one after the other.
 */
export async function lockAccount(tx: Executor, organizationId: string): Promise<BillingAccountRow> {
  await tx.insert(billingAccounts).values({ organizationId }).onConflictDoNothing();
  const [row] = await tx.select().from(billingAccounts).where(eq(billingAccounts.organizationId, organizationId)).for('update');
  return row!;
}

/** Links a Stripe customer to the organization unless one is linked already; returns the linked one. */
export async function linkCustomer(db: Executor, organizationId: string, stripeCustomerId: string): Promise<string> {
  await db.insert(billingAccounts).values({ organizationId }).onConflictDoNothing();
  await db
    .update(billingAccounts)
    .set({ stripeCustomerId })
    .where(and(eq(billingAccounts.organizationId, organizationId), isNull(billingAccounts.stripeCustomerId)));
  const row = await findAccount(db, organizationId);
  return row!.stripeCustomerId!;
}

/** Replaces a customer that the payment provider no longer knows. */
export async function replaceCustomer(db: Executor, organizationId: string, staleCustomerId: string, stripeCustomerId: string) {
  await db
    .update(billingAccounts)
    .set({ stripeCustomerId })
    .where(and(eq(billingAccounts.organizationId, organizationId), eq(billingAccounts.stripeCustomerId, staleCustomerId)));
}

export async function savePaymentState(db: Executor, organizationId: string, state: PaymentState) {
  await db.update(billingAccounts).set(state).where(eq(billingAccounts.organizationId, organizationId));
}

export async function listSubscriptions(db: Executor, organizationId: string): Promise<BillingSubscriptionRow[]> {
  return db
    .select()
    .from(billingSubscriptions)
    .where(eq(billingSubscriptions.organizationId, organizationId))
    .orderBy(desc(billingSubscriptions.createdAt));
}

export async function findSubscription(db: Executor, stripeSubscriptionId: string): Promise<BillingSubscriptionRow | undefined> {
  const [row] = await db.select().from(billingSubscriptions).where(eq(billingSubscriptions.stripeSubscriptionId, stripeSubscriptionId));
  return row;
}

export type SubscriptionValues = Omit<typeof billingSubscriptions.$inferInsert, 'createdAt' | 'updatedAt'>;

/** Stores a subscription as just fetched from Stripe; keeps the newest event time seen. */
export async function upsertSubscription(db: Executor, values: SubscriptionValues) {
  const { stripeSubscriptionId: _id, lastEventCreatedAt, ...rest } = values;
  const existing = await findSubscription(db, values.stripeSubscriptionId);
  if (!existing) {
    await db.insert(billingSubscriptions).values(values);
    return;
  }
  await db
    .update(billingSubscriptions)
    .set({ ...rest, lastEventCreatedAt: existing.lastEventCreatedAt > lastEventCreatedAt ? existing.lastEventCreatedAt : lastEventCreatedAt })
    .where(eq(billingSubscriptions.stripeSubscriptionId, values.stripeSubscriptionId));
}

/** Records an event id; false when it was recorded before (a duplicate delivery). */
export async function recordEvent(tx: Executor, event: { id: string; type: string; createdAt: Date }): Promise<boolean> {
  const rows = await tx
    .insert(stripeEvents)
    .values({ id: event.id, type: event.type, stripeCreatedAt: event.createdAt, outcome: 'processing' })
    .onConflictDoNothing()
    .returning({ id: stripeEvents.id });
  return rows.length === 1;
}

export async function finishEvent(tx: Executor, id: string, outcome: string, organizationId: string | null) {
  await tx.update(stripeEvents).set({ outcome, organizationId }).where(eq(stripeEvents.id, id));
}

export async function findOrganizationPlan(db: Executor, organizationId: string) {
  const [row] = await db
    .select({
      id: organizations.id,
      name: organizations.name,
      planId: organizations.planId,
      customMonthlyQuotaCalls: organizations.customMonthlyQuotaCalls,
      customRatePerMinuteCalls: organizations.customRatePerMinuteCalls,
    })
    .from(organizations)
    .where(eq(organizations.id, organizationId));
  return row;
}

export async function setOrganizationPlan(db: Executor, organizationId: string, planId: string) {
  await db.update(organizations).set({ planId }).where(eq(organizations.id, organizationId));
}

/** Organizations whose grace period has run out but which have not been moved to the free plan yet. */
export async function accountsWithGraceEnded(db: Db, now: Date): Promise<string[]> {
  const rows = await db
    .select({ organizationId: billingAccounts.organizationId })
    .from(billingAccounts)
    .where(and(lte(billingAccounts.graceEndsAt, now), isNull(billingAccounts.graceExpiredAt)))
    .orderBy(asc(billingAccounts.graceEndsAt));
  return rows.map((r) => r.organizationId);
}

/** The organization's owners' addresses (for billing e-mails). */
export async function ownerEmails(db: Executor, organizationId: string): Promise<string[]> {
  const rows = await db
    .select({ email: users.email })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(and(eq(memberships.organizationId, organizationId), eq(memberships.role, 'owner')));
  return rows.map((r) => r.email);
}
