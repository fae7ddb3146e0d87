/** Small pieces shared by the results panel and its summary: a titled block and value rows. */
import type { ReactNode } from 'react';
import { formatRelError } from '@/lib/field/format';
import { cn } from '@/components/ui/cn';

export function Block({
  title,
  hint,
  actions,
  children,
  testId,
  tone,
}: {
  title: string;
  hint?: string;
  actions?: ReactNode;
  children: ReactNode;
  testId?: string;
  tone?: 'accent';
}) {
  return (
    <section
      className={cn('rounded-md border p-3', tone === 'accent' ? 'border-copper-200 bg-copper-50' : 'border-line bg-surface')}
      data-testid={testId}
      aria-label={title}
    >
      <div className="mb-1.5 flex items-start justify-between gap-2">
        <div>
          <h3 className="text-sm font-semibold text-ink">{title}</h3>
          {hint ? <p className="text-xs text-ink-muted">{hint}</p> : null}
        </div>
        {actions}
      </div>
      {children}
    </section>
  );
}

export function ValueRow({ label, value, err, errText, testId }: { label: string; value: string; err?: number; errText?: string; testId?: string }) {
  return (
    <div className="flex items-baseline justify-between gap-3 border-b border-line/60 py-1 last:border-b-0">
      <dt className="text-ink-soft">{label}</dt>
      <dd className="text-right tabular-nums" data-testid={testId}>
        <span className="font-medium text-ink">{value}</span>
        {errText !== undefined || err !== undefined ? <span className="ml-1.5 whitespace-nowrap text-xs text-ink-muted">{errText ?? formatRelError(err)}</span> : null}
      </dd>
    </div>
  );
}

export function Item({ k, v }: { k: string; v: string }) {
  return (
    <div className="flex justify-between gap-2 border-b border-line/60 py-0.5">
      <dt className="text-ink-soft">{k}</dt>
      <dd className="text-right tabular-nums text-ink">{v}</dd>
    </div>
  );
}
