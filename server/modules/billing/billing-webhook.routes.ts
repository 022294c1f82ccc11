/**
 * POST /v1/webhooks/stripe: where Stripe delivers events. Mounted before express.json() so the handler
 * gets the exact bytes Stripe signed (a re-serialized body would not verify). No API key or session: the
 * signature is the authentication. A bad signature is 400 and changes nothing; a processing failure is a
 * 5xx, which makes Stripe deliver again; a duplicate is 200 and changes nothing.
 */
import express, { Router } from 'express';
import { StripeWebhookAckSchema } from '#shared/schemas/billing.ts';
import type { BillingService } from './billing.service.ts';

export const STRIPE_WEBHOOK_PATH = '/v1/webhooks/stripe';

export function billingWebhookRouter(service: BillingService) {
  const router = Router();
  router.post(STRIPE_WEBHOOK_PATH, express.raw({ type: ['application/json', 'application/*+json'], limit: '1mb' }), async (req, res) => {
    const event = service.verifyEvent(req.body, req.get('stripe-signature'));
    const { duplicate } = await service.handleEvent(event);
    res.json(StripeWebhookAckSchema.parse({ received: true, duplicate }));
  });
  return router;
}
