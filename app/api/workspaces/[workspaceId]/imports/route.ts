import { requireWorkspaceRole } from '@/lib/server/access';
import { apiHandler, json, type RouteCtx, readParams } from '@/lib/server/http';
import { importDrawingAsSection, readImportForm } from '@/lib/server/imports';

export const dynamic = 'force-dynamic';
type Ctx = RouteCtx<{ workspaceId: string }>;

/**
 * Import an SVG or DXF drawing as a new section (editors). multipart/form-data with `file`
 * (≤ 2 MB) and `options` (JSON: name, units, scale, layers → conductor/dielectric/ignore).
 * 413 too large, 415 not a drawing, 422 when the file or the mapping is refused (the
 * message names what is wrong); nothing is stored then.
 */
export const POST = apiHandler(async (req: Request, ctx: Ctx) => {
  const { workspaceId } = await readParams(ctx);
  const { user } = await requireWorkspaceRole(workspaceId, 'editor');
  const { file, options } = await readImportForm(req);
  const out = await importDrawingAsSection({ workspaceId, userId: user.id, file, options });
  return json(out, 201);
});
