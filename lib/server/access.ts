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
 * For read routes (viewer and up): the signed-in user, their role and the route's data, with
 * the role read in the data's own query (`load(userId)`, one of the db/queries `…WithRole`
 * reads), so a read costs two queries (user, role + data) instead of three. Same answers as
 * requireWorkspaceRole(workspaceId, 'viewer') followed by the read: 401 signed out, 404 when
 * not a member (the workspace's "not found", never the item's). When the data query finds no
 * row the role is read on its own, and a member gets `empty` (no such item, or an empty list).
 */
export async function readAsViewer<T>(
  workspaceId: string,
  load: (userId: string) => Promise<{ role: Role | null; data: T } | undefined>,
  empty: T,
): Promise<{ user: SessionUser; role: Role; data: T }> {
  const user = await getSessionUser();
  if (!user) throw unauthorized();
  if (!isId(workspaceId)) throw new ApiError(404, 'not_found', 'The workspace was not found.');
  const got = await load(user.id);
  const role = got ? got.role : ((await getMembership(user.id, workspaceId))?.role ?? null);
  if (!role || !(role in RANK)) throw new ApiError(404, 'not_found', 'The workspace was not found.');
  return { user, role, data: got ? got.data : empty };
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
