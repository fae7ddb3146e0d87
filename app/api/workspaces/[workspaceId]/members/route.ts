import { listMembers } from '@/db/queries/workspaces';
import { requireWorkspaceRole } from '@/lib/server/access';
import { apiHandler, json, type RouteCtx } from '@/lib/server/http';

export const dynamic = 'force-dynamic';

/** The workspace's members with their roles (any member may read). */
export const GET = apiHandler(async (_req: Request, ctx: RouteCtx<{ workspaceId: string }>) => {
  const { workspaceId } = await ctx.params;
  await requireWorkspaceRole(workspaceId, 'viewer');
  return json({ members: await listMembers(workspaceId) });
});
