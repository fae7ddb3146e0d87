/**
 * Data layer on a real migrated database (in-memory PGlite by default; a PostgreSQL server
 * when DATABASE_URL is set, see scripts/test-pg.sh): queries, immutable revisions, atomic
 * saves, solve dedupe, soft delete and restore, workspace isolation.
 */
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
vi.mock('server-only', () => ({}));

import { eq, sql } from 'drizzle-orm';
import { setDbForTesting, type Db, type DbHandle } from '@/db/client';
import { auditEvents, sectionRevisions, sections, solves } from '@/db/schema';
import {
  getRevision,
  getSection,
  insertRevision,
  insertSection,
  listRevisions,
  listSections,
  setSectionDeleted,
  updateSectionMeta,
} from '@/db/queries/sections';
import { getSolve, getSolveField, insertSolve, listSolves, setSolveField } from '@/db/queries/solves';
import { insertComment, listComments } from '@/db/queries/comments';
import { getMembershipRow, listMembers, listWorkspacesForUser } from '@/db/queries/workspaces';
import { createTestDb } from './helpers/db';
import { buildWorld, coaxSection, fakeResult, type World } from './helpers/fixtures';

let handle: DbHandle;
let db: Db;
let w: World;

beforeAll(async () => {
  handle = await createTestDb();
  db = handle.db;
  setDbForTesting(handle);
  w = await buildWorld(db);
});
afterAll(async () => {
  setDbForTesting(undefined);
  await handle?.close();
});

const count = async (table: typeof sectionRevisions | typeof sections | typeof solves) => {
  const [r] = await db.select({ n: sql<number>`count(*)::int` }).from(table);
  return Number(r!.n);
};

describe('workspaces and members', () => {
  it('lists a user’s workspaces with their role, and only theirs', async () => {
    const mine = await listWorkspacesForUser(w.users.viewer.id);
    expect(mine.map((x) => [x.id, x.role])).toEqual([[w.wsA, 'viewer']]);
    expect(await getMembershipRow(w.users.outsider.id, w.wsA)).toBeNull();
    expect(await getMembershipRow(w.users.editor.id, w.wsA)).toEqual({ role: 'editor' });
  });

  it('lists members owners first', async () => {
    const m = await listMembers(w.wsA);
    expect(m.map((x) => x.role)).toEqual(['owner', 'editor', 'viewer']);
    expect(m.some((x) => x.userId === w.users.outsider.id)).toBe(false);
  });
});

describe('sections and revisions', () => {
  it('creates a section with revision 1 and points at it', async () => {
    const { section, revision } = await insertSection({
      workspaceId: w.wsA,
      authorId: w.users.editor.id,
      name: 'Feed line',
      description: 'a microstrip feed',
      content: coaxSection(),
    });
    expect(revision.number).toBe(1);
    expect(section.latestRevisionId).toBe(revision.id);
    const view = await getSection(w.wsA, section.id);
    expect(view?.latestRevision?.content).toEqual(coaxSection());
  });

  it('every save is a new revision; earlier revisions keep their content', async () => {
    const { section, revision: r1 } = await insertSection({
      workspaceId: w.wsA,
      authorId: w.users.editor.id,
      name: 'History test',
      content: coaxSection(0.5),
    });
    const out2 = await insertRevision({
      workspaceId: w.wsA,
      sectionId: section.id,
      authorId: w.users.owner.id,
      content: coaxSection(0.7),
      message: 'thicker core',
      baseRevisionId: r1.id,
    });
    expect(out2.ok).toBe(true);
    if (!out2.ok) return;
    expect(out2.revision.number).toBe(2);
    expect(out2.section.latestRevisionId).toBe(out2.revision.id);
    const old = await getRevision(w.wsA, section.id, r1.id);
    expect(old?.content).toEqual(coaxSection(0.5));
    const list = await listRevisions(w.wsA, section.id);
    expect(list.map((r) => r.number)).toEqual([2, 1]);
    expect(list[0]!.message).toBe('thicker core');
    expect(list[0]!.author?.id).toBe(w.users.owner.id);
  });

  it('the database refuses to change a stored revision', async () => {
    await expect(
      db.update(sectionRevisions).set({ message: 'rewritten' }).where(eq(sectionRevisions.id, w.revisionA)),
    ).rejects.toThrow();
    const [r] = await db.select().from(sectionRevisions).where(eq(sectionRevisions.id, w.revisionA));
    expect(r!.message).toBe('');
  });

  it('a save based on a stale revision is refused and writes nothing', async () => {
    const { section, revision: r1 } = await insertSection({
      workspaceId: w.wsA,
      authorId: w.users.editor.id,
      name: 'Conflict test',
      content: coaxSection(),
    });
    const ok = await insertRevision({ workspaceId: w.wsA, sectionId: section.id, authorId: null, content: coaxSection(0.4), baseRevisionId: r1.id });
    expect(ok.ok).toBe(true);
    const before = await count(sectionRevisions);
    const stale = await insertRevision({ workspaceId: w.wsA, sectionId: section.id, authorId: null, content: coaxSection(0.3), baseRevisionId: r1.id });
    expect(stale).toMatchObject({ ok: false, reason: 'conflict', latestRevisionNumber: 2 });
    expect(await count(sectionRevisions)).toBe(before);
  });

  it('a save that fails inside the transaction leaves no trace (atomic)', async () => {
    const { section, revision: r1 } = await insertSection({
      workspaceId: w.wsA,
      authorId: w.users.editor.id,
      name: 'Atomic test',
      content: coaxSection(),
    });
    const revsBefore = await count(sectionRevisions);
    const [auditBefore] = await db.select({ n: sql<number>`count(*)::int` }).from(auditEvents);
    // PostgreSQL cannot store U+0000 in jsonb: the revision insert fails after the row lock
    // and the number lookup, so everything before it must roll back.
    const bad = { ...coaxSection(), title: 'nul \u0000 inside' };
    await expect(
      insertRevision({ workspaceId: w.wsA, sectionId: section.id, authorId: w.users.editor.id, content: bad }),
    ).rejects.toThrow();
    expect(await count(sectionRevisions)).toBe(revsBefore);
    const [auditAfter] = await db.select({ n: sql<number>`count(*)::int` }).from(auditEvents);
    expect(Number(auditAfter!.n)).toBe(Number(auditBefore!.n));
    const view = await getSection(w.wsA, section.id);
    expect(view?.latestRevisionId).toBe(r1.id);
    expect(view?.latestRevision?.number).toBe(1);
  });

  it('search, sort and soft delete / restore', async () => {
    const ws = w.wsA;
    const a = await insertSection({ workspaceId: ws, authorId: null, name: 'alpha cable', content: coaxSection() });
    const b = await insertSection({ workspaceId: ws, authorId: null, name: 'Beta plates', description: 'humidity cell', content: coaxSection() });
    const names = (await listSections(ws, { sort: 'name' })).map((s) => s.name);
    expect(names).toEqual([...names].sort((x, y) => x.toLowerCase().localeCompare(y.toLowerCase())));
    expect((await listSections(ws, { q: 'HUMIDITY' })).map((s) => s.id)).toEqual([b.section.id]);
    expect((await listSections(ws, { q: '%' })).length).toBe(0); // LIKE wildcards are literal
    const updatedFirst = await listSections(ws, { sort: 'updated', dir: 'desc' });
    expect(updatedFirst[0]!.id).toBe(b.section.id);

    await setSectionDeleted(ws, a.section.id, w.users.editor.id, true);
    expect((await listSections(ws)).some((s) => s.id === a.section.id)).toBe(false);
    expect((await listSections(ws, { deleted: true })).map((s) => s.id)).toContain(a.section.id);
    const save = await insertRevision({ workspaceId: ws, sectionId: a.section.id, authorId: null, content: coaxSection() });
    expect(save).toEqual({ ok: false, reason: 'deleted' });
    await setSectionDeleted(ws, a.section.id, w.users.editor.id, false);
    expect((await listSections(ws)).some((s) => s.id === a.section.id)).toBe(true);
    // Revisions survived the round trip.
    expect((await listRevisions(ws, a.section.id)).length).toBe(1);
  });

  it('renames a section and records audit events for writes', async () => {
    const renamed = await updateSectionMeta(w.wsA, w.sectionA, w.users.editor.id, { name: 'Renamed' });
    expect(renamed?.name).toBe('Renamed');
    const events = await db.select().from(auditEvents).where(eq(auditEvents.targetId, w.sectionA));
    expect(events.map((e) => e.action)).toContain('section.update');
  });

  it('never returns another workspace’s section or revision', async () => {
    expect(await getSection(w.wsA, w.sectionB)).toBeNull();
    expect(await getRevision(w.wsA, w.sectionB, w.revisionB)).toBeNull();
    expect(await getRevision(w.wsA, w.sectionA, w.revisionB)).toBeNull();
    expect(await listRevisions(w.wsA, w.sectionB)).toEqual([]);
    expect(await updateSectionMeta(w.wsA, w.sectionB, w.users.owner.id, { name: 'x' })).toBeNull();
    expect(await setSectionDeleted(w.wsA, w.sectionB, w.users.owner.id, true)).toBeNull();
    expect(await insertRevision({ workspaceId: w.wsA, sectionId: w.sectionB, authorId: null, content: coaxSection() })).toEqual({
      ok: false,
      reason: 'not_found',
    });
  });
});

describe('solves', () => {
  it('the same revision and settings hash is one solve', async () => {
    const base = {
      workspaceId: w.wsA,
      sectionId: w.sectionA,
      revisionId: w.revisionA,
      authorId: w.users.editor.id,
      settings: { preset: 'quick' },
      settingsHash: 'quick-1',
      result: fakeResult(1.5e-10),
      status: 'done' as const,
    };
    const before = await count(solves);
    const first = await insertSolve(base);
    const second = await insertSolve({ ...base, result: fakeResult(9e-10), authorId: w.users.owner.id });
    expect(first).toMatchObject({ ok: true, created: true });
    expect(second).toMatchObject({ ok: true, created: false });
    if (!first.ok || !second.ok) return;
    expect(second.solve.id).toBe(first.solve.id);
    expect((second.solve.result as ReturnType<typeof fakeResult>).capacitance.maxwell[0]![0]).toBe(1.5e-10);
    expect(await count(solves)).toBe(before + 1);
    const other = await insertSolve({ ...base, settingsHash: 'quick-2' });
    expect(other).toMatchObject({ ok: true, created: true });
  });

  it('refuses a revision of another section or workspace', async () => {
    const base = { workspaceId: w.wsA, authorId: null, settings: {}, settingsHash: 'x', result: fakeResult(), status: 'done' as const };
    expect(await insertSolve({ ...base, sectionId: w.sectionA, revisionId: w.revisionB })).toEqual({ ok: false, reason: 'revision_not_found' });
    expect(await insertSolve({ ...base, sectionId: w.sectionB, revisionId: w.revisionB })).toEqual({ ok: false, reason: 'section_not_found' });
  });

  it('lists with filters and reads one, only within the workspace', async () => {
    const all = await listSolves(w.wsA);
    expect(all.length).toBeGreaterThan(0);
    expect(all.every((s) => s.workspaceId === w.wsA)).toBe(true);
    const mine = await listSolves(w.wsA, { authorId: w.users.owner.id });
    expect(mine.every((s) => s.author?.id === w.users.owner.id)).toBe(true);
    expect(await listSolves(w.wsA, { from: new Date(Date.now() + 3_600_000) })).toEqual([]);
    expect(await getSolve(w.wsA, w.solveB)).toBeNull();
    const one = await getSolve(w.wsA, w.solveA);
    expect(one).toMatchObject({ id: w.solveA, sectionName: expect.any(String), revisionNumber: 1, hasField: false });
  });

  it('stores and returns the binary field unchanged', async () => {
    const blob = new Uint8Array(70_000);
    for (let i = 0; i < blob.length; i++) blob[i] = (i * 7919) & 0xff;
    expect(await getSolveField(w.wsA, w.solveA)).toBeNull();
    expect(await setSolveField(w.wsA, w.solveA, w.users.editor.id, blob)).toBe(true);
    const back = await getSolveField(w.wsA, w.solveA);
    expect(back).toBeInstanceOf(Uint8Array);
    expect(Buffer.from(back!).equals(Buffer.from(blob))).toBe(true);
    expect((await getSolve(w.wsA, w.solveA))?.fieldBytes).toBe(70_000);
    expect(await setSolveField(w.wsA, w.solveB, null, blob)).toBe(false);
    expect(await getSolveField(w.wsA, w.solveB)).toBeUndefined();
  });

  it('comments belong to a solve of the workspace', async () => {
    const c = await insertComment({ workspaceId: w.wsA, solveId: w.solveA, authorId: w.users.viewer.id, body: 'Looks right.' });
    expect(c?.author?.id).toBe(w.users.viewer.id);
    expect(await insertComment({ workspaceId: w.wsA, solveId: w.solveB, authorId: w.users.viewer.id, body: 'x' })).toBeNull();
    expect((await listComments(w.wsA, w.solveA)).map((x) => x.body)).toEqual(['Looks right.']);
    expect(await listComments(w.wsA, w.solveB)).toEqual([]);
  });
});
