'use client';

import { useQuery } from '@tanstack/react-query';
import { Activity, ArrowRight } from 'lucide-react';
import Link from 'next/link';
import { useId } from 'react';
import { Alert } from '@/components/ui/alert';
import { Badge } from '@/components/ui/badge';
import { Card } from '@/components/ui/card';
import { EmptyState } from '@/components/ui/empty-state';
import { LoadingNote, Skeleton } from '@/components/ui/skeleton';
import { Time } from '@/components/ui/time';
import { apiFetch, errorMessage } from '@/components/ui/api';
import { summariseResult } from './format';
import type { SolveItem } from './types';

export const RECENT_SOLVES = 8;

/** The latest solves of the workspace, each linking to its stable page. */
export function RecentSolves({ workspaceId, initial }: { workspaceId: string; initial: SolveItem[] }) {
  const id = useId();
  const query = useQuery({
    queryKey: ['solves', workspaceId, 'recent'],
    queryFn: async () => {
      const data = await apiFetch<{ solves: SolveItem[] } | SolveItem[]>(
        `/api/workspaces/${workspaceId}/solves?sort=created&dir=desc&limit=${RECENT_SOLVES}`,
      );
      return (Array.isArray(data) ? data : data.solves).slice(0, RECENT_SOLVES);
    },
    initialData: initial,
    initialDataUpdatedAt: Date.now(),
  });
  const rows = query.data ?? [];
  return (
    <Card aria-labelledby={`${id}-title`} data-testid="recent-solves">
      <div className="flex items-center justify-between border-b border-line px-5 py-3">
        <h2 id={`${id}-title`} className="text-md font-semibold text-ink">
          Recent solves
        </h2>
        <Link href={`/w/${workspaceId}/solves`} className="flex items-center gap-1 text-sm font-medium text-accent hover:underline">
          All solves <ArrowRight className="size-3.5" aria-hidden />
        </Link>
      </div>
      {query.isError ? (
        <div className="p-4">
          <Alert tone="danger" title="The solves could not be loaded.">
            {errorMessage(query.error)}
          </Alert>
        </div>
      ) : query.isPending ? (
        <div className="space-y-3 p-5">
          <LoadingNote label="Loading solves…" />
          <Skeleton className="h-4 w-2/3" />
          <Skeleton className="h-4 w-1/2" />
          <Skeleton className="h-4 w-3/5" />
        </div>
      ) : rows.length === 0 ? (
        <EmptyState icon={Activity} title="No solves yet" data-testid="solves-empty">
          Open a section and press Solve. Saved solves appear here for the whole team.
        </EmptyState>
      ) : (
        <ul className="divide-y divide-line">
          {rows.map((s) => {
            const summary = s.status === 'done' ? summariseResult(s.result) : null;
            return (
              <li key={s.id} data-testid="solve-row">
                <Link href={`/w/${workspaceId}/solves/${s.id}`} className="block px-5 py-2.5 hover:bg-grey-25">
                  <div className="flex items-center gap-2">
                    <span className="min-w-0 flex-1 truncate font-medium text-ink">{s.sectionName}</span>
                    <span className="num shrink-0 text-xs text-ink-muted">r{s.revisionNumber}</span>
                  </div>
                  <div className="mt-0.5 flex items-center gap-2 text-sm text-ink-muted">
                    {s.status === 'failed' ? (
                      <Badge tone="danger">Failed</Badge>
                    ) : summary ? (
                      <span className="num truncate text-ink-soft">{summary}</span>
                    ) : null}
                    <span className="ml-auto shrink-0 text-xs">
                      {s.author ? `${s.author.name} · ` : ''}
                      <Time value={s.createdAt} />
                    </span>
                  </div>
                </Link>
              </li>
            );
          })}
        </ul>
      )}
    </Card>
  );
}
