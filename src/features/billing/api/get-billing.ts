import { queryOptions, useQuery } from '@tanstack/react-query';
import { BillingOverviewSchema, type BillingOverview } from '#shared/schemas/billing.ts';
import { apiRequest } from '../../../lib/api-client.ts';
import { billingPaths } from './billing-paths.ts';

export const getBilling = () => apiRequest(billingPaths.overview, { schema: BillingOverviewSchema });

export const billingQueryOptions = () => queryOptions({ queryKey: ['billing'], queryFn: getBilling });

/** A subscription that is still in force (or can be again): not canceled or expired. */
export const hasLiveSubscription = (data: BillingOverview | undefined) =>
  Boolean(data?.subscription && !['canceled', 'incomplete_expired'].includes(data.subscription.status));

/**
 * The billing overview. After a checkout returns, `pollUntil` (a time in ms) polls every 2 s until a live
 * subscription shows up or the time has passed: the plan changes when the payment provider's webhook
 * arrives, which can take a moment after the browser is back.
 */
export const useBilling = (options: { pollUntil?: number } = {}) =>
  useQuery({
    ...billingQueryOptions(),
    refetchInterval: (query) => (options.pollUntil && Date.now() < options.pollUntil && !hasLiveSubscription(query.state.data) ? 2_000 : false),
  });
