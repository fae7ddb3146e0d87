/**
 * Share-link holders for the authorisation matrix (issue 8): real tokens (only their SHA-256
 * stored, as the app does) for read-only links of workspace A to its section and its solve,
 * and a signed-in person who belongs to no workspace at all. The links are separate from
 * World.shareLinkA, which the route table revokes on the way.
 */
import crypto from 'node:crypto';
import { eq } from 'drizzle-orm';
import type { Db } from '@/db/client';
import { shareLinks, users, workspaces } from '@/db/schema';
import type { World } from './fixtures';

export interface ShareHolders {
  /** Token of an active link of workspace A to World.sectionA. */
  sectionToken: string;
  /** Token of an active link of workspace A to World.solveA. */
  solveToken: string;
  /** Signed in, member of no workspace. */
  stranger: { id: string; email: string; name: string };
}

/** A token shaped like the app's (32 random bytes, base64url: 43 characters). */
export function randomToken(): string {
  return crypto.randomBytes(32).toString('base64url');
}

/** SHA-256 hex, the form share links and invitations store (lib/server/invitations.ts hashToken). */
export function sha256Hex(token: string): string {
  return crypto.createHash('sha256').update(token, 'utf8').digest('hex');
}

/** Insert a share link of `workspaceId` and return its token and id. */
export async function insertShareLinkWithToken(
  db: Db,
  data: { workspaceId: string; targetType: 'section' | 'solve'; targetId: string; createdBy: string; expiresAt?: Date | null; revokedAt?: Date | null },
): Promise<{ id: string; token: string }> {
  const token = randomToken();
  const [row] = await db
    .insert(shareLinks)
    .values({ ...data, expiresAt: data.expiresAt ?? null, revokedAt: data.revokedAt ?? null, tokenHash: sha256Hex(token) })
    .returning();
  return { id: row!.id, token };
}

export async function addShareHolders(db: Db, w: World): Promise<ShareHolders> {
  const section = await insertShareLinkWithToken(db, { workspaceId: w.wsA, targetType: 'section', targetId: w.sectionA, createdBy: w.users.editor.id });
  const solve = await insertShareLinkWithToken(db, { workspaceId: w.wsA, targetType: 'solve', targetId: w.solveA, createdBy: w.users.editor.id });
  const email = 'stranger@test.example';
  const [u] = await db.insert(users).values({ email, name: 'Test stranger' }).returning();
  return { sectionToken: section.token, solveToken: solve.token, stranger: { id: u!.id, email, name: u!.name! } };
}

/** Allow or forbid signed-out visitors on a workspace's share links (direct, no audit event). */
export async function setPublicLinks(db: Db, workspaceId: string, allow: boolean): Promise<void> {
  await db.update(workspaces).set({ allowPublicLinks: allow }).where(eq(workspaces.id, workspaceId));
}

/** The session user of each actor of the authorisation matrix (tests/integration/routes-table.ts). */
export function actorUser(
  actor: 'signedOut' | 'viewer' | 'editor' | 'owner' | 'otherWorkspace' | 'shareHolder' | 'shareHolderSignedIn',
  w: World,
  holders: ShareHolders,
): { id: string; email: string; name: string } | null {
  switch (actor) {
    case 'signedOut':
    case 'shareHolder':
      return null;
    case 'viewer':
    case 'editor':
    case 'owner':
      return w.users[actor];
    case 'otherWorkspace':
      return w.users.outsider;
    case 'shareHolderSignedIn':
      return holders.stranger;
  }
}
