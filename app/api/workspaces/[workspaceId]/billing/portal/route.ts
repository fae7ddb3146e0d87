import { getWorkspace } from '@/db/queries/workspaces';
import { requireWorkspaceRole } from '@/lib/server/access';
import { apiHandler, json, notFound, type RouteCtx, readParams } from '@/lib/server/http';
import { createPortal } from '@/lib/server/payments';

export const dynamic = 'force-dynamic';
type Ctx = RouteCtx<{ workspaceId: string }>;

/** Open the customer portal (owners): returns its URL. 409 before the first upgrade. */
export const POST = apiHandler(async (_req: Request, ctx: Ctx) => {
  const { workspaceId } = await readParams(ctx);
  await requireWorkspaceRole(workspaceId, 'owner');
  const ws = await getWorkspace(workspaceId);
  if (!ws) throw notFound('The workspace');
  return json({ url: await createPortal(ws) });
});
