'use client';
/** A stored solve: the result JSON at once, the field after its blob is fetched and checked. */
import { useQuery } from '@tanstack/react-query';
import type { SectionResult } from '@/lib/engine/types';
import { sectionSchema } from '@/lib/section/schema';
import { decodeFieldBlob, FieldBlobError } from '@/lib/field/codec';
import { ResultsPanel } from '@/components/results/results-panel';
import { FieldView } from '@/components/field/field-view';
import { Alert } from '@/components/ui/alert';
import { LoadingNote, Skeleton } from '@/components/ui/skeleton';
import { errorMessage } from '@/components/ui/api';

export function SavedSolveView({
  workspaceId,
  solveId,
  status,
  result,
  content,
  hasField,
}: {
  workspaceId: string;
  solveId: string;
  status: string;
  result: unknown;
  content: unknown;
  hasField: boolean;
}) {
  const parsed = sectionSchema.safeParse(content);
  const r = result as SectionResult | null;
  const field = useQuery({
    queryKey: ['solve-field', workspaceId, solveId],
    enabled: hasField && !!r,
    staleTime: Infinity,
    queryFn: async () => {
      const res = await fetch(`/api/workspaces/${workspaceId}/solves/${solveId}/field`);
      if (!res.ok) {
        const j = (await res.json().catch(() => null)) as { error?: { message?: string } } | null;
        throw new Error(j?.error?.message ?? `The field could not be loaded (${res.status}).`);
      }
      const bytes = new Uint8Array(await res.arrayBuffer());
      try {
        return decodeFieldBlob(bytes, { nx: r!.mesh.nx, ny: r!.mesh.ny, fields: r!.nets.length });
      } catch (e) {
        if (e instanceof FieldBlobError) throw new Error(`The stored field is unreadable: ${e.message}.`);
        throw e;
      }
    },
  });
  if (status !== 'done' || !r) {
    return <Alert tone="danger" title="This solve did not finish.">It holds no results.</Alert>;
  }
  return (
    <div className="grid grid-cols-1 gap-5 xl:grid-cols-[minmax(0,27rem)_minmax(0,1fr)]" data-testid="saved-solve">
      <ResultsPanel result={r} units={parsed.success ? parsed.data.units : undefined} />
      <div className="min-w-0">
        {!hasField ? (
          <Alert tone="info" title="No field stored with this solve.">The numbers are complete; the field picture was not uploaded.</Alert>
        ) : field.isError ? (
          <Alert tone="danger" title="The field could not be shown.">
            {errorMessage(field.error)}
          </Alert>
        ) : !field.data || !parsed.success ? (
          parsed.success ? (
            <div className="space-y-3 rounded-md border border-line bg-surface p-5">
              <LoadingNote label="Loading the stored field…" />
              <Skeleton className="h-64 w-full" />
            </div>
          ) : (
            <Alert tone="warning">The stored drawing of this revision cannot be read, so the field cannot be drawn over it.</Alert>
          )
        ) : (
          <FieldView result={r} fields={field.data} section={parsed.data} />
        )}
      </div>
    </div>
  );
}
