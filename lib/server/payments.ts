import 'server-only';
/**
 * Plans and payment (issue 7) through the official `stripe` SDK.
 *
 * - STRIPE_SECRET_KEY (+ STRIPE_WEBHOOK_SECRET, STRIPE_TEAM_PRICE_ID) set: the real service.
 * - Otherwise in demo mode (and tests): the SDK is pointed at the bundled fake
 *   (lib/server/fake-payments.ts) with `new Stripe(key, { host: '127.0.0.1', port, protocol: 'http' })`.
 *   The fake starts with the server in demo mode (EDGEFIELD_PAYMENTS_PORT, default: any free
 *   port) or on first use, and delivers its webhooks to this app's /api/billing/webhook.
 * - Otherwise: payment routes answer 503 with a sentence saying what to configure.
 *
 * Webhooks are verified with `stripe.webhooks.constructEvent` (HMAC-SHA256 signature over
 * "timestamp.payload", 5-minute tolerance); a bad signature is a 400 and changes nothing.
 * Each event id is applied once (billing_events).
 */
import crypto from 'node:crypto';
import { eq, sql } from 'drizzle-orm';
import Stripe from 'stripe';
import { getDb } from '@/db/client';
import { insertAuditEvent } from '@/db/queries/audit';
import { billingEvents, workspaces, type Workspace } from '@/db/schema';
import { startFakePayments, type FakePayments } from './fake-payments';
import { ApiError } from './http';
import { PLANS } from './plans';
import { getAuthSecret, isDemoMode } from './secret';

type G = typeof globalThis & { __edgefieldPayments?: Promise<FakePayments> };
const g = globalThis as G;

const FAKE_KEY = 'sk_test_edgefield_fake';

export function usingRealPayments(): boolean {
  return Boolean(process.env.STRIPE_SECRET_KEY);
}

export function webhookSecret(): string {
  if (process.env.STRIPE_WEBHOOK_SECRET) return process.env.STRIPE_WEBHOOK_SECRET;
  if (usingRealPayments()) throw new ApiError(503, 'payments_not_configured', 'STRIPE_WEBHOOK_SECRET is not set, so payment webhooks cannot be verified.');
  // Demo/test: a secret derived from the app's own secret, shared with the in-process fake.
  return `whsec_${crypto.createHmac('sha256', getAuthSecret()).update('edgefield-fake-payments').digest('base64url')}`;
}

function appOrigin(): string {
  return (process.env.NEXTAUTH_URL || `http://localhost:${process.env.PORT || 3000}`).replace(/\/+$/, '');
}

/** Start the bundled fake payment service once per process (demo mode and tests). */
export function ensureFakePayments(deliver?: (payload: string, signature: string) => Promise<number>): Promise<FakePayments> {
  if (!g.__edgefieldPayments) {
    const p = startFakePayments({
      port: Number(process.env.EDGEFIELD_PAYMENTS_PORT || 0),
      webhookSecret: webhookSecret(),
      deliver: deliver ?? `${appOrigin()}/api/billing/webhook`,
      teamMonthlyPrice: PLANS.team.monthlyPrice,
    });
    g.__edgefieldPayments = p;
    p.catch(() => {
      if (g.__edgefieldPayments === p) g.__edgefieldPayments = undefined;
    });
  }
  return g.__edgefieldPayments;
}

/** Tests: forget the fake (after closing it). */
export function resetFakePaymentsForTesting() {
  g.__edgefieldPayments = undefined;
}

export async function getStripe(): Promise<Stripe> {
  if (usingRealPayments()) return new Stripe(process.env.STRIPE_SECRET_KEY!);
  if (!isDemoMode() && process.env.NODE_ENV === 'production') {
    throw new ApiError(503, 'payments_not_configured', 'Payments are not configured: set STRIPE_SECRET_KEY, STRIPE_WEBHOOK_SECRET and STRIPE_TEAM_PRICE_ID.');
  }
  const fake = await ensureFakePayments();
  return new Stripe(FAKE_KEY, { host: '127.0.0.1', port: fake.port, protocol: 'http', maxNetworkRetries: 0 });
}

/** Start a checkout for the Team plan (the caller checked the owner role). Returns the page to send the owner to. */
export async function createCheckout(ws: Workspace, owner: { id: string; email: string; name: string }): Promise<string> {
  if (ws.plan === 'team') throw new ApiError(409, 'already_team', 'This workspace is already on the Team plan.');
  const stripe = await getStripe();
  let customer = ws.billingCustomerId;
  if (!customer) {
    const c = await stripe.customers.create({ email: owner.email, name: ws.name, metadata: { workspaceId: ws.id } });
    customer = c.id;
    const db = await getDb();
    await db.update(workspaces).set({ billingCustomerId: customer }).where(eq(workspaces.id, ws.id));
  }
  const back = `${appOrigin()}/w/${ws.id}/settings`;
  const price = process.env.STRIPE_TEAM_PRICE_ID;
  const session = await stripe.checkout.sessions.create({
    mode: 'subscription',
    customer,
    client_reference_id: ws.id,
    metadata: { workspaceId: ws.id, workspaceName: ws.name, ownerId: owner.id },
    subscription_data: { metadata: { workspaceId: ws.id } },
    line_items: price
      ? [{ price, quantity: 1 }]
      : [{ quantity: 1, price_data: { currency: 'eur', unit_amount: PLANS.team.monthlyPrice, recurring: { interval: 'month' }, product_data: { name: 'Edgefield Team plan' } } }],
    success_url: `${back}?billing=success`,
    cancel_url: `${back}?billing=cancelled`,
  });
  if (!session.url) throw new ApiError(502, 'payments_failed', 'The payment service did not return a checkout page.');
  return session.url;
}

export async function createPortal(ws: Workspace): Promise<string> {
  if (!ws.billingCustomerId) throw new ApiError(409, 'no_billing', 'This workspace has no billing account yet: upgrade first.');
  const stripe = await getStripe();
  const s = await stripe.billingPortal.sessions.create({ customer: ws.billingCustomerId, return_url: `${appOrigin()}/w/${ws.id}/settings` });
  return s.url;
}

export interface InvoiceView {
  id: string;
  number: string | null;
  amount: number;
  currency: string;
  status: string | null;
  created: string;
  url: string | null;
}

export async function listInvoices(ws: Workspace): Promise<InvoiceView[]> {
  if (!ws.billingCustomerId) return [];
  const stripe = await getStripe();
  const list = await stripe.invoices.list({ customer: ws.billingCustomerId, limit: 24 });
  return list.data.map((i) => ({
    id: i.id ?? '',
    number: i.number ?? null,
    amount: i.amount_paid ?? 0,
    currency: i.currency,
    status: i.status ?? null,
    created: new Date(i.created * 1000).toISOString(),
    url: i.hosted_invoice_url ?? null,
  }));
}

/**
 * Verify and apply one webhook. 400 (nothing changes) when the signature does not verify;
 * an event already applied is acknowledged without doing anything again.
 */
export async function handleWebhook(payload: string, signature: string | null): Promise<{ received: true; duplicate?: boolean; applied?: string }> {
  if (!signature) throw new ApiError(400, 'bad_signature', 'The Stripe-Signature header is missing.');
  let event: Stripe.Event;
  try {
    event = new Stripe(usingRealPayments() ? process.env.STRIPE_SECRET_KEY! : FAKE_KEY).webhooks.constructEvent(payload, signature, webhookSecret());
  } catch {
    throw new ApiError(400, 'bad_signature', 'The webhook signature does not verify.');
  }
  const db = await getDb();
  return db.transaction(async (tx) => {
    const obj = event.data.object as unknown as Record<string, unknown>;
    const meta = (obj.metadata ?? {}) as Record<string, string>;
    let wsId: string | null = typeof meta.workspaceId === 'string' ? meta.workspaceId : null;
    if (!wsId && typeof obj.id === 'string' && event.type.startsWith('customer.subscription.')) {
      const [w] = await tx.select({ id: workspaces.id }).from(workspaces).where(eq(workspaces.billingSubscriptionId, obj.id)).limit(1);
      wsId = w?.id ?? null;
    }
    if (wsId) {
      const [w] = await tx.select({ id: workspaces.id }).from(workspaces).where(eq(workspaces.id, wsId)).limit(1);
      if (!w) wsId = null;
    }
    const ins = await tx
      .insert(billingEvents)
      .values({ eventId: event.id, type: event.type, workspaceId: wsId })
      .onConflictDoNothing()
      .returning({ id: billingEvents.eventId });
    if (!ins.length) return { received: true as const, duplicate: true };
    if (!wsId) return { received: true as const };
    if (event.type === 'checkout.session.completed') {
      await tx
        .update(workspaces)
        .set({ plan: 'team', billingCustomerId: String(obj.customer), billingSubscriptionId: obj.subscription ? String(obj.subscription) : null, updatedAt: sql`now()` })
        .where(eq(workspaces.id, wsId));
      await insertAuditEvent(tx, { workspaceId: wsId, actorId: null, action: 'plan.change', targetType: 'workspace', targetId: wsId, data: { plan: 'team', event: event.id } });
      return { received: true as const, applied: 'plan=team' };
    }
    if (event.type === 'customer.subscription.deleted') {
      await tx.update(workspaces).set({ plan: 'free', billingSubscriptionId: null, updatedAt: sql`now()` }).where(eq(workspaces.id, wsId));
      await insertAuditEvent(tx, { workspaceId: wsId, actorId: null, action: 'plan.change', targetType: 'workspace', targetId: wsId, data: { plan: 'free', event: event.id } });
      return { received: true as const, applied: 'plan=free' };
    }
    return { received: true as const };
  });
}
