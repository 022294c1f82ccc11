/**
 * The console's billing contract: the organization's plan, limits and use this month, its subscription,
 * a failed payment and its grace period, the plan cards, checkout and portal redirects, and invoices. The
 * server answers with these schemas and the console parses its answers with the very same ones. Amounts
 * of money are integers in the currency's smallest unit (cents), as the payment provider counts them.
 */
import { z } from 'zod';
import { planIds, type PlanId } from '../plans.ts';

const Timestamp = z.iso.datetime({ offset: true });

export const PlanIdSchema = z.enum(planIds as [PlanId, ...PlanId[]]).meta({ id: 'PlanId', description: 'One of the plans.', example: 'builder' });

/** The plans that are paid for through checkout. */
export const paidPlanIds = planIds.filter((id) => id !== 'free') as Exclude<PlanId, 'free'>[];
export const PaidPlanIdSchema = z.enum(paidPlanIds as [Exclude<PlanId, 'free'>, ...Exclude<PlanId, 'free'>[]]).meta({
  id: 'PaidPlanId',
  description: 'A plan that is paid for monthly.',
  example: 'builder',
});

export const PlanSchema = z
  .object({
    id: PlanIdSchema,
    name: z.string().meta({ example: 'Builder' }),
    summary: z.string(),
    monthlyQuotaCalls: z.number().int().meta({ description: 'Metered calls allowed per UTC calendar month.', example: 100000 }),
    ratePerMinuteCalls: z.number().int().meta({ description: 'Calls allowed per minute.', example: 600 }),
    maxKeys: z.number().int().meta({ example: 10 }),
    maxEmbedOrigins: z.number().int().meta({ example: 10 }),
    priceUsdPerMonth: z.number().meta({ description: 'List price, US dollars per month.', example: 49 }),
  })
  .meta({ id: 'Plan', description: 'A plan: what it allows and what it costs.' });

export const SubscriptionStatusSchema = z.string().meta({
  description:
    "The payment provider's subscription status: trialing, active, past_due, unpaid, canceled, incomplete, incomplete_expired or paused (treat unknown values as not paying).",
  example: 'active',
});

export const BillingSubscriptionSchema = z
  .object({
    status: SubscriptionStatusSchema,
    planId: PlanIdSchema.nullable().meta({ description: 'The plan its price stands for; null for a price we do not sell.' }),
    cancelAtPeriodEnd: z.boolean().meta({ description: 'Set to end when the current period ends.' }),
    currentPeriodEnd: Timestamp.nullable(),
    canceledAt: Timestamp.nullable(),
  })
  .meta({ id: 'BillingSubscription' });

export const PaymentIssueSchema = z
  .object({
    failedAt: Timestamp.meta({ description: 'When a payment first failed (and has not been made good since).' }),
    graceEndsAt: Timestamp.meta({ description: 'Until then the paid plan keeps working; afterwards the organization is on the free plan until a payment succeeds.' }),
    graceExpired: z.boolean().meta({ description: 'The grace period is over and the free plan applies.' }),
  })
  .meta({ id: 'PaymentIssue', description: 'A failed payment that needs a new card or a retry in the billing portal.' });

export const BillingOverviewSchema = z
  .object({
    plan: PlanSchema.meta({ description: 'The plan the organization is on now.' }),
    limits: z.object({
      monthlyQuotaCalls: z.number().int().meta({ example: 100000 }),
      ratePerMinuteCalls: z.number().int().meta({ example: 600 }),
      custom: z.boolean().meta({ description: 'Negotiated limits override the plan’s.' }),
    }),
    usage: z.object({
      month: z.string().meta({ example: '2026-12' }),
      usedCalls: z.number().int().meta({ example: 1234 }),
      remainingCalls: z.number().int().meta({ example: 98766 }),
      resetsAt: Timestamp,
    }),
    subscription: BillingSubscriptionSchema.nullable().meta({ description: 'The subscription in force (or the newest), if any.' }),
    paymentIssue: PaymentIssueSchema.nullable(),
    canOpenPortal: z.boolean().meta({ description: 'A billing account exists, so the portal can manage the card, plan and cancellation.' }),
    plans: z.array(PlanSchema).meta({ description: 'Every plan, cheapest first, for the plan cards.' }),
  })
  .meta({ id: 'BillingOverview', description: "The organization's plan, limits, use this month, subscription and payment state." });

export const StartCheckoutInputSchema = z.strictObject({ planId: PaidPlanIdSchema }).meta({ id: 'StartCheckoutInput' });

export const BillingRedirectSchema = z
  .object({ url: z.url().meta({ description: 'Send the browser here. Short-lived and single-use: do not store or log it.', example: 'https://pay.example/checkout/cs_test_a1b2' }) })
  .meta({ id: 'BillingRedirect', description: 'Where to send the browser next.' });

export const InvoiceSchema = z
  .object({
    id: z.string().meta({ example: 'in_1a2b3c' }),
    number: z.string().nullable().meta({ example: 'OHM-0001' }),
    status: z.string().nullable().meta({ description: 'draft, open, paid, uncollectible or void.', example: 'paid' }),
    currency: z.string().meta({ example: 'usd' }),
    amountDueCents: z.number().int().meta({ example: 4900 }),
    amountPaidCents: z.number().int().meta({ example: 4900 }),
    createdAt: Timestamp,
    periodStart: Timestamp.nullable(),
    periodEnd: Timestamp.nullable(),
    hostedInvoiceUrl: z.url().nullable().meta({ description: 'The invoice page at the payment provider.' }),
  })
  .meta({ id: 'Invoice' });

export const InvoiceListSchema = z.object({ items: z.array(InvoiceSchema) }).meta({ id: 'InvoiceList', description: 'Invoices, newest first.' });

export const StripeWebhookAckSchema = z
  .object({
    received: z.literal(true),
    duplicate: z.boolean().meta({ description: 'This event id had been processed before; nothing changed.' }),
  })
  .meta({ id: 'StripeWebhookAck' });

export type PlanView = z.infer<typeof PlanSchema>;
export type BillingOverview = z.infer<typeof BillingOverviewSchema>;
export type BillingSubscription = z.infer<typeof BillingSubscriptionSchema>;
export type PaymentIssue = z.infer<typeof PaymentIssueSchema>;
export type StartCheckoutInput = z.infer<typeof StartCheckoutInputSchema>;
export type Invoice = z.infer<typeof InvoiceSchema>;
