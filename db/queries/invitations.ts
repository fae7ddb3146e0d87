import 'server-only';
import { and, asc, eq, gt, isNull, sql } from 'drizzle-orm';
import { getDb, type DbOrTx } from '../client';
import { invitations, memberships, users, workspaces, type Role } from '../schema';
import { insertAuditEvent } from './audit';

/** How long an invitation link works. */
export const INVITATION_TTL_MS = 7 * 24 * 3600 * 1000;

export interface PendingInvitation {
  id: string;
  email: string;
  role: Role;
  invitedBy: string | null;
  invitedByName: string | null;
  expiresAt: Date;
  createdAt: Date;
}

/** Invitations of a workspace that can still be accepted (not revoked, accepted or expired). */
export async function listPendingInvitations(workspaceId: string, now = new Date()): Promise<PendingInvitation[]> {
  const db = await getDb();
  const rows = await db
    .select({
      id: invitations.id,
      email: invitations.email,
      role: invitations.role,
      invitedBy: invitations.invitedBy,
      inviterName: users.name,
      inviterEmail: users.email,
      expiresAt: invitations.expiresAt,
      createdAt: invitations.createdAt,
    })
    .from(invitations)
    .leftJoin(users, eq(users.id, invitations.invitedBy))
    .where(
      and(
        eq(invitations.workspaceId, workspaceId),
        isNull(invitations.revokedAt),
        isNull(invitations.acceptedAt),
        gt(invitations.expiresAt, now),
      ),
    )
    .orderBy(asc(invitations.createdAt));
  return rows.map((r) => ({
    id: r.id,
    email: r.email,
    role: r.role,
    invitedBy: r.invitedBy,
    invitedByName: r.inviterName ?? r.inviterEmail ?? null,
    expiresAt: r.expiresAt,
    createdAt: r.createdAt,
  }));
}

/** Number of pending invitations (counted against the plan's member limit). */
export async function countPendingInvitations(workspaceId: string, db?: DbOrTx, now = new Date()): Promise<number> {
  const d = db ?? (await getDb());
  const [row] = await d
    .select({ n: sql<number>`count(*)::int` })
    .from(invitations)
    .where(
      and(
        eq(invitations.workspaceId, workspaceId),
        isNull(invitations.revokedAt),
        isNull(invitations.acceptedAt),
        gt(invitations.expiresAt, now),
      ),
    );
  return Number(row?.n ?? 0);
}

/**
 * Store an invitation (only the token's hash). A pending invitation of the same address to
 * the same workspace is revoked first, so the newest link is the only one that works.
 */
export async function insertInvitation(
  data: { workspaceId: string; email: string; role: Role; tokenHash: string; invitedBy: string; expiresAt: Date },
  db: DbOrTx,
) {
  await db
    .update(invitations)
    .set({ revokedAt: new Date() })
    .where(
      and(
        eq(invitations.workspaceId, data.workspaceId),
        eq(invitations.email, data.email),
        isNull(invitations.revokedAt),
        isNull(invitations.acceptedAt),
      ),
    );
  const [row] = await db.insert(invitations).values(data).returning();
  await insertAuditEvent(db, {
    workspaceId: data.workspaceId,
    actorId: data.invitedBy,
    action: 'member.invite',
    targetType: 'invitation',
    targetId: row!.id,
    data: { email: data.email, role: data.role },
  });
  return row!;
}

/** Revoke a pending invitation of this workspace. Returns false when there is none to revoke. */
export async function revokeInvitation(workspaceId: string, invitationId: string, actorId: string): Promise<boolean> {
  const db = await getDb();
  return db.transaction(async (tx) => {
    const [row] = await tx
      .update(invitations)
      .set({ revokedAt: new Date() })
      .where(
        and(
          eq(invitations.id, invitationId),
          eq(invitations.workspaceId, workspaceId),
          isNull(invitations.revokedAt),
          isNull(invitations.acceptedAt),
        ),
      )
      .returning();
    if (!row) return false;
    await insertAuditEvent(tx, {
      workspaceId,
      actorId,
      action: 'invitation.revoke',
      targetType: 'invitation',
      targetId: row.id,
      data: { email: row.email },
    });
    return true;
  });
}

export async function getInvitationInWorkspace(workspaceId: string, invitationId: string) {
  const db = await getDb();
  const [row] = await db
    .select()
    .from(invitations)
    .where(and(eq(invitations.id, invitationId), eq(invitations.workspaceId, workspaceId)))
    .limit(1);
  return row ?? null;
}

export type InvitationState = 'pending' | 'expired' | 'revoked' | 'accepted';

export interface InvitationByToken {
  id: string;
  workspaceId: string;
  workspaceName: string;
  email: string;
  role: Role;
  invitedByName: string | null;
  expiresAt: Date;
  state: InvitationState;
}

/** Look an invitation up by the hash of its link's token. */
export async function getInvitationByTokenHash(tokenHash: string, now = new Date()): Promise<InvitationByToken | null> {
  const db = await getDb();
  const [r] = await db
    .select({
      id: invitations.id,
      workspaceId: invitations.workspaceId,
      workspaceName: workspaces.name,
      email: invitations.email,
      role: invitations.role,
      inviterName: users.name,
      inviterEmail: users.email,
      expiresAt: invitations.expiresAt,
      revokedAt: invitations.revokedAt,
      acceptedAt: invitations.acceptedAt,
    })
    .from(invitations)
    .innerJoin(workspaces, eq(workspaces.id, invitations.workspaceId))
    .leftJoin(users, eq(users.id, invitations.invitedBy))
    .where(eq(invitations.tokenHash, tokenHash))
    .limit(1);
  if (!r) return null;
  const state: InvitationState = r.acceptedAt
    ? 'accepted'
    : r.revokedAt
      ? 'revoked'
      : r.expiresAt.getTime() <= now.getTime()
        ? 'expired'
        : 'pending';
  return {
    id: r.id,
    workspaceId: r.workspaceId,
    workspaceName: r.workspaceName,
    email: r.email,
    role: r.role,
    invitedByName: r.inviterName ?? r.inviterEmail ?? null,
    expiresAt: r.expiresAt,
    state,
  };
}

export class InvitationError extends Error {
  constructor(
    readonly code: 'not_found' | 'expired' | 'revoked' | 'accepted' | 'wrong_account',
    message: string,
  ) {
    super(message);
    this.name = 'InvitationError';
  }
}

/**
 * Accept an invitation for `user` inside `tx`: checks it is still pending and addressed to
 * the user's e-mail, adds the membership (an existing member keeps the higher of the two
 * roles), marks the invitation accepted and records the event. Throws InvitationError.
 */
export async function acceptInvitationTx(
  tx: DbOrTx,
  tokenHash: string,
  user: { id: string; email: string },
  now = new Date(),
): Promise<{ workspaceId: string; role: Role }> {
  const [inv] = await tx.select().from(invitations).where(eq(invitations.tokenHash, tokenHash)).limit(1).for('update');
  if (!inv) throw new InvitationError('not_found', 'This invitation link is not valid. Ask the workspace owner for a new one.');
  if (inv.acceptedAt) throw new InvitationError('accepted', 'This invitation has already been used.');
  if (inv.revokedAt) throw new InvitationError('revoked', 'This invitation was withdrawn by the workspace owner.');
  if (inv.expiresAt.getTime() <= now.getTime())
    throw new InvitationError('expired', 'This invitation has expired. Ask the workspace owner to send a new one.');
  if (inv.email.toLowerCase() !== user.email.toLowerCase())
    throw new InvitationError(
      'wrong_account',
      `This invitation is for ${inv.email}. Sign in with that address to accept it.`,
    );
  const [existing] = await tx
    .select({ role: memberships.role })
    .from(memberships)
    .where(and(eq(memberships.workspaceId, inv.workspaceId), eq(memberships.userId, user.id)))
    .limit(1);
  const rank = { viewer: 1, editor: 2, owner: 3 } as const;
  const role: Role = existing && rank[existing.role] >= rank[inv.role] ? existing.role : inv.role;
  if (existing) {
    await tx
      .update(memberships)
      .set({ role })
      .where(and(eq(memberships.workspaceId, inv.workspaceId), eq(memberships.userId, user.id)));
  } else {
    await tx.insert(memberships).values({ workspaceId: inv.workspaceId, userId: user.id, role });
  }
  await tx
    .update(invitations)
    .set({ acceptedAt: now, acceptedBy: user.id })
    .where(eq(invitations.id, inv.id));
  await insertAuditEvent(tx, {
    workspaceId: inv.workspaceId,
    actorId: user.id,
    action: 'member.join',
    targetType: 'user',
    targetId: user.id,
    data: { email: user.email, role, invitationId: inv.id },
  });
  return { workspaceId: inv.workspaceId, role };
}
