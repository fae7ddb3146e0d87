/**
 * Members and invitations (issue 7) through the route handlers and the accept actions:
 * invitation mail with a one-time link (only the token's hash stored), joining with the
 * invited role, expiry, revocation, wrong account, role changes that the API follows at
 * once, the last-owner rule, and the free plan's member limit.
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
const mails = vi.hoisted(() => [] as { to: string; subject: string; text: string; html: string }[]);
vi.mock('@/lib/server/mail', async (importOriginal) => ({
  ...(await importOriginal<typeof import('@/lib/server/mail')>()),
  sendMail: async (m: { to: string; subject: string; text: string; html: string }) => {
    mails.push(m);
  },
}));

import { eq } from 'drizzle-orm';
import { setDbForTesting, type DbHandle } from '@/db/client';
import { auditEvents, invitations, memberships, users, workspaces } from '@/db/schema';
import { hashToken } from '@/lib/server/invitations';
import { acceptInvitation, signUpWithInvitation } from '@/lib/server/actions/invitations';
import { PLANS } from '@/lib/server/plans';
import { coaxSection } from './helpers/fixtures';
import { createTestDb } from './helpers/db';
import { buildWorld, type World } from './helpers/fixtures';

import * as invitationsRoute from '@/app/api/workspaces/[workspaceId]/invitations/route';
import * as invitationRoute from '@/app/api/workspaces/[workspaceId]/invitations/[invitationId]/route';
import * as memberRoute from '@/app/api/workspaces/[workspaceId]/members/[userId]/route';
import * as sectionsRoute from '@/app/api/workspaces/[workspaceId]/sections/route';

let handle: DbHandle;
let w: World;

beforeAll(async () => {
  handle = await createTestDb();
  setDbForTesting(handle);
  w = await buildWorld(handle.db);
  // The flows below invite more people than the free plan allows; its limit is tested last.
  await handle.db.update(workspaces).set({ plan: 'team' }).where(eq(workspaces.id, w.wsA));
});
afterAll(async () => {
  setDbForTesting(undefined);
  await handle?.close();
});

type Fn = (req: Request, ctx: { params: Promise<Record<string, string>> }) => Promise<Response>;
async function call(fn: Fn, params: Record<string, string>, method: string, body?: unknown) {
  const res = await fn(
    new Request('http://localhost/api/x', {
      method,
      body: body === undefined ? undefined : JSON.stringify(body),
      headers: body === undefined ? {} : { 'content-type': 'application/json' },
    }),
    { params: Promise.resolve(params) },
  );
  return { status: res.status, json: (await res.json()) as Record<string, any> };
}
const as = (who: keyof World['users']) => {
  auth.user = w.users[who];
};

function tokenFromMail(m: { text: string }): string {
  const match = /\/invite\/([A-Za-z0-9_-]{43})\b/.exec(m.text);
  if (!match) throw new Error(`no invitation link in: ${m.text}`);
  return match[1]!;
}

async function invite(email: string, role: 'owner' | 'editor' | 'viewer') {
  as('owner');
  const before = mails.length;
  const r = await call(invitationsRoute.POST as Fn, { workspaceId: w.wsA }, 'POST', { email, role });
  expect(r.status, JSON.stringify(r.json)).toBe(201);
  expect(mails.length).toBe(before + 1);
  return { id: r.json.invitation.id as string, token: tokenFromMail(mails.at(-1)!) };
}

describe('invitations', () => {
  it('mails a one-time link; only the hash of its token is stored', async () => {
    const { id, token } = await invite('Nadia.Fenn@Test.Example', 'editor');
    const m = mails.at(-1)!;
    expect(m.to).toBe('nadia.fenn@test.example');
    expect(m.subject).toContain('Workspace A');
    expect(m.html).toContain(`/invite/${token}`);
    const [row] = await handle.db.select().from(invitations).where(eq(invitations.id, id));
    expect(row!.tokenHash).toBe(hashToken(token));
    expect(JSON.stringify(row)).not.toContain(token);
    // Expires in 7 days (common practice, no published source).
    const days = (row!.expiresAt.getTime() - Date.now()) / 86400e3;
    expect(days).toBeGreaterThan(6.99);
    expect(days).toBeLessThanOrEqual(7);
    const audit = await handle.db.select().from(auditEvents).where(eq(auditEvents.targetId, id));
    expect(audit.map((a) => a.action)).toContain('member.invite');
  });

  it('a new person signs up through the link and joins with the invited role, once', async () => {
    const { token } = await invite('new.person@test.example', 'editor');
    auth.user = null;
    const weak = await signUpWithInvitation(token, { name: 'New Person', password: 'short' });
    expect(weak).toMatchObject({ status: 'error', code: 'invalid' });
    const r = await signUpWithInvitation(token, { name: 'New Person', password: 'a-long-enough-password' });
    expect(r).toEqual({ status: 'ok', workspaceId: w.wsA, role: 'editor' });
    const [u] = await handle.db.select().from(users).where(eq(users.email, 'new.person@test.example'));
    expect(u!.passwordHash).toMatch(/^\$2[aby]\$/);
    const [m] = await handle.db.select().from(memberships).where(eq(memberships.userId, u!.id));
    expect(m).toMatchObject({ workspaceId: w.wsA, role: 'editor' });
    // The link works once.
    auth.user = { id: u!.id, email: u!.email, name: 'New Person' };
    expect(await acceptInvitation(token)).toMatchObject({ status: 'error', code: 'accepted' });
  });

  it('an existing account must be the invited address', async () => {
    const { token } = await invite(w.users.outsider.email, 'viewer');
    as('viewer');
    expect(await acceptInvitation(token)).toMatchObject({ status: 'error', code: 'wrong_account' });
    auth.user = null;
    expect(await acceptInvitation(token)).toMatchObject({ status: 'error', code: 'unauthorized' });
    expect(await acceptInvitation('not-a-token')).toMatchObject({ status: 'error', code: 'not_found' });
    as('outsider');
    expect(await acceptInvitation(token)).toEqual({ status: 'ok', workspaceId: w.wsA, role: 'viewer' });
    // An owner removes them again; the audit trail has both events.
    as('owner');
    expect((await call(memberRoute.DELETE as Fn, { workspaceId: w.wsA, userId: w.users.outsider.id }, 'DELETE')).status).toBe(200);
    const acts = (await handle.db.select().from(auditEvents).where(eq(auditEvents.targetId, w.users.outsider.id))).map((a) => a.action);
    expect(acts).toEqual(expect.arrayContaining(['member.join', 'member.remove']));
  });

  it('a revoked invitation no longer works; revoking twice is a 404', async () => {
    const { id, token } = await invite('revoked@test.example', 'viewer');
    as('owner');
    expect((await call(invitationRoute.DELETE as Fn, { workspaceId: w.wsA, invitationId: id }, 'DELETE')).status).toBe(200);
    expect((await call(invitationRoute.DELETE as Fn, { workspaceId: w.wsA, invitationId: id }, 'DELETE')).status).toBe(404);
    auth.user = null;
    expect(await signUpWithInvitation(token, { name: 'R', password: 'a-long-enough-password' })).toMatchObject({
      status: 'error',
      code: 'revoked',
    });
    expect((await handle.db.select().from(users).where(eq(users.email, 'revoked@test.example'))).length).toBe(0);
    // Not listed as pending any more.
    as('owner');
    const list = await call(invitationsRoute.GET as Fn, { workspaceId: w.wsA }, 'GET');
    expect(list.json.invitations.map((i: { email: string }) => i.email)).not.toContain('revoked@test.example');
  });

  it('an expired invitation no longer works', async () => {
    const { id, token } = await invite('late@test.example', 'viewer');
    await handle.db.update(invitations).set({ expiresAt: new Date(Date.now() - 1000) }).where(eq(invitations.id, id));
    auth.user = null;
    expect(await signUpWithInvitation(token, { name: 'Late', password: 'a-long-enough-password' })).toMatchObject({
      status: 'error',
      code: 'expired',
    });
  });

  it('inviting a member is a 409 naming the field; a malformed address is a 422', async () => {
    as('owner');
    const dup = await call(invitationsRoute.POST as Fn, { workspaceId: w.wsA }, 'POST', { email: w.users.editor.email, role: 'viewer' });
    expect(dup.status).toBe(409);
    expect(dup.json.error.field).toBe('email');
    const bad = await call(invitationsRoute.POST as Fn, { workspaceId: w.wsA }, 'POST', { email: 'not an address', role: 'viewer' });
    expect(bad.status).toBe(422);
    expect(bad.json.error.field).toBe('email');
    const role = await call(invitationsRoute.POST as Fn, { workspaceId: w.wsA }, 'POST', { email: 'x@test.example', role: 'admin' });
    expect(role.status).toBe(422);
    expect(role.json.error.field).toBe('role');
  });
});

describe('roles', () => {
  it('an editor made a viewer can no longer write (403), and an editor again can', async () => {
    as('owner');
    expect((await call(memberRoute.PATCH as Fn, { workspaceId: w.wsA, userId: w.users.editor.id }, 'PATCH', { role: 'viewer' })).status).toBe(200);
    as('editor');
    const denied = await call(sectionsRoute.POST as Fn, { workspaceId: w.wsA }, 'POST', { name: 'Blocked', content: coaxSection() });
    expect(denied.status).toBe(403);
    as('owner');
    expect((await call(memberRoute.PATCH as Fn, { workspaceId: w.wsA, userId: w.users.editor.id }, 'PATCH', { role: 'editor' })).status).toBe(200);
    as('editor');
    const ok = await call(sectionsRoute.POST as Fn, { workspaceId: w.wsA }, 'POST', { name: 'Allowed', content: coaxSection() });
    expect(ok.status).toBe(201);
  });

  it('the last owner can be neither demoted nor removed nor leave, with a clear message', async () => {
    as('owner');
    const demote = await call(memberRoute.PATCH as Fn, { workspaceId: w.wsA, userId: w.users.owner.id }, 'PATCH', { role: 'editor' });
    expect(demote.status).toBe(409);
    expect(demote.json.error.code).toBe('last_owner');
    expect(demote.json.error.message).toMatch(/at least one owner/);
    const leave = await call(memberRoute.DELETE as Fn, { workspaceId: w.wsA, userId: w.users.owner.id }, 'DELETE');
    expect(leave.status).toBe(409);
    expect(leave.json.error.message).toMatch(/only owner/);
    const [m] = await handle.db.select().from(memberships).where(eq(memberships.userId, w.users.owner.id));
    expect(m!.role).toBe('owner');
  });

  it('with a second owner the first may step down; members may leave; owners remove others', async () => {
    as('owner');
    expect((await call(memberRoute.PATCH as Fn, { workspaceId: w.wsA, userId: w.users.editor.id }, 'PATCH', { role: 'owner' })).status).toBe(200);
    expect((await call(memberRoute.PATCH as Fn, { workspaceId: w.wsA, userId: w.users.owner.id }, 'PATCH', { role: 'editor' })).status).toBe(200);
    // Now "owner" is an editor: they may not remove the viewer, but they may leave.
    const notAllowed = await call(memberRoute.DELETE as Fn, { workspaceId: w.wsA, userId: w.users.viewer.id }, 'DELETE');
    expect(notAllowed.status).toBe(403);
    as('editor'); // the new owner restores the original roles
    expect((await call(memberRoute.PATCH as Fn, { workspaceId: w.wsA, userId: w.users.owner.id }, 'PATCH', { role: 'owner' })).status).toBe(200);
    expect((await call(memberRoute.PATCH as Fn, { workspaceId: w.wsA, userId: w.users.editor.id }, 'PATCH', { role: 'editor' })).status).toBe(200);
    const audit = await handle.db.select().from(auditEvents).where(eq(auditEvents.action, 'member.role'));
    expect(audit.length).toBeGreaterThanOrEqual(4);
  });

  it('an owner removes a member, who then gets 404 for the workspace', async () => {
    const { token } = await invite('temp.member@test.example', 'viewer');
    auth.user = null;
    expect((await signUpWithInvitation(token, { name: 'Temp', password: 'a-long-enough-password' })).status).toBe('ok');
    const [u] = await handle.db.select().from(users).where(eq(users.email, 'temp.member@test.example'));
    as('owner');
    expect((await call(memberRoute.DELETE as Fn, { workspaceId: w.wsA, userId: u!.id }, 'DELETE')).status).toBe(200);
    auth.user = { id: u!.id, email: u!.email, name: 'Temp' };
    const r = await call(invitationsRoute.GET as Fn, { workspaceId: w.wsA }, 'GET');
    expect(r.status).toBe(404);
  });
});

describe('free plan member limit', () => {
  it('refuses an invitation beyond the limit with 402 and a sentence saying what to do', async () => {
    await handle.db.update(workspaces).set({ plan: 'free' }).where(eq(workspaces.id, w.wsA));
    as('owner');
    // Fill the free plan: members + pending invitations up to the limit.
    for (let i = 0; ; i++) {
      const r = await call(invitationsRoute.POST as Fn, { workspaceId: w.wsA }, 'POST', { email: `fill-${i}@test.example`, role: 'viewer' });
      if (r.status === 402) {
        expect(r.json.error.code).toBe('plan_limit');
        expect(r.json.error.message).toContain(`${PLANS.free.maxMembers} members`);
        expect(r.json.error.message).toMatch(/upgrade/i);
        break;
      }
      expect(r.status).toBe(201);
      expect(i).toBeLessThan(PLANS.free.maxMembers);
    }
  });
});
