import 'server-only';
import { and, asc, eq, sql } from 'drizzle-orm';
import { getDb, type DbOrTx } from '../client';
import { memberships, sections, solves, users, workspaces, type Role, type Workspace } from '../schema';
import { insertAuditEvent } from './audit';

export interface WorkspaceForUser {
  id: string;
  name: string;
  role: Role;
  createdAt: Date;
  updatedAt: Date;
}

/** The workspaces a user belongs to, with their role, oldest membership first. */
export async function listWorkspacesForUser(userId: string): Promise<WorkspaceForUser[]> {
  const db = await getDb();
  return db
    .select({
      id: workspaces.id,
      name: workspaces.name,
      role: memberships.role,
      createdAt: workspaces.createdAt,
      updatedAt: workspaces.updatedAt,
    })
    .from(memberships)
    .innerJoin(workspaces, eq(workspaces.id, memberships.workspaceId))
    .where(eq(memberships.userId, userId))
    .orderBy(asc(memberships.createdAt), asc(workspaces.name));
}

export async function getWorkspace(workspaceId: string): Promise<Workspace | null> {
  const db = await getDb();
  const [row] = await db.select().from(workspaces).where(eq(workspaces.id, workspaceId)).limit(1);
  return row ?? null;
}

/** Counts shown on the workspace home and settings. */
export async function getWorkspaceCounts(workspaceId: string) {
  const db = await getDb();
  const [s] = await db
    .select({ n: sql<number>`count(*)::int` })
    .from(sections)
    .where(and(eq(sections.workspaceId, workspaceId), sql`${sections.deletedAt} is null`));
  const [v] = await db.select({ n: sql<number>`count(*)::int` }).from(solves).where(eq(solves.workspaceId, workspaceId));
  const [m] = await db
    .select({ n: sql<number>`count(*)::int` })
    .from(memberships)
    .where(eq(memberships.workspaceId, workspaceId));
  return { sections: s?.n ?? 0, solves: v?.n ?? 0, members: m?.n ?? 0 };
}

/**
 * Inside a transaction: lock the workspace row so that writes checked against the plan's
 * limits (stored solves, members + pending invitations) are serialised per workspace, and
 * return its plan read under that lock; null when there is no such workspace. The lock is
 * FOR NO KEY UPDATE (PGlite and PostgreSQL): two limit checks of one workspace wait for each
 * other, while foreign-key checks of other writes (KEY SHARE on the workspace row) do not
 * wait, so a revision save and a solve save of one workspace cannot deadlock.
 */
export async function lockWorkspaceForLimits(tx: DbOrTx, workspaceId: string): Promise<{ plan: string } | null> {
  const [row] = await tx
    .select({ plan: workspaces.plan })
    .from(workspaces)
    .where(eq(workspaces.id, workspaceId))
    .for('no key update')
    .limit(1);
  return row ?? null;
}

/**
 * The user's role in the workspace as a scalar subquery (null when not a member), to be read
 * in the same query as a route's data (lib/server/access.ts readAsViewer).
 */
export function memberRoleSql(userId: string, workspaceId: string) {
  return sql<Role | null>`(select ${memberships.role} from ${memberships} where ${memberships.userId} = ${userId} and ${memberships.workspaceId} = ${workspaceId} limit 1)`;
}

export async function getMembershipRow(userId: string, workspaceId: string): Promise<{ role: Role } | null> {
  const db = await getDb();
  const [row] = await db
    .select({ role: memberships.role })
    .from(memberships)
    .where(and(eq(memberships.userId, userId), eq(memberships.workspaceId, workspaceId)))
    .limit(1);
  return row ?? null;
}

/** Create a workspace with `ownerId` as its owner (one transaction). */
export async function insertWorkspace(data: { name: string; ownerId: string }, db?: DbOrTx): Promise<Workspace> {
  const d = db ?? (await getDb());
  const run = async (tx: DbOrTx) => {
    const [ws] = await tx.insert(workspaces).values({ name: data.name }).returning();
    await tx.insert(memberships).values({ workspaceId: ws!.id, userId: data.ownerId, role: 'owner' });
    await insertAuditEvent(tx, {
      workspaceId: ws!.id,
      actorId: data.ownerId,
      action: 'workspace.create',
      targetType: 'workspace',
      targetId: ws!.id,
      data: { name: data.name },
    });
    return ws!;
  };
  return db ? run(d) : (d as Awaited<ReturnType<typeof getDb>>).transaction(run);
}

export async function insertMembership(
  data: { workspaceId: string; userId: string; role: Role },
  db?: DbOrTx,
): Promise<void> {
  const d = db ?? (await getDb());
  await d.insert(memberships).values(data).onConflictDoUpdate({
    target: [memberships.workspaceId, memberships.userId],
    set: { role: data.role },
  });
}

export async function updateWorkspace(workspaceId: string, actorId: string, patch: { name: string }) {
  const db = await getDb();
  return db.transaction(async (tx) => {
    const [row] = await tx
      .update(workspaces)
      .set({ name: patch.name, updatedAt: new Date() })
      .where(eq(workspaces.id, workspaceId))
      .returning();
    if (row) {
      await insertAuditEvent(tx, {
        workspaceId,
        actorId,
        action: 'workspace.rename',
        targetType: 'workspace',
        targetId: workspaceId,
        data: { name: patch.name },
      });
    }
    return row ?? null;
  });
}

export interface MemberRow {
  userId: string;
  name: string;
  email: string;
  role: Role;
  joinedAt: Date;
}

const ROLE_ORDER = sql`case ${memberships.role} when 'owner' then 0 when 'editor' then 1 else 2 end`;

export async function listMembers(workspaceId: string): Promise<MemberRow[]> {
  const db = await getDb();
  const rows = await db
    .select({
      userId: users.id,
      name: users.name,
      email: users.email,
      role: memberships.role,
      joinedAt: memberships.createdAt,
    })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(eq(memberships.workspaceId, workspaceId))
    .orderBy(ROLE_ORDER, asc(users.name));
  return rows.map((r) => ({ ...r, name: r.name ?? r.email }));
}
