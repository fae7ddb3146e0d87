import type { Metadata } from 'next';
import Link from 'next/link';
import { Card } from '@/components/ui/card';
import { EmptyState } from '@/components/ui/empty-state';
import { PageHeader } from '@/components/ui/page-header';
import { Time } from '@/components/ui/time';
import { listActivity } from '@/db/queries/activity';
import { listSections } from '@/db/queries/sections';
import { requireWorkspaceMember } from '@/lib/server/access';
import { describeActivity } from '@/lib/teamwork/activity';
import { Activity } from 'lucide-react';

export const metadata: Metadata = { title: 'Activity' };

/** The workspace's activity feed, from the audit trail (every member may read it). */
export default async function ActivityPage({
  params,
  searchParams,
}: {
  params: Promise<{ workspaceId: string }>;
  searchParams: Promise<Record<string, string | string[] | undefined>>;
}) {
  const { workspaceId } = await params;
  const sp = await searchParams;
  const { workspace } = await requireWorkspaceMember(workspaceId);
  const before = typeof sp.before === 'string' && /^\d{1,15}$/.test(sp.before) ? Number(sp.before) : undefined;
  const items = await listActivity(workspaceId, { limit: 100, before });
  const names = new Map<string, string>();
  for (const s of [...(await listSections(workspaceId)), ...(await listSections(workspaceId, { deleted: true }))]) names.set(s.id, s.name);
  const last = items[items.length - 1];
  return (
    <div className="mx-auto w-full max-w-page space-y-5 px-6 py-6">
      <PageHeader title="Activity" eyebrow={workspace.name} />
      <Card>
        {items.length === 0 ? (
          <EmptyState icon={Activity} title="Nothing yet">
            Changes to sections, solves, members and settings show here.
          </EmptyState>
        ) : (
          <ol className="divide-y divide-line" data-testid="activity">
            {items.map((e) => {
              const line = describeActivity(e, names);
              return (
                <li key={e.id} className="flex items-baseline gap-3 px-5 py-2.5 text-sm" data-testid="activity-item" data-action={e.action}>
                  <span className="w-28 shrink-0 text-xs text-ink-muted">
                    <Time value={e.createdAt} />
                  </span>
                  <span className="min-w-0 text-ink-soft">
                    <span className="font-medium text-ink">{e.actor?.name ?? 'Someone'}</span> {line.text}
                    {line.href ? (
                      <>
                        {' '}
                        <Link href={`/w/${workspaceId}/${line.href}`} className="font-medium text-accent hover:underline">
                          Open
                        </Link>
                      </>
                    ) : null}
                  </span>
                </li>
              );
            })}
          </ol>
        )}
        {items.length === 100 && last ? (
          <div className="border-t border-line px-5 py-3 text-sm">
            <Link href={`/w/${workspaceId}/activity?before=${last.id}`} className="font-medium text-accent hover:underline">
              Older activity
            </Link>
          </div>
        ) : null}
      </Card>
    </div>
  );
}
