/**
 * Entitlement from subscription status, and the grace period. The statuses and their meaning are Stripe's
 * (docs.stripe.com "How subscriptions work": active/trialing grant access, past_due is retrying a failed
 * payment, unpaid means the retries are exhausted, canceled/incomplete_expired are final); the grace
 * period is our own policy on top of past_due.
 */
import { describe, expect, it } from 'vitest';
import { entitledPlan, NO_PAYMENT_ISSUE, nextPaymentState, type PaymentState } from './billing.rules.ts';

const DAY = 86_400_000;
const now = new Date('2026-12-10T12:00:00Z');
const ago = (days: number) => new Date(now.getTime() - days * DAY);

describe('entitledPlan', () => {
  it('when a subscription is active or trialing, then its plan applies', () => {
    expect(entitledPlan([{ status: 'active', planId: 'builder' }], NO_PAYMENT_ISSUE)).toBe('builder');
    expect(entitledPlan([{ status: 'trialing', planId: 'scale' }], NO_PAYMENT_ISSUE)).toBe('scale');
  });

  it('when a subscription has ended, is unpaid, incomplete or paused, then the free plan applies', () => {
    for (const status of ['canceled', 'incomplete', 'incomplete_expired', 'unpaid', 'paused', 'some_future_status']) {
      expect(entitledPlan([{ status, planId: 'scale' }], NO_PAYMENT_ISSUE), status).toBe('free');
    }
  });

  it('when past_due, then the plan applies until the grace period has expired', () => {
    const inGrace: PaymentState = { paymentFailedAt: ago(2), graceEndsAt: new Date(ago(2).getTime() + 7 * DAY), graceExpiredAt: null };
    expect(entitledPlan([{ status: 'past_due', planId: 'builder' }], inGrace)).toBe('builder');
    expect(entitledPlan([{ status: 'past_due', planId: 'builder' }], { ...inGrace, graceExpiredAt: now })).toBe('free');
  });

  it('when the price is not one we sell, then it grants nothing', () => {
    expect(entitledPlan([{ status: 'active', planId: null }], NO_PAYMENT_ISSUE)).toBe('free');
  });

  it('when several subscriptions grant plans, then the highest applies', () => {
    const subs = [
      { status: 'active', planId: 'builder' as const },
      { status: 'active', planId: 'scale' as const },
      { status: 'canceled', planId: 'scale' as const },
    ];
    expect(entitledPlan(subs, NO_PAYMENT_ISSUE)).toBe('scale');
    expect(entitledPlan([subs[0]!, subs[2]!], NO_PAYMENT_ISSUE)).toBe('builder');
  });
});

describe('nextPaymentState', () => {
  it('when a subscription falls past_due, then the grace period starts at the failure and lasts the configured days', () => {
    const s = nextPaymentState([{ status: 'past_due', planId: 'builder' }], NO_PAYMENT_ISSUE, now, 7, ago(1));
    expect(s).toEqual({ paymentFailedAt: ago(1), graceEndsAt: new Date(ago(1).getTime() + 7 * DAY), graceExpiredAt: null });
  });

  it('when the failure time is unknown or in the future, then the grace period starts now', () => {
    expect(nextPaymentState([{ status: 'past_due', planId: 'builder' }], NO_PAYMENT_ISSUE, now, 7).paymentFailedAt).toEqual(now);
    expect(nextPaymentState([{ status: 'past_due', planId: 'builder' }], NO_PAYMENT_ISSUE, now, 7, new Date(now.getTime() + DAY)).paymentFailedAt).toEqual(now);
  });

  it('when a later failure is seen, then the grace clock is not restarted', () => {
    const first = nextPaymentState([{ status: 'past_due', planId: 'builder' }], NO_PAYMENT_ISSUE, ago(3), 7, ago(3));
    const again = nextPaymentState([{ status: 'past_due', planId: 'builder' }], first, now, 7, ago(0));
    expect(again).toEqual(first);
  });

  it('when the grace period has passed, then it is marked expired and stays so while the arrears last', () => {
    const first = nextPaymentState([{ status: 'past_due', planId: 'builder' }], NO_PAYMENT_ISSUE, ago(9), 7, ago(9));
    const expired = nextPaymentState([{ status: 'past_due', planId: 'builder' }], first, now, 7);
    expect(expired.graceExpiredAt).toEqual(now);
    // Seen again with an earlier clock (another instance slightly behind): still expired.
    expect(nextPaymentState([{ status: 'past_due', planId: 'builder' }], expired, ago(3), 7).graceExpiredAt).toEqual(now);
  });

  it('when no subscription is in arrears any more (paid, or ended), then the issue is cleared', () => {
    const failing: PaymentState = { paymentFailedAt: ago(9), graceEndsAt: ago(2), graceExpiredAt: ago(2) };
    expect(nextPaymentState([{ status: 'active', planId: 'builder' }], failing, now, 7)).toEqual(NO_PAYMENT_ISSUE);
    expect(nextPaymentState([{ status: 'canceled', planId: 'builder' }], failing, now, 7)).toEqual(NO_PAYMENT_ISSUE);
  });

  it('when retries are exhausted (unpaid), then the issue is shown although no plan is granted', () => {
    const s = nextPaymentState([{ status: 'unpaid', planId: 'builder' }], NO_PAYMENT_ISSUE, now, 7, ago(20));
    expect(s.paymentFailedAt).toEqual(ago(20));
    expect(s.graceExpiredAt).toEqual(now);
    expect(entitledPlan([{ status: 'unpaid', planId: 'builder' }], s)).toBe('free');
  });

  it('when the grace period is zero days, then a failure moves to the free plan at once', () => {
    const s = nextPaymentState([{ status: 'past_due', planId: 'scale' }], NO_PAYMENT_ISSUE, now, 0, now);
    expect(entitledPlan([{ status: 'past_due', planId: 'scale' }], s)).toBe('free');
  });
});
