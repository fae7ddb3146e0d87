import Link from 'next/link';
import type { ReactNode } from 'react';
import { AccountMenu } from './account-menu';
import { NotificationsBell } from '@/components/teamwork/notifications-bell';
import { LogoMark } from './logo';
import { WorkspaceNav } from './workspace-nav';
import { WorkspaceSwitcher, type WorkspaceChoice } from './workspace-switcher';

const ROLE_LABEL = { owner: 'Owner of this workspace', editor: 'Editor in this workspace', viewer: 'Viewer in this workspace' };

/**
 * The bar at the top of every signed-in page: mark, workspace switcher, the workspace's
 * tabs and the account menu. Without a workspace it shows the mark and the account only.
 */
export function AppHeader({
  user,
  current,
  workspaces,
  right,
}: {
  user: { name: string; email: string };
  current?: WorkspaceChoice;
  workspaces?: WorkspaceChoice[];
  right?: ReactNode;
}) {
  return (
    <header className="sticky top-0 z-40 h-header border-b border-line bg-surface/95 backdrop-blur supports-[backdrop-filter]:bg-surface/85">
      <div className="flex h-full items-center gap-3 px-5">
        <Link href={current ? `/w/${current.id}` : '/'} className="flex items-center gap-2 rounded-md" aria-label="Edgefield home">
          <LogoMark title="" className="size-7" />
          <span className="hidden text-md font-semibold tracking-tight text-ink xl:inline">
            Edge<span className="text-accent">field</span>
          </span>
        </Link>
        {current ? (
          <>
            <span aria-hidden className="text-line-strong">
              /
            </span>
            <WorkspaceSwitcher current={current} workspaces={workspaces ?? [current]} />
            <div className="ml-3 h-full">
              <WorkspaceNav workspaceId={current.id} />
            </div>
          </>
        ) : null}
        <div className="ml-auto flex items-center gap-3">
          {right}
          {current ? <NotificationsBell workspaceId={current.id} /> : null}
          <AccountMenu name={user.name} email={user.email} roleLabel={current ? ROLE_LABEL[current.role] : undefined} />
        </div>
      </div>
    </header>
  );
}
