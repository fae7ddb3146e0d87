'use client';
/** The comments on a solve: everyone in the workspace reads and writes (text shown escaped). */
import { useId, useState } from 'react';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { MessageSquare } from 'lucide-react';
import { apiFetch, errorMessage } from '@/components/ui/api';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { Alert } from '@/components/ui/alert';
import { Time } from '@/components/ui/time';

interface CommentItem {
  id: string;
  body: string;
  createdAt: string;
  author: { id: string; name: string } | null;
  pending?: boolean;
}

export function CommentThread({ workspaceId, solveId, initial }: { workspaceId: string; solveId: string; initial: CommentItem[] }) {
  const id = useId();
  const qc = useQueryClient();
  const key = ['solve-comments', workspaceId, solveId];
  const [text, setText] = useState('');
  const list = useQuery({
    queryKey: key,
    queryFn: async () => (await apiFetch<{ comments: CommentItem[] }>(`/api/workspaces/${workspaceId}/solves/${solveId}/comments`)).comments,
    initialData: initial,
    initialDataUpdatedAt: Date.now(),
  });
  const add = useMutation({
    mutationFn: async (body: string) =>
      (await apiFetch<{ comment: CommentItem }>(`/api/workspaces/${workspaceId}/solves/${solveId}/comments`, { method: 'POST', json: { body } }))
        .comment,
    onMutate: async (body) => {
      await qc.cancelQueries({ queryKey: key });
      const before = qc.getQueryData<CommentItem[]>(key);
      qc.setQueryData<CommentItem[]>(key, (old) => [
        ...(old ?? []),
        { id: `pending-${Date.now()}`, body, createdAt: new Date().toISOString(), author: null, pending: true },
      ]);
      return { before };
    },
    onError: (_e, _b, c) => {
      if (c?.before) qc.setQueryData(key, c.before);
    },
    onSuccess: () => setText(''),
    onSettled: () => qc.invalidateQueries({ queryKey: key }),
  });
  const comments = list.data ?? [];
  return (
    <Card aria-labelledby={`${id}-t`} data-testid="comment-thread">
      <div className="flex items-center gap-2 border-b border-line px-5 py-3">
        <MessageSquare className="size-4 text-ink-muted" aria-hidden />
        <h2 id={`${id}-t`} className="text-md font-semibold text-ink">
          Discussion
        </h2>
        <span className="text-sm text-ink-muted">{comments.length === 1 ? '1 comment' : `${comments.length} comments`}</span>
      </div>
      {comments.length === 0 ? (
        <p className="px-5 py-4 text-sm text-ink-muted">No comments yet. Ask a question or note what you checked.</p>
      ) : (
        <ol className="divide-y divide-line">
          {comments.map((c) => (
            <li key={c.id} className="px-5 py-3" data-testid="comment" aria-busy={c.pending || undefined}>
              <div className="flex items-baseline gap-2 text-sm">
                <span className="font-medium text-ink">{c.author?.name ?? (c.pending ? 'You' : 'A former member')}</span>
                <span className="text-xs text-ink-muted">{c.pending ? 'sending…' : <Time value={c.createdAt} />}</span>
              </div>
              <p className="mt-0.5 whitespace-pre-wrap break-words text-sm text-ink-soft">{c.body}</p>
            </li>
          ))}
        </ol>
      )}
      <form
        className="flex flex-col gap-2 border-t border-line px-5 py-3"
        onSubmit={(e) => {
          e.preventDefault();
          if (text.trim()) add.mutate(text.trim());
        }}
      >
        <label htmlFor={`${id}-c`} className="text-sm font-medium text-ink">
          Add a comment
        </label>
        <textarea
          id={`${id}-c`}
          className="min-h-20 rounded-md border border-line-strong bg-surface px-3 py-2 text-sm text-ink"
          value={text}
          onChange={(e) => setText(e.target.value)}
          maxLength={5000}
          data-testid="comment-input"
        />
        {add.isError ? (
          <Alert tone="danger" title="The comment was not posted.">
            {errorMessage(add.error)}
          </Alert>
        ) : null}
        <div>
          <Button type="submit" variant="primary" pending={add.isPending} disabled={!text.trim()} data-testid="comment-submit">
            Post comment
          </Button>
        </div>
      </form>
    </Card>
  );
}
