import 'server-only';
import { and, desc, eq, isNull } from 'drizzle-orm';
import { getDb } from '../client';
import { sections, shareLinks, solves, users, workspaces } from '../schema';
import { insertAuditEvent } from './audit';

export type ShareTarget = 'solve' | 'section';

export interface ShareLinkItem {
  id: string;
  targetType: ShareTarget;
  targetId: string;
  expiresAt: Date | null;
  revokedAt: Date | null;
  createdAt: Date;
  createdBy: { id: string; name: string } | null;
}

/** True when the target exists in this workspace (a live section, or a solve). */
export async function shareTargetExists(workspaceId: string, type: ShareTarget, id: string): Promise<boolean> {
  const db = await getDb();
  if (type === 'section') {
    const [r] = await db
      .select({ id: sections.id })
      .from(sections)
      .where(and(eq(sections.id, id), eq(sections.workspaceId, workspaceId), isNull(sections.deletedAt)))
      .limit(1);
    return Boolean(r);
  }
  const [r] = await db.select({ id: solves.id }).from(solves).where(and(eq(solves.id, id), eq(solves.workspaceId, workspaceId))).limit(1);
  return Boolean(r);
}

export async function listShareLinks(workspaceId: string, target?: { type: ShareTarget; id: string }): Promise<ShareLinkItem[]> {
  const db = await getDb();
  const where = [eq(shareLinks.workspaceId, workspaceId)];
  if (target) where.push(eq(shareLinks.targetType, target.type), eq(shareLinks.targetId, target.id));
  const rows = await db
    .select({
      id: shareLinks.id,
      targetType: shareLinks.targetType,
      targetId: shareLinks.targetId,
      expiresAt: shareLinks.expiresAt,
      revokedAt: shareLinks.revokedAt,
      createdAt: shareLinks.createdAt,
      uid: users.id,
      uname: users.name,
      uemail: users.email,
    })
    .from(shareLinks)
    .leftJoin(users, eq(users.id, shareLinks.createdBy))
    .where(and(...where))
    .orderBy(desc(shareLinks.createdAt));
  return rows.map((r) => ({
    id: r.id,
    targetType: r.targetType,
    targetId: r.targetId,
    expiresAt: r.expiresAt,
    revokedAt: r.revokedAt,
    createdAt: r.createdAt,
    createdBy: r.uid ? { id: r.uid, name: r.uname ?? r.uemail ?? '' } : null,
  }));
}

export async function insertShareLink(data: {
  workspaceId: string;
  targetType: ShareTarget;
  targetId: string;
  tokenHash: string;
  createdBy: string;
  expiresAt: Date | null;
}) {
  const db = await getDb();
  return db.transaction(async (tx) => {
    const [row] = await tx.insert(shareLinks).values(data).returning();
    await insertAuditEvent(tx, {
      workspaceId: data.workspaceId,
      actorId: data.createdBy,
      action: 'share.create',
      targetType: data.targetType,
      targetId: data.targetId,
      data: { linkId: row!.id, targetType: data.targetType, expiresAt: data.expiresAt?.toISOString() ?? null },
    });
    return row!;
  });
}

/**
 * Revoke a share link of this workspace. Idempotent: an already revoked link stays revoked
 * ('already'); 'not_found' when the workspace has no such link.
 */
export async function revokeShareLink(workspaceId: string, linkId: string, actorId: string): Promise<'revoked' | 'already' | 'not_found'> {
  const db = await getDb();
  return db.transaction(async (tx) => {
    const [cur] = await tx.select().from(shareLinks).where(and(eq(shareLinks.id, linkId), eq(shareLinks.workspaceId, workspaceId))).limit(1);
    if (!cur) return 'not_found';
    if (cur.revokedAt) return 'already';
    await tx.update(shareLinks).set({ revokedAt: new Date() }).where(eq(shareLinks.id, linkId));
    await insertAuditEvent(tx, {
      workspaceId,
      actorId,
      action: 'share.revoke',
      targetType: cur.targetType,
      targetId: cur.targetId,
      data: { linkId },
    });
    return 'revoked';
  });
}

/** Allow or forbid signed-out visitors on this workspace's share links (owners). */
export async function setAllowPublicLinks(workspaceId: string, allow: boolean, actorId: string) {
  const db = await getDb();
  return db.transaction(async (tx) => {
    const [row] = await tx.update(workspaces).set({ allowPublicLinks: allow, updatedAt: new Date() }).where(eq(workspaces.id, workspaceId)).returning();
    await insertAuditEvent(tx, {
      workspaceId,
      actorId,
      action: 'workspace.settings',
      targetType: 'workspace',
      targetId: workspaceId,
      data: { allowPublicLinks: allow },
    });
    return row ?? null;
  });
}

export interface ResolvedShareLink {
  id: string;
  workspaceId: string;
  workspaceName: string;
  allowPublicLinks: boolean;
  targetType: ShareTarget;
  targetId: string;
  state: 'ok' | 'expired' | 'revoked';
  expiresAt: Date | null;
}

export async function getShareLinkByTokenHash(tokenHash: string, now = new Date()): Promise<ResolvedShareLink | null> {
  const db = await getDb();
  const [r] = await db
    .select({
      id: shareLinks.id,
      workspaceId: shareLinks.workspaceId,
      workspaceName: workspaces.name,
      allowPublicLinks: workspaces.allowPublicLinks,
      targetType: shareLinks.targetType,
      targetId: shareLinks.targetId,
      expiresAt: shareLinks.expiresAt,
      revokedAt: shareLinks.revokedAt,
    })
    .from(shareLinks)
    .innerJoin(workspaces, eq(workspaces.id, shareLinks.workspaceId))
    .where(eq(shareLinks.tokenHash, tokenHash))
    .limit(1);
  if (!r) return null;
  const state = r.revokedAt ? 'revoked' : r.expiresAt && r.expiresAt.getTime() <= now.getTime() ? 'expired' : 'ok';
  return { ...r, state };
}
