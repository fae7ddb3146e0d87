import { listWorkspaceMaterials, upsertWorkspaceMaterial } from '@/db/queries/workspace-materials';
import { requireWorkspaceRole } from '@/lib/server/access';
import { apiHandler, json, parseJsonBody, readParams, type RouteCtx } from '@/lib/server/http';
import { saveWorkspaceMaterialSchema } from '@/lib/validations/material';

export const dynamic = 'force-dynamic';
type Ctx = RouteCtx<{ workspaceId: string }>;

/** Custom dielectric materials kept for the workspace (every member may read them). */
export const GET = apiHandler(async (_req: Request, ctx: Ctx) => {
  const { workspaceId } = await readParams(ctx);
  await requireWorkspaceRole(workspaceId, 'viewer');
  const rows = await listWorkspaceMaterials(workspaceId);
  return json({ materials: rows.map(({ key: _key, ...m }) => m) });
});

/** Keep a material for the workspace (editors); the same material id replaces the earlier one. */
export const POST = apiHandler(async (req: Request, ctx: Ctx) => {
  const { workspaceId } = await readParams(ctx);
  const { user } = await requireWorkspaceRole(workspaceId, 'editor');
  const body = await parseJsonBody(req, saveWorkspaceMaterialSchema, { maxBytes: 16 * 1024 });
  await upsertWorkspaceMaterial(workspaceId, user.id, body.material);
  return json({ material: body.material }, 201);
});
