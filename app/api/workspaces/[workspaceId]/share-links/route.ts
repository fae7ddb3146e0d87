import { insertShareLink, listShareLinks, shareTargetExists } from '@/db/queries/share-links';
import { requireWorkspaceRole } from '@/lib/server/access';
import { ApiError, apiHandler, json, parseJsonBody, parseSearchParams, type RouteCtx, readParams } from '@/lib/server/http';
import { hashToken, newToken, siteOrigin } from '@/lib/server/invitations';
import { createShareLinkSchema, listShareLinksQuerySchema } from '@/lib/validations/share';

export const dynamic = 'force-dynamic';
type Ctx = RouteCtx<{ workspaceId: string }>;

/** Share links of the workspace, optionally of one target (any member). Tokens are never listed. */
export const GET = apiHandler(async (req: Request, ctx: Ctx) => {
  const { workspaceId } = await readParams(ctx);
  await requireWorkspaceRole(workspaceId, 'viewer');
  const q = parseSearchParams(req, listShareLinksQuerySchema);
  const target = q.targetType && q.targetId ? { type: q.targetType, id: q.targetId } : undefined;
  return json({ links: await listShareLinks(workspaceId, target) });
});

/**
 * Make a read-only link to a solve or a section (editors). The token is returned once, in
 * the URL; only its hash is stored.
 */
export const POST = apiHandler(async (req: Request, ctx: Ctx) => {
  const { workspaceId } = await readParams(ctx);
  const { user } = await requireWorkspaceRole(workspaceId, 'editor');
  const body = await parseJsonBody(req, createShareLinkSchema, { maxBytes: 4 * 1024 });
  if (!(await shareTargetExists(workspaceId, body.targetType, body.targetId))) {
    throw new ApiError(404, 'not_found', `The ${body.targetType} was not found.`, 'targetId');
  }
  const token = newToken();
  const expiresAt = body.expiresInDays ? new Date(Date.now() + body.expiresInDays * 86400e3) : null;
  const row = await insertShareLink({ workspaceId, targetType: body.targetType, targetId: body.targetId, tokenHash: hashToken(token), createdBy: user.id, expiresAt });
  return json({ link: { id: row.id, targetType: row.targetType, targetId: row.targetId, expiresAt: row.expiresAt, createdAt: row.createdAt, url: `${siteOrigin()}/s/${token}` } }, 201);
});
