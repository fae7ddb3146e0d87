'use client';

/**
 * A dimension field: accepts a number or an expression over the section's variables
 * ("w/2 + d"), shows what it evaluates to, and commits on Enter or when focus leaves.
 * Invalid input is never committed; the message says why (unknown name, syntax ...).
 */
import { useEffect, useId, useState } from 'react';
import type { Value } from '@/lib/section/schema';
import { evaluateExpression } from '@/lib/section/expression';
import { formatValue, parseTyped } from '@/lib/editor/values';
import { formatLength } from '@/lib/editor/units';
import { cn } from '@/components/ui/cn';

export interface ValueFieldProps {
  label: string;
  value: Value;
  /** Resolved variable values, for evaluating expressions as the user types. */
  variables: Readonly<Record<string, number>>;
  unit?: string;
  readOnly?: boolean;
  onCommit: (v: Value) => void;
  testId?: string;
  /** Extra check on the evaluated number (for example "must be > 0"); returns a message or null. */
  validate?: (n: number) => string | null;
  compact?: boolean;
}

export function ValueField({ label, value, variables, unit, readOnly, onCommit, testId, validate, compact }: ValueFieldProps) {
  const id = useId();
  const [text, setText] = useState(formatValue(value));
  const [focused, setFocused] = useState(false);
  useEffect(() => {
    if (!focused) setText(formatValue(value));
  }, [value, focused]);

  const parsed = parseTyped(text);
  const ev = typeof parsed === 'number' ? ({ ok: true, value: parsed } as const) : evaluateExpression(parsed, variables);
  const extra = ev.ok && validate ? validate(ev.value) : null;
  const error = text.trim() === '' ? 'enter a number or an expression' : !ev.ok ? ev.error.message : extra;

  const commit = () => {
    if (error && !ev.ok) return;
    if (text.trim() === '') return;
    if (formatValue(value) === text.trim()) return;
    onCommit(parsed);
  };

  return (
    <div className={cn('min-w-0', compact ? '' : 'space-y-0.5')}>
      <div className="flex items-center gap-2">
        <label htmlFor={id} className="w-16 shrink-0 truncate text-xs font-medium text-ink-soft" title={label}>
          {label}
        </label>
        <div className="relative min-w-0 flex-1">
          <input
            id={id}
            data-testid={testId}
            className={cn(
              'h-7 w-full rounded-sm border bg-surface px-2 font-mono text-sm text-ink',
              error ? 'border-danger' : 'border-line-strong hover:border-grey-400',
              readOnly && 'border-transparent bg-transparent px-0',
            )}
            value={text}
            readOnly={readOnly}
            aria-invalid={error ? true : undefined}
            aria-describedby={`${id}-msg`}
            spellCheck={false}
            autoComplete="off"
            onChange={(e) => setText(e.target.value)}
            onFocus={() => setFocused(true)}
            onBlur={() => {
              setFocused(false);
              commit();
            }}
            onKeyDown={(e) => {
              e.stopPropagation();
              if (e.key === 'Enter') {
                commit();
                (e.target as HTMLInputElement).select();
              } else if (e.key === 'Escape') {
                setText(formatValue(value));
              }
            }}
          />
        </div>
        {unit ? <span className="w-7 shrink-0 text-2xs text-ink-muted">{unit}</span> : null}
      </div>
      <p id={`${id}-msg`} className="pl-[4.5rem] text-2xs leading-4" aria-live="polite">
        {error ? (
          <span className="font-medium text-danger" data-testid={testId ? `${testId}-error` : undefined}>
            {error}
          </span>
        ) : typeof parsed === 'string' && ev.ok ? (
          <span className="text-ink-muted" data-testid={testId ? `${testId}-value` : undefined}>
            = {formatLength(ev.value)}
            {unit ? ` ${unit}` : ''}
          </span>
        ) : null}
      </p>
    </div>
  );
}
