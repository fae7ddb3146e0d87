'use client';

import { useQuery, useQueryClient } from '@tanstack/react-query';
import { ChevronRight, Pencil, RotateCcw, Trash2 } from 'lucide-react';
import Link from 'next/link';
import { useRouter } from 'next/navigation';
import { useEffect, useId, useRef, useState, type FormEvent } from 'react';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import { Input } from '@/components/ui/field';
import { Time } from '@/components/ui/time';
import { apiFetch, errorMessage } from '@/components/ui/api';
import { sectionNameSchema } from '@/lib/validations/section';
import { sectionQueryKey, useDeleteSection, useRenameSection, useRestoreSection } from './section-mutations';
import type { SectionDetail } from './types';

function normalise(data: unknown): SectionDetail {
  const d = (data && typeof data === 'object' && 'section' in data ? (data as { section: unknown }).section : data) as SectionDetail;
  return d;
}

/** Name, revision, author and time of the section; rename and delete for editors and owners. */
export function SectionHeader({
  workspaceId,
  initial,
  canEdit,
}: {
  workspaceId: string;
  initial: SectionDetail;
  canEdit: boolean;
}) {
  const id = useId();
  const router = useRouter();
  const key = sectionQueryKey(workspaceId, initial.id);
  const query = useQuery({
    queryKey: key,
    queryFn: async () => normalise(await apiFetch<unknown>(`/api/workspaces/${workspaceId}/sections/${initial.id}`)),
    initialData: initial,
    initialDataUpdatedAt: Date.now(),
  });
  const section = query.data ?? initial;

  // A server re-render (router.refresh() after the editor saves a revision, or after a rename)
  // brings newer props: take them over when they are newer than what the cache holds.
  const qc = useQueryClient();
  useEffect(() => {
    const cached = qc.getQueryData<SectionDetail>(key);
    if (!cached || new Date(initial.updatedAt) >= new Date(cached.updatedAt)) qc.setQueryData(key, initial);
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [initial.updatedAt, initial.latestRevision?.id, initial.name, initial.deletedAt]);
  const rename = useRenameSection(workspaceId, initial.id);
  const del = useDeleteSection(workspaceId, initial.id);
  const restore = useRestoreSection(workspaceId);

  const [editing, setEditing] = useState(false);
  const [draft, setDraft] = useState(section.name);
  const [nameError, setNameError] = useState<string>();
  const [confirmDelete, setConfirmDelete] = useState(false);
  const inputRef = useRef<HTMLInputElement>(null);
  const renameButtonRef = useRef<HTMLButtonElement>(null);

  useEffect(() => {
    if (editing) inputRef.current?.select();
  }, [editing]);

  function startRename() {
    setDraft(section.name);
    setNameError(undefined);
    rename.reset();
    setEditing(true);
  }

  function submitRename(ev: FormEvent) {
    ev.preventDefault();
    const parsed = sectionNameSchema.safeParse(draft);
    if (!parsed.success) {
      setNameError(parsed.error.issues[0]?.message);
      return;
    }
    setEditing(false);
    if (parsed.data !== section.name) rename.mutate(parsed.data);
    requestAnimationFrame(() => renameButtonRef.current?.focus());
  }

  const rev = section.latestRevision;
  const deleted = Boolean(section.deletedAt);

  return (
    <div className="border-b border-line bg-surface px-5 py-3" data-testid="section-header">
      <nav aria-label="Breadcrumb" className="flex items-center gap-1 text-sm text-ink-muted">
        <Link href={`/w/${workspaceId}`} className="hover:text-ink hover:underline">
          Sections
        </Link>
        <ChevronRight className="size-3.5" aria-hidden />
        <span className="truncate">{section.name}</span>
      </nav>
      <div className="mt-1 flex flex-wrap items-center gap-x-4 gap-y-2">
        {editing ? (
          <form onSubmit={submitRename} className="flex min-w-[24rem] max-w-2xl flex-1 items-center gap-2" noValidate>
            <label htmlFor={`${id}-name`} className="sr-only">
              Section name
            </label>
            <Input
              ref={inputRef}
              id={`${id}-name`}
              value={draft}
              onChange={(e) => setDraft(e.target.value)}
              onKeyDown={(e) => {
                if (e.key === 'Escape') {
                  e.preventDefault();
                  setEditing(false);
                }
              }}
              maxLength={120}
              className="h-9 min-w-0 flex-1 text-lg font-semibold"
              aria-invalid={nameError ? true : undefined}
              aria-describedby={`${id}-name-error`}
              data-testid="section-name-input"
            />
            <Button type="submit" variant="primary" size="sm" data-testid="section-name-save">
              Save
            </Button>
            <Button size="sm" variant="ghost" onClick={() => setEditing(false)}>
              Cancel
            </Button>
          </form>
        ) : (
          <h1 className="min-w-0 truncate text-xl font-semibold text-ink" data-testid="section-name">
            {section.name}
          </h1>
        )}
        <p className="flex items-center gap-x-1.5 text-sm text-ink-muted" data-testid="section-meta">
          {rev ? (
            <>
              <span className="num rounded-sm bg-grey-100 px-1.5 text-xs text-ink-soft" data-testid="section-revision">
                r{rev.number}
              </span>
              <span>
                {rev.author ? <>saved by {rev.author.name}</> : 'saved'} <Time value={rev.createdAt} />
              </span>
            </>
          ) : (
            <span>No revision yet</span>
          )}
          <Link href={`/w/${workspaceId}/sections/${section.id}/history`} className="ml-1 font-medium text-accent hover:underline" data-testid="section-history-link">
            History and files
          </Link>
        </p>
        {canEdit && !editing && !deleted ? (
          <div className="ml-auto flex items-center gap-1.5">
            <Button ref={renameButtonRef} size="sm" variant="ghost" onClick={startRename} data-testid="section-rename">
              <Pencil className="size-3.5" aria-hidden />
              Rename
            </Button>
            <Button size="sm" variant="ghost" onClick={() => setConfirmDelete(true)} data-testid="section-delete">
              <Trash2 className="size-3.5" aria-hidden />
              Delete
            </Button>
          </div>
        ) : null}
      </div>
      <div aria-live="polite" className="empty:hidden">
        {nameError && editing ? (
          <p id={`${id}-name-error`} className="mt-1 text-xs font-medium text-danger">
            {nameError}
          </p>
        ) : null}
        {rename.isError ? (
          <Alert tone="danger" className="mt-2" data-testid="rename-error">
            The name was not changed: {errorMessage(rename.error)}
          </Alert>
        ) : null}
      </div>
      {deleted ? (
        <Alert tone="warning" className="mt-3" title="This section is deleted" data-testid="section-deleted">
          It is hidden from the workspace&apos;s list; its revisions and solves are kept.
          {canEdit ? (
            <Button
              size="sm"
              variant="secondary"
              className="ml-3"
              pending={restore.isPending}
              onClick={() => restore.mutate(section.id)}
              data-testid="section-restore"
            >
              <RotateCcw className="size-3.5" aria-hidden />
              Restore
            </Button>
          ) : null}
        </Alert>
      ) : null}
      <Dialog
        open={confirmDelete}
        onClose={() => setConfirmDelete(false)}
        title="Delete this section?"
        description="It leaves the workspace's list. Editors can restore it later from Deleted; its revisions and solves are kept."
        data-testid="delete-section-dialog"
      >
        {del.isError ? (
          <Alert tone="danger" className="mb-3">
            {errorMessage(del.error)}
          </Alert>
        ) : null}
        <div className="flex justify-end gap-2">
          <Button variant="ghost" onClick={() => setConfirmDelete(false)}>
            Keep it
          </Button>
          <Button
            variant="danger"
            pending={del.isPending}
            onClick={() =>
              del.mutate(undefined, {
                onSuccess: () => {
                  setConfirmDelete(false);
                  // The workspace home is rendered on the server at each visit, so it lists the change.
                  router.push(`/w/${workspaceId}`);
                },
              })
            }
            data-testid="delete-section-confirm"
          >
            Delete section
          </Button>
        </div>
      </Dialog>
    </div>
  );
}
