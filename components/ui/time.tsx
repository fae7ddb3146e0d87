'use client';

import { useEffect, useState } from 'react';

const absolute = new Intl.DateTimeFormat('en-GB', {
  day: 'numeric',
  month: 'short',
  year: 'numeric',
  hour: '2-digit',
  minute: '2-digit',
  timeZone: 'UTC',
  timeZoneName: 'short',
});

const rtf = new Intl.RelativeTimeFormat('en', { numeric: 'auto' });

/** "3 min ago", "yesterday", "12 Mar 2026" — relative for the last week, absolute otherwise. */
export function relativeTime(date: Date, now: Date = new Date()): string {
  const s = (date.getTime() - now.getTime()) / 1000;
  const a = Math.abs(s);
  if (a < 45) return 'just now';
  if (a < 3600) return rtf.format(Math.round(s / 60), 'minute');
  if (a < 86400) return rtf.format(Math.round(s / 3600), 'hour');
  if (a < 7 * 86400) return rtf.format(Math.round(s / 86400), 'day');
  return new Intl.DateTimeFormat('en-GB', { day: 'numeric', month: 'short', year: 'numeric' }).format(date);
}

/**
 * A <time> element: the server renders the absolute UTC time (stable, no hydration mismatch),
 * the browser then shows the relative form; the absolute time stays in the tooltip.
 */
export function Time({ value, className }: { value: string | Date; className?: string }) {
  const date = typeof value === 'string' ? new Date(value) : value;
  const abs = Number.isNaN(date.getTime()) ? '—' : absolute.format(date);
  const [text, setText] = useState(abs);
  useEffect(() => {
    if (Number.isNaN(date.getTime())) return;
    setText(relativeTime(date));
    const t = setInterval(() => setText(relativeTime(date)), 60_000);
    return () => clearInterval(t);
  }, [date.getTime()]); // eslint-disable-line react-hooks/exhaustive-deps
  return (
    <time dateTime={Number.isNaN(date.getTime()) ? undefined : date.toISOString()} title={abs} className={className}>
      {text}
    </time>
  );
}
