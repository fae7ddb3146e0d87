'use client';

/**
 * The section editor as the section page mounts it: loads nothing itself (the page passes
 * the latest revision), saves new revisions through the sections API with TanStack Query,
 * keeps unsaved work in the browser, and offers workspace materials.
 *
 * Other features that sit beside the drawing (solve, results, field views) pass their parts
 * through the same props as SectionEditor: toolbarEnd, sidePanel, overlay, worldLayer,
 * onSectionChange.
 */
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useRouter } from 'next/navigation';
import { useMemo, useRef } from 'react';
import { apiFetch } from '@/components/ui/api';
import { SECTION_FORMAT, sectionSchema, type Section } from '@/lib/section/schema';
import { SectionEditor, type SectionEditorProps } from './section-editor';

export interface SectionEditorClientProps
  extends Pick<SectionEditorProps, 'toolbarEnd' | 'sidePanel' | 'sidePanelLabel' | 'overlay' | 'worldLayer' | 'onSectionChange' | 'className'> {
  workspaceId: string;
  sectionId: string;
  /** Content of the latest revision (unchecked JSON from the database), or null for none yet. */
  content: unknown;
  revisionId: string | null;
  canEdit: boolean;
}

/** A blank drawing: one ground net, nothing drawn (for a section saved without content). */
export function blankSection(): Section {
  return {
    format: SECTION_FORMAT,
    units: 'mm',
    background: { epsR: 1 },
    materials: [],
    nets: [
      { name: 'signal', role: 'signal', color: '#d9480f' },
      { name: 'gnd', role: 'ground', color: '#495057' },
    ],
    shapes: [],
    boundary: { left: { type: 'open' }, right: { type: 'open' }, bottom: { type: 'open' }, top: { type: 'open' } },
  };
}

/** A custom material kept for the workspace (numbers only). */
export interface WorkspaceMaterial {
  id: string;
  name: string;
  epsR: number;
  lossTangent?: number;
  breakdownKVPerMm?: number;
  source?: string;
}

interface SavedRevision {
  revision: { id: string; number?: number };
}

export function SectionEditorClient({ workspaceId, sectionId, content, revisionId, canEdit, ...rest }: SectionEditorClientProps) {
  const router = useRouter();
  const qc = useQueryClient();
  const baseRef = useRef<string | null>(revisionId);
  const parsed = useMemo(() => (content == null ? null : sectionSchema.safeParse(content)), [content]);
  const initial = parsed?.success ? parsed.data : blankSection();

  const save = useMutation({
    mutationFn: (section: Section) =>
      apiFetch<SavedRevision>(`/api/workspaces/${workspaceId}/sections/${sectionId}/revisions`, {
        method: 'POST',
        json: { content: section, ...(baseRef.current ? { baseRevisionId: baseRef.current } : {}) },
      }),
    onSuccess: (data) => {
      baseRef.current = data.revision.id;
      void qc.invalidateQueries({ queryKey: ['sections', workspaceId] });
      void qc.invalidateQueries({ queryKey: ['revisions', workspaceId, sectionId] });
      router.refresh();
    },
  });

  const materials = useQuery({
    queryKey: ['materials', workspaceId],
    queryFn: () => apiFetch<{ materials: WorkspaceMaterial[] }>(`/api/workspaces/${workspaceId}/materials`),
    enabled: canEdit,
    staleTime: 60_000,
  });
  const keepMaterial = useMutation({
    mutationFn: (m: WorkspaceMaterial) => apiFetch(`/api/workspaces/${workspaceId}/materials`, { method: 'POST', json: { material: m } }),
    onSuccess: () => void qc.invalidateQueries({ queryKey: ['materials', workspaceId] }),
  });

  return (
    <div className="flex min-h-0 flex-1 flex-col">
      {parsed && !parsed.success ? (
        <p role="alert" className="mb-2 rounded-md bg-red-50 px-3 py-2 text-sm text-red-700">
          The saved drawing could not be read ({parsed.error.issues[0]?.message ?? 'invalid section'}); a blank drawing is shown instead. Saving replaces it with a new revision.
        </p>
      ) : null}
      <SectionEditor
        key={`${sectionId}`}
        initialSection={initial}
        readOnly={!canEdit}
        draftKey={canEdit ? `${workspaceId}:${sectionId}` : undefined}
        baseRevisionId={revisionId}
        onSave={async (section) => {
          const r = await save.mutateAsync(section);
          return { revisionId: r.revision.id };
        }}
        workspaceMaterials={materials.data?.materials}
        onSaveToWorkspace={
          canEdit
            ? async (m) => {
                await keepMaterial.mutateAsync(m);
              }
            : undefined
        }
        {...rest}
      />
    </div>
  );
}
