import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound } from 'next/navigation';
import { getSection } from '@/db/queries/sections';
import { getRevision } from '@/db/queries/sections';
import { getSolve } from '@/db/queries/solves';
import { listComments } from '@/db/queries/comments';
import { requireWorkspaceMember } from '@/lib/server/access';
import { PageHeader } from '@/components/ui/page-header';
import { Badge, RoleBadge } from '@/components/ui/badge';
import { Time } from '@/components/ui/time';
import { SavedSolveView } from '../_components/saved-solve-view';
import { CommentThread } from '../_components/comment-thread';
import { ShareLinksPanel } from '@/components/teamwork/share-links-panel';

export const metadata: Metadata = { title: 'Solve' };
export const dynamic = 'force-dynamic';

/**
 * One saved solve at its stable link: the results and field exactly as stored (no solving
 * again), the section revision it belongs to, and the team's comments. Read-only for all.
 */
export default async function SolvePage({ params }: { params: Promise<{ workspaceId: string; solveId: string }> }) {
  const { workspaceId, solveId } = await params;
  const { role, workspace } = await requireWorkspaceMember(workspaceId);
  const solve = await getSolve(workspaceId, solveId);
  if (!solve) notFound();
  const [revision, section, comments] = await Promise.all([
    getRevision(workspaceId, solve.sectionId, solve.revisionId),
    getSection(workspaceId, solve.sectionId),
    listComments(workspaceId, solveId),
  ]);
  if (!revision) notFound();
  const latest = section?.latestRevisionId === solve.revisionId;
  const settings = (solve.settings ?? {}) as { preset?: string; tolerance?: number };
  const plain = JSON.parse(JSON.stringify({ solve, content: revision.content, comments })) as {
    solve: { result: unknown; status: string; hasField: boolean };
    content: unknown;
    comments: { id: string; body: string; createdAt: string; author: { id: string; name: string } | null }[];
  };
  return (
    <div className="mx-auto w-full max-w-page px-6 py-6" data-testid="solve-page" data-solve-id={solve.id}>
      <PageHeader
        titleTestId="solve-title"
        eyebrow={
          <span className="flex flex-wrap items-center gap-2">
            <Link href={`/w/${workspaceId}/solves`} className="text-accent hover:underline">
              Solves
            </Link>
            <span aria-hidden>/</span> Saved solve <RoleBadge role={role} />
          </span>
        }
        title={solve.sectionName}
        description={
          <span className="flex flex-wrap items-center gap-x-2 gap-y-1">
            <span>
              Revision r{solve.revisionNumber}
              {revision.message ? ` (“${revision.message}”)` : ''}
            </span>
            {latest ? <Badge tone="success">latest revision</Badge> : <Badge tone="warning">older revision</Badge>}
            <span>· mesh {settings.preset ?? '—'}</span>
            <span>
              · solved by {solve.author?.name ?? 'a former member'} <Time value={solve.createdAt} />
            </span>
          </span>
        }
        actions={
          section && !section.deletedAt ? (
            <Link
              href={`/w/${workspaceId}/sections/${solve.sectionId}`}
              className="inline-flex h-9 items-center rounded-md border border-line-strong bg-surface px-3.5 text-base font-medium text-ink shadow-xs hover:bg-grey-50"
            >
              Open section
            </Link>
          ) : null
        }
      />
      <p className="mt-2 text-sm text-ink-muted">
        This is the stored solve: the numbers and the field are shown as they were saved, without solving again. Nobody can change it; anyone in the
        workspace can comment.
      </p>
      <div className="mt-5">
        <SavedSolveView
          workspaceId={workspaceId}
          solveId={solve.id}
          status={plain.solve.status}
          result={plain.solve.result}
          content={plain.content}
          hasField={plain.solve.hasField}
        />
      </div>
      <div className="mt-6 max-w-3xl">
        <ShareLinksPanel workspaceId={workspaceId} targetType="solve" targetId={solve.id} canEdit={role !== 'viewer'} publicAllowed={workspace.allowPublicLinks} />
      </div>
      <div className="mt-6 max-w-3xl">
        <CommentThread workspaceId={workspaceId} solveId={solve.id} initial={plain.comments} />
      </div>
    </div>
  );
}
