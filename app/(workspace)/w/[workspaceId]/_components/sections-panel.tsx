'use client';

import { useQuery } from '@tanstack/react-query';
import { ArrowDownWideNarrow, ArrowUpNarrowWide, FileBox, Plus, RotateCcw, Search, Trash2 } from 'lucide-react';
import Link from 'next/link';
import { useEffect, useId, useState } from 'react';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { EmptyState } from '@/components/ui/empty-state';
import { Input, Select } from '@/components/ui/field';
import { LoadingNote, SkeletonRows } from '@/components/ui/skeleton';
import { Time } from '@/components/ui/time';
import { apiFetch, errorMessage } from '@/components/ui/api';
import { CreateSectionDialog } from './create-section-dialog';
import { ImportDrawingButton } from '@/components/import/import-drawing';
import { useRestoreSection } from './section-mutations';
import { roleCanEdit, type Role, type SectionItem } from './types';

type Sort = 'updated' | 'name' | 'created';
type Dir = 'asc' | 'desc';

const SORT_LABEL: Record<Sort, string> = { updated: 'Last changed', name: 'Name', created: 'Created' };
const defaultDir = (s: Sort): Dir => (s === 'name' ? 'asc' : 'desc');

export function sectionsQueryKey(workspaceId: string, p?: { q: string; sort: Sort; dir: Dir; deleted: boolean }) {
  return p ? (['sections', workspaceId, p] as const) : (['sections', workspaceId] as const);
}

function useDebounced<T>(value: T, ms: number): T {
  const [v, setV] = useState(value);
  useEffect(() => {
    const t = setTimeout(() => setV(value), ms);
    return () => clearTimeout(t);
  }, [value, ms]);
  return v;
}

/** The workspace's sections: search, sort, the trash, and "New section" for editors and owners. */
export function SectionsPanel({
  workspaceId,
  role,
  initial,
}: {
  workspaceId: string;
  role: Role;
  initial: SectionItem[];
}) {
  const canEdit = roleCanEdit(role);
  const id = useId();
  const [q, setQ] = useState('');
  const [sort, setSort] = useState<Sort>('updated');
  const [dir, setDir] = useState<Dir>('desc');
  const [deleted, setDeleted] = useState(false);
  const [creating, setCreating] = useState(false);
  const dq = useDebounced(q.trim(), 250);
  const params = { q: dq, sort, dir, deleted };
  const isDefault = !dq && sort === 'updated' && dir === 'desc' && !deleted;

  const query = useQuery({
    queryKey: sectionsQueryKey(workspaceId, params),
    queryFn: async () => {
      const sp = new URLSearchParams({ sort, dir });
      if (dq) sp.set('q', dq);
      if (deleted) sp.set('deleted', '1');
      const data = await apiFetch<{ sections: SectionItem[] } | SectionItem[]>(
        `/api/workspaces/${workspaceId}/sections?${sp.toString()}`,
      );
      return Array.isArray(data) ? data : data.sections;
    },
    initialData: isDefault ? initial : undefined,
    initialDataUpdatedAt: isDefault ? Date.now() : undefined,
    placeholderData: (prev) => prev,
  });
  const restore = useRestoreSection(workspaceId);

  const rows = query.data ?? [];
  const filtering = Boolean(dq);

  return (
    <Card aria-labelledby={`${id}-title`} data-testid="sections-panel">
      <div className="flex items-center gap-2 px-5 pb-2 pt-3.5">
        <h2 id={`${id}-title`} className="mr-auto text-md font-semibold text-ink">
          {deleted ? 'Deleted sections' : 'Sections'}
        </h2>
        {canEdit ? (
          <Button
            size="sm"
            variant={deleted ? 'secondary' : 'ghost'}
            onClick={() => setDeleted((d) => !d)}
            aria-pressed={deleted}
            data-testid="sections-show-deleted"
          >
            <Trash2 className="size-4" aria-hidden />
            {deleted ? 'Back to sections' : 'Deleted'}
          </Button>
        ) : null}
        {canEdit && !deleted ? <ImportDrawingButton workspaceId={workspaceId} /> : null}
        {canEdit && !deleted ? (
          <Button size="sm" variant="primary" onClick={() => setCreating(true)} data-testid="new-section">
            <Plus className="size-4" aria-hidden />
            New section
          </Button>
        ) : null}
      </div>
      <div className="flex items-center gap-3 border-b border-line px-5 pb-3">
        <div className="relative min-w-0 flex-1">
          <label htmlFor={`${id}-q`} className="sr-only">
            Search sections
          </label>
          <Search className="pointer-events-none absolute left-2.5 top-1/2 size-4 -translate-y-1/2 text-ink-muted" aria-hidden />
          <Input
            id={`${id}-q`}
            type="search"
            placeholder="Search by name or description"
            value={q}
            onChange={(e) => setQ(e.target.value)}
            className="h-8 pl-8 text-sm"
            data-testid="sections-search"
          />
        </div>
        <div className="flex shrink-0 items-center gap-1.5">
          <label htmlFor={`${id}-sort`} className="whitespace-nowrap text-sm text-ink-muted">
            Sort by
          </label>
          <Select
            id={`${id}-sort`}
            value={sort}
            onChange={(e) => {
              const s = e.target.value as Sort;
              setSort(s);
              setDir(defaultDir(s));
            }}
            className="h-8 w-36 text-sm"
            data-testid="sections-sort"
          >
            {(Object.keys(SORT_LABEL) as Sort[]).map((s) => (
              <option key={s} value={s}>
                {SORT_LABEL[s]}
              </option>
            ))}
          </Select>
          <Button
            size="sm"
            variant="ghost"
            onClick={() => setDir((d) => (d === 'asc' ? 'desc' : 'asc'))}
            aria-label={dir === 'asc' ? 'Ascending; switch to descending' : 'Descending; switch to ascending'}
            title={dir === 'asc' ? 'Ascending' : 'Descending'}
            data-testid="sections-dir"
          >
            {dir === 'asc' ? <ArrowUpNarrowWide className="size-4" aria-hidden /> : <ArrowDownWideNarrow className="size-4" aria-hidden />}
          </Button>
        </div>
      </div>

      {query.isError ? (
        <div className="p-5">
          <Alert tone="danger" title="The sections could not be loaded.">
            {errorMessage(query.error)}{' '}
            <button type="button" className="font-medium underline" onClick={() => void query.refetch()}>
              Try again
            </button>
          </Alert>
        </div>
      ) : query.isPending ? (
        <>
          <LoadingNote label="Loading sections…" />
          <SkeletonRows rows={4} />
        </>
      ) : rows.length === 0 ? (
        filtering ? (
          <EmptyState icon={Search} title="No section matches" data-testid="sections-empty">
            Nothing in {deleted ? 'the deleted sections' : 'this workspace'} has “{dq}” in its name or description.
          </EmptyState>
        ) : deleted ? (
          <EmptyState icon={Trash2} title="Nothing deleted" data-testid="sections-empty">
            Deleted sections stay here and can be restored.
          </EmptyState>
        ) : (
          <EmptyState
            icon={FileBox}
            title="No sections yet"
            data-testid="sections-empty"
            action={
              canEdit ? (
                <Button variant="primary" onClick={() => setCreating(true)}>
                  <Plus className="size-4" aria-hidden />
                  New section
                </Button>
              ) : undefined
            }
          >
            {canEdit
              ? 'A section is one cross-section design: conductors, dielectrics and a reference. Start from a drawing such as a microstrip or a plate pair.'
              : 'Editors of this workspace have not drawn any section yet.'}
          </EmptyState>
        )
      ) : (
        <table
          className={`w-full table-fixed text-left transition-opacity ${query.isPlaceholderData ? 'opacity-60' : ''}`}
          aria-busy={query.isFetching || undefined}
          data-stale={query.isPlaceholderData ? 'true' : undefined}
        >
          <thead className="border-b border-line bg-surface-muted text-xs font-medium text-ink-muted">
            <tr>
              <th scope="col" className="px-5 py-2 font-medium">
                Name
              </th>
              <th scope="col" className="w-20 px-3 py-2 font-medium">
                Revision
              </th>
              <th scope="col" className="w-20 px-3 py-2 text-right font-medium">
                Solves
              </th>
              <th scope="col" className="w-36 px-5 py-2 text-right font-medium">
                {deleted ? 'Deleted' : sort === 'created' ? 'Created' : 'Changed'}
              </th>
              {deleted ? <th className="w-28 px-3 py-2" aria-label="Actions" /> : null}
            </tr>
          </thead>
          <tbody className="divide-y divide-line">
            {rows.map((s) => (
              <tr key={s.id} className="group hover:bg-grey-25" data-testid="section-row">
                <td className="px-5 py-2.5">
                  {deleted ? (
                    <span className="block truncate font-medium text-ink">{s.name}</span>
                  ) : (
                    <Link
                      href={`/w/${workspaceId}/sections/${s.id}`}
                      className="block truncate font-medium text-ink hover:text-accent hover:underline"
                      data-testid="section-link"
                    >
                      {s.name}
                    </Link>
                  )}
                  <p className="truncate text-sm text-ink-muted">
                    {s.description || (s.createdBy ? `Created by ${s.createdBy.name}` : '\u00a0')}
                  </p>
                </td>
                <td className="num px-3 py-2.5 text-sm text-ink-soft">
                  {s.latestRevisionNumber ? `r${s.latestRevisionNumber}` : '—'}
                </td>
                <td className="num px-3 py-2.5 text-right text-sm text-ink-soft">{s.solveCount}</td>
                <td className="num-sans px-5 py-2.5 text-right text-sm text-ink-muted">
                  <Time value={deleted && s.deletedAt ? s.deletedAt : sort === 'created' ? s.createdAt : s.updatedAt} />
                </td>
                {deleted ? (
                  <td className="px-3 py-2 text-right">
                    <Button
                      size="sm"
                      variant="secondary"
                      pending={restore.isPending && restore.variables === s.id}
                      onClick={() => restore.mutate(s.id)}
                      data-testid="section-restore"
                    >
                      <RotateCcw className="size-3.5" aria-hidden />
                      Restore
                    </Button>
                  </td>
                ) : null}
              </tr>
            ))}
          </tbody>
        </table>
      )}
      {restore.isError ? (
        <div className="border-t border-line p-4">
          <Alert tone="danger">{errorMessage(restore.error)}</Alert>
        </div>
      ) : null}
      {canEdit ? <CreateSectionDialog workspaceId={workspaceId} open={creating} onClose={() => setCreating(false)} /> : null}
    </Card>
  );
}
