import { getSolveWithRole } from '@/db/queries/solves';
import { readAsViewer } from '@/lib/server/access';
import { apiHandler, json, notFound, type RouteCtx, readParams } from '@/lib/server/http';

export const dynamic = 'force-dynamic';

/** One solve (settings, result, status; the field blob is at …/field). */
export const GET = apiHandler(async (_req: Request, ctx: RouteCtx<{ workspaceId: string; solveId: string }>) => {
  const { workspaceId, solveId } = await readParams(ctx);
  // the role is read with the solve (one query); same statuses as requireWorkspaceRole 'viewer' first
  const { data: solve } = await readAsViewer(workspaceId, (userId) => getSolveWithRole(userId, workspaceId, solveId), null);
  if (!solve) throw notFound('The solve');
  return json({ solve });
});
