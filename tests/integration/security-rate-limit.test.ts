/**
 * Rate limits (lib/server/rate-limit.ts) on credentials sign-in, e-mail sign-in links,
 * sign-up and invitations: an exhausted bucket answers 429 with the JSON error shape (the
 * sign-up server action answers with its form state) and does nothing.
 * The limits themselves are common practice, no published source.
 */
import path from 'node:path';
import { afterAll, beforeAll, beforeEach, describe, expect, it, vi } from 'vitest';

vi.mock('server-only', () => ({}));
const auth = vi.hoisted(() => ({ user: null as null | { id: string; email: string; name: string }, nextAuthCalls: 0 }));
vi.mock('@/lib/server/session', () => ({
  getSessionUser: async () => auth.user,
  requireUser: async () => auth.user,
}));
vi.mock('@/lib/server/mail', async (importOriginal) => ({
  ...(await importOriginal<typeof import('@/lib/server/mail')>()),
  sendMail: async () => {},
}));
// The limiter runs before next-auth; next-auth itself is replaced so that only the wrapper is tested.
vi.mock('next-auth', () => ({
  default: async () => {
    auth.nextAuthCalls++;
    return Response.json({ url: 'http://localhost/w' });
  },
}));

import { setDbForTesting, type DbHandle } from '@/db/client';
import { signUp } from '@/lib/server/actions/auth';
import { RATE_LIMITS, resetRateLimits, setClockForTesting, take } from '@/lib/server/rate-limit';
import { createTestDb } from './helpers/db';
import { snapshotTables } from './helpers/db-snapshot';
import { buildWorld, type World } from './helpers/fixtures';

beforeEach(() => resetRateLimits());

describe('token bucket', () => {
  it('allows the burst, refuses the next, refills with time', () => {
    let t = 1_000_000;
    const restore = setClockForTesting(() => t);
    try {
      const spec = RATE_LIMITS['sign-in:account'];
      for (let i = 0; i < spec.capacity; i++) expect(take([{ name: 'sign-in:account', key: 'k' }]).ok).toBe(true);
      const r = take([{ name: 'sign-in:account', key: 'k' }]);
      expect(r.ok).toBe(false);
      expect(r.retryAfter).toBe(Math.ceil(60 / spec.perMinute));
      expect(take([{ name: 'sign-in:account', key: 'other' }]).ok).toBe(true);
      t += (60_000 / spec.perMinute) * 1.01; // one token back
      expect(take([{ name: 'sign-in:account', key: 'k' }]).ok).toBe(true);
      expect(take([{ name: 'sign-in:account', key: 'k' }]).ok).toBe(false);
      t += 3_600_000; // never more than the capacity
      for (let i = 0; i < spec.capacity; i++) expect(take([{ name: 'sign-in:account', key: 'k' }]).ok).toBe(true);
      expect(take([{ name: 'sign-in:account', key: 'k' }]).ok).toBe(false);
    } finally {
      restore();
    }
  });

  it('takes from all buckets or none', () => {
    for (let i = 0; i < RATE_LIMITS['magic-link:account'].capacity; i++) {
      expect(take([{ name: 'magic-link:account', key: 'a' }]).ok).toBe(true);
    }
    const before = RATE_LIMITS['magic-link:ip'].capacity;
    expect(take([{ name: 'magic-link:ip', key: 'ip' }, { name: 'magic-link:account', key: 'a' }]).ok).toBe(false);
    // The ip bucket was not charged by the refused attempt.
    let n = 0;
    while (take([{ name: 'magic-link:ip', key: 'ip' }]).ok) n++;
    expect(n).toBe(before);
  });
});

type NextAuthRoute = (req: Request, ctx: { params: Promise<{ nextauth: string[] }> }) => Promise<Response>;
async function authRoute(): Promise<NextAuthRoute> {
  const mod = await import(/* @vite-ignore */ path.resolve('app/api/auth/[...nextauth]/route.ts'));
  return mod.POST as NextAuthRoute;
}
function authPost(parts: string[], email: string, ip: string) {
  const req = new Request(`http://localhost/api/auth/${parts.join('/')}`, {
    method: 'POST',
    headers: { 'content-type': 'application/x-www-form-urlencoded', 'x-forwarded-for': `${ip}, 10.0.0.1` },
    body: new URLSearchParams({ email, password: 'wrong-password', csrfToken: 'x', json: 'true' }).toString(),
  });
  return { req, ctx: { params: Promise.resolve({ nextauth: parts }) } };
}

describe('credentials sign-in (POST /api/auth/callback/credentials)', () => {
  it('429 with the JSON shape after the burst for one account from one address; others still pass', async () => {
    const POST = await authRoute();
    const cap = RATE_LIMITS['sign-in:account'].capacity;
    auth.nextAuthCalls = 0;
    for (let i = 0; i < cap; i++) {
      const { req, ctx } = authPost(['callback', 'credentials'], 'Victim@Test.example', '203.0.113.5');
      expect((await POST(req, ctx)).status).toBe(200);
    }
    expect(auth.nextAuthCalls).toBe(cap);
    const { req, ctx } = authPost(['callback', 'credentials'], 'victim@test.example', '203.0.113.5');
    const res = await POST(req, ctx);
    expect(res.status).toBe(429);
    expect(Number(res.headers.get('retry-after'))).toBeGreaterThan(0);
    const body = (await res.json()) as { error: { code: string; message: string }; url: string };
    expect(body.error.code).toBe('rate_limited');
    expect(body.error.message).toMatch(/too many/i);
    // next-auth's client reads `url`; the sign-in form shows TooManyRequests as a sentence.
    expect(new URL(body.url).searchParams.get('error')).toBe('TooManyRequests');
    expect(auth.nextAuthCalls).toBe(cap); // next-auth was not reached
    const other = authPost(['callback', 'credentials'], 'someone-else@test.example', '203.0.113.5');
    expect((await POST(other.req, other.ctx)).status).toBe(200);
    const elsewhere = authPost(['callback', 'credentials'], 'victim@test.example', '198.51.100.7');
    expect((await POST(elsewhere.req, elsewhere.ctx)).status).toBe(200);
  });

  it('one address trying many accounts is stopped by the per-address bucket', async () => {
    const POST = await authRoute();
    const cap = RATE_LIMITS['sign-in:ip'].capacity;
    for (let i = 0; i < cap; i++) {
      const { req, ctx } = authPost(['callback', 'credentials'], `spray-${i}@test.example`, '203.0.113.9');
      expect((await POST(req, ctx)).status).toBe(200);
    }
    const { req, ctx } = authPost(['callback', 'credentials'], 'spray-new@test.example', '203.0.113.9');
    expect((await POST(req, ctx)).status).toBe(429);
  });

  it('other next-auth POSTs (sign-out) are not limited', async () => {
    const POST = await authRoute();
    for (let i = 0; i < 80; i++) {
      const { req, ctx } = authPost(['signout'], 'x@test.example', '203.0.113.10');
      expect((await POST(req, ctx)).status).toBe(200);
    }
  });
});

describe('e-mail sign-in links (POST /api/auth/signin/email)', () => {
  it('one inbox gets at most the burst of links, from any address', async () => {
    const POST = await authRoute();
    const cap = RATE_LIMITS['magic-link:account'].capacity;
    for (let i = 0; i < cap; i++) {
      const { req, ctx } = authPost(['signin', 'email'], 'inbox@test.example', `198.51.100.${i + 1}`);
      expect((await POST(req, ctx)).status).toBe(200);
    }
    const { req, ctx } = authPost(['signin', 'email'], 'inbox@test.example', '198.51.100.200');
    const res = await POST(req, ctx);
    expect(res.status).toBe(429);
    expect(((await res.json()) as { error: { code: string } }).error.code).toBe('rate_limited');
  });
});

describe('sign-up (server action)', () => {
  it('answers the form with "too many attempts" after the burst, before touching anything', async () => {
    const cap = RATE_LIMITS['sign-up:ip'].capacity;
    const form = new FormData(); // invalid on purpose: no database needed for these attempts
    for (let i = 0; i < cap; i++) {
      const r = await signUp({ status: 'idle' }, form);
      expect(r.status === 'error' && r.message).toBe('Please correct the marked fields.');
    }
    const r = await signUp({ status: 'idle' }, form);
    expect(r.status).toBe('error');
    expect(r.status === 'error' && r.message).toMatch(/too many attempts/i);
  });
});

describe('invitations (POST /api/workspaces/[id]/invitations)', () => {
  let handle: DbHandle;
  let w: World;
  beforeAll(async () => {
    handle = await createTestDb();
    setDbForTesting(handle);
    w = await buildWorld(handle.db);
  });
  afterAll(async () => {
    setDbForTesting(undefined);
    await handle?.close();
  });

  it('one address cannot be invited over and over: 429 and nothing stored changes', async () => {
    auth.user = w.users.owner;
    const mod = await import(/* @vite-ignore */ path.resolve('app/api/workspaces/[workspaceId]/invitations/route.ts'));
    const POST = mod.POST as (req: Request, ctx: { params: Promise<Record<string, string>> }) => Promise<Response>;
    const send = () =>
      POST(
        new Request('http://localhost/api/x', {
          method: 'POST',
          headers: { 'content-type': 'application/json' },
          body: JSON.stringify({ email: 'again@test.example', role: 'viewer' }),
        }),
        { params: Promise.resolve({ workspaceId: w.wsA }) },
      );
    const cap = RATE_LIMITS['invite:address'].capacity;
    for (let i = 0; i < cap; i++) expect((await send()).status).toBeLessThan(429);
    const before = await snapshotTables(handle);
    const res = await send();
    expect(res.status).toBe(429);
    const body = (await res.json()) as { error: { code: string; message: string } };
    expect(body.error.code).toBe('rate_limited');
    expect(await snapshotTables(handle)).toEqual(before);
  });
});
