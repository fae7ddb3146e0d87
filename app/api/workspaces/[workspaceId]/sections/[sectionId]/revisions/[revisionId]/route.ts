import { getRevision } from '@/db/queries/sections';
import { requireWorkspaceRole } from '@/lib/server/access';
import { apiHandler, json, notFound, type RouteCtx, readParams } from '@/lib/server/http';

export const dynamic = 'force-dynamic';

/** One revision with its content. */
export const GET = apiHandler(
  async (_req: Request, ctx: RouteCtx<{ workspaceId: string; sectionId: string; revisionId: string }>) => {
    const { workspaceId, sectionId, revisionId } = await readParams(ctx);
    await requireWorkspaceRole(workspaceId, 'viewer');
    const revision = await getRevision(workspaceId, sectionId, revisionId);
    if (!revision) throw notFound('The revision');
    return json({ revision });
  },
);
