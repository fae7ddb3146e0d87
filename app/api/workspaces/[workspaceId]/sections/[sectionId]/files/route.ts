import { listSectionFiles } from '@/db/queries/files';
import { getSectionRow } from '@/db/queries/sections';
import { requireWorkspaceRole } from '@/lib/server/access';
import { apiHandler, json, notFound, type RouteCtx, readParams } from '@/lib/server/http';

export const dynamic = 'force-dynamic';
type Ctx = RouteCtx<{ workspaceId: string; sectionId: string }>;

/** Files kept with a section: the original drawing and measured data (any member). */
export const GET = apiHandler(async (_req: Request, ctx: Ctx) => {
  const { workspaceId, sectionId } = await readParams(ctx);
  await requireWorkspaceRole(workspaceId, 'viewer');
  if (!(await getSectionRow(workspaceId, sectionId))) throw notFound('The section');
  return json({ files: await listSectionFiles(workspaceId, sectionId) });
});
