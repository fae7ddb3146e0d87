'use client';

import Link from 'next/link';
import { usePathname } from 'next/navigation';
import { cn } from '@/components/ui/cn';

/** Tabs of a workspace: its sections, its solves, its settings. */
export function WorkspaceNav({ workspaceId }: { workspaceId: string }) {
  const pathname = usePathname() ?? '';
  const base = `/w/${workspaceId}`;
  const tabs = [
    { href: base, label: 'Sections', active: pathname === base || pathname.startsWith(`${base}/sections`) },
    { href: `${base}/solves`, label: 'Solves', active: pathname.startsWith(`${base}/solves`) },
    { href: `${base}/activity`, label: 'Activity', active: pathname.startsWith(`${base}/activity`) },
    { href: `${base}/settings`, label: 'Settings', active: pathname.startsWith(`${base}/settings`) },
  ];
  return (
    <nav aria-label="Workspace" className="flex h-full items-stretch gap-1">
      {tabs.map((t) => (
        <Link
          key={t.href}
          href={t.href}
          aria-current={t.active ? 'page' : undefined}
          data-testid={`nav-${t.label.toLowerCase()}`}
          className={cn(
            'relative flex items-center rounded-sm px-2.5 text-base transition-colors',
            t.active ? 'font-medium text-ink' : 'text-ink-muted hover:text-ink',
            t.active && 'after:absolute after:inset-x-2 after:-bottom-px after:h-0.5 after:rounded-full after:bg-accent',
          )}
        >
          {t.label}
        </Link>
      ))}
    </nav>
  );
}
