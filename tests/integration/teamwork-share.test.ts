/**
 * Read-only share links (issue 7): members always open them; others only when the
 * workspace allows public links; revoked and expired links never open; tokens are stored
 * only as hashes.
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
import { setDbForTesting, type DbHandle } from '@/db/client';
import { shareLinks } from '@/db/schema';
import { hashToken } from '@/lib/server/invitations';
import { openShareLink } from '@/lib/server/share';
import { createTestDb } from './helpers/db';
import { buildWorld, type World } from './helpers/fixtures';
import * as linksRoute from '@/app/api/workspaces/[workspaceId]/share-links/route';
import * as linkRoute from '@/app/api/workspaces/[workspaceId]/share-links/[linkId]/route';
import * as publicRoute from '@/app/api/workspaces/[workspaceId]/public-links/route';

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

type Fn = (req: Request, ctx: { params: Promise<Record<string, string>> }) => Promise<Response>;
async function call(fn: Fn, params: Record<string, string>, method: string, body?: unknown) {
  const res = await fn(
    new Request('http://localhost/api/x', { method, body: body === undefined ? undefined : JSON.stringify(body), headers: { 'content-type': 'application/json' } }),
    { params: Promise.resolve(params) },
  );
  return { status: res.status, json: (await res.json()) as Record<string, any> };
}

async function makeLink(targetType: 'section' | 'solve', targetId: string, expiresInDays: number | null = 7) {
  auth.user = w.users.editor;
  const r = await call(linksRoute.POST as Fn, { workspaceId: w.wsA }, 'POST', { targetType, targetId, expiresInDays });
  expect(r.status, JSON.stringify(r.json)).toBe(201);
  const token = /\/s\/([A-Za-z0-9_-]{43})$/.exec(r.json.link.url)![1]!;
  return { id: r.json.link.id as string, token };
}

async function setPublic(allow: boolean) {
  auth.user = w.users.owner;
  expect((await call(publicRoute.PUT as Fn, { workspaceId: w.wsA }, 'PUT', { allow })).status).toBe(200);
}

describe('share links', () => {
  it('store only the token hash; members open them; others only with public links allowed', async () => {
    const { id, token } = await makeLink('section', w.sectionA);
    const [row] = await handle.db.select().from(shareLinks).where(eq(shareLinks.id, id));
    expect(row!.tokenHash).toBe(hashToken(token));

    expect(await openShareLink(token, { id: w.users.viewer.id })).toMatchObject({ status: 'ok', asMember: true, target: { type: 'section', name: 'Section in A' } });
    expect(await openShareLink(token, null)).toMatchObject({ status: 'members_only' });
    expect(await openShareLink(token, { id: w.users.outsider.id })).toMatchObject({ status: 'members_only' });
    await setPublic(true);
    expect(await openShareLink(token, null)).toMatchObject({ status: 'ok', asMember: false });
    await setPublic(false);
    expect(await openShareLink(token, null)).toMatchObject({ status: 'members_only' });
  });

  it('a solve link shows the stored result', async () => {
    const { token } = await makeLink('solve', w.solveA, null);
    const open = await openShareLink(token, { id: w.users.viewer.id });
    expect(open).toMatchObject({ status: 'ok', target: { type: 'solve', sectionName: 'Section in A', revisionNumber: 1 } });
  });

  it('a revoked link no longer opens, even for members; revoking again is harmless', async () => {
    const { id, token } = await makeLink('section', w.sectionA);
    auth.user = w.users.editor;
    expect((await call(linkRoute.DELETE as Fn, { workspaceId: w.wsA, linkId: id }, 'DELETE')).json).toEqual({ revoked: true, alreadyRevoked: false });
    expect((await call(linkRoute.DELETE as Fn, { workspaceId: w.wsA, linkId: id }, 'DELETE')).json).toEqual({ revoked: true, alreadyRevoked: true });
    expect(await openShareLink(token, { id: w.users.owner.id })).toMatchObject({ status: 'revoked' });
  });

  it('an expired link no longer opens', async () => {
    const { id, token } = await makeLink('section', w.sectionA, 1);
    await handle.db.update(shareLinks).set({ expiresAt: new Date(Date.now() - 1000) }).where(eq(shareLinks.id, id));
    expect(await openShareLink(token, { id: w.users.owner.id })).toMatchObject({ status: 'expired' });
  });

  it('refuses another workspace’s target, bad expiry, unknown tokens', async () => {
    auth.user = w.users.editor;
    const foreign = await call(linksRoute.POST as Fn, { workspaceId: w.wsA }, 'POST', { targetType: 'section', targetId: w.sectionB, expiresInDays: 7 });
    expect(foreign.status).toBe(404);
    const badExpiry = await call(linksRoute.POST as Fn, { workspaceId: w.wsA }, 'POST', { targetType: 'section', targetId: w.sectionA, expiresInDays: 5 });
    expect(badExpiry.status).toBe(422);
    expect(badExpiry.json.error.field).toBe('expiresInDays');
    expect(await openShareLink('x'.repeat(43), null)).toEqual({ status: 'not_found' });
    expect(await openShareLink('short', null)).toEqual({ status: 'not_found' });
  });
});
