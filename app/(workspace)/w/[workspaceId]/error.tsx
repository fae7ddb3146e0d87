'use client';

import { ErrorPanel } from '@/components/ui/error-panel';

export default function WorkspaceError({ error, reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return (
    <div className="mx-auto w-full max-w-page px-6 py-10">
      <ErrorPanel error={error} reset={reset} />
    </div>
  );
}
