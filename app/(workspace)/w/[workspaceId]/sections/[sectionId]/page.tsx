import type { Metadata } from 'next';
import { notFound } from 'next/navigation';
import { getSection } from '@/db/queries/sections';
import { requireWorkspaceMember } from '@/lib/server/access';
import { SectionHeader } from '../../_components/section-header';
import { roleCanEdit, toPlain, type SectionDetail } from '../../_components/types';

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
      {/* EDITOR: mount components/canvas/SectionEditor here (content, latestRevision.id, canEdit). */}
      <div
        data-testid="section-editor-slot"
        data-has-content={content ? 'true' : 'false'}
        className="flex min-h-[28rem] flex-1 items-center justify-center bg-[linear-gradient(var(--color-grey-100)_1px,transparent_1px),linear-gradient(90deg,var(--color-grey-100)_1px,transparent_1px)] bg-[size:24px_24px]"
      >
        <p className="rounded-md border border-line bg-surface px-4 py-3 text-sm text-ink-muted shadow-sm">
          The drawing editor appears here.
        </p>
      </div>
    </div>
  );
}
