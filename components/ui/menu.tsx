'use client';

import Link from 'next/link';
import {
  useCallback,
  useEffect,
  useId,
  useRef,
  useState,
  type KeyboardEvent,
  type ReactNode,
} from 'react';
import { cn } from './cn';

/**
 * A small dropdown menu that works with the keyboard: Enter/Space/ArrowDown open it and focus
 * the first item, arrows move, Home/End jump, Escape closes and returns focus to the button,
 * Tab closes. Items are links or buttons with role="menuitem".
 */
export function Menu({
  label,
  trigger,
  children,
  align = 'end',
  className,
  triggerClassName,
  testId,
}: {
  /** Accessible name of the trigger button. */
  label: string;
  trigger: ReactNode;
  children: (close: () => void) => ReactNode;
  align?: 'start' | 'end';
  className?: string;
  triggerClassName?: string;
  testId?: string;
}) {
  const [open, setOpen] = useState(false);
  const rootRef = useRef<HTMLDivElement>(null);
  const buttonRef = useRef<HTMLButtonElement>(null);
  const menuRef = useRef<HTMLDivElement>(null);
  const menuId = useId();

  const items = () => Array.from(menuRef.current?.querySelectorAll<HTMLElement>('[role="menuitem"]') ?? []);
  const focusItem = (i: number) => {
    const list = items();
    if (list.length === 0) return;
    list[(i + list.length) % list.length]?.focus();
  };

  const close = useCallback((returnFocus = true) => {
    setOpen(false);
    if (returnFocus) buttonRef.current?.focus();
  }, []);

  useEffect(() => {
    if (!open) return;
    const onDown = (e: MouseEvent) => {
      if (!rootRef.current?.contains(e.target as Node)) setOpen(false);
    };
    const onKey = (e: globalThis.KeyboardEvent) => {
      if (e.key === 'Escape') {
        setOpen(false);
        buttonRef.current?.focus();
      }
    };
    document.addEventListener('mousedown', onDown);
    document.addEventListener('keydown', onKey);
    return () => {
      document.removeEventListener('mousedown', onDown);
      document.removeEventListener('keydown', onKey);
    };
  }, [open]);

  const [focusFirst, setFocusFirst] = useState<'first' | 'last' | null>(null);
  useEffect(() => {
    if (open && focusFirst) {
      focusItem(focusFirst === 'first' ? 0 : -1);
      setFocusFirst(null);
    }
  }, [open, focusFirst]);

  const onButtonKey = (e: KeyboardEvent) => {
    if (e.key === 'ArrowDown' || e.key === 'Enter' || e.key === ' ') {
      e.preventDefault();
      setOpen(true);
      setFocusFirst('first');
    } else if (e.key === 'ArrowUp') {
      e.preventDefault();
      setOpen(true);
      setFocusFirst('last');
    }
  };

  const onMenuKey = (e: KeyboardEvent) => {
    const list = items();
    const i = list.indexOf(document.activeElement as HTMLElement);
    if (e.key === 'ArrowDown') {
      e.preventDefault();
      focusItem(i + 1);
    } else if (e.key === 'ArrowUp') {
      e.preventDefault();
      focusItem(i - 1);
    } else if (e.key === 'Home') {
      e.preventDefault();
      focusItem(0);
    } else if (e.key === 'End') {
      e.preventDefault();
      focusItem(-1);
    } else if (e.key === 'Escape') {
      e.preventDefault();
      close();
    } else if (e.key === 'Tab') {
      setOpen(false);
    }
  };

  return (
    <div ref={rootRef} className={cn('relative', className)}>
      <button
        ref={buttonRef}
        type="button"
        aria-haspopup="menu"
        aria-expanded={open}
        aria-controls={open ? menuId : undefined}
        aria-label={label}
        onClick={() => setOpen((o) => !o)}
        onKeyDown={onButtonKey}
        className={triggerClassName}
        data-testid={testId}
      >
        {trigger}
      </button>
      {open ? (
        <div
          ref={menuRef}
          id={menuId}
          role="menu"
          aria-label={label}
          onKeyDown={onMenuKey}
          className={cn(
            'absolute top-full z-50 mt-1.5 min-w-56 rounded-md border border-line bg-surface p-1 shadow-md',
            align === 'end' ? 'right-0' : 'left-0',
          )}
        >
          {children(() => close())}
        </div>
      ) : null}
    </div>
  );
}

const itemClass =
  'flex w-full items-center gap-2 rounded-sm px-2.5 py-1.5 text-left text-base text-ink outline-none ' +
  'hover:bg-grey-100 focus-visible:bg-grey-100 focus-visible:outline-none';

export function MenuItemLink({
  href,
  children,
  onSelect,
  current,
  className,
  ...rest
}: {
  href: string;
  children: ReactNode;
  onSelect?: () => void;
  current?: boolean;
  className?: string;
  'data-testid'?: string;
}) {
  return (
    <Link
      role="menuitem"
      href={href}
      tabIndex={-1}
      aria-current={current ? 'true' : undefined}
      onClick={onSelect}
      className={cn(itemClass, current && 'font-medium', className)}
      {...rest}
    >
      {children}
    </Link>
  );
}

export function MenuItemButton({
  children,
  onSelect,
  className,
  ...rest
}: {
  children: ReactNode;
  onSelect: () => void;
  className?: string;
  'data-testid'?: string;
}) {
  return (
    <button type="button" role="menuitem" tabIndex={-1} onClick={onSelect} className={cn(itemClass, className)} {...rest}>
      {children}
    </button>
  );
}

export function MenuSeparator() {
  return <div role="separator" className="my-1 h-px bg-line" />;
}

export function MenuLabel({ children }: { children: ReactNode }) {
  return <div className="px-2.5 pb-1 pt-1.5 text-xs font-medium uppercase tracking-wide text-ink-muted">{children}</div>;
}
