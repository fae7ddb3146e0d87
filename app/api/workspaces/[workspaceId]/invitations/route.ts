import { listPendingInvitations } from '@/db/queries/invitations';
import { requireWorkspaceRole } from '@/lib/server/access';
import { apiHandler, json, parseJsonBody, type RouteCtx, readParams } from '@/lib/server/http';
import { inviteByEmail } from '@/lib/server/invitations';
import { inviteSchema } from '@/lib/validations/members';

export const dynamic = 'force-dynamic';
type Ctx = RouteCtx<{ workspaceId: string }>;

/** Pending invitations (owners). */
export const GET = apiHandler(async (_req: Request, ctx: Ctx) => {
  const { workspaceId } = await readParams(ctx);
  await requireWorkspaceRole(workspaceId, 'owner');
  return json({ invitations: await listPendingInvitations(workspaceId) });
});

/** Invite an address with a role (owners): stores the hashed token and mails the link. */
export const POST = apiHandler(async (req: Request, ctx: Ctx) => {
  const { workspaceId } = await readParams(ctx);
  const { user } = await requireWorkspaceRole(workspaceId, 'owner');
  const body = await parseJsonBody(req, inviteSchema, { maxBytes: 8 * 1024 });
  const out = await inviteByEmail({ workspaceId, email: body.email, role: body.role, actor: user });
  return json(out, 201);
});
