import { getWorkspace } from '@/db/queries/workspaces';
import { renderReportPdf } from '@/lib/server/report-pdf';
import { requireWorkspaceRole } from '@/lib/server/access';
import { apiHandler, parseJsonBody, readParams, type RouteCtx } from '@/lib/server/http';
import { reportRequestSchema } from '@/lib/validations/report';

export const dynamic = 'force-dynamic';
export const runtime = 'nodejs';

/** A PDF report of a solve, sweep or fringing study computed in the browser (viewer and up). */
export const POST = apiHandler(async (req: Request, ctx: RouteCtx<{ workspaceId: string }>) => {
  const { workspaceId } = await readParams(ctx);
  const { user } = await requireWorkspaceRole(workspaceId, 'viewer');
  const body = await parseJsonBody(req, reportRequestSchema, { maxBytes: 6 << 20 });
  const ws = await getWorkspace(workspaceId);
  const pdf = await renderReportPdf(body, { workspace: ws?.name ?? workspaceId, author: user.name || user.email, date: new Date() });
  const name = body.title.replace(/[^A-Za-z0-9._-]+/g, '-').slice(0, 80) || 'report';
  return new Response(new Uint8Array(pdf), {
    status: 200,
    headers: {
      'content-type': 'application/pdf',
      'content-disposition': `attachment; filename="edgefield-${name}.pdf"`,
      'cache-control': 'no-store',
      'x-content-type-options': 'nosniff',
    },
  });
});
