import { getWorkspace, getWorkspaceCounts, updateWorkspace } from '@/db/queries/workspaces';
import { requireWorkspaceRole } from '@/lib/server/access';
import { apiHandler, json, notFound, parseJsonBody, type RouteCtx, readParams } from '@/lib/server/http';
import { updateWorkspaceSchema } from '@/lib/validations/workspace';

export const dynamic = 'force-dynamic';
type Ctx = RouteCtx<{ workspaceId: string }>;

/** The workspace, the caller's role and counts (any member). */
export const GET = apiHandler(async (_req: Request, ctx: Ctx) => {
  const { workspaceId } = await readParams(ctx);
  const { role } = await requireWorkspaceRole(workspaceId, 'viewer');
  const ws = await getWorkspace(workspaceId);
  if (!ws) throw notFound('The workspace');
  return json({ workspace: { ...ws, role, counts: await getWorkspaceCounts(workspaceId) } });
});

/** Rename the workspace (owners). */
export const PATCH = apiHandler(async (req: Request, ctx: Ctx) => {
  const { workspaceId } = await readParams(ctx);
  const { user, role } = await requireWorkspaceRole(workspaceId, 'owner');
  const body = await parseJsonBody(req, updateWorkspaceSchema, { maxBytes: 16 * 1024 });
  const ws = await updateWorkspace(workspaceId, user.id, body);
  if (!ws) throw notFound('The workspace');
  return json({ workspace: { ...ws, role } });
});
