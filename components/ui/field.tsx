import type { ComponentProps, ReactNode } from 'react';
import { cn } from './cn';

const control =
  'block w-full rounded-md border border-line-strong bg-surface px-3 text-base text-ink shadow-xs ' +
  'placeholder:text-ink-muted/80 hover:border-grey-400 focus-visible:border-focus focus-visible:outline-2 ' +
  'focus-visible:outline-offset-0 focus-visible:outline-focus/40 disabled:bg-surface-muted disabled:text-ink-muted ' +
  'aria-[invalid=true]:border-danger';

export function Input({ className, ...rest }: ComponentProps<'input'>) {
  return <input className={cn(control, 'h-9', className)} {...rest} />;
}

export function Textarea({ className, ...rest }: ComponentProps<'textarea'>) {
  return <textarea className={cn(control, 'min-h-20 py-2', className)} {...rest} />;
}

export function Select({ className, ...rest }: ComponentProps<'select'>) {
  return <select className={cn(control, 'select-chevron h-9 pr-8', className)} {...rest} />;
}

export function Label({ className, ...rest }: ComponentProps<'label'>) {
  return <label className={cn('block text-sm font-medium text-ink-soft', className)} {...rest} />;
}

export interface FieldProps {
  id: string;
  label: ReactNode;
  /** Error text for this field; rendered in an aria-live region and linked by aria-describedby. */
  error?: string;
  hint?: ReactNode;
  children: ReactNode;
  className?: string;
  /** data-testid of the error message element. */
  errorTestId?: string;
}

/**
 * A label, a control (children; give it `id`, `aria-invalid` and `aria-describedby={fieldDescribedBy(id)}`),
 * an optional hint and an error message that screen readers announce.
 */
export function Field({ id, label, error, hint, children, className, errorTestId }: FieldProps) {
  return (
    <div className={cn('space-y-1.5', className)}>
      <Label htmlFor={id}>{label}</Label>
      {children}
      {hint ? (
        <p id={`${id}-hint`} className="text-xs text-ink-muted">
          {hint}
        </p>
      ) : null}
      <p
        id={`${id}-error`}
        className="min-h-0 text-xs font-medium text-danger empty:hidden"
        aria-live="polite"
        data-testid={errorTestId}
      >
        {error ?? ''}
      </p>
    </div>
  );
}

export function fieldDescribedBy(id: string, hasHint = false) {
  return hasHint ? `${id}-hint ${id}-error` : `${id}-error`;
}
