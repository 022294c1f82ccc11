/**
 * Ohmstead's plans, defined once: the monthly call quota, the per-minute rate, how many keys and embed
 * origins an organization may hold, and the monthly price. Shown on the pricing section and in the
 * console; enforced by the metering layer. Prices are our own list prices in US dollars.
 */
export type PlanId = 'free' | 'builder' | 'scale';

export interface Plan {
  id: PlanId;
  name: string;
  monthlyQuotaCalls: number;
  ratePerMinuteCalls: number;
  maxKeys: number;
  maxEmbedOrigins: number;
  priceUsdPerMonth: number;
  summary: string;
}

export const plans: Record<PlanId, Plan> = {
  free: {
    id: 'free',
    name: 'Free',
    monthlyQuotaCalls: 1_000,
    ratePerMinuteCalls: 30,
    maxKeys: 2,
    maxEmbedOrigins: 1,
    priceUsdPerMonth: 0,
    summary: 'Try every calculation and embed one widget on one site.',
  },
  builder: {
    id: 'builder',
    name: 'Builder',
    monthlyQuotaCalls: 100_000,
    ratePerMinuteCalls: 600,
    maxKeys: 10,
    maxEmbedOrigins: 10,
    priceUsdPerMonth: 49,
    summary: 'For a retailer or installer running calculators on their own sites and tools.',
  },
  scale: {
    id: 'scale',
    name: 'Scale',
    monthlyQuotaCalls: 2_000_000,
    ratePerMinuteCalls: 6_000,
    maxKeys: 50,
    maxEmbedOrigins: 50,
    priceUsdPerMonth: 299,
    summary: 'For app makers and publishers with heavy traffic.',
  },
};

export const planIds = Object.keys(plans) as PlanId[];

export function isPlanId(value: string): value is PlanId {
  return Object.hasOwn(plans, value);
}

/** The limits an organization runs under: its plan's, unless it carries negotiated custom limits. */
export function effectiveLimits(org: { planId: string; customMonthlyQuotaCalls: number | null; customRatePerMinuteCalls: number | null }) {
  const plan = isPlanId(org.planId) ? plans[org.planId] : plans.free;
  return {
    plan,
    monthlyQuotaCalls: org.customMonthlyQuotaCalls ?? plan.monthlyQuotaCalls,
    ratePerMinuteCalls: org.customRatePerMinuteCalls ?? plan.ratePerMinuteCalls,
  };
}
