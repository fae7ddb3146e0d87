import 'server-only';
import { and, asc, desc, eq, gte, isNull, lte, sql, type SQL } from 'drizzle-orm';
import { getDb } from '../client';
import { sectionRevisions, sections, solves, users, type Role, type SolveRow, type SolveStatus } from '../schema';
import { insertAuditEvent } from './audit';
import { lockWorkspaceForLimits, memberRoleSql } from './workspaces';

/**
 * A read made together with the reader's role in the workspace (one query; see
 * lib/server/access.ts readAsViewer): the role read with the rows (null: not a member) and
 * the data, or undefined when the query found no row at all (then the role is unknown).
 */
export type WithRole<T> = { role: Role | null; data: T } | undefined;

/** A solve without its field blob. */
export interface SolveView {
  id: string;
  workspaceId: string;
  sectionId: string;
  sectionName: string;
  revisionId: string;
  revisionNumber: number;
  settings: unknown;
  settingsHash: string;
  result: unknown;
  status: SolveStatus;
  hasField: boolean;
  fieldBytes: number | null;
  author: { id: string; name: string } | null;
  createdAt: Date;
  updatedAt: Date;
}

const viewColumns = {
  id: solves.id,
  workspaceId: solves.workspaceId,
  sectionId: solves.sectionId,
  sectionName: sections.name,
  revisionId: solves.revisionId,
  revisionNumber: sectionRevisions.number,
  settings: solves.settings,
  settingsHash: solves.settingsHash,
  result: solves.result,
  status: solves.status,
  fieldBytes: solves.fieldBytes,
  hasField: sql<boolean>`(${solves.field} is not null)`,
  authorId: users.id,
  authorName: users.name,
  authorEmail: users.email,
  createdAt: solves.createdAt,
  updatedAt: solves.updatedAt,
};

type ViewRow = {
  [K in keyof typeof viewColumns]: unknown;
};

function toView(r: ViewRow): SolveView {
  return {
    id: r.id as string,
    workspaceId: r.workspaceId as string,
    sectionId: r.sectionId as string,
    sectionName: r.sectionName as string,
    revisionId: r.revisionId as string,
    revisionNumber: r.revisionNumber as number,
    settings: r.settings,
    settingsHash: r.settingsHash as string,
    result: r.result,
    status: r.status as SolveStatus,
    hasField: Boolean(r.hasField),
    fieldBytes: (r.fieldBytes as number | null) ?? null,
    author: r.authorId
      ? { id: r.authorId as string, name: ((r.authorName as string | null) ?? (r.authorEmail as string)) || '' }
      : null,
    createdAt: r.createdAt as Date,
    updatedAt: r.updatedAt as Date,
  };
}

/** The solve view query; `role` adds the reader's role (memberRoleSql) as column memberRole. */
function baseQuery(db: Awaited<ReturnType<typeof getDb>>, role?: SQL<Role | null>) {
  return db
    .select({ ...viewColumns, memberRole: role ?? sql<Role | null>`null` })
    .from(solves)
    .innerJoin(sections, eq(sections.id, solves.sectionId))
    .innerJoin(sectionRevisions, eq(sectionRevisions.id, solves.revisionId))
    .leftJoin(users, eq(users.id, solves.authorId));
}

export interface ListSolvesOptions {
  sectionId?: string;
  authorId?: string;
  from?: Date;
  to?: Date;
  sort?: 'created' | 'section' | 'author';
  dir?: 'asc' | 'desc';
  limit?: number;
}

function listSolvesQuery(db: Awaited<ReturnType<typeof getDb>>, workspaceId: string, opts: ListSolvesOptions, role?: SQL<Role | null>) {
  const where: SQL[] = [eq(solves.workspaceId, workspaceId)];
  if (opts.sectionId) where.push(eq(solves.sectionId, opts.sectionId));
  if (opts.authorId) where.push(eq(solves.authorId, opts.authorId));
  if (opts.from) where.push(gte(solves.createdAt, opts.from));
  if (opts.to) where.push(lte(solves.createdAt, opts.to));
  const sort = opts.sort ?? 'created';
  const dir = opts.dir ?? (sort === 'created' ? 'desc' : 'asc');
  const col =
    sort === 'section' ? sql`lower(${sections.name})` : sort === 'author' ? sql`lower(coalesce(${users.name}, ${users.email}))` : solves.createdAt;
  const ord = dir === 'asc' ? asc(col) : desc(col);
  return baseQuery(db, role)
    .where(and(...where))
    .orderBy(ord, desc(solves.createdAt), asc(solves.id))
    .limit(opts.limit ?? 100);
}

export async function listSolves(workspaceId: string, opts: ListSolvesOptions = {}): Promise<SolveView[]> {
  const db = await getDb();
  return (await listSolvesQuery(db, workspaceId, opts)).map(toView);
}

/** listSolves and the reader's role in one query (undefined when no solve matched). */
export async function listSolvesWithRole(userId: string, workspaceId: string, opts: ListSolvesOptions = {}): Promise<WithRole<SolveView[]>> {
  const db = await getDb();
  const rows = await listSolvesQuery(db, workspaceId, opts, memberRoleSql(userId, workspaceId));
  return rows[0] ? { role: rows[0].memberRole, data: rows.map(toView) } : undefined;
}

/** One solve of this workspace (without the field blob), or null. */
export async function getSolve(workspaceId: string, solveId: string): Promise<SolveView | null> {
  const db = await getDb();
  const [row] = await baseQuery(db)
    .where(and(eq(solves.id, solveId), eq(solves.workspaceId, workspaceId)))
    .limit(1);
  return row ? toView(row) : null;
}

/** getSolve and the reader's role in one query (undefined when there is no such solve). */
export async function getSolveWithRole(userId: string, workspaceId: string, solveId: string): Promise<WithRole<SolveView>> {
  const db = await getDb();
  const [row] = await baseQuery(db, memberRoleSql(userId, workspaceId))
    .where(and(eq(solves.id, solveId), eq(solves.workspaceId, workspaceId)))
    .limit(1);
  return row ? { role: row.memberRole, data: toView(row) } : undefined;
}

export type InsertSolveOutcome =
  | { ok: true; created: boolean; solve: SolveView }
  | { ok: false; reason: 'section_not_found' | 'revision_not_found' | 'section_deleted' };

/**
 * Store a solve of a revision. The same (revisionId, settingsHash) is one solve: when it
 * already exists, nothing is written and the existing one is returned with created=false.
 *
 * `checkLimit` (the plan's solve limit) runs inside the same transaction, after the workspace
 * row is locked (lockWorkspaceForLimits) and before the insert, with the plan and the number
 * of solves stored: whatever it throws rolls everything back. Concurrent saves of one
 * workspace are serialised by that lock, so they cannot together exceed the limit. A repeat
 * of an existing solve is never refused (it stores nothing new).
 */
export async function insertSolve(data: {
  workspaceId: string;
  sectionId: string;
  revisionId: string;
  authorId: string | null;
  settings: unknown;
  settingsHash: string;
  result: unknown;
  status: SolveStatus;
}, opts: { checkLimit?: (plan: string, stored: number) => void } = {}): Promise<InsertSolveOutcome> {
  const db = await getDb();
  const outcome = await db.transaction(async (tx) => {
    const ws = opts.checkLimit ? await lockWorkspaceForLimits(tx, data.workspaceId) : null;
    const [section] = await tx
      .select({ id: sections.id, deletedAt: sections.deletedAt })
      .from(sections)
      .where(and(eq(sections.id, data.sectionId), eq(sections.workspaceId, data.workspaceId)))
      .limit(1);
    if (!section) return { ok: false as const, reason: 'section_not_found' as const };
    if (section.deletedAt) return { ok: false as const, reason: 'section_deleted' as const };
    const [rev] = await tx
      .select({ id: sectionRevisions.id })
      .from(sectionRevisions)
      .where(and(eq(sectionRevisions.id, data.revisionId), eq(sectionRevisions.sectionId, section.id)))
      .limit(1);
    if (!rev) return { ok: false as const, reason: 'revision_not_found' as const };
    if (opts.checkLimit && ws) {
      const [dup] = await tx
        .select({ id: solves.id })
        .from(solves)
        .where(and(eq(solves.revisionId, data.revisionId), eq(solves.settingsHash, data.settingsHash)))
        .limit(1);
      if (dup) return { ok: true as const, created: false, id: dup.id };
      const [n] = await tx.select({ n: sql<number>`count(*)::int` }).from(solves).where(eq(solves.workspaceId, data.workspaceId));
      opts.checkLimit(ws.plan, Number(n?.n ?? 0));
    }
    const inserted = await tx
      .insert(solves)
      .values({
        workspaceId: data.workspaceId,
        sectionId: data.sectionId,
        revisionId: data.revisionId,
        authorId: data.authorId,
        settings: data.settings,
        settingsHash: data.settingsHash,
        result: data.result ?? null,
        status: data.status,
      })
      .onConflictDoNothing({ target: [solves.revisionId, solves.settingsHash] })
      .returning({ id: solves.id });
    if (inserted[0]) {
      await insertAuditEvent(tx, {
        workspaceId: data.workspaceId,
        actorId: data.authorId,
        action: 'solve.create',
        targetType: 'solve',
        targetId: inserted[0].id,
        data: { sectionId: data.sectionId, revisionId: data.revisionId, status: data.status },
      });
      return { ok: true as const, created: true, id: inserted[0].id };
    }
    const [existing] = await tx
      .select({ id: solves.id })
      .from(solves)
      .where(and(eq(solves.revisionId, data.revisionId), eq(solves.settingsHash, data.settingsHash)))
      .limit(1);
    return { ok: true as const, created: false, id: existing!.id };
  });
  if (!outcome.ok) return outcome;
  const solve = await getSolve(data.workspaceId, outcome.id);
  return { ok: true, created: outcome.created, solve: solve! };
}

/** The stored field blob of a solve of this workspace: undefined when no such solve, null when none uploaded. */
export async function getSolveField(workspaceId: string, solveId: string): Promise<Uint8Array | null | undefined> {
  const db = await getDb();
  const [row] = await db
    .select({ field: solves.field })
    .from(solves)
    .where(and(eq(solves.id, solveId), eq(solves.workspaceId, workspaceId)))
    .limit(1);
  if (!row) return undefined;
  return row.field ?? null;
}

/** getSolveField and the reader's role in one query (undefined when there is no such solve). */
export async function getSolveFieldWithRole(userId: string, workspaceId: string, solveId: string): Promise<WithRole<Uint8Array | null>> {
  const db = await getDb();
  const [row] = await db
    .select({ field: solves.field, memberRole: memberRoleSql(userId, workspaceId) })
    .from(solves)
    .where(and(eq(solves.id, solveId), eq(solves.workspaceId, workspaceId)))
    .limit(1);
  return row ? { role: row.memberRole, data: row.field ?? null } : undefined;
}

/**
 * Whether a solve of this workspace holds a field and its size, without reading the blob
 * (for answering If-None-Match): undefined when there is no such solve.
 */
export async function getSolveFieldInfoWithRole(
  userId: string,
  workspaceId: string,
  solveId: string,
): Promise<WithRole<{ hasField: boolean; fieldBytes: number | null }>> {
  const db = await getDb();
  const [row] = await db
    .select({
      hasField: sql<boolean>`(${solves.field} is not null)`,
      fieldBytes: solves.fieldBytes,
      memberRole: memberRoleSql(userId, workspaceId),
    })
    .from(solves)
    .where(and(eq(solves.id, solveId), eq(solves.workspaceId, workspaceId)))
    .limit(1);
  return row ? { role: row.memberRole, data: { hasField: Boolean(row.hasField), fieldBytes: row.fieldBytes ?? null } } : undefined;
}

export type StoreFieldOutcome = 'stored' | 'exists' | 'not_found';

/**
 * Store the field blob of a solve of this workspace, once: a saved solve never changes. The
 * update is conditional (`field is null`), so of two concurrent uploads exactly one stores
 * and the other gets 'exists'; 'not_found' when there is no such solve in this workspace. The
 * field and its audit event commit together.
 */
export async function storeSolveField(
  workspaceId: string,
  solveId: string,
  actorId: string | null,
  field: Uint8Array,
): Promise<StoreFieldOutcome> {
  const db = await getDb();
  return db.transaction(async (tx): Promise<StoreFieldOutcome> => {
    const rows = await tx
      .update(solves)
      .set({ field, fieldBytes: field.byteLength, updatedAt: new Date() })
      .where(and(eq(solves.id, solveId), eq(solves.workspaceId, workspaceId), isNull(solves.field)))
      .returning({ id: solves.id });
    if (!rows[0]) {
      const [there] = await tx
        .select({ id: solves.id })
        .from(solves)
        .where(and(eq(solves.id, solveId), eq(solves.workspaceId, workspaceId)))
        .limit(1);
      return there ? 'exists' : 'not_found';
    }
    await insertAuditEvent(tx, {
      workspaceId,
      actorId,
      action: 'solve.field',
      targetType: 'solve',
      targetId: solveId,
      data: { bytes: field.byteLength },
    });
    return 'stored';
  });
}

/** storeSolveField as a yes/no: true when stored now; false when no such solve or it already holds a field. */
export async function setSolveField(workspaceId: string, solveId: string, actorId: string | null, field: Uint8Array): Promise<boolean> {
  return (await storeSolveField(workspaceId, solveId, actorId, field)) === 'stored';
}

export type { SolveRow };
