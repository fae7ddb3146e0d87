import type { Metadata } from 'next';
import Link from 'next/link';
import { Activity } from 'lucide-react';
import { listSections } from '@/db/queries/sections';
import { listSolves } from '@/db/queries/solves';
import { listMembers } from '@/db/queries/workspaces';
import { requireWorkspaceMember } from '@/lib/server/access';
import { listSolvesQuerySchema } from '@/lib/validations/solve';
import { PageHeader } from '@/components/ui/page-header';
import { Badge } from '@/components/ui/badge';
import { Card } from '@/components/ui/card';
import { EmptyState } from '@/components/ui/empty-state';
import { Alert } from '@/components/ui/alert';
import { Time } from '@/components/ui/time';
import { buttonClass } from '@/components/ui/button';
import { summariseResult } from '../_components/format';

export const metadata: Metadata = { title: 'Solves' };
export const dynamic = 'force-dynamic';

type Search = Record<string, string | string[] | undefined>;
const one = (v: string | string[] | undefined) => (Array.isArray(v) ? v[0] : v) || undefined;

/** Every saved solve of the workspace, filtered by section, author and date, sorted. */
export default async function SolvesPage({ params, searchParams }: { params: Promise<{ workspaceId: string }>; searchParams: Promise<Search> }) {
  const { workspaceId } = await params;
  await requireWorkspaceMember(workspaceId);
  const sp = await searchParams;
  const raw = { sectionId: one(sp.section), authorId: one(sp.author), from: one(sp.from), to: one(sp.to), sort: one(sp.sort), dir: one(sp.dir) };
  const parsed = listSolvesQuerySchema.safeParse(raw);
  const q = parsed.success ? parsed.data : listSolvesQuerySchema.parse({});
  // "to" is a day: include the whole of it
  const toDate = q.to ? new Date(/^\d{4}-\d{2}-\d{2}$/.test(q.to) ? `${q.to}T23:59:59.999Z` : q.to) : undefined;
  const [solves, sections, members] = await Promise.all([
    listSolves(workspaceId, { sectionId: q.sectionId, authorId: q.authorId, from: q.from ? new Date(q.from) : undefined, to: toDate, sort: q.sort, dir: q.dir, limit: 200 }),
    listSections(workspaceId, { sort: 'name', dir: 'asc' }),
    listMembers(workspaceId),
  ]);
  const filtered = !!(q.sectionId || q.authorId || q.from || q.to);
  const field = 'h-9 rounded-md border border-line-strong bg-surface px-2 text-sm text-ink';
  return (
    <div className="mx-auto w-full max-w-page px-6 py-6" data-testid="solves-page">
      <PageHeader title="Solves" description="Every solve saved in this workspace. Each has a stable link to share with the team." />
      <Card className="mt-5">
        <form method="get" className="flex flex-wrap items-end gap-3 border-b border-line px-5 py-3" aria-label="Filter and sort solves">
          <label className="flex flex-col gap-1 text-xs font-medium text-ink-soft">
            Section
            <select name="section" defaultValue={q.sectionId ?? ''} className={field} data-testid="filter-section">
              <option value="">All sections</option>
              {sections.map((s) => (
                <option key={s.id} value={s.id}>
                  {s.name}
                </option>
              ))}
            </select>
          </label>
          <label className="flex flex-col gap-1 text-xs font-medium text-ink-soft">
            Solved by
            <select name="author" defaultValue={q.authorId ?? ''} className={field} data-testid="filter-author">
              <option value="">Anyone</option>
              {members.map((m) => (
                <option key={m.userId} value={m.userId}>
                  {m.name}
                </option>
              ))}
            </select>
          </label>
          <label className="flex flex-col gap-1 text-xs font-medium text-ink-soft">
            From
            <input type="date" name="from" defaultValue={q.from?.slice(0, 10) ?? ''} className={field} />
          </label>
          <label className="flex flex-col gap-1 text-xs font-medium text-ink-soft">
            To
            <input type="date" name="to" defaultValue={q.to?.slice(0, 10) ?? ''} className={field} />
          </label>
          <label className="flex flex-col gap-1 text-xs font-medium text-ink-soft">
            Sort by
            <select name="sort" defaultValue={q.sort} className={field} data-testid="sort">
              <option value="created">Date</option>
              <option value="section">Section</option>
              <option value="author">Author</option>
            </select>
          </label>
          <label className="flex flex-col gap-1 text-xs font-medium text-ink-soft">
            Order
            <select name="dir" defaultValue={q.dir ?? ''} className={field}>
              <option value="">Default</option>
              <option value="asc">Ascending</option>
              <option value="desc">Descending</option>
            </select>
          </label>
          <button type="submit" className={buttonClass('primary', 'md')} data-testid="filter-apply">
            Apply
          </button>
          {filtered ? (
            <Link href={`/w/${workspaceId}/solves`} className={buttonClass('ghost', 'md')}>
              Clear filters
            </Link>
          ) : null}
        </form>
        {!parsed.success ? (
          <div className="px-5 pt-3">
            <Alert tone="warning">Some filters were not understood and were ignored: {parsed.error.issues[0]?.message}</Alert>
          </div>
        ) : null}
        {solves.length === 0 ? (
          <EmptyState icon={Activity} title={filtered ? 'No solves match these filters' : 'No solves yet'}>
            {filtered ? 'Change or clear the filters.' : 'Open a section, press Solve and save the solve: it appears here for the whole team.'}
          </EmptyState>
        ) : (
          <div className="overflow-x-auto">
            <table className="w-full text-sm" data-testid="solves-table">
              <thead>
                <tr className="border-b border-line bg-surface-muted text-left text-xs text-ink-soft">
                  <th className="px-5 py-2 font-medium">Section</th>
                  <th className="px-3 py-2 font-medium">Revision</th>
                  <th className="px-3 py-2 font-medium">Mesh</th>
                  <th className="px-3 py-2 font-medium">Result</th>
                  <th className="px-3 py-2 font-medium">Solved by</th>
                  <th className="px-5 py-2 text-right font-medium">When</th>
                </tr>
              </thead>
              <tbody className="divide-y divide-line">
                {solves.map((s) => {
                  const settings = (s.settings ?? {}) as { preset?: string };
                  return (
                    <tr key={s.id} className="hover:bg-grey-25" data-testid="solves-row">
                      <td className="px-5 py-2">
                        <Link href={`/w/${workspaceId}/solves/${s.id}`} className="font-medium text-accent hover:underline">
                          {s.sectionName}
                        </Link>
                      </td>
                      <td className="num px-3 py-2 text-ink-soft">r{s.revisionNumber}</td>
                      <td className="px-3 py-2 text-ink-soft">{settings.preset ?? '—'}</td>
                      <td className="num px-3 py-2 text-ink">
                        {s.status === 'failed' ? <Badge tone="danger">Failed</Badge> : (summariseResult(s.result) ?? '—')}
                      </td>
                      <td className="px-3 py-2 text-ink-soft">{s.author?.name ?? 'former member'}</td>
                      <td className="px-5 py-2 text-right text-ink-muted">
                        <Time value={s.createdAt} />
                      </td>
                    </tr>
                  );
                })}
              </tbody>
            </table>
          </div>
        )}
      </Card>
    </div>
  );
}
