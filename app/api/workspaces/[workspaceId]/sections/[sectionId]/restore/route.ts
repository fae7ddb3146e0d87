import { setSectionDeleted } from '@/db/queries/sections';
import { requireWorkspaceRole } from '@/lib/server/access';
import { apiHandler, json, notFound, type RouteCtx } from '@/lib/server/http';

export const dynamic = 'force-dynamic';

/** Restore a soft-deleted section (editors). */
export const POST = apiHandler(async (_req: Request, ctx: RouteCtx<{ workspaceId: string; sectionId: string }>) => {
  const { workspaceId, sectionId } = await ctx.params;
  const { user } = await requireWorkspaceRole(workspaceId, 'editor');
  const section = await setSectionDeleted(workspaceId, sectionId, user.id, false);
  if (!section) throw notFound('The section');
  return json({ section });
});
