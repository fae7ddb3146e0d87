'use client';

import { ErrorPanel } from '@/components/ui/error-panel';

export default function RootError({ error, reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return (
    <main id="main" className="flex min-h-screen items-center justify-center px-6">
      <ErrorPanel error={error} reset={reset} />
    </main>
  );
}
