import { getSectionRow, insertRevision, listRevisions } from '@/db/queries/sections';
import { requireWorkspaceRole } from '@/lib/server/access';
import { checkSavedSection } from '@/lib/server/section-checks';
import { ApiError, apiHandler, json, notFound, parseJsonBody, type RouteCtx, readParams } from '@/lib/server/http';
import { MAX_SECTION_BODY_BYTES, saveRevisionSchema } from '@/lib/validations/section';

export const dynamic = 'force-dynamic';
type Ctx = RouteCtx<{ workspaceId: string; sectionId: string }>;

/** The section's revisions, newest first (without content). */
export const GET = apiHandler(async (_req: Request, ctx: Ctx) => {
  const { workspaceId, sectionId } = await readParams(ctx);
  await requireWorkspaceRole(workspaceId, 'viewer');
  if (!(await getSectionRow(workspaceId, sectionId))) throw notFound('The section');
  return json({ revisions: await listRevisions(workspaceId, sectionId) });
});

/**
 * Save a new immutable revision (editors). 409 when `baseRevisionId` is not the latest
 * (someone saved in between) or the section is deleted. Atomic: a failed save writes nothing.
 * The content must match the section schema (422); resolve/geometry problems do not block
 * saving a drawing in progress and come back as `checks` (solving stays blocked by them).
 */
export const POST = apiHandler(async (req: Request, ctx: Ctx) => {
  const { workspaceId, sectionId } = await readParams(ctx);
  const { user } = await requireWorkspaceRole(workspaceId, 'editor');
  const body = await parseJsonBody(req, saveRevisionSchema, { maxBytes: MAX_SECTION_BODY_BYTES });
  const out = await insertRevision({
    workspaceId,
    sectionId,
    authorId: user.id,
    content: body.content,
    message: body.message,
    baseRevisionId: body.baseRevisionId,
  });
  if (out.ok) return json({ section: out.section, revision: out.revision, checks: checkSavedSection(body.content) }, 201);
  if (out.reason === 'not_found') throw notFound('The section');
  if (out.reason === 'deleted') throw new ApiError(409, 'deleted', 'The section is deleted. Restore it before saving.');
  throw new ApiError(
    409,
    'conflict',
    `Someone saved this section after you opened it (now at revision ${out.latestRevisionNumber ?? '?'}). Reload it and apply your change again.`,
    'baseRevisionId',
  );
});
