/**
 * CSRF: every state-changing API route refuses a browser request from another site with
 * 403 `cross_site` before doing anything (nothing stored changes), and accepts the same
 * request from our own origin (the route table's success statuses). The check itself
 * (lib/server/csrf.ts) is tested on plain Requests first.
 * Source of the rule: common practice (OWASP CSRF Prevention Cheat Sheet, "Verifying origin
 * with standard headers" and "Fetch Metadata"), no published numbers involved.
 */
import path from 'node:path';
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
vi.mock('@/lib/server/mail', async (importOriginal) => ({
  ...(await importOriginal<typeof import('@/lib/server/mail')>()),
  sendMail: async () => {},
}));

import fs from 'node:fs';
import { setDbForTesting, type DbHandle } from '@/db/client';
import { isCrossSiteRequest } from '@/lib/server/csrf';
import { createTestDb } from './helpers/db';
import { snapshotTables } from './helpers/db-snapshot';
import { buildWorld, type World } from './helpers/fixtures';
import { ROUTES, type RouteRow } from './routes-table';

const API_DIR = path.resolve('app/api');

describe('isCrossSiteRequest', () => {
  const req = (method: string, headers: Record<string, string>, url = 'http://app.example:3000/api/x') =>
    new Request(url, { method, headers });
  const savedUrl = process.env.NEXTAUTH_URL;
  const savedAllowed = process.env.EDGEFIELD_ALLOWED_ORIGINS;
  afterAll(() => {
    if (savedUrl === undefined) delete process.env.NEXTAUTH_URL;
    else process.env.NEXTAUTH_URL = savedUrl;
    if (savedAllowed === undefined) delete process.env.EDGEFIELD_ALLOWED_ORIGINS;
    else process.env.EDGEFIELD_ALLOWED_ORIGINS = savedAllowed;
  });

  it('never refuses safe methods', () => {
    for (const m of ['GET', 'HEAD', 'OPTIONS']) {
      expect(isCrossSiteRequest(req(m, { origin: 'https://evil.example', 'sec-fetch-site': 'cross-site' }))).toBe(false);
    }
  });
  it('refuses Sec-Fetch-Site cross-site and same-site, accepts same-origin and none', () => {
    expect(isCrossSiteRequest(req('POST', { 'sec-fetch-site': 'cross-site' }))).toBe(true);
    expect(isCrossSiteRequest(req('DELETE', { 'sec-fetch-site': 'same-site' }))).toBe(true);
    expect(isCrossSiteRequest(req('POST', { 'sec-fetch-site': 'same-origin' }))).toBe(false);
    expect(isCrossSiteRequest(req('POST', { 'sec-fetch-site': 'none' }))).toBe(false);
  });
  it('compares Origin with the Host header (and X-Forwarded-Host/Proto behind a proxy)', () => {
    expect(isCrossSiteRequest(req('POST', { host: 'app.example:3000', origin: 'http://app.example:3000' }))).toBe(false);
    expect(isCrossSiteRequest(req('POST', { host: 'app.example:3000', origin: 'http://app.example:3001' }))).toBe(true);
    expect(isCrossSiteRequest(req('PATCH', { host: 'app.example:3000', origin: 'https://evil.example' }))).toBe(true);
    expect(isCrossSiteRequest(req('PUT', { host: 'app.example:3000', origin: 'null' }))).toBe(true);
    expect(isCrossSiteRequest(req('POST', { host: 'app.example:3000', origin: 'not a url' }))).toBe(true);
    expect(
      isCrossSiteRequest(
        req('POST', { host: '127.0.0.1:3000', 'x-forwarded-host': 'edge.example', 'x-forwarded-proto': 'https', origin: 'https://edge.example' }),
      ),
    ).toBe(false);
    expect(
      isCrossSiteRequest(
        req('POST', { host: '127.0.0.1:3000', 'x-forwarded-host': 'edge.example', 'x-forwarded-proto': 'https', origin: 'http://edge.example' }),
      ),
    ).toBe(true);
  });
  it('accepts NEXTAUTH_URL and EDGEFIELD_ALLOWED_ORIGINS origins', () => {
    process.env.NEXTAUTH_URL = 'https://edgefield.example/';
    process.env.EDGEFIELD_ALLOWED_ORIGINS = 'https://a.example, https://b.example:8443';
    const h = { host: 'internal:3000' };
    expect(isCrossSiteRequest(req('POST', { ...h, origin: 'https://edgefield.example' }))).toBe(false);
    expect(isCrossSiteRequest(req('POST', { ...h, origin: 'https://b.example:8443' }))).toBe(false);
    expect(isCrossSiteRequest(req('POST', { ...h, origin: 'https://c.example' }))).toBe(true);
  });
  it('lets requests without Origin or Sec-Fetch-Site through (non-browser clients)', () => {
    expect(isCrossSiteRequest(req('POST', {}))).toBe(false);
  });
});

let handle: DbHandle;
let w: World;
const wasDemo = process.env.EDGEFIELD_DEMO;

beforeAll(async () => {
  process.env.EDGEFIELD_DEMO = '1';
  handle = await createTestDb();
  setDbForTesting(handle);
  w = await buildWorld(handle.db);
});
afterAll(async () => {
  if (wasDemo === undefined) delete process.env.EDGEFIELD_DEMO;
  else process.env.EDGEFIELD_DEMO = wasDemo;
  setDbForTesting(undefined);
  await handle?.close();
});

/** Rows that change state; the signed payment webhook is server-to-server and exempt. */
const rows = ROUTES.filter(
  (r) => r.method !== 'GET' && r.file !== 'billing/webhook' && r.file !== 'auth/[...nextauth]' && fs.existsSync(path.join(API_DIR, r.file, 'route.ts')),
);

let counter = 0;
async function call(row: RouteRow, headers: Record<string, string>) {
  const who = row.access === 'public' || row.access === 'user' ? 'owner' : row.access;
  auth.user = w.users[who];
  const mod = (await import(/* @vite-ignore */ path.join(API_DIR, row.file, 'route.ts'))) as Record<
    string,
    (req: Request, ctx: { params: Promise<Record<string, string>> }) => Promise<Response>
  >;
  const init: RequestInit = { method: row.method, headers: { host: 'localhost', ...headers } };
  if (row.rawBody) {
    const { contentType, data } = row.rawBody(w);
    init.body = data as unknown as BodyInit;
    (init.headers as Record<string, string>)['content-type'] = contentType;
  } else if (row.body) {
    init.body = JSON.stringify(row.body(w, 10_000 + ++counter));
    (init.headers as Record<string, string>)['content-type'] = 'application/json';
  }
  const res = await mod[row.method]!(new Request(`http://localhost/api/${row.file}${row.query ?? ''}`, init), {
    params: Promise.resolve(row.params?.(w) ?? {}),
  });
  const text = await res.text();
  return { status: res.status, json: JSON.parse(text || 'null') as { error?: { code: string; message: string } } | null };
}

describe('every state-changing route', () => {
  it('has rows to check', () => {
    expect(rows.length).toBeGreaterThan(10);
  });

  it.each(rows.map((r) => [`${r.method} /api/${r.file}`, r] as const))('%s refuses another site, changes nothing', async (_n, row) => {
    const before = await snapshotTables(handle);
    const hostile: Record<string, string>[] = [{ origin: 'https://evil.example' }, { 'sec-fetch-site': 'cross-site' }, { origin: 'null' }];
    for (const headers of hostile) {
      const r = await call(row, headers);
      expect(r.status).toBe(403);
      expect(r.json?.error?.code).toBe('cross_site');
      expect(r.json?.error?.message.length).toBeGreaterThan(10);
    }
    expect(await snapshotTables(handle)).toEqual(before);
  });
});

describe('our own origin', () => {
  // One representative per kind of route (JSON POST, PATCH, DELETE): a same-origin browser
  // request passes the check and the handler answers with the table's success status.
  const picks = ['POST', 'PATCH', 'DELETE', 'PUT']
    .map((m) => rows.find((r) => r.method === m && r.access !== 'public'))
    .filter((r): r is RouteRow => !!r);
  it.each(picks.map((r) => [`${r.method} /api/${r.file}`, r] as const))('%s passes', async (_n, row) => {
    const r = await call(row, { origin: 'http://localhost', 'sec-fetch-site': 'same-origin' });
    expect(row.ok, JSON.stringify(r.json)).toContain(r.status);
  });
});
