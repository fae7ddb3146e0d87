import { insertSolve, listSolvesWithRole } from '@/db/queries/solves';
import { readAsViewer, requireWorkspaceRole } from '@/lib/server/access';
import { assertSolveLimit } from '@/lib/server/plans';
import { ApiError, apiHandler, json, parseJsonBody, parseSearchParams, type RouteCtx, readParams } from '@/lib/server/http';
import { createSolveSchema, listSolvesQuerySchema, MAX_SOLVE_BODY_BYTES } from '@/lib/validations/solve';

export const dynamic = 'force-dynamic';
type Ctx = RouteCtx<{ workspaceId: string }>;

/** List solves: ?sectionId=&authorId=&from=&to=&sort=created|section|author&dir=&limit= */
export const GET = apiHandler(async (req: Request, ctx: Ctx) => {
  const { workspaceId } = await readParams(ctx);
  let q;
  try {
    q = parseSearchParams(req, listSolvesQuerySchema);
  } catch (e) {
    await requireWorkspaceRole(workspaceId, 'viewer'); // a bad query: 401/404 still come first
    throw e;
  }
  // the role is read with the list (one query); same statuses as requireWorkspaceRole 'viewer' first
  const { data: solves } = await readAsViewer(
    workspaceId,
    (userId) =>
      listSolvesWithRole(userId, workspaceId, {
        sectionId: q.sectionId,
        authorId: q.authorId,
        from: q.from ? new Date(q.from) : undefined,
        to: q.to ? new Date(q.to) : undefined,
        sort: q.sort,
        dir: q.dir,
        limit: q.limit,
      }),
    [],
  );
  return json({ solves });
});

/**
 * Store a solve (editors). The same (revisionId, settingsHash) is recognised: the existing
 * solve comes back with 200 instead of 201 and nothing is written. 402 when the plan's solve
 * limit is reached (counted under a lock on the workspace row, in the solve's transaction).
 */
export const POST = apiHandler(async (req: Request, ctx: Ctx) => {
  const { workspaceId } = await readParams(ctx);
  const { user } = await requireWorkspaceRole(workspaceId, 'editor');
  const body = await parseJsonBody(req, createSolveSchema, { maxBytes: MAX_SOLVE_BODY_BYTES });
  const out = await insertSolve({
    workspaceId,
    sectionId: body.sectionId,
    revisionId: body.revisionId,
    authorId: user.id,
    settings: body.settings,
    settingsHash: body.settingsHash,
    result: body.result ?? null,
    status: body.status,
  }, { checkLimit: assertSolveLimit }); // issue 7: 402 when the plan is full, checked inside the solve's transaction
  if (out.ok) return json({ solve: out.solve, created: out.created }, out.created ? 201 : 200);
  if (out.reason === 'section_not_found') throw new ApiError(404, 'not_found', 'The section was not found.', 'sectionId');
  if (out.reason === 'revision_not_found')
    throw new ApiError(404, 'not_found', 'The revision was not found in this section.', 'revisionId');
  throw new ApiError(409, 'deleted', 'The section is deleted. Restore it before storing solves.', 'sectionId');
});
