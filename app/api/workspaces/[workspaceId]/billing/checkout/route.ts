import { getWorkspace } from '@/db/queries/workspaces';
import { requireWorkspaceRole } from '@/lib/server/access';
import { apiHandler, json, notFound, type RouteCtx, readParams } from '@/lib/server/http';
import { createCheckout } from '@/lib/server/payments';

export const dynamic = 'force-dynamic';
type Ctx = RouteCtx<{ workspaceId: string }>;

/** Start the upgrade to the Team plan (owners): returns the checkout page's URL. 409 when already on it. */
export const POST = apiHandler(async (_req: Request, ctx: Ctx) => {
  const { workspaceId } = await readParams(ctx);
  const { user } = await requireWorkspaceRole(workspaceId, 'owner');
  const ws = await getWorkspace(workspaceId);
  if (!ws) throw notFound('The workspace');
  return json({ url: await createCheckout(ws, user) });
});
