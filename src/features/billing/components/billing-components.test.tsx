/**
 * The billing components rendered to HTML (react-dom/server): the pricing section shows every plan exactly
 * as shared/plans.ts defines it, and the failed-payment banner says when the grace period ends, in the
 * right urgency, with the way to fix it.
 */
import { renderToStaticMarkup } from 'react-dom/server';
import { describe, expect, it } from 'vitest';
import { planIds, plans } from '#shared/plans.ts';
import { hasLiveSubscription } from '../api/get-billing.ts';
import { formatCount, formatMoney } from './format.ts';
import { PaymentBanner } from './payment-banner.tsx';
import { PricingSection } from './pricing-section.tsx';

describe('PricingSection', () => {
  it('when rendered, then every plan appears with its price and limits from shared/plans.ts, under a labelled section', () => {
    const html = renderToStaticMarkup(<PricingSection />);
    expect(html).toContain('aria-labelledby="pricing-title"');
    for (const id of planIds) {
      const plan = plans[id];
      expect(html).toContain(`>${plan.name}</h3>`);
      expect(html).toContain(`>$${formatCount(plan.priceUsdPerMonth)}</span>`);
      for (const n of [plan.monthlyQuotaCalls, plan.ratePerMinuteCalls, plan.maxKeys, plan.maxEmbedOrigins]) expect(html).toContain(`>${formatCount(n)}</dd>`);
    }
    expect(html.match(/<li /g)).toHaveLength(planIds.length);
  });
});

describe('PaymentBanner', () => {
  const issue = { failedAt: '2026-12-02T10:00:00.000Z', graceEndsAt: '2026-12-09T10:00:00.000Z', graceExpired: false };

  it('when there is no payment issue, then nothing is shown', () => {
    expect(renderToStaticMarkup(<PaymentBanner issue={null} planName="Builder" onFix={() => undefined} busy={false} />)).toBe('');
  });

  it('when the grace period runs, then a status names the plan and the end of the grace period and offers the fix', () => {
    const html = renderToStaticMarkup(<PaymentBanner issue={issue} planName="Builder" onFix={() => undefined} busy={false} />);
    expect(html).toContain('role="status"');
    expect(html).toContain('Your Builder plan keeps working until');
    expect(html).toContain('dateTime="2026-12-09T10:00:00.000Z"');
    expect(html).toContain('Update the card or retry');
  });

  it('when the grace period has ended, then an alert says the free plan applies', () => {
    const html = renderToStaticMarkup(<PaymentBanner issue={{ ...issue, graceExpired: true }} planName="Builder" onFix={() => undefined} busy={false} />);
    expect(html).toContain('role="alert"');
    expect(html).toContain('the organization is on the free plan');
  });
});

describe('helpers', () => {
  it('when money is formatted, then whole amounts drop the cents and others keep two digits', () => {
    expect(formatMoney(4900)).toBe('$49');
    expect(formatMoney(4950)).toBe('$49.50');
    expect(formatMoney(29900, 'usd')).toBe('$299');
  });

  it('when a subscription has ended, then it is not live', () => {
    const base = { planId: 'builder' as const, cancelAtPeriodEnd: false, currentPeriodEnd: null, canceledAt: null };
    const overview = (status: string | null) => ({ subscription: status ? { ...base, status } : null }) as Parameters<typeof hasLiveSubscription>[0];
    expect(hasLiveSubscription(overview('active'))).toBe(true);
    expect(hasLiveSubscription(overview('past_due'))).toBe(true);
    expect(hasLiveSubscription(overview('canceled'))).toBe(false);
    expect(hasLiveSubscription(overview(null))).toBe(false);
  });
});
