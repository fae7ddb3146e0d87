import { getSectionFile } from '@/db/queries/files';
import { requireWorkspaceRole } from '@/lib/server/access';
import { apiHandler, notFound, type RouteCtx, readParams } from '@/lib/server/http';

export const dynamic = 'force-dynamic';
type Ctx = RouteCtx<{ workspaceId: string; sectionId: string; fileId: string }>;

/**
 * Download a kept file as it was uploaded (any member). Always an attachment with
 * nosniff and a sandbox policy, so an uploaded SVG never runs in the site's origin.
 */
export const GET = apiHandler(async (_req: Request, ctx: Ctx) => {
  const { workspaceId, sectionId, fileId } = await readParams(ctx);
  await requireWorkspaceRole(workspaceId, 'viewer');
  const f = await getSectionFile(workspaceId, sectionId, fileId);
  if (!f) throw notFound('The file');
  const ascii = f.name.replace(/[^\x20-\x7e]/g, '_').replace(/["\\]/g, '_');
  return new Response(f.data as BodyInit, {
    status: 200,
    headers: {
      'content-type': 'application/octet-stream',
      'content-length': String(f.bytes),
      'content-disposition': `attachment; filename="${ascii}"; filename*=UTF-8''${encodeURIComponent(f.name)}`,
      'x-content-type-options': 'nosniff',
      'content-security-policy': "default-src 'none'; sandbox",
      'cache-control': 'private, no-store',
    },
  });
});
