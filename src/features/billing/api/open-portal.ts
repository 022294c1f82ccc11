import { useMutation } from '@tanstack/react-query';
import { BillingRedirectSchema } from '#shared/schemas/billing.ts';
import { apiRequest } from '../../../lib/api-client.ts';
import { billingPaths } from './billing-paths.ts';

/** Opens a billing-portal session; the answer is a short-lived, single-use address (not stored anywhere). */
export const openPortal = () => apiRequest(billingPaths.portal, { method: 'POST', schema: BillingRedirectSchema });

export function useOpenPortal() {
  return useMutation({ mutationFn: openPortal, onSuccess: ({ url }) => window.location.assign(url) });
}
