import { setSectionDeleted } from '@/db/queries/sections';
import { requireWorkspaceRole } from '@/lib/server/access';
import { apiHandler, json, notFound, type RouteCtx, readParams } from '@/lib/server/http';

export const dynamic = 'force-dynamic';

/** Restore a soft-deleted section (editors). */
export const POST = apiHandler(async (_req: Request, ctx: RouteCtx<{ workspaceId: string; sectionId: string }>) => {
  const { workspaceId, sectionId } = await readParams(ctx);
  const { user } = await requireWorkspaceRole(workspaceId, 'editor');
  const section = await setSectionDeleted(workspaceId, sectionId, user.id, false);
  if (!section) throw notFound('The section');
  return json({ section });
});
