import { getWorkspace, getWorkspaceCounts } from '@/db/queries/workspaces';
import { countPendingInvitations } from '@/db/queries/invitations';
import { requireWorkspaceRole } from '@/lib/server/access';
import { apiHandler, json, notFound, type RouteCtx, readParams } from '@/lib/server/http';
import { listInvoices } from '@/lib/server/payments';
import { planOf } from '@/lib/server/plans';

export const dynamic = 'force-dynamic';
type Ctx = RouteCtx<{ workspaceId: string }>;

/** The plan, its limits, the usage and the invoices (owners). */
export const GET = apiHandler(async (_req: Request, ctx: Ctx) => {
  const { workspaceId } = await readParams(ctx);
  await requireWorkspaceRole(workspaceId, 'owner');
  const ws = await getWorkspace(workspaceId);
  if (!ws) throw notFound('The workspace');
  const counts = await getWorkspaceCounts(workspaceId);
  const plan = planOf(ws.plan);
  return json({
    plan: plan.id,
    limits: { members: plan.maxMembers, solves: plan.maxSolves },
    usage: { members: counts.members + (await countPendingInvitations(workspaceId)), solves: counts.solves },
    invoices: await listInvoices(ws),
  });
});
