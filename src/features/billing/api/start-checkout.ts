import { useMutation } from '@tanstack/react-query';
import { BillingRedirectSchema, type StartCheckoutInput } from '#shared/schemas/billing.ts';
import { apiRequest } from '../../../lib/api-client.ts';
import { billingPaths } from './billing-paths.ts';

/** Creates a hosted checkout for a paid plan; the answer is where to send the browser. */
export const startCheckout = (input: StartCheckoutInput) => apiRequest(billingPaths.checkout, { method: 'POST', body: input, schema: BillingRedirectSchema });

/** Starts a checkout and leaves for the payment page (nothing to invalidate: the plan changes by webhook). */
export function useStartCheckout() {
  return useMutation({ mutationFn: startCheckout, onSuccess: ({ url }) => window.location.assign(url) });
}
