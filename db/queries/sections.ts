import 'server-only';
import { and, asc, desc, eq, ilike, isNotNull, isNull, or, sql, type SQL } from 'drizzle-orm';
import { alias } from 'drizzle-orm/pg-core';
import { getDb, type DbOrTx } from '../client';
import { sectionRevisions, sections, solves, users, type SectionRevisionRow, type SectionRow } from '../schema';
import { insertAuditEvent } from './audit';

export interface SectionListItem {
  id: string;
  name: string;
  description: string;
  createdAt: Date;
  updatedAt: Date;
  deletedAt: Date | null;
  latestRevisionId: string | null;
  latestRevisionNumber: number | null;
  createdBy: { id: string; name: string } | null;
  solveCount: number;
}

export interface ListSectionsOptions {
  q?: string;
  sort?: 'updated' | 'name' | 'created';
  dir?: 'asc' | 'desc';
  /** true: only deleted sections; false/undefined: only live ones. */
  deleted?: boolean;
  limit?: number;
}

function escapeLike(s: string) {
  return s.replace(/[\\%_]/g, (c) => `\\${c}`);
}

export async function listSections(workspaceId: string, opts: ListSectionsOptions = {}): Promise<SectionListItem[]> {
  const db = await getDb();
  const where: SQL[] = [eq(sections.workspaceId, workspaceId)];
  where.push(opts.deleted ? isNotNull(sections.deletedAt) : isNull(sections.deletedAt));
  const q = opts.q?.trim();
  if (q) {
    const pat = `%${escapeLike(q)}%`;
    where.push(or(ilike(sections.name, pat), ilike(sections.description, pat))!);
  }
  const sort = opts.sort ?? 'updated';
  const dir = opts.dir ?? (sort === 'name' ? 'asc' : 'desc');
  const col = sort === 'name' ? sql`lower(${sections.name})` : sort === 'created' ? sections.createdAt : sections.updatedAt;
  const order = dir === 'asc' ? asc(col) : desc(col);
  const creator = alias(users, 'creator');
  const rows = await db
    .select({
      id: sections.id,
      name: sections.name,
      description: sections.description,
      createdAt: sections.createdAt,
      updatedAt: sections.updatedAt,
      deletedAt: sections.deletedAt,
      latestRevisionId: sections.latestRevisionId,
      latestRevisionNumber: sectionRevisions.number,
      creatorId: creator.id,
      creatorName: creator.name,
      creatorEmail: creator.email,
      solveCount: sql<number>`(select count(*)::int from ${solves} where ${solves.sectionId} = ${sections.id})`,
    })
    .from(sections)
    .leftJoin(sectionRevisions, eq(sectionRevisions.id, sections.latestRevisionId))
    .leftJoin(creator, eq(creator.id, sections.createdBy))
    .where(and(...where))
    .orderBy(order, asc(sections.id))
    .limit(opts.limit ?? 500);
  return rows.map((r) => ({
    id: r.id,
    name: r.name,
    description: r.description,
    createdAt: r.createdAt,
    updatedAt: r.updatedAt,
    deletedAt: r.deletedAt,
    latestRevisionId: r.latestRevisionId,
    latestRevisionNumber: r.latestRevisionNumber,
    createdBy: r.creatorId ? { id: r.creatorId, name: r.creatorName ?? r.creatorEmail ?? '' } : null,
    solveCount: Number(r.solveCount),
  }));
}

/** A section of this workspace (deleted ones too), or null. */
export async function getSectionRow(workspaceId: string, sectionId: string, db?: DbOrTx): Promise<SectionRow | null> {
  const d = db ?? (await getDb());
  const [row] = await d
    .select()
    .from(sections)
    .where(and(eq(sections.id, sectionId), eq(sections.workspaceId, workspaceId)))
    .limit(1);
  return row ?? null;
}

export interface RevisionView {
  id: string;
  sectionId: string;
  number: number;
  content: unknown;
  message: string;
  createdAt: Date;
  author: { id: string; name: string } | null;
}

export interface SectionView extends SectionRow {
  latestRevision: RevisionView | null;
}

/** A section with its latest revision (content included), or null when not in this workspace. */
export async function getSection(workspaceId: string, sectionId: string): Promise<SectionView | null> {
  const row = await getSectionRow(workspaceId, sectionId);
  if (!row) return null;
  const latestRevision = row.latestRevisionId ? await getRevision(workspaceId, sectionId, row.latestRevisionId) : null;
  return { ...row, latestRevision };
}

const revisionColumns = {
  id: sectionRevisions.id,
  sectionId: sectionRevisions.sectionId,
  number: sectionRevisions.number,
  message: sectionRevisions.message,
  createdAt: sectionRevisions.createdAt,
  authorId: users.id,
  authorName: users.name,
  authorEmail: users.email,
};

type RevisionSelect = {
  id: string;
  sectionId: string;
  number: number;
  message: string;
  createdAt: Date;
  authorId: string | null;
  authorName: string | null;
  authorEmail: string | null;
  content?: unknown;
};

function toRevisionView(r: RevisionSelect): RevisionView {
  return {
    id: r.id,
    sectionId: r.sectionId,
    number: r.number,
    content: r.content,
    message: r.message,
    createdAt: r.createdAt,
    author: r.authorId ? { id: r.authorId, name: r.authorName ?? r.authorEmail ?? '' } : null,
  };
}

/** One revision of a section of this workspace (with content), or null. */
export async function getRevision(workspaceId: string, sectionId: string, revisionId: string): Promise<RevisionView | null> {
  const db = await getDb();
  const [row] = await db
    .select({ ...revisionColumns, content: sectionRevisions.content })
    .from(sectionRevisions)
    .innerJoin(sections, eq(sections.id, sectionRevisions.sectionId))
    .leftJoin(users, eq(users.id, sectionRevisions.authorId))
    .where(
      and(
        eq(sectionRevisions.id, revisionId),
        eq(sectionRevisions.sectionId, sectionId),
        eq(sections.workspaceId, workspaceId),
      ),
    )
    .limit(1);
  return row ? toRevisionView(row) : null;
}

/** The revisions of a section, newest first, without their content. */
export async function listRevisions(workspaceId: string, sectionId: string): Promise<Omit<RevisionView, 'content'>[]> {
  const db = await getDb();
  const rows = await db
    .select(revisionColumns)
    .from(sectionRevisions)
    .innerJoin(sections, eq(sections.id, sectionRevisions.sectionId))
    .leftJoin(users, eq(users.id, sectionRevisions.authorId))
    .where(and(eq(sectionRevisions.sectionId, sectionId), eq(sections.workspaceId, workspaceId)))
    .orderBy(desc(sectionRevisions.number));
  return rows.map((r) => {
    const { content: _c, ...rest } = toRevisionView(r);
    return rest;
  });
}

/**
 * Create a section and its first revision in one transaction (a nested one, i.e. a
 * savepoint, when `db` is already a transaction: an import adds its original file to it).
 */
export async function insertSection(
  data: {
    workspaceId: string;
    authorId: string | null;
    name: string;
    description?: string;
    content: unknown;
    message?: string;
  },
  db?: DbOrTx,
): Promise<{ section: SectionRow; revision: SectionRevisionRow }> {
  const d = db ?? (await getDb());
  return d.transaction(async (tx) => {
    const [section] = await tx
      .insert(sections)
      .values({
        workspaceId: data.workspaceId,
        name: data.name,
        description: data.description ?? '',
        createdBy: data.authorId,
      })
      .returning();
    const [revision] = await tx
      .insert(sectionRevisions)
      .values({
        sectionId: section!.id,
        number: 1,
        content: data.content,
        message: data.message ?? 'Created',
        authorId: data.authorId,
      })
      .returning();
    const [updated] = await tx
      .update(sections)
      .set({ latestRevisionId: revision!.id })
      .where(eq(sections.id, section!.id))
      .returning();
    await insertAuditEvent(tx, {
      workspaceId: data.workspaceId,
      actorId: data.authorId,
      action: 'section.create',
      targetType: 'section',
      targetId: section!.id,
      data: { name: data.name, revisionId: revision!.id },
    });
    return { section: updated!, revision: revision! };
  });
}

export type SaveRevisionOutcome =
  | { ok: true; section: SectionRow; revision: SectionRevisionRow }
  | { ok: false; reason: 'not_found' }
  | { ok: false; reason: 'deleted' }
  | { ok: false; reason: 'conflict'; latestRevisionId: string | null; latestRevisionNumber: number | null };

/**
 * Save a new immutable revision and point the section at it, atomically. With
 * `baseRevisionId`, refuses (conflict) when it is no longer the latest revision.
 */
export async function insertRevision(data: {
  workspaceId: string;
  sectionId: string;
  authorId: string | null;
  content: unknown;
  message?: string;
  baseRevisionId?: string;
}): Promise<SaveRevisionOutcome> {
  const db = await getDb();
  return db.transaction(async (tx): Promise<SaveRevisionOutcome> => {
    // Row lock: concurrent saves of one section are serialised (PostgreSQL; PGlite is single-connection).
    const [section] = await tx
      .select()
      .from(sections)
      .where(and(eq(sections.id, data.sectionId), eq(sections.workspaceId, data.workspaceId)))
      .for('update')
      .limit(1);
    if (!section) return { ok: false, reason: 'not_found' };
    if (section.deletedAt) return { ok: false, reason: 'deleted' };
    const [max] = await tx
      .select({ n: sql<number>`coalesce(max(${sectionRevisions.number}), 0)::int` })
      .from(sectionRevisions)
      .where(eq(sectionRevisions.sectionId, section.id));
    const latestNumber = Number(max?.n ?? 0);
    if (data.baseRevisionId !== undefined && data.baseRevisionId !== section.latestRevisionId) {
      return {
        ok: false,
        reason: 'conflict',
        latestRevisionId: section.latestRevisionId,
        latestRevisionNumber: latestNumber || null,
      };
    }
    const [revision] = await tx
      .insert(sectionRevisions)
      .values({
        sectionId: section.id,
        number: latestNumber + 1,
        content: data.content,
        message: data.message ?? '',
        authorId: data.authorId,
      })
      .returning();
    const [updated] = await tx
      .update(sections)
      .set({ latestRevisionId: revision!.id, updatedAt: new Date() })
      .where(eq(sections.id, section.id))
      .returning();
    await insertAuditEvent(tx, {
      workspaceId: data.workspaceId,
      actorId: data.authorId,
      action: 'section.revision',
      targetType: 'section',
      targetId: section.id,
      data: { revisionId: revision!.id, number: revision!.number },
    });
    return { ok: true, section: updated!, revision: revision! };
  });
}

/** Rename / re-describe a section. Null when not in this workspace. */
export async function updateSectionMeta(
  workspaceId: string,
  sectionId: string,
  actorId: string,
  patch: { name?: string; description?: string },
): Promise<SectionRow | null> {
  const db = await getDb();
  return db.transaction(async (tx) => {
    const [row] = await tx
      .update(sections)
      .set({ ...patch, updatedAt: new Date() })
      .where(and(eq(sections.id, sectionId), eq(sections.workspaceId, workspaceId)))
      .returning();
    if (!row) return null;
    await insertAuditEvent(tx, {
      workspaceId,
      actorId,
      action: 'section.update',
      targetType: 'section',
      targetId: sectionId,
      data: patch,
    });
    return row;
  });
}

/** Soft delete (deleted=true) or restore (deleted=false). Null when not in this workspace. */
export async function setSectionDeleted(
  workspaceId: string,
  sectionId: string,
  actorId: string,
  deleted: boolean,
): Promise<SectionRow | null> {
  const db = await getDb();
  return db.transaction(async (tx) => {
    const [row] = await tx
      .update(sections)
      .set({ deletedAt: deleted ? new Date() : null })
      .where(and(eq(sections.id, sectionId), eq(sections.workspaceId, workspaceId)))
      .returning();
    if (!row) return null;
    await insertAuditEvent(tx, {
      workspaceId,
      actorId,
      action: deleted ? 'section.delete' : 'section.restore',
      targetType: 'section',
      targetId: sectionId,
    });
    return row;
  });
}
