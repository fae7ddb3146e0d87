import { insertSection, listSections } from '@/db/queries/sections';
import { requireWorkspaceRole } from '@/lib/server/access';
import { checkSavedSection } from '@/lib/server/section-checks';
import { apiHandler, json, parseJsonBody, parseSearchParams, type RouteCtx, readParams } from '@/lib/server/http';
import { createSectionSchema, listSectionsQuerySchema, MAX_SECTION_BODY_BYTES } from '@/lib/validations/section';

export const dynamic = 'force-dynamic';
type Ctx = RouteCtx<{ workspaceId: string }>;

/** List sections: ?q= (name/description), sort=updated|name|created, dir=asc|desc, deleted=1 (the trash). */
export const GET = apiHandler(async (req: Request, ctx: Ctx) => {
  const { workspaceId } = await readParams(ctx);
  await requireWorkspaceRole(workspaceId, 'viewer');
  const q = parseSearchParams(req, listSectionsQuerySchema);
  const sections = await listSections(workspaceId, { q: q.q, sort: q.sort, dir: q.dir, deleted: q.deleted === '1' });
  return json({ sections });
});

/**
 * Create a section with its first revision (editors). The content must match the section
 * schema (422); resolve/geometry problems do not block saving and come back as `checks`.
 */
export const POST = apiHandler(async (req: Request, ctx: Ctx) => {
  const { workspaceId } = await readParams(ctx);
  const { user } = await requireWorkspaceRole(workspaceId, 'editor');
  const body = await parseJsonBody(req, createSectionSchema, { maxBytes: MAX_SECTION_BODY_BYTES });
  const { section, revision } = await insertSection({
    workspaceId,
    authorId: user.id,
    name: body.name,
    description: body.description,
    content: body.content,
    message: body.message,
  });
  return json({ section, revision, checks: checkSavedSection(body.content) }, 201);
});
