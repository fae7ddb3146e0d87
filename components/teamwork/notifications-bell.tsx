'use client';

import { useQuery } from '@tanstack/react-query';
import { Bell } from 'lucide-react';
import Link from 'next/link';
import { apiFetch } from '@/components/ui/api';

/** The header's bell: unread comments and mentions, linking to the notifications page. */
export function NotificationsBell({ workspaceId }: { workspaceId: string }) {
  const q = useQuery({
    queryKey: ['notifications-count'],
    queryFn: () => apiFetch<{ unread: number }>('/api/notifications'),
    refetchInterval: 60_000,
    staleTime: 30_000,
  });
  const n = q.data?.unread ?? 0;
  return (
    <Link
      href={`/w/${workspaceId}/notifications`}
      className="relative flex size-8 items-center justify-center rounded-md text-ink-soft hover:bg-grey-100 hover:text-ink"
      aria-label={n ? `Notifications, ${n} unread` : 'Notifications'}
      data-testid="notifications-bell"
      data-unread={n}
    >
      <Bell className="size-4" aria-hidden />
      {n ? (
        <span className="num absolute -right-0.5 -top-0.5 min-w-4 rounded-full bg-accent px-1 text-center text-2xs font-semibold leading-4 text-white">{n > 99 ? '99+' : n}</span>
      ) : null}
    </Link>
  );
}
