import 'server-only';
import { and, asc, eq, isNull } from 'drizzle-orm';
import { getDb } from '../client';
import { comments, solves, users } from '../schema';
import { insertAuditEvent } from './audit';
import type { WithRole } from './solves';
import { memberRoleSql } from './workspaces';

export interface CommentView {
  id: string;
  solveId: string;
  body: string;
  createdAt: Date;
  author: { id: string; name: string } | null;
}

/** Comments on a solve of this workspace, oldest first. */
export async function listComments(workspaceId: string, solveId: string): Promise<CommentView[]> {
  const db = await getDb();
  const rows = await db
    .select({
      id: comments.id,
      solveId: comments.solveId,
      body: comments.body,
      createdAt: comments.createdAt,
      authorId: users.id,
      authorName: users.name,
      authorEmail: users.email,
    })
    .from(comments)
    .innerJoin(solves, eq(solves.id, comments.solveId))
    .leftJoin(users, eq(users.id, comments.authorId))
    .where(and(eq(comments.solveId, solveId), eq(solves.workspaceId, workspaceId), isNull(comments.deletedAt)))
    .orderBy(asc(comments.createdAt), asc(comments.id));
  return rows.map((r) => ({
    id: r.id,
    solveId: r.solveId,
    body: r.body,
    createdAt: r.createdAt,
    author: r.authorId ? { id: r.authorId, name: r.authorName ?? r.authorEmail ?? '' } : null,
  }));
}

/**
 * listComments, the solve's existence and the reader's role in one query: the comments of a
 * solve of this workspace (oldest first), or undefined when the workspace has no such solve.
 */
export async function listCommentsWithRole(userId: string, workspaceId: string, solveId: string): Promise<WithRole<CommentView[]>> {
  const db = await getDb();
  const rows = await db
    .select({
      id: comments.id,
      body: comments.body,
      createdAt: comments.createdAt,
      authorId: users.id,
      authorName: users.name,
      authorEmail: users.email,
      memberRole: memberRoleSql(userId, workspaceId),
    })
    .from(solves)
    .leftJoin(comments, and(eq(comments.solveId, solves.id), isNull(comments.deletedAt)))
    .leftJoin(users, eq(users.id, comments.authorId))
    .where(and(eq(solves.id, solveId), eq(solves.workspaceId, workspaceId)))
    .orderBy(asc(comments.createdAt), asc(comments.id));
  if (!rows[0]) return undefined;
  const out: CommentView[] = [];
  for (const r of rows) {
    if (r.id === null) continue; // the solve's own row when it has no comments
    out.push({
      id: r.id,
      solveId,
      body: r.body!,
      createdAt: r.createdAt!,
      author: r.authorId ? { id: r.authorId, name: r.authorName ?? r.authorEmail ?? '' } : null,
    });
  }
  return { role: rows[0].memberRole, data: out };
}

/** Add a comment to a solve of this workspace; null when the solve is not there. */
export async function insertComment(data: {
  workspaceId: string;
  solveId: string;
  authorId: string;
  body: string;
}): Promise<CommentView | null> {
  const db = await getDb();
  return db.transaction(async (tx) => {
    const [solve] = await tx
      .select({ id: solves.id })
      .from(solves)
      .where(and(eq(solves.id, data.solveId), eq(solves.workspaceId, data.workspaceId)))
      .limit(1);
    if (!solve) return null;
    const [row] = await tx
      .insert(comments)
      .values({ solveId: data.solveId, authorId: data.authorId, body: data.body })
      .returning();
    const [author] = await tx.select({ name: users.name, email: users.email }).from(users).where(eq(users.id, data.authorId));
    await insertAuditEvent(tx, {
      workspaceId: data.workspaceId,
      actorId: data.authorId,
      action: 'comment.create',
      targetType: 'solve',
      targetId: data.solveId,
      data: { commentId: row!.id },
    });
    return {
      id: row!.id,
      solveId: row!.solveId,
      body: row!.body,
      createdAt: row!.createdAt,
      author: { id: data.authorId, name: author?.name ?? author?.email ?? '' },
    };
  });
}
