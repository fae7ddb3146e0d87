import 'server-only';
import { and, eq, sql } from 'drizzle-orm';
import { getDb, type DbOrTx } from '../client';
import { memberships, users, type Role } from '../schema';
import { insertAuditEvent } from './audit';

export class MembershipError extends Error {
  constructor(
    readonly code: 'not_found' | 'last_owner',
    message: string,
  ) {
    super(message);
    this.name = 'MembershipError';
  }
}

export const LAST_OWNER_MESSAGE =
  'A workspace needs at least one owner. Make another member an owner first.';

/** Lock the workspace's membership rows and count its owners (inside a transaction). */
async function ownerCount(tx: DbOrTx, workspaceId: string): Promise<number> {
  const rows = await tx
    .select({ role: memberships.role })
    .from(memberships)
    .where(eq(memberships.workspaceId, workspaceId))
    .for('update');
  return rows.filter((r) => r.role === 'owner').length;
}

async function memberRole(tx: DbOrTx, workspaceId: string, userId: string): Promise<Role | null> {
  const [row] = await tx
    .select({ role: memberships.role })
    .from(memberships)
    .where(and(eq(memberships.workspaceId, workspaceId), eq(memberships.userId, userId)))
    .limit(1);
  return row?.role ?? null;
}

/**
 * Change a member's role. The last owner cannot be demoted (MembershipError 'last_owner');
 * an unknown member is 'not_found'. Returns the previous and the new role.
 */
export async function updateMemberRole(workspaceId: string, userId: string, role: Role, actorId: string) {
  const db = await getDb();
  return db.transaction(async (tx) => {
    const owners = await ownerCount(tx, workspaceId);
    const before = await memberRole(tx, workspaceId, userId);
    if (!before) throw new MembershipError('not_found', 'That person is not a member of this workspace.');
    if (before === 'owner' && role !== 'owner' && owners <= 1) throw new MembershipError('last_owner', LAST_OWNER_MESSAGE);
    if (before !== role) {
      await tx
        .update(memberships)
        .set({ role })
        .where(and(eq(memberships.workspaceId, workspaceId), eq(memberships.userId, userId)));
      await insertAuditEvent(tx, {
        workspaceId,
        actorId,
        action: 'member.role',
        targetType: 'user',
        targetId: userId,
        data: { from: before, to: role },
      });
    }
    return { before, role };
  });
}

/**
 * Remove a member (an owner removing someone, or `actorId === userId` leaving). The last
 * owner can neither be removed nor leave.
 */
export async function removeMember(workspaceId: string, userId: string, actorId: string) {
  const db = await getDb();
  return db.transaction(async (tx) => {
    const owners = await ownerCount(tx, workspaceId);
    const before = await memberRole(tx, workspaceId, userId);
    if (!before) throw new MembershipError('not_found', 'That person is not a member of this workspace.');
    if (before === 'owner' && owners <= 1)
      throw new MembershipError(
        'last_owner',
        actorId === userId
          ? 'You are the only owner, so you cannot leave. Make another member an owner first.'
          : LAST_OWNER_MESSAGE,
      );
    await tx.delete(memberships).where(and(eq(memberships.workspaceId, workspaceId), eq(memberships.userId, userId)));
    const [u] = await tx.select({ email: users.email }).from(users).where(eq(users.id, userId)).limit(1);
    await insertAuditEvent(tx, {
      workspaceId,
      actorId,
      action: actorId === userId ? 'member.leave' : 'member.remove',
      targetType: 'user',
      targetId: userId,
      data: { email: u?.email ?? null, role: before },
    });
    return { before };
  });
}

export async function countMembers(workspaceId: string, db?: DbOrTx): Promise<number> {
  const d = db ?? (await getDb());
  const [row] = await d
    .select({ n: sql<number>`count(*)::int` })
    .from(memberships)
    .where(eq(memberships.workspaceId, workspaceId));
  return Number(row?.n ?? 0);
}
