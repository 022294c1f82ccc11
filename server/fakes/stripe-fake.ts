/**
 * A local, stateful, Stripe-shaped HTTP server for development and tests. The real Stripe SDK talks to it
 * through its `host` / `port` / `protocol` settings; nothing in the Ohmstead server knows the difference.
 *
 * What it implements is only what Ohmstead calls, with the object shapes of the pinned API version:
 *   POST /v1/customers · GET /v1/customers/:id
 *   POST /v1/checkout/sessions · GET /v1/checkout/sessions/:id
 *   GET /v1/subscriptions · GET /v1/subscriptions/:id · POST /v1/subscriptions/:id · DELETE /v1/subscriptions/:id
 *   POST /v1/billing_portal/sessions
 *   GET /v1/invoices · GET /v1/invoices/:id · GET /v1/prices/:id
 * Requests are application/x-www-form-urlencoded with bracketed keys (`line_items[0][price]`), parsed
 * qs-style; `Idempotency-Key` replays the first answer (a different body under the same key is an error);
 * errors have Stripe's `{ error: { type, code, message, param } }` shape.
 *
 * It also serves plain pages of its own design where a person (or a test) acts as the customer:
 *   /checkout/:id  a hosted checkout: a test card number pays or is declined;
 *   /portal/:id    a billing portal: change plan, cancel or resume, update the card, and test controls
 *                  that bill the next period now (what a real account does on its own a month later);
 *   /invoices/:id  a hosted invoice.
 * Each change produces the events Stripe would (customer.subscription.created/updated/deleted,
 * invoice.paid, invoice.payment_failed, checkout.session.completed), signed with the webhook secret
 * exactly as Stripe signs them (`t=<unix>,v1=<HMAC-SHA256(secret, "t.payload")>`) and POSTed to the
 * configured webhook URL in order, with a few retries.
 *
 * Test cards (our own choice of meaning, using the numbers test-mode payment systems reserve):
 *   4242 4242 4242 4242  pays, now and at every renewal;
 *   4000 0000 0000 0002  is declined;
 *   4000 0000 0000 0341  is accepted as the card on file, but every charge to it fails.
 * Any other number is refused as not a test card.
 *
 * Development and tests only: it keeps everything in memory and moves no money.
 */
import express, { type NextFunction, type Request, type Response } from 'express';
import { createHash, randomBytes } from 'node:crypto';
import { existsSync, mkdirSync, readFileSync, renameSync, writeFileSync } from 'node:fs';
import type { Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { dirname } from 'node:path';
import Stripe from 'stripe';
import { plans } from '#shared/plans.ts';
import type { Env } from '../env.ts';
import { STRIPE_API_VERSION } from '../modules/billing/stripe-client.ts';

export interface FakePrice {
  id: string;
  /** What the customer sees on the pages, e.g. "Builder". */
  nickname: string;
  unitAmountCents: number;
  currency?: string;
}

/** Our paid plans as the fake's prices, under the price ids both sides are configured with. */
export function planPrices(priceIds: { builder: string; scale: string }): FakePrice[] {
  return (['builder', 'scale'] as const).map((id) => ({ id: priceIds[id], nickname: plans[id].name, unitAmountCents: Math.round(plans[id].priceUsdPerMonth * 100) }));
}

export interface StripeFakeOptions {
  /** Where to listen (default 127.0.0.1 and a free port). */
  host?: string;
  port?: number;
  /** The secret key the API accepts (Authorization: Bearer …). */
  secretKey: string;
  /** The signing secret of the webhook endpoint (whsec_…). */
  webhookSecret: string;
  /** Where events are delivered; null keeps them in `events` only (deliver them with `deliver`). */
  webhookUrl?: string | null;
  prices: FakePrice[];
  /** The API version stamped on events (the version the webhook endpoint is pinned to). */
  apiVersion?: string;
  /** The fake's clock, in ms (default Date.now): `created`, periods and renewals follow it. */
  clock?: () => number;
  /** Delivery attempts per event and the pause between them. */
  deliveryAttempts?: number;
  retryDelayMs?: number;
  /** Called for each delivery attempt (for logs). */
  onDelivery?: (d: Delivery) => void;
  /** Development: keep customers, subscriptions and invoices in this JSON file across restarts. */
  stateFile?: string;
}

export interface Delivery {
  eventId: string;
  type: string;
  attempt: number;
  status: number | 'error';
  url: string;
}

export interface FakeEvent {
  id: string;
  object: 'event';
  api_version: string;
  created: number;
  data: { object: Record<string, unknown>; previous_attributes?: Record<string, unknown> };
  livemode: false;
  pending_webhooks: number;
  request: { id: string | null; idempotency_key: string | null };
  type: string;
}

type Obj = Record<string, unknown>;

interface Card {
  number: string;
  last4: string;
  /** Whether charges to it succeed. */
  charges: boolean;
}

export const TEST_CARDS = {
  pays: '4242424242424242',
  declined: '4000000000000002',
  failsLater: '4000000000000341',
} as const;

class FakeError extends Error {
  constructor(
    readonly status: number,
    readonly type: string,
    message: string,
    readonly param?: string,
    readonly code?: string,
  ) {
    super(message);
  }
}

const newestInvoiceFirst = (a: Record<string, unknown>, b: Record<string, unknown>) =>
  Number(b.created) - Number(a.created) || String(b.number).localeCompare(String(a.number));
const newId = (prefix: string) => `${prefix}_${randomBytes(18).toString('base64url').replace(/[-_]/g, '').slice(0, 24)}`;
const clone = <T>(v: T): T => structuredClone(v);

function addMonthsUtc(unixS: number, months: number): number {
  const d = new Date(unixS * 1000);
  const day = d.getUTCDate();
  const target = new Date(Date.UTC(d.getUTCFullYear(), d.getUTCMonth() + months, 1, d.getUTCHours(), d.getUTCMinutes(), d.getUTCSeconds()));
  // Clamp to the last day of the target month (31 Jan + 1 month = 28/29 Feb), as calendar billing does.
  const lastDay = new Date(Date.UTC(target.getUTCFullYear(), target.getUTCMonth() + 1, 0)).getUTCDate();
  target.setUTCDate(Math.min(day, lastDay));
  return Math.floor(target.getTime() / 1000);
}

function cardFrom(input: unknown): Card | FakeError {
  const number = String(input ?? '').replace(/[\s-]/g, '');
  if (!/^\d{12,19}$/.test(number)) return new FakeError(400, 'card_error', 'Enter a card number: 12 to 19 digits.', 'card', 'invalid_number');
  if (number === TEST_CARDS.declined) return new FakeError(402, 'card_error', 'The card was declined.', 'card', 'card_declined');
  if (number === TEST_CARDS.pays) return { number, last4: number.slice(-4), charges: true };
  if (number === TEST_CARDS.failsLater) return { number, last4: number.slice(-4), charges: false };
  return new FakeError(400, 'card_error', 'Not a test card: use one of the test numbers listed on this page.', 'card', 'invalid_number');
}

const escapeHtml = (s: unknown) =>
  String(s ?? '').replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);

const money = (cents: number, currency = 'usd') => `${currency === 'usd' ? '$' : `${currency.toUpperCase()} `}${(cents / 100).toFixed(2)}`;
const day = (unixS: number | null | undefined) => (unixS ? new Date(unixS * 1000).toISOString().slice(0, 10) : '—');

function page(title: string, body: string): string {
  return `<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<title>${escapeHtml(title)}</title>
<style>
  :root { color-scheme: light; --ink: #23262b; --muted: #5b6068; --line: #c9ced6; --panel: #ffffff; --bg: #eef1f5; --accent: #2d5f8b; --bad: #9b1c1c; --good: #1d6b3a; }
  * { box-sizing: border-box; }
  body { margin: 0; background: var(--bg); color: var(--ink); font: 16px/1.5 system-ui, sans-serif; }
  header { background: #2f3640; color: #fff; padding: .75rem 1.25rem; font-size: .9rem; }
  header strong { letter-spacing: .04em; }
  main { max-width: 34rem; margin: 2rem auto; padding: 0 1rem; }
  section { background: var(--panel); border: 1px solid var(--line); border-radius: 6px; padding: 1.25rem; margin-bottom: 1rem; }
  h1 { font-size: 1.35rem; margin: 0 0 .5rem; } h2 { font-size: 1.05rem; margin: 0 0 .5rem; }
  dl { display: grid; grid-template-columns: auto 1fr; gap: .25rem 1rem; margin: 0; } dt { color: var(--muted); } dd { margin: 0; font-variant-numeric: tabular-nums; }
  label { display: block; font-weight: 600; margin: .75rem 0 .25rem; }
  input[type=text], select { width: 100%; padding: .55rem .6rem; font: inherit; border: 1px solid #8a919c; border-radius: 4px; }
  button { margin-top: .9rem; padding: .55rem 1rem; font: inherit; font-weight: 600; border-radius: 4px; border: 1px solid var(--accent); background: var(--accent); color: #fff; cursor: pointer; min-height: 2.5rem; }
  button.secondary { background: #fff; color: var(--accent); }
  :focus-visible { outline: 3px solid #e0a100; outline-offset: 2px; }
  .error { color: var(--bad); font-weight: 600; } .ok { color: var(--good); font-weight: 600; }
  .note { color: var(--muted); font-size: .9rem; } ul.cards { padding-left: 1.2rem; margin: .25rem 0 0; } code { font-size: .95em; }
  a { color: var(--accent); }
</style>
</head>
<body>
<header><strong>LOCAL TEST PAYMENTS</strong> · a development stand-in: no real card is charged</header>
<main>${body}</main>
</body>
</html>`;
}

const testCardList = `<ul class="cards">
  <li><code>4242 4242 4242 4242</code> pays, now and at every renewal</li>
  <li><code>4000 0000 0000 0002</code> is declined</li>
  <li><code>4000 0000 0000 0341</code> is kept on file, but every charge to it fails</li>
</ul>`;

export interface StripeFake {
  /** Base URL of the fake (API and pages), e.g. http://127.0.0.1:12111. */
  url: string;
  host: string;
  port: number;
  /** Every event generated, oldest first. */
  events: FakeEvent[];
  deliveries: Delivery[];
  setWebhookUrl(url: string | null): void;
  /** Resolves when every queued delivery has finished (all attempts). */
  settle(): Promise<void>;
  /** Signs and POSTs one event (again) to a URL (default: the configured webhook URL); returns the status. */
  deliver(event: FakeEvent, url?: string): Promise<number>;
  /** The body and Stripe-Signature header Stripe would send for an event. */
  sign(event: FakeEvent | Obj, timestampS?: number): { payload: string; header: string };
  /** Bills a subscription's next period now, charging the card on file (what happens a month later). */
  renew(subscriptionId: string): void;
  /** Makes a card the customer's card on file (as the portal's "update card" does, without the payment retry). */
  setCard(customerId: string, cardNumber: string): void;
  subscription(id: string): Obj | undefined;
  close(): Promise<void>;
}

export async function startStripeFake(options: StripeFakeOptions): Promise<StripeFake> {
  const apiVersion = options.apiVersion ?? STRIPE_API_VERSION;
  const clockMs = options.clock ?? Date.now;
  const nowS = () => Math.floor(clockMs() / 1000);
  const attempts = Math.max(1, options.deliveryAttempts ?? 3);
  const retryDelayMs = options.retryDelayMs ?? 250;
  let webhookUrl = options.webhookUrl ?? null;
  let baseUrl = '';

  const prices = new Map(options.prices.map((p) => [p.id, p]));
  const customers = new Map<string, Obj>();
  const cards = new Map<string, Card>();
  const sessions = new Map<string, Obj>();
  const subscriptions = new Map<string, Obj>();
  const invoices = new Map<string, Obj>();
  const portalSessions = new Map<string, Obj>();
  const idempotency = new Map<string, { fingerprint: string; status: number; body: unknown }>();
  const events: FakeEvent[] = [];
  const deliveries: Delivery[] = [];
  let invoiceCounter = 0;
  let queue: Promise<void> = Promise.resolve();

  // ---------------------------------------------------------------- optional persistence (development)
  const stores = { customers, cards, sessions, subscriptions, invoices, portalSessions } as Record<string, Map<string, unknown>>;
  if (options.stateFile && existsSync(options.stateFile)) {
    const saved = JSON.parse(readFileSync(options.stateFile, 'utf8')) as { invoiceCounter?: number; stores?: Record<string, Array<[string, unknown]>> };
    for (const [name, entries] of Object.entries(saved.stores ?? {})) for (const [k, v] of entries) stores[name]?.set(k, v);
    invoiceCounter = saved.invoiceCounter ?? 0;
  }
  function persist() {
    if (!options.stateFile) return;
    mkdirSync(dirname(options.stateFile), { recursive: true });
    const data = { invoiceCounter, stores: Object.fromEntries(Object.entries(stores).map(([name, map]) => [name, [...map.entries()]])) };
    writeFileSync(`${options.stateFile}.tmp`, JSON.stringify(data));
    renameSync(`${options.stateFile}.tmp`, options.stateFile);
  }

  // ---------------------------------------------------------------- objects
  function priceObject(p: FakePrice): Obj {
    return {
      id: p.id,
      object: 'price',
      active: true,
      currency: p.currency ?? 'usd',
      nickname: p.nickname,
      product: `prod_${p.id.replace(/^price_/, '')}`,
      recurring: { interval: 'month', interval_count: 1, usage_type: 'licensed' },
      type: 'recurring',
      unit_amount: p.unitAmountCents,
      livemode: false,
    };
  }

  function requirePrice(id: unknown, param: string): FakePrice {
    const p = prices.get(String(id ?? ''));
    if (!p) throw new FakeError(400, 'invalid_request_error', `No such price: '${String(id ?? '')}'`, param, 'resource_missing');
    return p;
  }

  function requireCustomer(id: unknown, param = 'customer'): Obj {
    const c = customers.get(String(id ?? ''));
    if (!c) throw new FakeError(404, 'invalid_request_error', `No such customer: '${String(id ?? '')}'`, param, 'resource_missing');
    return c;
  }

  function requireSubscription(id: string): Obj {
    const s = subscriptions.get(id);
    if (!s) throw new FakeError(404, 'invalid_request_error', `No such subscription: '${id}'`, 'id', 'resource_missing');
    return s;
  }

  function list(url: string, items: Obj[], query: Obj): Obj {
    const limit = Math.min(100, Math.max(1, Number(query.limit ?? 10) || 10));
    let start = 0;
    if (query.starting_after) {
      const i = items.findIndex((x) => x.id === query.starting_after);
      start = i < 0 ? items.length : i + 1;
    }
    const data = items.slice(start, start + limit);
    return { object: 'list', data: clone(data), has_more: start + limit < items.length, url };
  }

  // ---------------------------------------------------------------- events and delivery
  function emit(type: string, object: Obj, previous?: Obj): FakeEvent {
    const event: FakeEvent = {
      id: newId('evt'),
      object: 'event',
      api_version: apiVersion,
      created: nowS(),
      data: { object: clone(object), ...(previous ? { previous_attributes: clone(previous) } : {}) },
      livemode: false,
      pending_webhooks: webhookUrl ? 1 : 0,
      request: { id: null, idempotency_key: null },
      type,
    };
    events.push(event);
    if (webhookUrl) {
      const url = webhookUrl;
      queue = queue.then(() => deliverWithRetries(event, url));
    }
    return event;
  }

  function sign(event: FakeEvent | Obj, timestampS = Math.floor(Date.now() / 1000)) {
    const payload = JSON.stringify(event, null, 2);
    // The signature scheme Stripe documents and its SDK verifies; the timestamp is the real time of sending.
    const header = Stripe.webhooks.generateTestHeaderString({ payload, secret: options.webhookSecret, timestamp: timestampS });
    return { payload, header };
  }

  async function deliverOnce(event: FakeEvent, url: string): Promise<number> {
    const { payload, header } = sign(event);
    const response = await fetch(url, {
      method: 'POST',
      headers: { 'Content-Type': 'application/json; charset=utf-8', 'Stripe-Signature': header, 'User-Agent': 'Stripe/1.0 (+local test fake)' },
      body: payload,
      signal: AbortSignal.timeout(15_000),
    });
    await response.arrayBuffer();
    return response.status;
  }

  async function deliverWithRetries(event: FakeEvent, url: string): Promise<void> {
    for (let attempt = 1; attempt <= attempts; attempt++) {
      let status: number | 'error';
      try {
        status = await deliverOnce(event, url);
      } catch {
        status = 'error';
      }
      const record = { eventId: event.id, type: event.type, attempt, status, url };
      deliveries.push(record);
      options.onDelivery?.(record);
      if (typeof status === 'number' && status >= 200 && status < 300) return;
      if (attempt < attempts) await new Promise((r) => setTimeout(r, retryDelayMs * attempt));
    }
  }

  // ---------------------------------------------------------------- billing behaviour
  function newInvoice(sub: Obj, reason: string, periodStart: number, periodEnd: number): Obj {
    const item = (sub.items as { data: Obj[] }).data[0]!;
    const price = item.price as Obj;
    invoiceCounter += 1;
    const id = newId('in');
    const invoice: Obj = {
      id,
      object: 'invoice',
      customer: sub.customer,
      number: `OHMTEST-${String(invoiceCounter).padStart(4, '0')}`,
      status: 'open',
      currency: price.currency,
      amount_due: price.unit_amount,
      amount_paid: 0,
      amount_remaining: price.unit_amount,
      subtotal: price.unit_amount,
      total: price.unit_amount,
      attempt_count: 0,
      attempted: false,
      billing_reason: reason,
      collection_method: 'charge_automatically',
      created: nowS(),
      period_start: periodStart,
      period_end: periodEnd,
      hosted_invoice_url: `${baseUrl}/invoices/${id}`,
      invoice_pdf: null,
      parent: { type: 'subscription_details', quote_details: null, subscription_details: { subscription: sub.id, metadata: clone(sub.metadata ?? {}) } },
      lines: {
        object: 'list',
        data: [
          {
            id: newId('il'),
            object: 'line_item',
            amount: price.unit_amount,
            currency: price.currency,
            description: `1 × ${String(price.nickname)} (monthly)`,
            period: { start: periodStart, end: periodEnd },
            quantity: 1,
            pricing: { type: 'price_details', price_details: { price: price.id, product: price.product } },
          },
        ],
        has_more: false,
        url: `/v1/invoices/${id}/lines`,
      },
      status_transitions: { finalized_at: nowS(), paid_at: null },
      livemode: false,
    };
    invoices.set(id, invoice);
    sub.latest_invoice = id;
    return invoice;
  }

  /** Charges an open invoice to the customer's card on file; returns whether it was paid. */
  function chargeInvoice(invoice: Obj): boolean {
    const card = cards.get(String(invoice.customer));
    invoice.attempt_count = Number(invoice.attempt_count) + 1;
    invoice.attempted = true;
    if (card?.charges) {
      invoice.status = 'paid';
      invoice.amount_paid = invoice.amount_due;
      invoice.amount_remaining = 0;
      (invoice.status_transitions as Obj).paid_at = nowS();
      return true;
    }
    return false;
  }

  function subscriptionObject(customerId: string, price: FakePrice, metadata: Obj): Obj {
    const start = nowS();
    const end = addMonthsUtc(start, 1);
    const id = newId('sub');
    return {
      id,
      object: 'subscription',
      customer: customerId,
      status: 'incomplete',
      currency: price.currency ?? 'usd',
      collection_method: 'charge_automatically',
      cancel_at_period_end: false,
      cancel_at: null,
      canceled_at: null,
      ended_at: null,
      cancellation_details: { comment: null, feedback: null, reason: null },
      created: start,
      start_date: start,
      billing_cycle_anchor: start,
      latest_invoice: null,
      default_payment_method: null,
      metadata: clone(metadata),
      items: {
        object: 'list',
        data: [
          {
            id: newId('si'),
            object: 'subscription_item',
            created: start,
            current_period_start: start,
            current_period_end: end,
            price: priceObject(price),
            quantity: 1,
            subscription: id,
            metadata: {},
          },
        ],
        has_more: false,
        url: `/v1/subscription_items?subscription=${id}`,
      },
      livemode: false,
    };
  }

  const itemOf = (sub: Obj) => (sub.items as { data: Obj[] }).data[0]!;

  function completeCheckout(session: Obj, card: Card) {
    const customerId = String(session.customer);
    cards.set(customerId, card);
    const customer = customers.get(customerId)!;
    const pm = newId('pm');
    (customer.invoice_settings as Obj).default_payment_method = pm;
    const lineItems = session._line_items as Array<{ price: string }>;
    const price = requirePrice(lineItems[0]?.price, 'line_items[0][price]');
    const sub = subscriptionObject(customerId, price, (session._subscription_metadata as Obj) ?? {});
    sub.default_payment_method = pm;
    subscriptions.set(String(sub.id), sub);
    const item = itemOf(sub);
    const invoice = newInvoice(sub, 'subscription_create', Number(item.current_period_start), Number(item.current_period_end));
    const paid = chargeInvoice(invoice);
    if (!paid) {
      // Checkout only completes on a successful first payment; the card was checked before this point.
      throw new FakeError(402, 'card_error', 'The card was declined.', 'card', 'card_declined');
    }
    sub.status = 'active';
    session.status = 'complete';
    session.payment_status = 'paid';
    session.subscription = sub.id;
    session.invoice = invoice.id;
    session.url = null;
    emit('customer.subscription.created', sub);
    emit('invoice.paid', invoice);
    emit('checkout.session.completed', publicSession(session));
  }

  function updateSubscription(sub: Obj, changes: { price?: FakePrice; cancelAtPeriodEnd?: boolean; metadata?: Obj }) {
    const previous: Obj = {};
    const item = itemOf(sub);
    if (changes.price && (item.price as Obj).id !== changes.price.id) {
      previous.items = clone(sub.items);
      item.price = priceObject(changes.price);
    }
    if (changes.cancelAtPeriodEnd !== undefined && changes.cancelAtPeriodEnd !== sub.cancel_at_period_end) {
      previous.cancel_at_period_end = sub.cancel_at_period_end;
      previous.cancel_at = sub.cancel_at;
      sub.cancel_at_period_end = changes.cancelAtPeriodEnd;
      sub.cancel_at = changes.cancelAtPeriodEnd ? item.current_period_end : null;
    }
    if (changes.metadata) {
      previous.metadata = clone(sub.metadata);
      sub.metadata = { ...(sub.metadata as Obj), ...changes.metadata };
    }
    if (Object.keys(previous).length) emit('customer.subscription.updated', sub, previous);
  }

  function cancelNow(sub: Obj, reason = 'cancellation_requested') {
    if (sub.status === 'canceled') throw new FakeError(400, 'invalid_request_error', `This subscription is already canceled: '${String(sub.id)}'`);
    sub.status = 'canceled';
    sub.canceled_at = nowS();
    sub.ended_at = nowS();
    sub.cancellation_details = { comment: null, feedback: null, reason };
    for (const inv of invoices.values()) {
      if ((inv.parent as Obj | null)?.subscription_details && ((inv.parent as Obj).subscription_details as Obj).subscription === sub.id && inv.status === 'open') {
        inv.status = 'void';
      }
    }
    emit('customer.subscription.deleted', sub);
  }

  function openInvoiceOf(sub: Obj): Obj | undefined {
    const latest = sub.latest_invoice ? invoices.get(String(sub.latest_invoice)) : undefined;
    return latest?.status === 'open' ? latest : undefined;
  }

  function retryOpenInvoice(sub: Obj) {
    const invoice = openInvoiceOf(sub);
    if (!invoice) return;
    if (chargeInvoice(invoice)) {
      emit('invoice.paid', invoice);
      if (sub.status !== 'active') {
        const previous = { status: sub.status };
        sub.status = 'active';
        emit('customer.subscription.updated', sub, previous);
      }
    } else {
      emit('invoice.payment_failed', invoice);
    }
  }

  /** The next billing period: end a subscription set to cancel, or invoice and charge the card on file. */
  function renew(subscriptionId: string) {
    const sub = requireSubscription(subscriptionId);
    if (sub.status === 'canceled' || sub.status === 'incomplete_expired') throw new FakeError(400, 'invalid_request_error', 'This subscription has ended.');
    if (sub.status === 'past_due' && openInvoiceOf(sub)) {
      // A real account retries the open invoice on a schedule; here each renewal is one more attempt.
      retryOpenInvoice(sub);
      return;
    }
    if (sub.cancel_at_period_end) {
      cancelNow(sub, 'cancellation_requested');
      return;
    }
    const item = itemOf(sub);
    const previous: Obj = { items: clone(sub.items), latest_invoice: sub.latest_invoice };
    const start = Number(item.current_period_end);
    const end = addMonthsUtc(start, 1);
    item.current_period_start = start;
    item.current_period_end = end;
    const invoice = newInvoice(sub, 'subscription_cycle', start, end);
    if (chargeInvoice(invoice)) {
      emit('invoice.paid', invoice);
      emit('customer.subscription.updated', sub, previous);
    } else {
      previous.status = sub.status;
      sub.status = 'past_due';
      emit('invoice.payment_failed', invoice);
      emit('customer.subscription.updated', sub, previous);
    }
  }

  function publicSession(s: Obj): Obj {
    const { _line_items: _l, _subscription_metadata: _m, ...rest } = s;
    return clone(rest);
  }

  // ---------------------------------------------------------------- the HTTP server
  const app = express();
  app.disable('x-powered-by');
  app.set('query parser', 'extended');
  app.use(express.urlencoded({ extended: true, limit: '200kb', parameterLimit: 2000 }));
  app.use((req, res, next) => {
    if (req.method !== 'GET') res.on('finish', persist);
    next();
  });

  const api = express.Router();
  api.use((req, res, next) => {
    res.setHeader('Request-Id', newId('req'));
    res.setHeader('Stripe-Version', String(req.get('stripe-version') ?? apiVersion));
    const auth = req.get('authorization') ?? '';
    const key = auth.startsWith('Bearer ') ? auth.slice(7) : '';
    if (key !== options.secretKey) {
      const shown = key ? `${key.slice(0, 8)}${'*'.repeat(Math.max(0, key.length - 12))}${key.slice(-4)}` : '';
      throw new FakeError(401, 'invalid_request_error', key ? `Invalid API Key provided: ${shown}` : 'You did not provide an API key.');
    }
    // Idempotency-Key: the first answer is replayed; the same key with other parameters is refused.
    const idemKey = req.get('idempotency-key');
    if (req.method === 'POST' && idemKey) {
      const slot = `${req.path} ${idemKey}`;
      const fingerprint = createHash('sha256').update(JSON.stringify(req.body ?? {})).digest('hex');
      const seen = idempotency.get(slot);
      if (seen) {
        if (seen.fingerprint !== fingerprint) {
          throw new FakeError(
            400,
            'idempotency_error',
            `Keys for idempotent requests can only be used with the same parameters they were first used with. Try using a key other than '${idemKey}' if you meant to execute a different request.`,
          );
        }
        res.setHeader('Idempotent-Replayed', 'true');
        res.status(seen.status).json(seen.body);
        return;
      }
      const json = res.json.bind(res);
      res.json = (body: unknown) => {
        if (res.statusCode < 500) idempotency.set(slot, { fingerprint, status: res.statusCode, body });
        return json(body);
      };
    }
    next();
  });

  api.post('/customers', (req, res) => {
    const b = req.body as Obj;
    const id = newId('cus');
    const customer: Obj = {
      id,
      object: 'customer',
      created: nowS(),
      email: b.email ?? null,
      name: b.name ?? null,
      description: b.description ?? null,
      metadata: (b.metadata as Obj) ?? {},
      balance: 0,
      currency: null,
      delinquent: false,
      invoice_settings: { default_payment_method: null, custom_fields: null, footer: null, rendering_options: null },
      livemode: false,
    };
    customers.set(id, customer);
    res.json(customer);
  });

  api.get('/customers/:id', (req, res) => {
    res.json(requireCustomer(req.params.id, 'id'));
  });

  api.post('/checkout/sessions', (req, res) => {
    const b = req.body as Obj;
    if (b.mode !== 'subscription') throw new FakeError(400, 'invalid_request_error', 'This server supports mode=subscription only.', 'mode');
    if (typeof b.success_url !== 'string' || !/^https?:\/\//.test(b.success_url)) {
      throw new FakeError(400, 'invalid_request_error', 'Missing required param: success_url.', 'success_url', 'parameter_missing');
    }
    const lineItems = Array.isArray(b.line_items) ? (b.line_items as Obj[]) : [];
    if (lineItems.length !== 1) throw new FakeError(400, 'invalid_request_error', 'Pass exactly one line item (one recurring price).', 'line_items');
    const price = requirePrice(lineItems[0]!.price, 'line_items[0][price]');
    if (String(lineItems[0]!.quantity ?? '1') !== '1') throw new FakeError(400, 'invalid_request_error', 'Quantity must be 1.', 'line_items[0][quantity]');
    if (b.customer) requireCustomer(b.customer);
    const id = `cs_test_${randomBytes(24).toString('base64url').replace(/[-_]/g, '').slice(0, 40)}`;
    const created = nowS();
    const session: Obj = {
      id,
      object: 'checkout.session',
      mode: 'subscription',
      status: 'open',
      payment_status: 'unpaid',
      customer: b.customer ?? null,
      customer_email: b.customer_email ?? null,
      client_reference_id: b.client_reference_id ?? null,
      success_url: String(b.success_url).replaceAll('{CHECKOUT_SESSION_ID}', id),
      cancel_url: typeof b.cancel_url === 'string' ? b.cancel_url : null,
      url: `${baseUrl}/checkout/${id}`,
      subscription: null,
      invoice: null,
      metadata: (b.metadata as Obj) ?? {},
      amount_subtotal: price.unitAmountCents,
      amount_total: price.unitAmountCents,
      currency: price.currency ?? 'usd',
      created,
      expires_at: created + 24 * 3600,
      livemode: false,
      _line_items: [{ price: price.id }],
      _subscription_metadata: ((b.subscription_data as Obj | undefined)?.metadata as Obj) ?? {},
    };
    if (!session.customer) {
      // Stripe creates the customer at the end of a checkout without one; create it up front here.
      const cid = newId('cus');
      customers.set(cid, {
        id: cid,
        object: 'customer',
        created,
        email: session.customer_email,
        name: null,
        metadata: {},
        invoice_settings: { default_payment_method: null },
        livemode: false,
      });
      session.customer = cid;
    }
    sessions.set(id, session);
    res.json(publicSession(session));
  });

  api.get('/checkout/sessions/:id', (req, res) => {
    const s = sessions.get(req.params.id);
    if (!s) throw new FakeError(404, 'invalid_request_error', `No such checkout.session: '${req.params.id}'`, 'id', 'resource_missing');
    res.json(publicSession(s));
  });

  api.get('/subscriptions', (req, res) => {
    const q = req.query as Obj;
    const items = [...subscriptions.values()]
      .filter((s) => !q.customer || s.customer === q.customer)
      .filter((s) => (q.status ? q.status === 'all' || s.status === q.status : s.status !== 'canceled'))
      .sort((a, b) => Number(b.created) - Number(a.created));
    res.json(list('/v1/subscriptions', items, q));
  });

  api.get('/subscriptions/:id', (req, res) => {
    res.json(requireSubscription(req.params.id));
  });

  api.post('/subscriptions/:id', (req, res) => {
    const sub = requireSubscription(req.params.id);
    if (sub.status === 'canceled') throw new FakeError(400, 'invalid_request_error', 'A canceled subscription can only update its cancellation_details and metadata.');
    const b = req.body as Obj;
    const items = Array.isArray(b.items) ? (b.items as Obj[]) : [];
    updateSubscription(sub, {
      price: items[0]?.price ? requirePrice(items[0].price, 'items[0][price]') : undefined,
      cancelAtPeriodEnd: b.cancel_at_period_end === undefined ? undefined : b.cancel_at_period_end === 'true',
      metadata: b.metadata as Obj | undefined,
    });
    res.json(sub);
  });

  api.delete('/subscriptions/:id', (req, res) => {
    const sub = requireSubscription(req.params.id);
    cancelNow(sub);
    res.json(sub);
  });

  api.post('/billing_portal/sessions', (req, res) => {
    const b = req.body as Obj;
    const customer = requireCustomer(b.customer);
    const id = newId('bps');
    const session: Obj = {
      id,
      object: 'billing_portal.session',
      configuration: 'bpc_local',
      created: nowS(),
      customer: customer.id,
      flow: null,
      livemode: false,
      locale: null,
      on_behalf_of: null,
      return_url: typeof b.return_url === 'string' ? b.return_url : null,
      url: `${baseUrl}/portal/${id}`,
    };
    portalSessions.set(id, { ...session, _expires_at_ms: Date.now() + 60 * 60_000 });
    res.json(session);
  });

  api.get('/invoices', (req, res) => {
    const q = req.query as Obj;
    const items = [...invoices.values()]
      .filter((i) => !q.customer || i.customer === q.customer)
      .filter((i) => !q.subscription || ((i.parent as Obj).subscription_details as Obj).subscription === q.subscription)
      .filter((i) => !q.status || i.status === q.status)
      .sort(newestInvoiceFirst);
    res.json(list('/v1/invoices', items, q));
  });

  api.get('/invoices/:id', (req, res) => {
    const inv = invoices.get(req.params.id);
    if (!inv) throw new FakeError(404, 'invalid_request_error', `No such invoice: '${req.params.id}'`, 'id', 'resource_missing');
    res.json(inv);
  });

  api.get('/prices/:id', (req, res) => {
    const p = prices.get(req.params.id);
    if (!p) throw new FakeError(404, 'invalid_request_error', `No such price: '${req.params.id}'`, 'id', 'resource_missing');
    res.json(priceObject(p));
  });

  api.use((req) => {
    throw new FakeError(404, 'invalid_request_error', `Unrecognized request URL (${req.method}: /v1${req.path}). This local server implements only the calls Ohmstead makes.`);
  });

  app.use('/v1', api);

  // ---------------------------------------------------------------- pages
  const findSession = (id: string) => {
    const s = sessions.get(id);
    if (!s) throw new FakeError(404, 'invalid_request_error', 'This checkout link is not valid.');
    return s;
  };

  function checkoutPage(s: Obj, message?: { kind: 'error'; text: string }) {
    const price = prices.get((s._line_items as Array<{ price: string }>)[0]!.price)!;
    const customer = customers.get(String(s.customer));
    if (s.status !== 'open') {
      return page(
        'Checkout finished',
        `<section><h1>This checkout is ${escapeHtml(s.status)}</h1><p>Nothing more to do here.</p>${
          s.success_url && s.status === 'complete' ? `<p><a href="${escapeHtml(s.success_url)}">Return to the merchant</a></p>` : ''
        }</section>`,
      );
    }
    return page(
      `Subscribe: ${price.nickname}`,
      `<section aria-labelledby="t"><h1 id="t">Subscribe to ${escapeHtml(price.nickname)}</h1>
<dl><dt>Price</dt><dd>${money(price.unitAmountCents, price.currency)} per month</dd>
<dt>Billed to</dt><dd>${escapeHtml(customer?.email ?? customer?.name ?? s.customer_email ?? 'new customer')}</dd></dl></section>
<section aria-labelledby="p"><h2 id="p">Pay with a test card</h2>
${message ? `<p class="error" role="alert">${escapeHtml(message.text)}</p>` : ''}
<form method="post" action="/checkout/${escapeHtml(s.id)}">
<label for="card">Card number</label>
<input id="card" name="card" type="text" inputmode="numeric" autocomplete="off" required aria-describedby="cards-help" value="">
<div id="cards-help" class="note">Test numbers: ${testCardList}</div>
<button type="submit">Pay ${money(price.unitAmountCents, price.currency)} and subscribe</button>
</form>
${s.cancel_url ? `<p><a href="${escapeHtml(s.cancel_url)}">Cancel and go back</a></p>` : ''}
</section>`,
    );
  }

  app.get('/checkout/:id', (req, res) => {
    res.type('html').send(checkoutPage(findSession(req.params.id)));
  });

  app.post('/checkout/:id', (req, res) => {
    const s = findSession(req.params.id);
    if (s.status !== 'open') {
      res.status(409).type('html').send(checkoutPage(s));
      return;
    }
    const card = cardFrom((req.body as Obj).card);
    if (card instanceof FakeError) {
      res.status(card.status).type('html').send(checkoutPage(s, { kind: 'error', text: card.message }));
      return;
    }
    if (!card.charges) {
      res.status(402).type('html').send(checkoutPage(s, { kind: 'error', text: 'The card was declined.' }));
      return;
    }
    completeCheckout(s, card);
    res.redirect(303, String(s.success_url));
  });

  const findPortal = (id: string) => {
    const p = portalSessions.get(id);
    if (!p || Number(p._expires_at_ms) < Date.now()) throw new FakeError(404, 'invalid_request_error', 'This billing portal link has expired. Open the portal again from the application.');
    return p;
  };

  function portalPage(p: Obj, message?: { kind: 'error' | 'ok'; text: string }) {
    const customerId = String(p.customer);
    const card = cards.get(customerId);
    const subs = [...subscriptions.values()].filter((s) => s.customer === customerId).sort((a, b) => Number(b.created) - Number(a.created));
    const live = subs.find((s) => s.status !== 'canceled' && s.status !== 'incomplete_expired');
    const customerInvoices = [...invoices.values()].filter((i) => i.customer === customerId).sort(newestInvoiceFirst);
    const action = (name: string) => `/portal/${escapeHtml(p.id)}/${name}`;
    let subSection = '<section><h2>Subscription</h2><p>No active subscription.</p></section>';
    if (live) {
      const item = itemOf(live);
      const price = item.price as Obj;
      const others = [...prices.values()].filter((x) => x.id !== price.id);
      subSection = `<section aria-labelledby="s"><h2 id="s">Subscription</h2>
<dl><dt>Plan</dt><dd>${escapeHtml(price.nickname)} · ${money(Number(price.unit_amount), String(price.currency))} per month</dd>
<dt>Status</dt><dd>${escapeHtml(live.status)}${live.cancel_at_period_end ? ` · ends ${day(Number(live.cancel_at))}` : ''}</dd>
<dt>Current period</dt><dd>${day(Number(item.current_period_start))} to ${day(Number(item.current_period_end))}</dd></dl>
${
  others.length
    ? `<form method="post" action="${action('plan')}"><label for="price">Change plan</label><select id="price" name="price">${others
        .map((o) => `<option value="${escapeHtml(o.id)}">${escapeHtml(o.nickname)} · ${money(o.unitAmountCents, o.currency)} per month</option>`)
        .join('')}</select><button type="submit">Change plan</button></form>`
    : ''
}
${
  live.cancel_at_period_end
    ? `<form method="post" action="${action('resume')}"><button type="submit">Keep my subscription</button></form>`
    : `<form method="post" action="${action('cancel')}"><fieldset style="border:0;padding:0;margin:.75rem 0 0"><legend style="font-weight:600">Cancel</legend>
<label style="font-weight:400"><input type="radio" name="when" value="period_end" checked> At the end of the current period</label>
<label style="font-weight:400"><input type="radio" name="when" value="now"> Now</label></fieldset>
<button type="submit" class="secondary">Cancel subscription</button></form>`
}</section>`;
    }
    const cardSection = `<section aria-labelledby="c"><h2 id="c">Card on file</h2>
<p>${card ? `Test card ending ${escapeHtml(card.last4)}` : 'No card on file.'}</p>
<form method="post" action="${action('card')}"><label for="card">New card number</label>
<input id="card" name="card" type="text" inputmode="numeric" autocomplete="off" required aria-describedby="cards-help">
<div id="cards-help" class="note">Test numbers: ${testCardList}An open invoice is charged again to the new card.</div>
<button type="submit">Update card</button></form></section>`;
    const invoiceSection = `<section aria-labelledby="i"><h2 id="i">Invoices</h2>${
      customerInvoices.length
        ? `<ul>${customerInvoices
            .map((i) => `<li><a href="${escapeHtml(i.hosted_invoice_url)}">${escapeHtml(i.number)}</a> · ${day(Number(i.created))} · ${money(Number(i.amount_due), String(i.currency))} · ${escapeHtml(i.status)}</li>`)
            .join('')}</ul>`
        : '<p>No invoices yet.</p>'
    }</section>`;
    const testSection = live
      ? `<section aria-labelledby="x"><h2 id="x">Test controls</h2><p class="note">A real account bills the next period a month from now; this bills it at once, charging the card on file.</p>
<form method="post" action="${action('renew')}"><button type="submit" class="secondary">Bill the next period now</button></form></section>`
      : '';
    return page(
      'Billing portal',
      `<section><h1>Billing</h1>${message ? `<p class="${message.kind}" role="${message.kind === 'error' ? 'alert' : 'status'}">${escapeHtml(message.text)}</p>` : ''}
${p.return_url ? `<p><a href="${escapeHtml(p.return_url)}">Return to the application</a></p>` : ''}</section>
${subSection}${cardSection}${invoiceSection}${testSection}`,
    );
  }

  const liveSubscriptionOf = (customerId: string) =>
    [...subscriptions.values()]
      .filter((s) => s.customer === customerId && s.status !== 'canceled' && s.status !== 'incomplete_expired')
      .sort((a, b) => Number(b.created) - Number(a.created))[0];

  app.get('/portal/:id', (req, res) => {
    res.type('html').send(portalPage(findPortal(req.params.id)));
  });

  app.post('/portal/:id/:action', (req, res) => {
    const p = findPortal(req.params.id);
    const customerId = String(p.customer);
    const body = req.body as Obj;
    const live = liveSubscriptionOf(customerId);
    const reply = (status: number, message: { kind: 'error' | 'ok'; text: string }) => res.status(status).type('html').send(portalPage(p, message));
    switch (req.params.action) {
      case 'plan': {
        if (!live) return reply(409, { kind: 'error', text: 'There is no subscription to change.' });
        const price = prices.get(String(body.price ?? ''));
        if (!price) return reply(400, { kind: 'error', text: 'Choose one of the listed plans.' });
        updateSubscription(live, { price });
        return reply(200, { kind: 'ok', text: `Your plan is now ${price.nickname}.` });
      }
      case 'cancel': {
        if (!live) return reply(409, { kind: 'error', text: 'There is no subscription to cancel.' });
        if (body.when === 'now') {
          cancelNow(live);
          return reply(200, { kind: 'ok', text: 'Your subscription is canceled.' });
        }
        updateSubscription(live, { cancelAtPeriodEnd: true });
        return reply(200, { kind: 'ok', text: `Your subscription ends on ${day(Number(live.cancel_at))}.` });
      }
      case 'resume': {
        if (!live) return reply(409, { kind: 'error', text: 'There is no subscription to keep.' });
        updateSubscription(live, { cancelAtPeriodEnd: false });
        return reply(200, { kind: 'ok', text: 'Your subscription continues.' });
      }
      case 'card': {
        const card = cardFrom(body.card);
        if (card instanceof FakeError) return reply(card.status, { kind: 'error', text: card.message });
        cards.set(customerId, card);
        const customer = customers.get(customerId);
        if (customer) (customer.invoice_settings as Obj).default_payment_method = newId('pm');
        if (live && openInvoiceOf(live)) {
          retryOpenInvoice(live);
          return live.status === 'active'
            ? reply(200, { kind: 'ok', text: `Card ending ${card.last4} saved, and the open invoice is paid.` })
            : reply(402, { kind: 'error', text: `Card ending ${card.last4} saved, but charging the open invoice failed.` });
        }
        return reply(200, { kind: 'ok', text: `Card ending ${card.last4} saved.` });
      }
      case 'renew': {
        if (!live) return reply(409, { kind: 'error', text: 'There is no subscription to bill.' });
        renew(String(live.id));
        return reply(200, { kind: 'ok', text: `Billed: the subscription is now ${String(live.status)}.` });
      }
      default:
        return reply(404, { kind: 'error', text: 'Unknown action.' });
    }
  });

  app.get('/invoices/:id', (req, res) => {
    const inv = invoices.get(req.params.id);
    if (!inv) throw new FakeError(404, 'invalid_request_error', 'No such invoice.');
    const line = (inv.lines as { data: Obj[] }).data[0]!;
    res.type('html').send(
      page(
        `Invoice ${String(inv.number)}`,
        `<section><h1>Invoice ${escapeHtml(inv.number)}</h1><dl>
<dt>Status</dt><dd>${escapeHtml(inv.status)}</dd><dt>Date</dt><dd>${day(Number(inv.created))}</dd>
<dt>Item</dt><dd>${escapeHtml(line.description)}</dd><dt>Period</dt><dd>${day(Number(inv.period_start))} to ${day(Number(inv.period_end))}</dd>
<dt>Amount due</dt><dd>${money(Number(inv.amount_due), String(inv.currency))}</dd><dt>Amount paid</dt><dd>${money(Number(inv.amount_paid), String(inv.currency))}</dd></dl>
<p class="note">A test invoice from the local stand-in; nothing was charged.</p></section>`,
      ),
    );
  });

  app.use((req, _res, next: NextFunction) => {
    next(new FakeError(404, 'invalid_request_error', `Unrecognized request URL (${req.method}: ${req.path}).`));
  });

  app.use((err: unknown, req: Request, res: Response, _next: NextFunction) => {
    const e =
      err instanceof FakeError
        ? err
        : (err as { type?: string }).type === 'entity.parse.failed'
          ? new FakeError(400, 'invalid_request_error', 'Invalid request body.')
          : new FakeError(500, 'api_error', 'An error occurred in the local Stripe stand-in.');
    if (e.status === 500) console.error('[stripe fake]', err);
    if (req.path.startsWith('/v1/')) {
      res.status(e.status).json({ error: { type: e.type, message: e.message, ...(e.param ? { param: e.param } : {}), ...(e.code ? { code: e.code } : {}) } });
    } else {
      res.status(e.status).type('html').send(page('Not available', `<section><h1>Not available</h1><p>${escapeHtml(e.message)}</p></section>`));
    }
  });

  const server: Server = app.listen(options.port ?? 0, options.host ?? '127.0.0.1');
  await new Promise<void>((resolve, reject) => {
    server.once('listening', resolve);
    server.once('error', reject);
  });
  const address = server.address() as AddressInfo;
  const host = options.host ?? '127.0.0.1';
  baseUrl = `http://${host.includes(':') ? `[${host}]` : host}:${address.port}`;

  return {
    url: baseUrl,
    host,
    port: address.port,
    events,
    deliveries,
    setWebhookUrl(url) {
      webhookUrl = url;
    },
    async settle() {
      // Deliveries may enqueue while earlier ones run; wait until the chain stops growing.
      let current: Promise<void>;
      do {
        current = queue;
        await current;
      } while (current !== queue);
    },
    deliver(event, url) {
      const target = url ?? webhookUrl;
      if (!target) throw new Error('No webhook URL to deliver to');
      return deliverOnce(event, target);
    },
    sign,
    renew(subscriptionId) {
      renew(subscriptionId);
      persist();
    },
    setCard(customerId, cardNumber) {
      requireCustomer(customerId);
      const card = cardFrom(cardNumber);
      if (card instanceof FakeError) throw card;
      cards.set(customerId, card);
      persist();
    },
    subscription(id) {
      const s = subscriptions.get(id);
      return s ? clone(s) : undefined;
    },
    close() {
      return new Promise<void>((resolve) => {
        server.close(() => resolve());
        server.closeAllConnections();
      });
    },
  };
}

const LOOPBACK_HOSTS = new Set(['127.0.0.1', 'localhost', '::1']);

/**
 * `npm start` in development: the fake on the address the billing configuration points at, with its
 * state kept in .data/ across restarts. Null when the configuration points elsewhere (real test-mode keys
 * and STRIPE_API_HOST=api.stripe.com) or when the port is taken (another checkout's fake).
 */
export async function startDevelopmentStripeFake(env: Env, log: (line: string) => void, stateFile = '.data/stripe-fake.json'): Promise<StripeFake | null> {
  if (!LOOPBACK_HOSTS.has(env.STRIPE_API_HOST) || env.STRIPE_API_PROTOCOL !== 'http') return null;
  try {
    const fake = await startStripeFake({
      host: env.STRIPE_API_HOST,
      port: env.STRIPE_API_PORT,
      secretKey: env.STRIPE_SECRET_KEY,
      webhookSecret: env.STRIPE_WEBHOOK_SECRET,
      prices: planPrices({ builder: env.STRIPE_PRICE_BUILDER, scale: env.STRIPE_PRICE_SCALE }),
      apiVersion: STRIPE_API_VERSION,
      stateFile,
      onDelivery: (d) => {
        if (d.status !== 200) log(`Stripe stand-in: ${d.type} delivery ${d.attempt} answered ${d.status}`);
      },
    });
    log(`Stripe stand-in listening on ${fake.url} (test checkout and portal; card 4242 4242 4242 4242 pays).`);
    return fake;
  } catch (error) {
    if ((error as NodeJS.ErrnoException).code !== 'EADDRINUSE') throw error;
    log(`Port ${env.STRIPE_API_PORT} is taken: billing talks to whatever listens there (another Ohmstead's Stripe stand-in?).`);
    return null;
  }
}
