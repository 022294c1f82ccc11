/**
 * Console API for billing, mounted at /console-api (session, CSRF-protected): the billing page, invoices,
 * starting a checkout and opening the billing portal. Owners only: billing is the owner's business
 * (MemberRole), and the portal URL is a bearer credential for the organization's payment details.
 */
import { Router } from 'express';
import { BillingOverviewSchema, BillingRedirectSchema, InvoiceListSchema, StartCheckoutInputSchema } from '#shared/schemas/billing.ts';
import { parseJsonBody } from '../../http/validate.ts';
import { requestMeta } from '../auth/request-meta.ts';
import { organizationAuth, requireRole } from '../auth/session.ts';
import type { BillingService } from './billing.service.ts';

export function billingConsoleRouter(service: BillingService) {
  const router = Router();
  const ownerOnly = requireRole('owner');

  router.get('/billing', ownerOnly, async (_req, res) => {
    res.json(BillingOverviewSchema.parse(await service.overview(organizationAuth(res).organizationId)));
  });

  router.get('/billing/invoices', ownerOnly, async (_req, res) => {
    res.json(InvoiceListSchema.parse({ items: await service.listInvoices(organizationAuth(res).organizationId) }));
  });

  router.post('/billing/checkout', ownerOnly, async (req, res) => {
    const { planId } = parseJsonBody(StartCheckoutInputSchema, req);
    const auth = organizationAuth(res);
    const redirect = await service.startCheckout({
      organizationId: auth.organizationId,
      planId,
      user: { id: auth.user.id, email: auth.user.email },
      requestKey: String(req.id),
      meta: requestMeta(req),
    });
    res.status(201).json(BillingRedirectSchema.parse(redirect));
  });

  router.post('/billing/portal', ownerOnly, async (req, res) => {
    const auth = organizationAuth(res);
    const redirect = await service.openPortal({ organizationId: auth.organizationId, userId: auth.user.id, meta: requestMeta(req) });
    res.status(201).json(BillingRedirectSchema.parse(redirect));
  });

  return router;
}
