'use client';

import { useMutation } from '@tanstack/react-query';
import { useRouter } from 'next/navigation';
import { useId, useState, type FormEvent } from 'react';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { Field, Input, fieldDescribedBy } from '@/components/ui/field';
import { ApiClientError, apiFetch, errorMessage } from '@/components/ui/api';
import { workspaceNameSchema } from '@/lib/validations/workspace';

/**
 * The workspace's name. Owners change it (shown at once, rolled back if the server refuses);
 * everyone else sees it read-only.
 */
export function WorkspaceNameForm({ workspaceId, name, canEdit }: { workspaceId: string; name: string; canEdit: boolean }) {
  const id = useId();
  const router = useRouter();
  const [saved, setSaved] = useState(name);
  const [draft, setDraft] = useState(name);
  const [error, setError] = useState<string>();
  const [done, setDone] = useState(false);

  const mutation = useMutation({
    mutationFn: (next: string) =>
      apiFetch<unknown>(`/api/workspaces/${workspaceId}`, { method: 'PATCH', json: { name: next } }),
    onMutate: (next) => {
      const previous = saved;
      setSaved(next); // optimistic
      setDone(false);
      return { previous };
    },
    onError: (e, _next, ctx) => {
      if (ctx) {
        setSaved(ctx.previous);
      }
      if (e instanceof ApiClientError && e.field === 'name') setError(e.message);
    },
    onSuccess: () => {
      setDone(true);
      router.refresh(); // header and switcher show the new name
    },
  });

  function onSubmit(ev: FormEvent) {
    ev.preventDefault();
    const parsed = workspaceNameSchema.safeParse(draft);
    if (!parsed.success) {
      setError(parsed.error.issues[0]?.message);
      return;
    }
    setError(undefined);
    setDraft(parsed.data);
    mutation.mutate(parsed.data);
  }

  const fieldId = `${id}-name`;
  if (!canEdit) {
    return (
      <div>
        <p className="text-sm font-medium text-ink-soft">Name</p>
        <p className="mt-1 text-md text-ink" data-testid="workspace-name-readonly">
          {saved}
        </p>
        <p className="mt-1 text-xs text-ink-muted">Only an owner of this workspace can rename it.</p>
      </div>
    );
  }
  return (
    <form onSubmit={onSubmit} noValidate className="max-w-lg space-y-3" data-testid="workspace-name-form">
      <Field id={fieldId} label="Name" error={error} hint="Shown to every member, in the header and the workspace list.">
        <Input
          id={fieldId}
          value={draft}
          maxLength={120}
          onChange={(e) => {
            setDraft(e.target.value);
            setDone(false);
          }}
          aria-invalid={error ? true : undefined}
          aria-describedby={fieldDescribedBy(fieldId, true)}
          data-testid="workspace-name-input"
        />
      </Field>
      <div className="flex items-center gap-3">
        <Button
          type="submit"
          variant="primary"
          pending={mutation.isPending}
          disabled={draft.trim() === saved}
          data-testid="workspace-name-save"
        >
          Save name
        </Button>
        <span aria-live="polite" className="text-sm text-success">
          {done && !mutation.isPending ? 'Saved.' : ''}
        </span>
      </div>
      {mutation.isError && !(mutation.error instanceof ApiClientError && mutation.error.field === 'name') ? (
        <Alert tone="danger">The name was not changed: {errorMessage(mutation.error)}</Alert>
      ) : null}
    </form>
  );
}
