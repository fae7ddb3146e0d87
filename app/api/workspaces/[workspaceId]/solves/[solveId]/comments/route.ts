/**
 * The comment thread of a solve. Every member may read and comment (viewers too: commenting
 * does not change the solve).
 */
import { insertComment, listCommentsWithRole } from '@/db/queries/comments';
import { readAsViewer, requireWorkspaceRole } from '@/lib/server/access';
import { apiHandler, json, notFound, parseJsonBody, type RouteCtx, readParams } from '@/lib/server/http';
import { createCommentSchema } from '@/lib/validations/comment';
import { notifyComment } from '@/lib/server/notify';

export const dynamic = 'force-dynamic';
type Ctx = RouteCtx<{ workspaceId: string; solveId: string }>;

const MAX_COMMENT_BODY_BYTES = 32 * 1024;

export const GET = apiHandler(async (_req: Request, ctx: Ctx) => {
  const { workspaceId, solveId } = await readParams(ctx);
  // one query: the role, the solve's existence and its thread (statuses as requireWorkspaceRole 'viewer' first)
  const { data: comments } = await readAsViewer(workspaceId, (userId) => listCommentsWithRole(userId, workspaceId, solveId), null);
  if (!comments) throw notFound('The solve');
  return json({ comments });
});

export const POST = apiHandler(async (req: Request, ctx: Ctx) => {
  const { workspaceId, solveId } = await readParams(ctx);
  const { user } = await requireWorkspaceRole(workspaceId, 'viewer');
  const body = await parseJsonBody(req, createCommentSchema, { maxBytes: MAX_COMMENT_BODY_BYTES });
  const comment = await insertComment({ workspaceId, solveId, authorId: user.id, body: body.body });
  if (!comment) throw notFound('The solve');
  // Issue 7: tell the solve's author and anyone @mentioned. Deliberately AFTER the comment's
  // transaction (which holds the comment and its audit event) and outside it: a failed
  // notification or mail is logged and never fails or undoes the comment, and the e-mails
  // cannot be rolled back anyway. The cost, accepted: a crash between the two statements
  // keeps the comment and loses its notifications.
  await notifyComment({ workspaceId, solveId, commentId: comment.id, authorId: user.id, body: body.body }).catch((e) =>
    console.error('Edgefield: comment notifications failed', e),
  );
  return json({ comment }, 201);
});
