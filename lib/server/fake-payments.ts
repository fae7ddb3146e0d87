/**
 * A small local fake of the payment service, shipped with Edgefield for demo mode, tests and
 * development (never used when a real key is configured). It answers the few REST calls the
 * official `stripe` SDK makes here (customers, checkout sessions, billing-portal sessions,
 * subscriptions, invoices) and serves two pages a browser visits: the checkout page and the
 * customer portal. Completing a checkout or cancelling in the portal sends webhook events to
 * the app, signed exactly as the real service signs them (the SDK's
 * `webhooks.generateTestHeaderString`: `t=<unix time>,v1=<HMAC-SHA256 of "t.payload">`).
 *
 * State lives in memory: restarting the server forgets fake customers (the app keeps its plan).
 * Everything here is fictional; no money moves.
 */
import http from 'node:http';
import crypto from 'node:crypto';
import type { AddressInfo } from 'node:net';
import Stripe from 'stripe';

type Obj = Record<string, unknown>;

export interface FakePayments {
  port: number;
  /** Base URL the browser uses for the checkout and portal pages. */
  publicUrl: string;
  close(): Promise<void>;
  /** For tests: complete a checkout session as if the customer paid (sends the webhooks). */
  pay(sessionId: string): Promise<{ successUrl: string }>;
  state: FakeState;
}

interface FakeState {
  customers: Map<string, Obj>;
  sessions: Map<string, Obj>;
  subscriptions: Map<string, Obj>;
  invoices: Map<string, Obj>;
  portals: Map<string, Obj>;
}

export interface FakePaymentsOptions {
  port?: number;
  host?: string;
  /** Secret the webhooks are signed with (the app verifies with the same one). */
  webhookSecret: string;
  /** Where events go: an URL (POST) or a function (tests). */
  deliver: string | ((payload: string, signature: string) => Promise<number>);
  /** Price of the team plan per month in cents, for the pages and invoices. */
  teamMonthlyPrice: number;
}

const id = (prefix: string) => `${prefix}_${crypto.randomBytes(12).toString('hex')}`;
const now = () => Math.floor(Date.now() / 1000);

/** Parse x-www-form-urlencoded with bracket keys (a[b][0][c]=v), as the SDK encodes. */
export function parseStripeForm(body: string): Obj {
  const out: Obj = {};
  for (const [rawK, v] of new URLSearchParams(body)) {
    const keys = rawK.replace(/\]/g, '').split('[');
    let cur: Obj | unknown[] = out;
    keys.forEach((k, i) => {
      const last = i === keys.length - 1;
      const nextIsIndex = !last && /^\d+$/.test(keys[i + 1]!);
      const c = cur as Record<string, unknown>;
      if (last) c[k] = v;
      else {
        c[k] ??= nextIsIndex ? [] : {};
        cur = c[k] as Obj;
      }
    });
  }
  return out;
}

function esc(s: string) {
  return s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);
}

/** A Unix time in seconds as an ISO day (UTC). */
const day = (t: number) => (Number.isFinite(t) ? new Date(t * 1000).toISOString().slice(0, 10) : '—');

function page(title: string, body: string) {
  return `<!doctype html><html lang="en"><head><meta charset="utf-8"><title>${esc(title)}</title><meta name="viewport" content="width=device-width,initial-scale=1">
<style>body{font-family:system-ui,sans-serif;background:#f4f6f5;color:#141d23;margin:0}main{max-width:440px;margin:8vh auto;background:#fff;border:1px solid #dbe0df;border-radius:10px;padding:28px;box-shadow:0 1px 3px #0001}
h1{font-size:20px;margin:0 0 4px}.muted{color:#5a676d;font-size:14px}.price{font-size:32px;font-weight:600;margin:18px 0}.row{display:flex;gap:10px;margin-top:22px}
button,a.btn{font:inherit;font-weight:600;padding:10px 16px;border-radius:6px;border:1px solid #b9c2c3;background:#fff;color:#141d23;text-decoration:none;cursor:pointer}
button.primary{background:#2f5e80;border-color:#2f5e80;color:#fff}.note{margin-top:22px;font-size:12px;color:#5a676d;border-top:1px solid #dbe0df;padding-top:12px}
table{width:100%;border-collapse:collapse;font-size:14px;margin-top:12px;font-variant-numeric:tabular-nums}th{text-align:left;font-size:12px;font-weight:600;color:#5a676d;padding:6px 0;border-bottom:1px solid #dbe0df}
td{padding:6px 0;border-bottom:1px solid #eceff0}th.r,td.r{text-align:right;padding-left:12px}</style></head>
<body><main>${body}<p class="note">Test payment service bundled with Edgefield for demos and tests. No card is charged and no money moves.</p></main></body></html>`;
}

export async function startFakePayments(opts: FakePaymentsOptions): Promise<FakePayments> {
  const state: FakeState = { customers: new Map(), sessions: new Map(), subscriptions: new Map(), invoices: new Map(), portals: new Map() };
  const signer = new Stripe('sk_test_fake_signer', {});
  let publicUrl = '';

  async function sendEvent(type: string, object: Obj) {
    const event = { id: id('evt'), object: 'event', api_version: '2026-01-01', created: now(), type, livemode: false, pending_webhooks: 1, data: { object } };
    const payload = JSON.stringify(event);
    const signature = signer.webhooks.generateTestHeaderString({ payload, secret: opts.webhookSecret });
    let status: number;
    if (typeof opts.deliver === 'function') status = await opts.deliver(payload, signature);
    else {
      const res = await fetch(opts.deliver, { method: 'POST', body: payload, headers: { 'content-type': 'application/json', 'stripe-signature': signature } });
      status = res.status;
    }
    if (status >= 300) console.error(`fake payments: webhook ${type} answered ${status}`);
    return status;
  }

  async function pay(sessionId: string) {
    const s = state.sessions.get(sessionId);
    if (!s) throw new Error(`no checkout session ${sessionId}`);
    if (s.status !== 'complete') {
      const sub = { id: id('sub'), object: 'subscription', customer: s.customer, status: 'active', metadata: s.metadata, current_period_end: now() + 30 * 86400, created: now() };
      state.subscriptions.set(sub.id, sub);
      const inv = {
        id: id('in'),
        object: 'invoice',
        customer: s.customer,
        subscription: sub.id,
        status: 'paid',
        amount_paid: opts.teamMonthlyPrice,
        amount_due: opts.teamMonthlyPrice,
        currency: 'eur',
        created: now(),
        number: `EDGE-${String(state.invoices.size + 1).padStart(4, '0')}`,
        hosted_invoice_url: null,
        description: 'Edgefield Team plan, 1 month',
      };
      state.invoices.set(inv.id, inv);
      Object.assign(s, { status: 'complete', payment_status: 'paid', subscription: sub.id });
      await sendEvent('checkout.session.completed', s);
      await sendEvent('invoice.paid', inv);
    }
    return { successUrl: String(s.success_url).replace('{CHECKOUT_SESSION_ID}', sessionId) };
  }

  async function cancel(subId: string) {
    const sub = state.subscriptions.get(subId);
    if (!sub || sub.status === 'canceled') return;
    Object.assign(sub, { status: 'canceled', canceled_at: now() });
    await sendEvent('customer.subscription.deleted', sub);
  }

  const json = (res: http.ServerResponse, status: number, body: unknown) => {
    res.writeHead(status, { 'content-type': 'application/json' });
    res.end(JSON.stringify(body));
  };
  const html = (res: http.ServerResponse, status: number, body: string) => {
    res.writeHead(status, { 'content-type': 'text/html; charset=utf-8' });
    res.end(body);
  };
  const notFound = (res: http.ServerResponse, what: string) =>
    json(res, 404, { error: { type: 'invalid_request_error', message: `No such ${what}`, code: 'resource_missing' } });

  const server = http.createServer((req, res) => {
    const chunks: Buffer[] = [];
    let size = 0;
    req.on('data', (c: Buffer) => {
      size += c.length;
      if (size > 256 * 1024) req.destroy();
      else chunks.push(c);
    });
    req.on('end', () => {
      void handle(req, res, Buffer.concat(chunks).toString('utf8')).catch((e) => {
        console.error('fake payments:', e);
        if (!res.headersSent) json(res, 500, { error: { type: 'api_error', message: 'fake payment service error' } });
      });
    });
  });

  async function handle(req: http.IncomingMessage, res: http.ServerResponse, body: string) {
    const url = new URL(req.url ?? '/', 'http://fake');
    const p = url.pathname;
    const m = req.method ?? 'GET';
    if (p.startsWith('/v1/')) {
      if (!/^Bearer sk_(test|live)_/.test(req.headers.authorization ?? '')) {
        return json(res, 401, { error: { type: 'invalid_request_error', message: 'Invalid API Key provided' } });
      }
      const form = parseStripeForm(body);
      if (m === 'POST' && p === '/v1/customers') {
        const c = { id: id('cus'), object: 'customer', email: form.email ?? null, name: form.name ?? null, metadata: form.metadata ?? {}, created: now() };
        state.customers.set(c.id, c);
        return json(res, 200, c);
      }
      if (m === 'POST' && p === '/v1/checkout/sessions') {
        if (!form.customer || !state.customers.has(String(form.customer))) return notFound(res, 'customer');
        const sid = id('cs_test');
        const s = {
          id: sid,
          object: 'checkout.session',
          mode: form.mode ?? 'subscription',
          customer: form.customer,
          client_reference_id: form.client_reference_id ?? null,
          metadata: form.metadata ?? {},
          success_url: form.success_url,
          cancel_url: form.cancel_url,
          status: 'open',
          payment_status: 'unpaid',
          amount_total: opts.teamMonthlyPrice,
          currency: 'eur',
          url: `${publicUrl}/checkout/${sid}`,
          created: now(),
        };
        state.sessions.set(sid, s);
        return json(res, 200, s);
      }
      if (m === 'POST' && p === '/v1/billing_portal/sessions') {
        if (!form.customer || !state.customers.has(String(form.customer))) return notFound(res, 'customer');
        const bid = id('bps');
        const s = { id: bid, object: 'billing_portal.session', customer: form.customer, return_url: form.return_url, url: `${publicUrl}/portal/${bid}`, created: now() };
        state.portals.set(bid, s);
        return json(res, 200, s);
      }
      if (m === 'GET' && p === '/v1/invoices') {
        const customer = url.searchParams.get('customer');
        const data = [...state.invoices.values()].filter((i) => !customer || i.customer === customer).sort((a, b) => Number(b.created) - Number(a.created));
        return json(res, 200, { object: 'list', data, has_more: false, url: '/v1/invoices' });
      }
      const sub = /^\/v1\/subscriptions\/([\w]+)$/.exec(p);
      if (sub) {
        const s = state.subscriptions.get(sub[1]!);
        if (!s) return notFound(res, 'subscription');
        if (m === 'DELETE') await cancel(sub[1]!);
        return json(res, 200, s);
      }
      return json(res, 404, { error: { type: 'invalid_request_error', message: `Unrecognized request URL (${m}: ${p}). The fake payment service implements only what Edgefield uses.` } });
    }
    const co = /^\/checkout\/(cs_test_[0-9a-f]+)(\/pay|\/cancel)?$/.exec(p);
    if (co) {
      const s = state.sessions.get(co[1]!);
      if (!s) return html(res, 404, page('Not found', '<h1>Checkout not found</h1><p class="muted">This checkout link is not valid any more.</p>'));
      if (m === 'POST' && co[2] === '/pay') {
        const { successUrl } = await pay(co[1]!);
        res.writeHead(303, { location: successUrl });
        return res.end();
      }
      if (m === 'POST' && co[2] === '/cancel') {
        res.writeHead(303, { location: String(s.cancel_url) });
        return res.end();
      }
      const c = state.customers.get(String(s.customer));
      const price = (opts.teamMonthlyPrice / 100).toFixed(2);
      return html(
        res,
        200,
        page(
          'Checkout',
          `<p class="muted">Edgefield</p><h1>Team plan</h1><p class="muted">For ${esc(String((s.metadata as Obj)?.workspaceName ?? 'your workspace'))}${c?.email ? ` · billed to ${esc(String(c.email))}` : ''}</p>
<div class="price">€${price} <span class="muted">per month</span></div><p class="muted">Up to 50 members and 10,000 stored solves.</p>
${s.status === 'complete' ? '<p><strong>Already paid.</strong></p>' : ''}
<div class="row"><form method="post" action="/checkout/${esc(String(s.id))}/pay"><button class="primary" type="submit" data-testid="fake-pay">Pay €${price} (test)</button></form>
<form method="post" action="/checkout/${esc(String(s.id))}/cancel"><button type="submit" data-testid="fake-cancel">Cancel</button></form></div>`,
        ),
      );
    }
    const po = /^\/portal\/(bps_[0-9a-f]+)(\/cancel)?$/.exec(p);
    if (po) {
      const s = state.portals.get(po[1]!);
      if (!s) return html(res, 404, page('Not found', '<h1>Portal session not found</h1>'));
      const subs = [...state.subscriptions.values()].filter((x) => x.customer === s.customer);
      if (m === 'POST' && po[2] === '/cancel') {
        for (const x of subs) await cancel(String(x.id));
        res.writeHead(303, { location: String(s.return_url) });
        return res.end();
      }
      const invs = [...state.invoices.values()].filter((x) => x.customer === s.customer);
      const active = subs.find((x) => x.status === 'active');
      return html(
        res,
        200,
        page(
          'Billing',
          `<p class="muted">Edgefield</p><h1>Billing</h1><p class="muted">${active ? `Team plan, active · renews ${day(Number(active.current_period_end))}` : 'No active subscription'}</p>
${
  invs.length
    ? `<table data-testid="fake-portal-invoices"><thead><tr><th>Invoice</th><th>Date</th><th class="r">Amount</th><th class="r">Status</th></tr></thead><tbody>${invs
        .map((i) => `<tr><td>${esc(String(i.number))}</td><td>${day(Number(i.created))}</td><td class="r">€${(Number(i.amount_paid) / 100).toFixed(2)}</td><td class="r">${esc(String(i.status))}</td></tr>`)
        .join('')}</tbody></table>`
    : '<p class="muted">No invoices yet.</p>'
}
<div class="row">${active ? `<form method="post" action="/portal/${esc(String(s.id))}/cancel"><button type="submit" data-testid="fake-portal-cancel">Cancel subscription</button></form>` : ''}<a class="btn" href="${esc(String(s.return_url))}">Back to Edgefield</a></div>`,
        ),
      );
    }
    html(res, 404, page('Not found', '<h1>Not found</h1>'));
  }

  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(opts.port ?? 0, opts.host ?? '127.0.0.1', () => resolve());
  });
  const port = (server.address() as AddressInfo).port;
  publicUrl = `http://localhost:${port}`;
  return {
    port,
    publicUrl,
    state,
    pay,
    close: () => new Promise<void>((r) => server.close(() => r())),
  };
}
