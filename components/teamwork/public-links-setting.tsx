'use client';

import { useMutation } from '@tanstack/react-query';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { Alert } from '@/components/ui/alert';
import { apiFetch, errorMessage } from '@/components/ui/api';
import { Card, CardHeader } from '@/components/ui/card';

/** Owners allow or forbid signed-out visitors on the workspace's read-only links. */
export function PublicLinksSetting({ workspaceId, allow, canEdit }: { workspaceId: string; allow: boolean; canEdit: boolean }) {
  const router = useRouter();
  const [value, setValue] = useState(allow);
  const m = useMutation({
    mutationFn: (next: boolean) => apiFetch<{ allowPublicLinks: boolean }>(`/api/workspaces/${workspaceId}/public-links`, { method: 'PUT', json: { allow: next } }),
    onMutate: (next) => setValue(next),
    onError: () => setValue(allow),
    onSuccess: (d) => {
      setValue(d.allowPublicLinks);
      router.refresh();
    },
  });
  return (
    <Card aria-labelledby="ws-sharing" data-testid="sharing-setting">
      <CardHeader id="ws-sharing" title="Sharing" />
      <div className="space-y-2 px-5 py-4">
        <label className="flex items-start gap-3 text-sm">
          <input
            type="checkbox"
            className="mt-0.5 size-4 accent-accent"
            checked={value}
            disabled={!canEdit || m.isPending}
            onChange={(e) => m.mutate(e.target.checked)}
            data-testid="allow-public-links"
          />
          <span>
            <span className="font-medium text-ink">Allow public read-only links</span>
            <span className="block text-ink-muted">
              When on, people who are not members (even signed out) can open links made from sections and solves. When off, links open only for members.
              {canEdit ? '' : ' Only an owner can change this.'}
            </span>
          </span>
        </label>
        {m.isError ? <Alert tone="danger">{errorMessage(m.error)}</Alert> : null}
      </div>
    </Card>
  );
}
