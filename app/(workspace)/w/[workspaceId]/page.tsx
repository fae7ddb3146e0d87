import type { Metadata } from 'next';
import { listSections } from '@/db/queries/sections';
import { listSolves } from '@/db/queries/solves';
import { getWorkspaceCounts } from '@/db/queries/workspaces';
import { requireWorkspaceMember } from '@/lib/server/access';
import { PageHeader } from '@/components/ui/page-header';
import { RoleBadge } from '@/components/ui/badge';
import { RecentSolves, RECENT_SOLVES } from './_components/recent-solves';
import { SectionsPanel } from './_components/sections-panel';
import { toPlain, type SectionItem, type SolveItem } from './_components/types';

export const metadata: Metadata = { title: 'Sections' };

const plural = (n: number, one: string, many = `${one}s`) => `${n} ${n === 1 ? one : many}`;

/** Workspace home: the sections (search, sort, create) and the latest solves. */
export default async function WorkspaceHome({ params }: { params: Promise<{ workspaceId: string }> }) {
  const { workspaceId } = await params;
  const { role, workspace } = await requireWorkspaceMember(workspaceId);
  const [counts, sections, solves] = await Promise.all([
    getWorkspaceCounts(workspaceId),
    listSections(workspaceId, { sort: 'updated', dir: 'desc' }),
    listSolves(workspaceId, { sort: 'created', dir: 'desc', limit: RECENT_SOLVES }),
  ]);
  return (
    <div className="mx-auto w-full max-w-page px-6 py-6">
      <PageHeader
        title={workspace.name}
        titleTestId="workspace-title"
        eyebrow={
          <span className="flex items-center gap-2">
            Workspace <RoleBadge role={role} />
          </span>
        }
        description={`${plural(counts.sections, 'section')} · ${plural(counts.solves, 'saved solve')} · ${plural(counts.members, 'member')}`}
      />
      <div className="mt-6 grid grid-cols-1 gap-5 lg:grid-cols-[minmax(0,1fr)_20rem] xl:grid-cols-[minmax(0,1fr)_24rem]">
        <SectionsPanel workspaceId={workspaceId} role={role} initial={toPlain(sections) as SectionItem[]} />
        <RecentSolves workspaceId={workspaceId} initial={toPlain(solves) as SolveItem[]} />
      </div>
    </div>
  );
}
