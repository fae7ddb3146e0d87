import { revokeShareLink } from '@/db/queries/share-links';
import { requireWorkspaceRole } from '@/lib/server/access';
import { apiHandler, json, notFound, type RouteCtx, readParams } from '@/lib/server/http';

export const dynamic = 'force-dynamic';
type Ctx = RouteCtx<{ workspaceId: string; linkId: string }>;

/** Revoke a share link (editors); it stops working at once. Revoking twice is harmless (200). */
export const DELETE = apiHandler(async (_req: Request, ctx: Ctx) => {
  const { workspaceId, linkId } = await readParams(ctx);
  const { user } = await requireWorkspaceRole(workspaceId, 'editor');
  const out = await revokeShareLink(workspaceId, linkId, user.id);
  if (out === 'not_found') throw notFound('The share link');
  return json({ revoked: true, alreadyRevoked: out === 'already' });
});
