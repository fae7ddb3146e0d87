'use client';

import { LogOut, UserRound } from 'lucide-react';
import { signOut } from 'next-auth/react';
import { Menu, MenuItemButton, MenuSeparator } from '@/components/ui/menu';

function initials(name: string) {
  const parts = name.trim().split(/\s+/).filter(Boolean);
  const first = parts[0]?.[0] ?? '?';
  const last = parts.length > 1 ? (parts[parts.length - 1]?.[0] ?? '') : '';
  return (first + last).toUpperCase();
}

/** The signed-in person: name, e-mail, role here, and sign out. */
export function AccountMenu({ name, email, roleLabel }: { name: string; email: string; roleLabel?: string }) {
  return (
    <Menu
      label={`Account: ${name}`}
      testId="account-menu"
      triggerClassName="flex items-center gap-2 rounded-md py-1 pl-1 pr-2 text-sm text-ink-soft hover:bg-grey-100"
      trigger={
        <>
          <span
            aria-hidden
            className="flex size-7 items-center justify-center rounded-full bg-grey-800 text-2xs font-semibold tracking-wide text-white"
          >
            {initials(name)}
          </span>
          <span className="max-w-40 truncate font-medium text-ink">{name}</span>
        </>
      }
    >
      {() => (
        <>
          <div className="flex items-start gap-2.5 px-2.5 py-2">
            <UserRound className="mt-0.5 size-4 text-ink-muted" aria-hidden />
            <div className="min-w-0">
              <p className="truncate font-medium text-ink" data-testid="account-name">
                {name}
              </p>
              <p className="truncate text-sm text-ink-muted" data-testid="account-email">
                {email}
              </p>
              {roleLabel ? <p className="mt-0.5 text-xs text-ink-muted">{roleLabel}</p> : null}
            </div>
          </div>
          <MenuSeparator />
          <MenuItemButton onSelect={() => void signOut({ callbackUrl: '/login' })} data-testid="sign-out">
            <LogOut className="size-4 text-ink-muted" aria-hidden />
            Sign out
          </MenuItemButton>
        </>
      )}
    </Menu>
  );
}
