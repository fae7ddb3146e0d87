'use client';

import { CircleAlert, RotateCcw } from 'lucide-react';
import Link from 'next/link';
import { useEffect } from 'react';
import { Button, buttonClass } from './button';

/** The body of every error.tsx: what happened in plain words, Try again, and a way home. */
export function ErrorPanel({ error, reset }: { error: Error & { digest?: string }; reset: () => void }) {
  useEffect(() => {
    console.error(error);
  }, [error]);
  return (
    <div role="alert" className="mx-auto max-w-lg rounded-lg border border-line bg-surface p-6 shadow-sm" data-testid="error-panel">
      <div className="flex items-start gap-3">
        <div className="flex size-9 shrink-0 items-center justify-center rounded-full bg-red-50 text-danger">
          <CircleAlert className="size-5" aria-hidden />
        </div>
        <div>
          <h1 className="text-lg font-semibold text-ink">This page could not be shown</h1>
          <p className="mt-1 text-sm text-ink-muted">
            Something went wrong while loading it. Your saved work is not affected. Try again; if it keeps happening, reload
            the page or come back in a minute.
          </p>
          {error.digest ? <p className="num mt-2 text-xs text-ink-muted">Reference: {error.digest}</p> : null}
          <div className="mt-4 flex gap-2">
            <Button variant="primary" onClick={reset}>
              <RotateCcw className="size-4" aria-hidden />
              Try again
            </Button>
            <Link href="/" className={buttonClass('ghost')}>
              Go to your workspace
            </Link>
          </div>
        </div>
      </div>
    </div>
  );
}
