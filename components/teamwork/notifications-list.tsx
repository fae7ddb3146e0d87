'use client';

import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { AtSign, MessageSquare } from 'lucide-react';
import Link from 'next/link';
import { useEffect } from 'react';
import { Alert } from '@/components/ui/alert';
import { apiFetch, errorMessage } from '@/components/ui/api';
import { Card, CardHeader } from '@/components/ui/card';
import { EmptyState } from '@/components/ui/empty-state';
import { Time } from '@/components/ui/time';

interface Item {
  id: string;
  kind: 'comment' | 'mention';
  workspaceId: string | null;
  workspaceName: string | null;
  data: { solveId: string; actorName: string; sectionName: string; excerpt: string };
  readAt: string | null;
  createdAt: string;
}

/** The in-app list of comments on your solves and mentions of you, plus the e-mail setting. */
export function NotificationsList() {
  const qc = useQueryClient();
  const q = useQuery({ queryKey: ['notifications'], queryFn: () => apiFetch<{ notifications: Item[]; unread: number; emailEnabled: boolean }>('/api/notifications') });
  const read = useMutation({
    mutationFn: () => apiFetch('/api/notifications/read', { method: 'POST' }),
    onSuccess: () => void qc.invalidateQueries({ queryKey: ['notifications-count'] }),
  });
  const email = useMutation({
    mutationFn: (on: boolean) => apiFetch<{ emailEnabled: boolean }>('/api/notifications/settings', { method: 'PUT', json: { emailEnabled: on } }),
    onSuccess: () => void qc.invalidateQueries({ queryKey: ['notifications'] }),
  });
  const unread = q.data?.unread ?? 0;
  // Seeing the list marks it read (the unread ones stay highlighted until the next visit).
  useEffect(() => {
    if (unread > 0 && !read.isPending && !read.isSuccess) read.mutate();
  }, [unread]); // eslint-disable-line react-hooks/exhaustive-deps

  return (
    <div className="space-y-5">
      <Card aria-labelledby="notif-settings" data-testid="notification-settings">
        <CardHeader id="notif-settings" title="E-mail" />
        <label className="flex items-start gap-3 px-5 py-4 text-sm">
          <input
            type="checkbox"
            className="mt-0.5 size-4 accent-accent"
            checked={email.isPending ? Boolean(email.variables) : (q.data?.emailEnabled ?? true)}
            disabled={!q.data || email.isPending}
            onChange={(e) => email.mutate(e.target.checked)}
            data-testid="notify-email"
          />
          <span>
            <span className="font-medium text-ink">E-mail me when someone comments on my solves or mentions me</span>
            <span className="block text-ink-muted">Mention someone in a comment with @ and their name, e.g. @Maren Holt. This list keeps every notification either way.</span>
          </span>
        </label>
        {email.isError ? <Alert tone="danger" className="mx-5 mb-4">{errorMessage(email.error)}</Alert> : null}
      </Card>
      <Card aria-labelledby="notif-list">
        <CardHeader id="notif-list" title="Notifications" description={unread ? `${unread} new` : undefined} />
        {q.isError ? (
          <Alert tone="danger" className="m-5">
            {errorMessage(q.error)}
          </Alert>
        ) : !q.data ? (
          <p className="px-5 py-4 text-sm text-ink-muted">Loading…</p>
        ) : q.data.notifications.length === 0 ? (
          <EmptyState title="No notifications yet">Comments on your solves and mentions of you show here.</EmptyState>
        ) : (
          <ul className="divide-y divide-line" data-testid="notifications">
            {q.data.notifications.map((n) => {
              const Icon = n.kind === 'mention' ? AtSign : MessageSquare;
              return (
                <li key={n.id} className={`flex gap-3 px-5 py-3 text-sm ${n.readAt ? '' : 'bg-copper-50/60'}`} data-testid="notification" data-kind={n.kind} data-read={n.readAt ? 'true' : 'false'}>
                  <Icon className="mt-0.5 size-4 shrink-0 text-ink-muted" aria-hidden />
                  <div className="min-w-0 flex-1">
                    <p className="text-ink">
                      <span className="font-medium">{n.data.actorName}</span>{' '}
                      {n.kind === 'mention' ? 'mentioned you on the solve of' : 'commented on your solve of'}{' '}
                      {n.workspaceId ? (
                        <Link href={`/w/${n.workspaceId}/solves/${n.data.solveId}`} className="font-medium text-accent hover:underline">
                          {n.data.sectionName}
                        </Link>
                      ) : (
                        n.data.sectionName
                      )}
                      {n.workspaceName ? <span className="text-ink-muted"> · {n.workspaceName}</span> : null}
                    </p>
                    <p className="mt-0.5 line-clamp-2 text-ink-soft">{n.data.excerpt}</p>
                  </div>
                  <span className="shrink-0 text-xs text-ink-muted">
                    <Time value={n.createdAt} />
                  </span>
                </li>
              );
            })}
          </ul>
        )}
      </Card>
    </div>
  );
}
