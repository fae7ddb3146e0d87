'use client';

import { Check, ChevronsUpDown } from 'lucide-react';
import { Menu, MenuItemLink, MenuLabel } from '@/components/ui/menu';

export interface WorkspaceChoice {
  id: string;
  name: string;
  role: 'owner' | 'editor' | 'viewer';
}

/** Shows the current workspace and lets a member of several switch between them. */
export function WorkspaceSwitcher({ current, workspaces }: { current: WorkspaceChoice; workspaces: WorkspaceChoice[] }) {
  return (
    <Menu
      label="Switch workspace"
      align="start"
      testId="workspace-switcher"
      triggerClassName="flex max-w-80 items-center gap-1.5 rounded-md px-2 py-1.5 text-base font-medium text-ink hover:bg-grey-100"
      trigger={
        <>
          <span className="truncate" data-testid="current-workspace-name">
            {current.name}
          </span>
          <ChevronsUpDown className="size-3.5 shrink-0 text-ink-muted" aria-hidden />
        </>
      }
    >
      {(close) => (
        <>
          <MenuLabel>Your workspaces</MenuLabel>
          {workspaces.map((w) => (
            <MenuItemLink key={w.id} href={`/w/${w.id}`} onSelect={close} current={w.id === current.id}>
              <span className="flex w-4 justify-center">
                {w.id === current.id ? <Check className="size-3.5 text-accent" aria-hidden /> : null}
              </span>
              <span className="min-w-0 flex-1 truncate">{w.name}</span>
              <span className="text-xs capitalize text-ink-muted">{w.role}</span>
            </MenuItemLink>
          ))}
        </>
      )}
    </Menu>
  );
}
