import { z } from 'zod';
import { BillingOverviewSchema, BillingRedirectSchema, InvoiceListSchema, StartCheckoutInputSchema, StripeWebhookAckSchema } from '#shared/schemas/billing.ts';
import { commonProblemResponses, problemResponse, registry } from '../../openapi/registry.ts';
import { registerConsolePath } from '../console/console.openapi.ts';
import { STRIPE_WEBHOOK_PATH } from './billing-webhook.routes.ts';

registerConsolePath({
  method: 'get',
  path: '/billing',
  summary: 'Billing overview',
  description:
    "The active organization's plan and effective limits, calls used this month, its subscription, a failed payment and the end of its grace period, whether the billing portal can be opened, and every plan for the plan cards.",
  access: ['owner'],
  response: { status: 200, description: 'The billing overview.', schema: BillingOverviewSchema },
});

registerConsolePath({
  method: 'get',
  path: '/billing/invoices',
  summary: 'Invoices',
  description: "The organization's invoices from the payment provider, newest first (empty before the first checkout).",
  access: ['owner'],
  response: { status: 200, description: 'Invoices.', schema: InvoiceListSchema },
});

registerConsolePath({
  method: 'post',
  path: '/billing/checkout',
  summary: 'Start a checkout for a paid plan',
  description:
    'Creates a hosted checkout for a monthly subscription to the plan and returns where to send the browser. The plan changes only when the payment provider confirms the payment (by webhook), not when the browser comes back. An organization with a subscription changes plans in the billing portal instead (409).',
  access: ['owner'],
  body: StartCheckoutInputSchema,
  response: { status: 201, description: 'The checkout was created: redirect to `url`.', schema: BillingRedirectSchema },
  problems: { 409: 'The organization already has a subscription: use the billing portal.' },
});

registerConsolePath({
  method: 'post',
  path: '/billing/portal',
  summary: 'Open the billing portal',
  description: "Creates a billing-portal session for the organization's billing account (card, plan changes, cancellation, invoices) and returns where to send the browser.",
  access: ['owner'],
  response: { status: 201, description: 'The portal session was created: redirect to `url`.', schema: BillingRedirectSchema },
  problems: { 409: 'There is no billing account yet: start a checkout first.' },
});

registry.registerPath({
  method: 'post',
  path: STRIPE_WEBHOOK_PATH,
  tags: ['Billing'],
  summary: 'Payment provider events (Stripe webhook)',
  description:
    'Where Stripe delivers subscription, invoice and checkout events. Not for API clients: the `Stripe-Signature` header (HMAC-SHA256 over the raw body with the endpoint\'s signing secret) is the authentication. Each event id is processed once; a repeated delivery answers 200 with `duplicate: true` and changes nothing.',
  security: [],
  request: {
    headers: z.object({ 'Stripe-Signature': z.string().meta({ description: 'Stripe\'s signature header: `t=<unix time>,v1=<hex HMAC>`.', example: 't=1796190481,v1=5257a869e7ecebeda32affa62cdca3fa51cad7e77a0e56ff536d0ce8e108d8bd' }) }),
    body: { required: true, content: { 'application/json': { schema: z.object({ id: z.string(), type: z.string() }).catchall(z.unknown()).meta({ id: 'StripeEvent', description: 'A Stripe event object.' }) } } },
  },
  responses: {
    200: { description: 'Received (and processed, or recognized as a duplicate).', content: { 'application/json': { schema: StripeWebhookAckSchema } } },
    400: problemResponse('The body is not a Stripe event, or the signature is missing or does not verify.'),
    413: commonProblemResponses[413],
    500: commonProblemResponses[500],
    503: problemResponse('The payment provider could not be reached to confirm the event; Stripe delivers it again later.'),
  },
});
