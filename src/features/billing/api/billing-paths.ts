/** The billing console API addresses (kept beside the feature until they join src/lib/api-paths.ts). */
export const billingPaths = {
  overview: '/console-api/billing',
  invoices: '/console-api/billing/invoices',
  checkout: '/console-api/billing/checkout',
  portal: '/console-api/billing/portal',
} as const;
