'use client';

import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { Link2, X } from 'lucide-react';
import { useId, useState } from 'react';
import { Alert } from '@/components/ui/alert';
import { apiFetch, errorMessage } from '@/components/ui/api';
import { Badge } from '@/components/ui/badge';
import { Button } from '@/components/ui/button';
import { Card, CardHeader } from '@/components/ui/card';
import { Input, Select } from '@/components/ui/field';
import { Time } from '@/components/ui/time';

interface LinkRow {
  id: string;
  expiresAt: string | null;
  revokedAt: string | null;
  createdAt: string;
  createdBy: { name: string } | null;
}

/**
 * Read-only links to one section or solve: editors make them (with an expiry) and revoke
 * them; the URL is shown once, right after it is made (only its hash is stored).
 */
export function ShareLinksPanel({
  workspaceId,
  targetType,
  targetId,
  canEdit,
  publicAllowed,
}: {
  workspaceId: string;
  targetType: 'section' | 'solve';
  targetId: string;
  canEdit: boolean;
  publicAllowed: boolean;
}) {
  const id = useId();
  const qc = useQueryClient();
  const key = ['share-links', workspaceId, targetType, targetId];
  const [days, setDays] = useState<string>('7');
  const [fresh, setFresh] = useState<string | null>(null);
  const list = useQuery({
    queryKey: key,
    queryFn: () => apiFetch<{ links: LinkRow[] }>(`/api/workspaces/${workspaceId}/share-links?targetType=${targetType}&targetId=${targetId}`),
  });
  const create = useMutation({
    mutationFn: () =>
      apiFetch<{ link: { url: string } }>(`/api/workspaces/${workspaceId}/share-links`, {
        method: 'POST',
        json: { targetType, targetId, expiresInDays: days === 'never' ? null : Number(days) },
      }),
    onSuccess: (d) => {
      setFresh(d.link.url);
      void qc.invalidateQueries({ queryKey: key });
    },
  });
  const revoke = useMutation({
    mutationFn: (linkId: string) => apiFetch(`/api/workspaces/${workspaceId}/share-links/${linkId}`, { method: 'DELETE' }),
    onSuccess: () => void qc.invalidateQueries({ queryKey: key }),
  });
  const now = Date.now();
  const links = list.data?.links ?? [];
  return (
    <Card aria-labelledby={`${id}-t`} data-testid="share-links">
      <CardHeader
        id={`${id}-t`}
        title="Read-only links"
        description={
          publicAllowed
            ? 'Anyone with a link can view this, signed in or not, until it expires or is revoked.'
            : 'Only members of this workspace can open these links; an owner can allow public links in Settings.'
        }
      />
      <div className="space-y-3 px-5 py-4">
        {canEdit ? (
          <div className="flex flex-wrap items-center gap-2">
            <label htmlFor={`${id}-exp`} className="text-sm text-ink-soft">
              Expires after
            </label>
            <div className="w-32">
            <Select id={`${id}-exp`} value={days} onChange={(e) => setDays(e.target.value)} className="h-8 text-sm" data-testid="share-expiry">
              <option value="1">1 day</option>
              <option value="7">7 days</option>
              <option value="30">30 days</option>
              <option value="90">90 days</option>
              <option value="never">never</option>
            </Select>
            </div>
            <Button size="sm" variant="secondary" pending={create.isPending} onClick={() => create.mutate()} data-testid="share-create">
              <Link2 className="size-4" aria-hidden />
              Make a link
            </Button>
          </div>
        ) : null}
        {fresh ? (
          <Alert tone="success" title="Link made: copy it now, it is shown only once">
            <Input readOnly value={fresh} onFocus={(e) => e.currentTarget.select()} className="mt-1 h-8 font-mono text-xs" data-testid="share-url" aria-label="Share link" />
          </Alert>
        ) : null}
        {create.isError ? <Alert tone="danger">{errorMessage(create.error)}</Alert> : null}
        {revoke.isError ? <Alert tone="danger">{errorMessage(revoke.error)}</Alert> : null}
        {links.length ? (
          <ul className="divide-y divide-line rounded-md border border-line">
            {links.map((l) => {
              const expired = l.expiresAt && new Date(l.expiresAt).getTime() <= now;
              const state = l.revokedAt ? 'revoked' : expired ? 'expired' : 'active';
              return (
                <li key={l.id} className="flex items-center gap-3 px-3 py-2 text-sm" data-testid="share-link" data-state={state}>
                  <Badge tone={state === 'active' ? 'success' : 'neutral'}>{state}</Badge>
                  <span className="text-ink-soft">
                    by {l.createdBy?.name ?? '—'}, <Time value={l.createdAt} />
                  </span>
                  <span className="text-ink-muted">{l.expiresAt ? <>· expires <Time value={l.expiresAt} /></> : '· no expiry'}</span>
                  {canEdit && state === 'active' ? (
                    <Button size="sm" variant="ghost" className="ml-auto" onClick={() => revoke.mutate(l.id)} data-testid="share-revoke">
                      <X className="size-4" aria-hidden />
                      Revoke
                    </Button>
                  ) : null}
                </li>
              );
            })}
          </ul>
        ) : list.isLoading ? null : (
          <p className="text-sm text-ink-muted">No links yet.</p>
        )}
      </div>
    </Card>
  );
}
