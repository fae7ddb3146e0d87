'use client';

import { Upload } from 'lucide-react';
import { useRouter } from 'next/navigation';
import { useId, useState, type ChangeEvent, type ReactNode } from 'react';
import { Alert } from '@/components/ui/alert';
import { apiFetch, errorMessage } from '@/components/ui/api';

/**
 * Upload a measured-capacitance CSV for a section (editors). The server checks it again.
 * Used in the section's files card and, in a dialog, from the sweep card ("Add measured
 * data"), which passes `onUploaded` to show the new set at once and a `hint` naming the
 * sweep's quantity and unit.
 */
export function MeasuredUpload({ workspaceId, sectionId, onUploaded, hint }: { workspaceId: string; sectionId: string; onUploaded?: (name: string) => void; hint?: ReactNode }) {
  const id = useId();
  const router = useRouter();
  const [error, setError] = useState<string>();
  const [done, setDone] = useState<string>();
  const [pending, setPending] = useState(false);
  async function onFile(ev: ChangeEvent<HTMLInputElement>) {
    const file = ev.target.files?.[0];
    ev.target.value = '';
    setError(undefined);
    setDone(undefined);
    if (!file) return;
    if (file.size > 1024 * 1024) {
      setError(`"${file.name}" is ${(file.size / 1048576).toFixed(1)} MB; measured data may be at most 1 MB.`);
      return;
    }
    setPending(true);
    try {
      const text = await file.text();
      const { parseMeasuredCsv } = await import('@/lib/import/measured-csv');
      parseMeasuredCsv(text, file.size); // the same checks as the server, before sending
      await apiFetch(`/api/workspaces/${workspaceId}/sections/${sectionId}/measurements?name=${encodeURIComponent(file.name)}`, {
        method: 'POST',
        body: text,
        headers: { 'content-type': 'text/csv' },
      });
      setDone(`${file.name} was added.`);
      onUploaded?.(file.name);
      router.refresh();
    } catch (e) {
      setError(errorMessage(e));
    } finally {
      setPending(false);
    }
  }
  return (
    <div className="space-y-2">
      <label
        htmlFor={`${id}-csv`}
        className="inline-flex h-8 cursor-pointer items-center gap-1.5 rounded-md border border-line-strong bg-surface px-2.5 text-sm font-medium text-ink shadow-xs hover:bg-grey-50 has-[:focus-visible]:outline-2 has-[:focus-visible]:outline-focus"
      >
        <Upload className="size-4" aria-hidden />
        {pending ? 'Uploading…' : 'Upload measured CSV'}
        <input id={`${id}-csv`} type="file" accept=".csv,text/csv" className="sr-only" onChange={(e) => void onFile(e)} data-testid="measured-file" />
      </label>
      <p className="text-xs text-ink-muted">
        Header row, then numbers: the swept quantity first (e.g. <code>w (mm)</code>), then capacitance columns with units (e.g.{' '}
        <code>C (pF/m)</code>). Kept for overlay on sweep charts.
      </p>
      {hint ? <p className="text-xs text-ink-soft">{hint}</p> : null}
      {error ? (
        <Alert tone="danger" data-testid="measured-error">
          {error}
        </Alert>
      ) : null}
      {done ? (
        <Alert tone="success" data-testid="measured-done">
          {done}
        </Alert>
      ) : null}
    </div>
  );
}
