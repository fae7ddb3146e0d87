import type { LucideIcon } from 'lucide-react';
import type { ReactNode } from 'react';
import { cn } from './cn';

export function EmptyState({
  icon: Icon,
  title,
  children,
  action,
  className,
  ...rest
}: {
  icon?: LucideIcon;
  title: ReactNode;
  children?: ReactNode;
  action?: ReactNode;
  className?: string;
  'data-testid'?: string;
}) {
  return (
    <div className={cn('flex flex-col items-center px-6 py-12 text-center', className)} {...rest}>
      {Icon ? (
        <div className="mb-3 flex size-10 items-center justify-center rounded-full bg-grey-100 text-ink-muted">
          <Icon className="size-5" aria-hidden />
        </div>
      ) : null}
      <p className="text-md font-semibold text-ink">{title}</p>
      {children ? <div className="mt-1 max-w-md text-sm text-ink-muted">{children}</div> : null}
      {action ? <div className="mt-4">{action}</div> : null}
    </div>
  );
}
