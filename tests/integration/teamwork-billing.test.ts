/**
 * Plans and payment (issue 7): the free plan's limits are enforced on the server (402);
 * upgrading through the bundled fake checkout, whose webhook is signed like the real
 * service's, lifts them; a webhook with a bad signature is refused (400) and changes
 * nothing; a redelivered event is applied once; cancelling in the portal returns to free.
 */
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';

vi.mock('server-only', () => ({}));
const auth = vi.hoisted(() => ({ user: null as null | { id: string; email: string; name: string } }));
vi.mock('@/lib/server/session', () => ({
  getSessionUser: async () => auth.user,
  requireUser: async () => {
    if (!auth.user) throw new Error('redirect /login');
    return auth.user;
  },
}));

import { eq } from 'drizzle-orm';
import Stripe from 'stripe';
import { setDbForTesting, type DbHandle } from '@/db/client';
import { auditEvents, workspaces } from '@/db/schema';
import { ensureFakePayments, resetFakePaymentsForTesting, webhookSecret } from '@/lib/server/payments';
import type { FakePayments } from '@/lib/server/fake-payments';
import { PLANS } from '@/lib/server/plans';
import { createTestDb } from './helpers/db';
import { buildWorld, fakeResult, type World } from './helpers/fixtures';
import * as webhookRoute from '@/app/api/billing/webhook/route';
import * as billingRoute from '@/app/api/workspaces/[workspaceId]/billing/route';
import * as checkoutRoute from '@/app/api/workspaces/[workspaceId]/billing/checkout/route';
import * as portalRoute from '@/app/api/workspaces/[workspaceId]/billing/portal/route';
import * as solvesRoute from '@/app/api/workspaces/[workspaceId]/solves/route';

let handle: DbHandle;
let w: World;
let fake: FakePayments;
const delivered: number[] = [];
const wasDemo = process.env.EDGEFIELD_DEMO;

type Fn = (req: Request, ctx: { params: Promise<Record<string, string>> }) => Promise<Response>;

async function deliver(payload: string, signature: string): Promise<number> {
  const res = await (webhookRoute.POST as Fn)(
    new Request('http://localhost/api/billing/webhook', { method: 'POST', body: payload, headers: { 'content-type': 'application/json', 'stripe-signature': signature } }),
    { params: Promise.resolve({}) },
  );
  delivered.push(res.status);
  return res.status;
}

beforeAll(async () => {
  process.env.EDGEFIELD_DEMO = '1';
  handle = await createTestDb();
  setDbForTesting(handle);
  w = await buildWorld(handle.db);
  fake = await ensureFakePayments(deliver); // webhooks go straight to the route handler
});
afterAll(async () => {
  await fake?.close();
  resetFakePaymentsForTesting();
  if (wasDemo === undefined) delete process.env.EDGEFIELD_DEMO;
  else process.env.EDGEFIELD_DEMO = wasDemo;
  setDbForTesting(undefined);
  await handle?.close();
});

async function call(fn: Fn, method: string, params: Record<string, string>, body?: unknown) {
  const res = await fn(
    new Request('http://localhost/api/x', { method, body: body === undefined ? undefined : JSON.stringify(body), headers: { 'content-type': 'application/json' } }),
    { params: Promise.resolve(params) },
  );
  return { status: res.status, json: (await res.json()) as Record<string, any> };
}
const plan = async () => (await handle.db.select().from(workspaces).where(eq(workspaces.id, w.wsA)))[0]!;
const storeSolve = (n: number) => {
  auth.user = w.users.editor;
  return call(solvesRoute.POST as Fn, 'POST', { workspaceId: w.wsA }, {
    sectionId: w.sectionA,
    revisionId: w.revisionA,
    settings: { preset: 'quick', n },
    settingsHash: `limit-${n}`,
    result: fakeResult(),
    status: 'done',
  });
};

describe('plans and payment', () => {
  it('the free plan refuses the solve beyond its limit with 402; a repeat of a stored solve still answers', async () => {
    for (let n = 1; ; n++) {
      const r = await storeSolve(n);
      if (r.status === 402) {
        expect(r.json.error.code).toBe('plan_limit');
        expect(r.json.error.message).toContain(`up to ${PLANS.free.maxSolves} solves`);
        break;
      }
      expect(r.status).toBe(201);
      expect(n).toBeLessThanOrEqual(PLANS.free.maxSolves);
    }
    expect((await storeSolve(1)).status).toBe(200); // the same solve again: nothing new stored
  });

  it('a webhook with a bad signature is refused and changes nothing', async () => {
    const payload = JSON.stringify({ id: 'evt_forged', object: 'event', type: 'checkout.session.completed', data: { object: { metadata: { workspaceId: w.wsA }, customer: 'cus_x' } } });
    const forged = new Stripe('sk_test_x').webhooks.generateTestHeaderString({ payload, secret: 'whsec_not_the_secret' });
    expect(await deliver(payload, forged)).toBe(400);
    // Right secret, but the body was altered after signing.
    const good = new Stripe('sk_test_x').webhooks.generateTestHeaderString({ payload, secret: webhookSecret() });
    expect(await deliver(payload.replace('cus_x', 'cus_y'), good)).toBe(400);
    expect(await deliver(payload, 't=1,v1=00')).toBe(400);
    expect((await plan()).plan).toBe('free');
    const audit = await handle.db.select().from(auditEvents).where(eq(auditEvents.action, 'plan.change'));
    expect(audit).toHaveLength(0);
  });

  it('upgrading through the fake checkout (signed webhook) lifts the limits; invoices are listed', async () => {
    auth.user = w.users.owner;
    const co = await call(checkoutRoute.POST as Fn, 'POST', { workspaceId: w.wsA });
    expect(co.status, JSON.stringify(co.json)).toBe(200);
    const sessionId = /\/checkout\/(cs_test_[0-9a-f]+)$/.exec(co.json.url)![1]!;
    // The checkout page exists for the browser.
    const pageRes = await fetch(co.json.url);
    expect(await pageRes.text()).toContain('Team plan');
    const before = delivered.length;
    const { successUrl } = await fake.pay(sessionId);
    expect(successUrl).toMatch(new RegExp(`/w/${w.wsA}/settings\\?billing=success$`));
    expect(delivered.slice(before)).toEqual([200, 200]); // checkout.session.completed, invoice.paid
    const ws = await plan();
    expect(ws.plan).toBe('team');
    expect(ws.billingCustomerId).toMatch(/^cus_/);
    expect(ws.billingSubscriptionId).toMatch(/^sub_/);
    // The limit is lifted.
    expect((await storeSolve(10_001)).status).toBe(201);
    auth.user = w.users.owner;
    const b = await call(billingRoute.GET as Fn, 'GET', { workspaceId: w.wsA });
    expect(b.json).toMatchObject({ plan: 'team', limits: { members: PLANS.team.maxMembers, solves: PLANS.team.maxSolves } });
    expect(b.json.invoices).toHaveLength(1);
    expect(b.json.invoices[0]).toMatchObject({ amount: PLANS.team.monthlyPrice, currency: 'eur', status: 'paid' });
    // Paying the same session again sends nothing new and changes nothing.
    await fake.pay(sessionId);
    expect((await call(checkoutRoute.POST as Fn, 'POST', { workspaceId: w.wsA })).status).toBe(409);
  });

  it('a redelivered event is applied once', async () => {
    const payload = JSON.stringify({ id: 'evt_repeat', object: 'event', type: 'customer.subscription.deleted', data: { object: { id: (await plan()).billingSubscriptionId, metadata: { workspaceId: w.wsA } } } });
    const sig = () => new Stripe('sk_test_x').webhooks.generateTestHeaderString({ payload, secret: webhookSecret() });
    expect(await deliver(payload, sig())).toBe(200);
    expect((await plan()).plan).toBe('free');
    await handle.db.update(workspaces).set({ plan: 'team' }).where(eq(workspaces.id, w.wsA));
    expect(await deliver(payload, sig())).toBe(200);
    expect((await plan()).plan).toBe('team'); // not applied a second time
  });

  it('cancelling in the portal returns the workspace to the free plan', async () => {
    auth.user = w.users.owner;
    const p = await call(portalRoute.POST as Fn, 'POST', { workspaceId: w.wsA });
    expect(p.status).toBe(200);
    const res = await fetch(`${p.json.url}/cancel`, { method: 'POST', redirect: 'manual' });
    expect(res.status).toBe(303);
    expect((await plan()).plan).toBe('free');
  });
});
