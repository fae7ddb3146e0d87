/**
 * The cheap read path (issue 8, Load): the read routes read the member's role in the same
 * query as their data (lib/server/access.ts readAsViewer) and must answer exactly as a role
 * check followed by the read did; a stored field carries an ETag and answers If-None-Match
 * with 304 only to members; comments come with the solve's existence in one query. On
 * in-memory PGlite with the real migrations.
 */
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';

vi.mock('server-only', () => ({}));
const who = vi.hoisted(() => ({ current: null as null | { id: string; email: string; name: string } }));
vi.mock('@/lib/server/session', () => ({
  getSessionUser: async () => who.current,
  requireUser: async () => {
    if (!who.current) throw new Error('redirect');
    return who.current;
  },
}));

import { eq } from 'drizzle-orm';
import type { DbHandle } from '@/db/client';
import { setDbForTesting } from '@/db/client';
import { comments, memberships, solves } from '@/db/schema';
import { listComments } from '@/db/queries/comments';
import { listSolves } from '@/db/queries/solves';
import { createTestDb } from './helpers/db';
import { buildWorld, type Who, type World } from './helpers/fixtures';
import * as listRoute from '@/app/api/workspaces/[workspaceId]/solves/route';
import * as solveRoute from '@/app/api/workspaces/[workspaceId]/solves/[solveId]/route';
import * as fieldRoute from '@/app/api/workspaces/[workspaceId]/solves/[solveId]/field/route';
import * as commentsRoute from '@/app/api/workspaces/[workspaceId]/solves/[solveId]/comments/route';

let handle: DbHandle;
let world: World;
const BLOB = new Uint8Array(Array.from({ length: 5000 }, (_, i) => (i * 37) % 256));

beforeAll(async () => {
  handle = await createTestDb();
  setDbForTesting(handle);
  world = await buildWorld(handle.db);
  // The field is stored directly (the upload's checks have their own tests).
  await handle.db.update(solves).set({ field: BLOB, fieldBytes: BLOB.byteLength }).where(eq(solves.id, world.solveA));
});
afterAll(async () => {
  setDbForTesting(undefined);
  await handle?.close();
});

function as(w: Who | null) {
  who.current = w ? world.users[w] : null;
}
const base = (ws: string) => `http://localhost/api/workspaces/${ws}/solves`;
async function code(res: Response): Promise<string> {
  return ((await res.json()) as { error: { code: string } }).error.code;
}
const getList = (ws: string, query = '') => listRoute.GET(new Request(base(ws) + query), { params: Promise.resolve({ workspaceId: ws }) });
const getSolve = (ws: string, id: string) => solveRoute.GET(new Request(`${base(ws)}/${id}`), { params: Promise.resolve({ workspaceId: ws, solveId: id }) });
const getComments = (ws: string, id: string) =>
  commentsRoute.GET(new Request(`${base(ws)}/${id}/comments`), { params: Promise.resolve({ workspaceId: ws, solveId: id }) });
const getField = (ws: string, id: string, headers: Record<string, string> = {}) =>
  fieldRoute.GET(new Request(`${base(ws)}/${id}/field`, { headers }), { params: Promise.resolve({ workspaceId: ws, solveId: id }) });

describe('read routes with the role read in the data query', () => {
  it('answer 401 signed out and 404 (the workspace, not the item) to outsiders, for existing and missing items alike', async () => {
    as(null);
    for (const r of [await getList(world.wsA), await getSolve(world.wsA, world.solveA), await getComments(world.wsA, world.solveA), await getField(world.wsA, world.solveA)]) {
      expect(r.status).toBe(401);
    }
    as('outsider');
    const missing = 'no-such-solve';
    for (const r of [
      await getList(world.wsA),
      await getSolve(world.wsA, world.solveA),
      await getSolve(world.wsA, missing),
      await getComments(world.wsA, world.solveA),
      await getComments(world.wsA, missing),
      await getField(world.wsA, world.solveA),
      await getField(world.wsA, missing),
      await getField(world.wsA, world.solveA, { 'if-none-match': '*' }),
    ]) {
      expect(r.status).toBe(404);
      expect(((await r.json()) as { error: { message: string } }).error.message).toBe('The workspace was not found.');
    }
  });

  it('give members the same data as the plain reads, and "the solve was not found" for a missing or foreign solve', async () => {
    as('viewer');
    const list = await getList(world.wsA);
    expect(list.status).toBe(200);
    const listed = ((await list.json()) as { solves: { id: string }[] }).solves.map((s) => s.id);
    expect(listed).toEqual((await listSolves(world.wsA)).map((s) => s.id));
    expect(listed).toContain(world.solveA);

    const one = await getSolve(world.wsA, world.solveA);
    expect(one.status).toBe(200);
    expect(((await one.json()) as { solve: { id: string; hasField: boolean } }).solve).toMatchObject({ id: world.solveA, hasField: true });
    for (const r of [await getSolve(world.wsA, world.solveB), await getComments(world.wsA, world.solveB), await getField(world.wsA, world.solveB)]) {
      expect(r.status).toBe(404);
      expect(((await r.json()) as { error: { message: string } }).error.message).toBe('The solve was not found.');
    }
  });

  it('lists nothing (200, not 404) for a member whose filter matches no solve, and refuses a bad query after the role check', async () => {
    as('viewer');
    const r = await getList(world.wsA, '?sectionId=' + world.sectionB);
    expect(r.status).toBe(200);
    expect(((await r.json()) as { solves: unknown[] }).solves).toEqual([]);
    expect((await getList(world.wsA, '?sort=sideways')).status).toBe(422);
    as('outsider');
    expect((await getList(world.wsA, '?sort=sideways')).status).toBe(404);
    as(null);
    expect((await getList(world.wsA, '?sort=sideways')).status).toBe(401);
  });

  it('a member removed from the workspace is refused at once', async () => {
    as('viewer');
    expect((await getSolve(world.wsA, world.solveA)).status).toBe(200);
    const [m] = await handle.db.select().from(memberships).where(eq(memberships.userId, world.users.viewer.id));
    await handle.db.delete(memberships).where(eq(memberships.userId, world.users.viewer.id));
    try {
      expect((await getSolve(world.wsA, world.solveA)).status).toBe(404);
      expect((await getComments(world.wsA, world.solveA)).status).toBe(404);
    } finally {
      await handle.db.insert(memberships).values(m!);
    }
  });
});

describe('comments in one query', () => {
  it('returns the thread oldest first without deleted comments, and [] for a solve without comments', async () => {
    as('viewer');
    const r = await getComments(world.wsA, world.solveA);
    expect(r.status).toBe(200);
    const got = ((await r.json()) as { comments: { id: string }[] }).comments.map((c) => c.id);
    expect(got).toEqual((await listComments(world.wsA, world.solveA)).map((c) => c.id));

    const [c] = await handle.db
      .insert(comments)
      .values({ solveId: world.solveA, authorId: world.users.viewer.id, body: 'Checked the gap.' })
      .returning();
    await handle.db
      .insert(comments)
      .values({ solveId: world.solveA, authorId: world.users.viewer.id, body: 'gone', deletedAt: new Date() });
    const after = ((await (await getComments(world.wsA, world.solveA)).json()) as { comments: { id: string; body: string; author: { id: string } }[] }).comments;
    expect(after.map((x) => x.body)).toContain('Checked the gap.');
    expect(after.map((x) => x.body)).not.toContain('gone');
    expect(after.find((x) => x.id === c!.id)?.author.id).toBe(world.users.viewer.id);

    await handle.db.delete(comments).where(eq(comments.solveId, world.solveA));
    const none = await getComments(world.wsA, world.solveA);
    expect(none.status).toBe(200);
    expect(((await none.json()) as { comments: unknown[] }).comments).toEqual([]);
  });
});

describe('GET …/field: ETag and If-None-Match', () => {
  it('sends the stored bytes with a private immutable cache and an ETag', async () => {
    as('viewer');
    const r = await getField(world.wsA, world.solveA);
    expect(r.status).toBe(200);
    expect(r.headers.get('cache-control')).toBe('private, max-age=31536000, immutable');
    expect(r.headers.get('etag')).toMatch(/^".+"$/);
    expect(new Uint8Array(await r.arrayBuffer())).toEqual(BLOB);
  });

  it('answers a matching If-None-Match with 304 and no body, and a stale one with the bytes', async () => {
    as('viewer');
    const etag = (await getField(world.wsA, world.solveA)).headers.get('etag')!;
    const hit = await getField(world.wsA, world.solveA, { 'if-none-match': `"other", ${etag}` });
    expect(hit.status).toBe(304);
    expect(hit.headers.get('etag')).toBe(etag);
    expect(await hit.text()).toBe('');
    const weak = await getField(world.wsA, world.solveA, { 'if-none-match': `W/${etag}` });
    expect(weak.status).toBe(304);
    const stale = await getField(world.wsA, world.solveA, { 'if-none-match': '"field-stale"' });
    expect(stale.status).toBe(200);
    expect(new Uint8Array(await stale.arrayBuffer())).toEqual(BLOB);
  });

  it('never answers 304 for a solve without a field or outside the workspace', async () => {
    as('viewer');
    await handle.db.update(solves).set({ field: null, fieldBytes: null }).where(eq(solves.id, world.solveA));
    try {
      const r = await getField(world.wsA, world.solveA, { 'if-none-match': '*' });
      expect(r.status).toBe(404);
      expect(await code(r)).toBe('no_field');
    } finally {
      await handle.db.update(solves).set({ field: BLOB, fieldBytes: BLOB.byteLength }).where(eq(solves.id, world.solveA));
    }
    const foreign = await getField(world.wsA, world.solveB, { 'if-none-match': '*' });
    expect(foreign.status).toBe(404);
    expect(await code(foreign)).toBe('not_found');
  });
});
