import { getSolve } from '@/db/queries/solves';
import { requireWorkspaceRole } from '@/lib/server/access';
import { apiHandler, json, notFound, type RouteCtx, readParams } from '@/lib/server/http';

export const dynamic = 'force-dynamic';

/** One solve (settings, result, status; the field blob is at …/field). */
export const GET = apiHandler(async (_req: Request, ctx: RouteCtx<{ workspaceId: string; solveId: string }>) => {
  const { workspaceId, solveId } = await readParams(ctx);
  await requireWorkspaceRole(workspaceId, 'viewer');
  const solve = await getSolve(workspaceId, solveId);
  if (!solve) throw notFound('The solve');
  return json({ solve });
});
