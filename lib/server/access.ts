import 'server-only';
import { notFound } from 'next/navigation';
import type { Role } from '@/db/schema';
import { getMembershipRow, getWorkspace } from '@/db/queries/workspaces';
import { ApiError, forbidden, isId, unauthorized } from './http';
import { getSessionUser, requireUser, type SessionUser } from './session';

export type { Role };

const RANK: Record<Role, number> = { viewer: 1, editor: 2, owner: 3 };

/** True when `role` may do what `needed` may do (owner ⊃ editor ⊃ viewer). */
export function roleAtLeast(role: Role, needed: Role): boolean {
  return RANK[role] >= RANK[needed];
}

export async function getMembership(userId: string, workspaceId: string): Promise<{ role: Role } | null> {
  return getMembershipRow(userId, workspaceId);
}

/**
 * For route handlers and server actions: the signed-in user and their role in the workspace.
 * Throws ApiError 401 (signed out), 404 (not a member, or no such workspace: never say
 * which), 403 (member with a lower role than `needed`).
 */
export async function requireWorkspaceRole(
  workspaceId: string,
  needed: Role,
): Promise<{ user: SessionUser; role: Role }> {
  const user = await getSessionUser();
  if (!user) throw unauthorized();
  const m = isId(workspaceId) ? await getMembership(user.id, workspaceId) : null;
  if (!m) throw new ApiError(404, 'not_found', 'The workspace was not found.');
  if (!roleAtLeast(m.role, needed)) {
    throw forbidden(
      needed === 'owner'
        ? 'Only an owner of this workspace can do this.'
        : 'Viewers can read this workspace but not change it. Ask an owner for the editor role.',
    );
  }
  return { user, role: m.role };
}

/**
 * For pages: the signed-in user (else redirect to /login), their role and the workspace
 * (else the not-found page, so other workspaces' ids are not revealed).
 */
export async function requireWorkspaceMember(workspaceId: string) {
  const user = await requireUser();
  const m = isId(workspaceId) ? await getMembership(user.id, workspaceId) : null;
  if (!m) notFound();
  const workspace = await getWorkspace(workspaceId);
  if (!workspace) notFound();
  return { user, role: m.role, workspace };
}
