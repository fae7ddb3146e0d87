import { MembershipError, removeMember, updateMemberRole } from '@/db/queries/members';
import { requireWorkspaceRole } from '@/lib/server/access';
import { ApiError, apiHandler, json, parseJsonBody, type RouteCtx, readParams } from '@/lib/server/http';
import { memberRoleSchema } from '@/lib/validations/members';

export const dynamic = 'force-dynamic';
type Ctx = RouteCtx<{ workspaceId: string; userId: string }>;

function toApiError(e: unknown): never {
  if (e instanceof MembershipError) {
    throw e.code === 'not_found' ? new ApiError(404, 'not_found', e.message) : new ApiError(409, 'last_owner', e.message, 'role');
  }
  throw e;
}

/** Change a member's role (owners). The last owner cannot be demoted (409). */
export const PATCH = apiHandler(async (req: Request, ctx: Ctx) => {
  const { workspaceId, userId } = await readParams(ctx);
  const { user } = await requireWorkspaceRole(workspaceId, 'owner');
  const { role } = await parseJsonBody(req, memberRoleSchema, { maxBytes: 4 * 1024 });
  const out = await updateMemberRole(workspaceId, userId, role, user.id).catch(toApiError);
  return json({ member: { userId, role: out.role, previousRole: out.before } });
});

/**
 * Remove a member (owners), or leave the workspace (any member, on their own id). The last
 * owner can neither be removed nor leave (409).
 */
export const DELETE = apiHandler(async (_req: Request, ctx: Ctx) => {
  const { workspaceId, userId } = await readParams(ctx);
  const self = await requireWorkspaceRole(workspaceId, 'viewer');
  if (self.user.id !== userId) await requireWorkspaceRole(workspaceId, 'owner');
  await removeMember(workspaceId, userId, self.user.id).catch(toApiError);
  return json({ removed: true, left: self.user.id === userId });
});
