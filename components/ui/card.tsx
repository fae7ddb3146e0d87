import type { ComponentProps, ReactNode } from 'react';
import { cn } from './cn';

export function Card({ className, ...rest }: ComponentProps<'section'>) {
  return <section className={cn('rounded-lg border border-line bg-surface shadow-sm', className)} {...rest} />;
}

export function CardHeader({
  title,
  description,
  actions,
  id,
  className,
}: {
  title: ReactNode;
  description?: ReactNode;
  actions?: ReactNode;
  id?: string;
  className?: string;
}) {
  return (
    <div className={cn('flex items-start justify-between gap-4 border-b border-line px-5 py-3.5', className)}>
      <div className="min-w-0">
        <h2 id={id} className="text-md font-semibold text-ink">
          {title}
        </h2>
        {description ? <p className="mt-0.5 text-sm text-ink-muted">{description}</p> : null}
      </div>
      {actions ? <div className="flex shrink-0 items-center gap-2">{actions}</div> : null}
    </div>
  );
}
