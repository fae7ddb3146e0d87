'use client';

import { History } from 'lucide-react';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { apiFetch, errorMessage } from '@/components/ui/api';
import { Button } from '@/components/ui/button';

/**
 * Restore an old revision: its content is saved as a NEW revision on top of the latest one,
 * so no revision is lost. Refused (409) when someone saved in the meantime.
 */
export function RestoreRevisionButton({
  workspaceId,
  sectionId,
  revisionId,
  revisionNumber,
  latestRevisionId,
}: {
  workspaceId: string;
  sectionId: string;
  revisionId: string;
  revisionNumber: number;
  latestRevisionId: string;
}) {
  const router = useRouter();
  const [pending, setPending] = useState(false);
  const [error, setError] = useState<string>();
  async function restore() {
    if (!window.confirm(`Save the content of r${revisionNumber} as a new revision? All revisions are kept.`)) return;
    setPending(true);
    setError(undefined);
    try {
      const base = `/api/workspaces/${workspaceId}/sections/${sectionId}/revisions`;
      const { revision } = await apiFetch<{ revision: { content: unknown } }>(`${base}/${revisionId}`);
      const saved = await apiFetch<{ revision: { id: string } }>(base, {
        method: 'POST',
        json: { content: revision.content, baseRevisionId: latestRevisionId, message: `Restored from r${revisionNumber}` },
      });
      router.replace(`/w/${workspaceId}/sections/${sectionId}/history?a=${revisionId}&b=${saved.revision.id}`);
      router.refresh();
    } catch (e) {
      setError(errorMessage(e));
    } finally {
      setPending(false);
    }
  }
  return (
    <span className="inline-flex items-center gap-2">
      {error ? (
        <span role="alert" className="max-w-64 truncate text-xs text-danger" title={error}>
          {error}
        </span>
      ) : null}
      <Button size="sm" variant="ghost" pending={pending} onClick={() => void restore()} data-testid="revision-restore">
        <History className="size-3.5" aria-hidden />
        Restore
      </Button>
    </span>
  );
}
