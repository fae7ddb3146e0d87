import type { Metadata } from 'next';
import { notFound } from 'next/navigation';
import { getSection } from '@/db/queries/sections';
import { requireWorkspaceMember } from '@/lib/server/access';
import { SectionHeader } from '../../_components/section-header';
import { roleCanEdit, toPlain, type SectionDetail } from '../../_components/types';
import { SectionSolveArea } from '@/components/results/section-solve-area';

export const metadata: Metadata = { title: 'Section' };

/** One section: its header (name, revision, author; rename/delete for editors) and the editor. */
export default async function SectionPage({ params }: { params: Promise<{ workspaceId: string; sectionId: string }> }) {
  const { workspaceId, sectionId } = await params;
  const { role } = await requireWorkspaceMember(workspaceId);
  const section = await getSection(workspaceId, sectionId);
  if (!section) notFound();
  const canEdit = roleCanEdit(role);
  const { latestRevision, ...rest } = section;
  const header = toPlain({
    ...rest,
    latestRevision: latestRevision ? { ...latestRevision, content: undefined } : null,
  }) as SectionDetail;
  // The latest saved drawing ("edgefield.section/1"), for the editor.
  const content = latestRevision?.content ?? null;

  return (
    <div className="flex min-h-0 flex-1 flex-col">
      <SectionHeader workspaceId={workspaceId} initial={header} canEdit={canEdit} />
      {/* EDITOR: the drawing editor (components/canvas). */}
      <div data-testid="section-editor-slot" data-has-content={content ? 'true' : 'false'} className="flex min-h-0 flex-1 flex-col p-3">
        {/* RESULTS: the editor with solving, results and field views (wraps SectionEditorClient). */}
        <SectionSolveArea
          workspaceId={workspaceId}
          sectionId={sectionId}
          content={content}
          revisionId={latestRevision?.id ?? null}
          canEdit={canEdit}
        />
      </div>
    </div>
  );
}
