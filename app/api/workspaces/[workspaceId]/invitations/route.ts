import { listPendingInvitations } from '@/db/queries/invitations';
import { requireWorkspaceRole } from '@/lib/server/access';
import { ApiError, apiHandler, json, parseJsonBody, type RouteCtx, readParams } from '@/lib/server/http';
import { RATE_LIMIT_MESSAGE, take } from '@/lib/server/rate-limit';
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
  // Rate limit (lib/server/rate-limit.ts): per inviting person, and per invited address in this workspace.
  const limit = take([
    { name: 'invite:user', key: user.id },
    { name: 'invite:address', key: `${workspaceId}|${body.email.toLowerCase()}` },
  ]);
  if (!limit.ok) throw new ApiError(429, 'rate_limited', RATE_LIMIT_MESSAGE);
  const out = await inviteByEmail({ workspaceId, email: body.email, role: body.role, actor: user });
  return json(out, 201);
});
