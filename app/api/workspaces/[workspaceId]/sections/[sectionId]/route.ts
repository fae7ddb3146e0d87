import { getSection, setSectionDeleted, updateSectionMeta } from '@/db/queries/sections';
import { requireWorkspaceRole } from '@/lib/server/access';
import { apiHandler, json, notFound, parseJsonBody, type RouteCtx, readParams } from '@/lib/server/http';
import { updateSectionSchema } from '@/lib/validations/section';

export const dynamic = 'force-dynamic';
type Ctx = RouteCtx<{ workspaceId: string; sectionId: string }>;

/** The section with its latest revision (content included). Deleted sections too (deletedAt set). */
export const GET = apiHandler(async (_req: Request, ctx: Ctx) => {
  const { workspaceId, sectionId } = await readParams(ctx);
  await requireWorkspaceRole(workspaceId, 'viewer');
  const section = await getSection(workspaceId, sectionId);
  if (!section) throw notFound('The section');
  return json({ section });
});

/** Rename or re-describe (editors). */
export const PATCH = apiHandler(async (req: Request, ctx: Ctx) => {
  const { workspaceId, sectionId } = await readParams(ctx);
  const { user } = await requireWorkspaceRole(workspaceId, 'editor');
  const body = await parseJsonBody(req, updateSectionSchema, { maxBytes: 64 * 1024 });
  const section = await updateSectionMeta(workspaceId, sectionId, user.id, body);
  if (!section) throw notFound('The section');
  return json({ section });
});

/** Soft delete (editors); restore with POST …/restore. */
export const DELETE = apiHandler(async (_req: Request, ctx: Ctx) => {
  const { workspaceId, sectionId } = await readParams(ctx);
  const { user } = await requireWorkspaceRole(workspaceId, 'editor');
  const section = await setSectionDeleted(workspaceId, sectionId, user.id, true);
  if (!section) throw notFound('The section');
  return json({ section });
});
