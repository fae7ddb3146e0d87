/**
 * The share view /s/[token] (issue 8, the share-link column of the authorisation matrix): the
 * page itself is rendered on the server for each kind of link × visitor and must show the
 * shared item only where the link is valid and the visitor may open it. The page uses no API
 * route (it reads through lib/server/share.ts); what a token holder gets from the API is in
 * tests/integration/route-roles.test.ts.
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
import { renderToString } from 'react-dom/server';
import SharedPage from '@/app/s/[token]/page';
import { setDbForTesting, type DbHandle } from '@/db/client';
import { sections } from '@/db/schema';
import { snapshotTables } from './helpers/db-snapshot';
import { createTestDb } from './helpers/db';
import { buildWorld, type World } from './helpers/fixtures';
import { addShareHolders, insertShareLinkWithToken, setPublicLinks, type ShareHolders } from './helpers/share-holders';

type Visitor = 'signedOut' | 'stranger' | 'memberOfB' | 'viewerOfA';
const VISITORS: Visitor[] = ['signedOut', 'stranger', 'memberOfB', 'viewerOfA'];
const LABEL: Record<Visitor, string> = {
  signedOut: 'signed out',
  stranger: 'signed in, member of no workspace',
  memberOfB: 'member of workspace B only',
  viewerOfA: 'viewer of workspace A',
};
type Status = 'ok' | 'members_only' | 'expired' | 'revoked' | 'not_found';

let handle: DbHandle;
let w: World;
let holders: ShareHolders;
const tokens: Record<string, string> = {};

beforeAll(async () => {
  handle = await createTestDb();
  setDbForTesting(handle);
  w = await buildWorld(handle.db);
  holders = await addShareHolders(handle.db, w);
  const db = handle.db;
  const by = w.users.editor.id;
  tokens.section = holders.sectionToken;
  tokens.solve = holders.solveToken;
  tokens.expired = (await insertShareLinkWithToken(db, { workspaceId: w.wsA, targetType: 'section', targetId: w.sectionA, createdBy: by, expiresAt: new Date(Date.now() - 60_000) })).token;
  tokens.revoked = (await insertShareLinkWithToken(db, { workspaceId: w.wsA, targetType: 'solve', targetId: w.solveA, createdBy: by, revokedAt: new Date() })).token;
  // A link row of A aimed at B's objects (cannot be made through the API, which checks the
  // target; a forged or corrupted row must still open nothing of B).
  tokens.foreignSection = (await insertShareLinkWithToken(db, { workspaceId: w.wsA, targetType: 'section', targetId: w.sectionB, createdBy: by })).token;
  tokens.foreignSolve = (await insertShareLinkWithToken(db, { workspaceId: w.wsA, targetType: 'solve', targetId: w.solveB, createdBy: by })).token;
  // A link of workspace B (B does not allow public links).
  tokens.ofB = (await insertShareLinkWithToken(db, { workspaceId: w.wsB, targetType: 'section', targetId: w.sectionB, createdBy: w.users.outsider.id })).token;
  // A link whose section was deleted since.
  const [gone] = await db.insert(sections).values({ workspaceId: w.wsA, name: 'Deleted later', createdBy: by }).returning();
  tokens.deleted = (await insertShareLinkWithToken(db, { workspaceId: w.wsA, targetType: 'section', targetId: gone!.id, createdBy: by })).token;
  await db.update(sections).set({ deletedAt: new Date() }).where(eq(sections.id, gone!.id));
  // Right shape, one character off a valid token; and shapes no token has.
  const last = tokens.section.at(-1)!;
  tokens.wrong = tokens.section.slice(0, -1) + (last === 'A' ? 'B' : 'A');
  tokens.malformed = "x'; drop table share_links;--";
});
afterAll(async () => {
  setDbForTesting(undefined);
  await handle?.close();
});

function userOf(v: Visitor) {
  return { signedOut: null, stranger: holders.stranger, memberOfB: w.users.outsider, viewerOfA: w.users.viewer }[v];
}

async function render(token: string, v: Visitor) {
  auth.user = userOf(v);
  const html = renderToString(await SharedPage({ params: Promise.resolve({ token }) }));
  const status = /data-testid="shared-page" data-status="([a-z_]+)"/.exec(html)?.[1];
  return { html, status };
}

interface Case {
  name: string;
  token: keyof typeof tokens | string;
  /** Workspace A allows signed-out visitors on its links. */
  publicA: boolean;
  expect: Record<Visitor, Status>;
  /** Text that shows only when the item is open. */
  shows: string;
}

const all = (s: Status): Record<Visitor, Status> => ({ signedOut: s, stranger: s, memberOfB: s, viewerOfA: s });

const CASES: Case[] = [
  {
    name: 'valid section link, public links off',
    token: 'section',
    publicA: false,
    expect: { signedOut: 'members_only', stranger: 'members_only', memberOfB: 'members_only', viewerOfA: 'ok' },
    shows: 'Section in A',
  },
  { name: 'valid section link, public links on', token: 'section', publicA: true, expect: all('ok'), shows: 'Section in A' },
  {
    name: 'valid solve link, public links off',
    token: 'solve',
    publicA: false,
    expect: { signedOut: 'members_only', stranger: 'members_only', memberOfB: 'members_only', viewerOfA: 'ok' },
    shows: 'Solve of Section in A',
  },
  { name: 'valid solve link, public links on', token: 'solve', publicA: true, expect: all('ok'), shows: 'Solve of Section in A' },
  { name: 'expired link', token: 'expired', publicA: true, expect: all('expired'), shows: 'Section in A' },
  { name: 'revoked link', token: 'revoked', publicA: true, expect: all('revoked'), shows: 'Solve of Section in A' },
  { name: 'wrong token', token: 'wrong', publicA: true, expect: all('not_found'), shows: 'Section in A' },
  { name: 'malformed token', token: 'malformed', publicA: true, expect: all('not_found'), shows: 'Section in A' },
  { name: 'link of A to a section of B', token: 'foreignSection', publicA: true, expect: all('not_found'), shows: 'Section in B' },
  { name: 'link of A to a solve of B', token: 'foreignSolve', publicA: true, expect: all('not_found'), shows: 'Solve of Section in B' },
  { name: 'link to a deleted section', token: 'deleted', publicA: true, expect: all('not_found'), shows: 'Deleted later' },
  {
    name: 'link of B (public links off in B)',
    token: 'ofB',
    publicA: true,
    expect: { signedOut: 'members_only', stranger: 'members_only', memberOfB: 'ok', viewerOfA: 'members_only' },
    shows: 'Section in B',
  },
];

describe.each(CASES.map((c) => [c.name, c] as const))('/s/[token]: %s', (_n, c) => {
  for (const v of VISITORS) {
    const expected = c.expect[v];
    it(`/s/[token] ${c.name} as ${LABEL[v]} → ${expected}`, async () => {
      await setPublicLinks(handle.db, w.wsA, c.publicA);
      const { html, status } = await render(tokens[c.token] ?? c.token, v);
      expect(status).toBe(expected);
      if (expected === 'ok') {
        expect(html).toContain(c.shows);
        expect(html).toContain('data-testid="shared-sketch"');
        if (c.shows.startsWith('Solve of')) expect(html).toContain('data-testid="shared-result"');
      } else {
        // Nothing of any shared item: no names, drawing or result.
        for (const s of ['Section in A', 'Section in B', 'Deleted later', 'shared-sketch', 'shared-result', 'shared-title']) expect(html).not.toContain(s);
        expect(html).toContain('data-testid="shared-error"');
        // An unusable token does not even say which workspace it would belong to.
        if (expected === 'not_found') for (const s of ['Workspace A', 'Workspace B']) expect(html).not.toContain(s);
      }
      // Signed-out visitors are offered sign-in; signed-in ones are not.
      expect(html.includes('Sign in</a>')).toBe(v === 'signedOut');
    });
  }
});

describe('/s/[token] is read-only', () => {
  it('opening every kind of link as every visitor changes nothing stored', async () => {
    await setPublicLinks(handle.db, w.wsA, true);
    const before = await snapshotTables(handle);
    for (const t of Object.values(tokens)) for (const v of VISITORS) await render(t, v);
    expect(await snapshotTables(handle)).toEqual(before);
  });
});
