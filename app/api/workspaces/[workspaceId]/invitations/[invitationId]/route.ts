import { revokeInvitation } from '@/db/queries/invitations';
import { requireWorkspaceRole } from '@/lib/server/access';
import { apiHandler, json, notFound, type RouteCtx, readParams } from '@/lib/server/http';

export const dynamic = 'force-dynamic';
type Ctx = RouteCtx<{ workspaceId: string; invitationId: string }>;

/** Revoke a pending invitation (owners); its link stops working at once. */
export const DELETE = apiHandler(async (_req: Request, ctx: Ctx) => {
  const { workspaceId, invitationId } = await readParams(ctx);
  const { user } = await requireWorkspaceRole(workspaceId, 'owner');
  if (!(await revokeInvitation(workspaceId, invitationId, user.id))) throw notFound('The pending invitation');
  return json({ revoked: true });
});
