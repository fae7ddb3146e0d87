import { listMembers } from '@/db/queries/workspaces';
import { requireWorkspaceRole } from '@/lib/server/access';
import { apiHandler, json, type RouteCtx, readParams } from '@/lib/server/http';

export const dynamic = 'force-dynamic';

/** The workspace's members with their roles (any member may read). */
export const GET = apiHandler(async (_req: Request, ctx: RouteCtx<{ workspaceId: string }>) => {
  const { workspaceId } = await readParams(ctx);
  await requireWorkspaceRole(workspaceId, 'viewer');
  return json({ members: await listMembers(workspaceId) });
});
