/**
 * Which plan an organization is entitled to, from its subscriptions and its payment state. Pure: the
 * service loads the rows, asks these functions, and writes what they say.
 *
 * Entitlement follows the subscription's status, never which event arrived last (Stripe, "Using webhooks
 * with subscriptions": derive access from `status`):
 *   - trialing, active            → the plan of the subscription's price;
 *   - past_due                    → that plan while the grace period after the first failed payment runs
 *                                   (BILLING_GRACE_DAYS), the free plan after it;
 *   - unpaid (retries exhausted), canceled, incomplete, incomplete_expired, paused → nothing.
 * Several live subscriptions (which checkout normally prevents) grant the highest of their plans.
 */
import { planIds, type PlanId } from '#shared/plans.ts';

export interface SubscriptionState {
  status: string;
  /** The plan the subscription's price stands for; null for a price we do not sell. */
  planId: PlanId | null;
}

export interface PaymentState {
  paymentFailedAt: Date | null;
  graceEndsAt: Date | null;
  /** When the grace period was found to be over; from then on a past_due subscription grants nothing. */
  graceExpiredAt: Date | null;
}

export const NO_PAYMENT_ISSUE: PaymentState = { paymentFailedAt: null, graceEndsAt: null, graceExpiredAt: null };

const PAYING = new Set(['active', 'trialing']);
const IN_ARREARS = new Set(['past_due', 'unpaid']);
/** Statuses after which a subscription can never become active again. */
export const TERMINAL_STATUSES = new Set(['canceled', 'incomplete_expired']);

const rank = (id: PlanId) => planIds.indexOf(id);

/** Whether a subscription grants its plan, given the organization's payment state. */
export function grantsPlan(sub: SubscriptionState, payment: PaymentState): sub is SubscriptionState & { planId: PlanId } {
  if (!sub.planId) return false;
  if (PAYING.has(sub.status)) return true;
  return sub.status === 'past_due' && payment.graceExpiredAt === null;
}

/** The plan an organization's subscriptions entitle it to: the highest granted, otherwise free. */
export function entitledPlan(subs: readonly SubscriptionState[], payment: PaymentState): PlanId {
  let best: PlanId = 'free';
  for (const sub of subs) if (grantsPlan(sub, payment) && rank(sub.planId) > rank(best)) best = sub.planId;
  return best;
}

/**
 * The payment state after looking at the subscriptions at `now`. A subscription in arrears starts the
 * grace clock once (at `failedAt` when the failure's own time is known, else now); the clock is not
 * restarted by later failures. When no subscription is in arrears, every trace of the failure is cleared
 * (a payment succeeded, or the subscription ended). Once `graceEndsAt` has passed, `graceExpiredAt` is set
 * and stays set until the arrears end, so a clock running slightly behind cannot lift the downgrade.
 */
export function nextPaymentState(
  subs: readonly SubscriptionState[],
  previous: PaymentState,
  now: Date,
  graceDays: number,
  failedAt?: Date,
): PaymentState {
  const inArrears = subs.some((s) => s.planId !== null && IN_ARREARS.has(s.status));
  if (!inArrears) return NO_PAYMENT_ISSUE;
  let { paymentFailedAt, graceEndsAt } = previous;
  if (!paymentFailedAt || !graceEndsAt) {
    paymentFailedAt = failedAt && failedAt < now ? failedAt : now;
    graceEndsAt = new Date(paymentFailedAt.getTime() + graceDays * 86_400_000);
  }
  const graceExpiredAt = previous.graceExpiredAt ?? (graceEndsAt <= now ? now : null);
  return { paymentFailedAt, graceEndsAt, graceExpiredAt };
}

export function samePaymentState(a: PaymentState, b: PaymentState): boolean {
  const t = (d: Date | null) => d?.getTime() ?? null;
  return t(a.paymentFailedAt) === t(b.paymentFailedAt) && t(a.graceEndsAt) === t(b.graceEndsAt) && t(a.graceExpiredAt) === t(b.graceExpiredAt);
}
