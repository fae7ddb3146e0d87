import { setAllowPublicLinks } from '@/db/queries/share-links';
import { requireWorkspaceRole } from '@/lib/server/access';
import { apiHandler, json, notFound, parseJsonBody, type RouteCtx, readParams } from '@/lib/server/http';
import { publicLinksSchema } from '@/lib/validations/share';

export const dynamic = 'force-dynamic';
type Ctx = RouteCtx<{ workspaceId: string }>;

/** Allow or forbid signed-out visitors on this workspace's share links (owners). */
export const PUT = apiHandler(async (req: Request, ctx: Ctx) => {
  const { workspaceId } = await readParams(ctx);
  const { user } = await requireWorkspaceRole(workspaceId, 'owner');
  const { allow } = await parseJsonBody(req, publicLinksSchema, { maxBytes: 1024 });
  const ws = await setAllowPublicLinks(workspaceId, allow, user.id);
  if (!ws) throw notFound('The workspace');
  return json({ allowPublicLinks: ws.allowPublicLinks });
});
