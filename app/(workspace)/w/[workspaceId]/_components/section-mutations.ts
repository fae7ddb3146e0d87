'use client';

import { useMutation, useQueryClient } from '@tanstack/react-query';
import { useRouter } from 'next/navigation';
import { apiFetch } from '@/components/ui/api';
import type { SectionDetail } from './types';

export const sectionQueryKey = (workspaceId: string, sectionId: string) => ['section', workspaceId, sectionId] as const;

/** Rename with an optimistic update of the header; rolled back when the server refuses. */
export function useRenameSection(workspaceId: string, sectionId: string) {
  const qc = useQueryClient();
  const router = useRouter();
  const key = sectionQueryKey(workspaceId, sectionId);
  return useMutation({
    mutationFn: (name: string) =>
      apiFetch<unknown>(`/api/workspaces/${workspaceId}/sections/${sectionId}`, { method: 'PATCH', json: { name } }),
    onMutate: async (name) => {
      await qc.cancelQueries({ queryKey: key });
      const previous = qc.getQueryData<SectionDetail>(key);
      if (previous) qc.setQueryData<SectionDetail>(key, { ...previous, name });
      return { previous };
    },
    onError: (_e, _name, ctx) => {
      if (ctx?.previous) qc.setQueryData(key, ctx.previous);
    },
    onSettled: () => {
      void qc.invalidateQueries({ queryKey: key });
      void qc.invalidateQueries({ queryKey: ['sections', workspaceId] });
      router.refresh();
    },
  });
}

export function useDeleteSection(workspaceId: string, sectionId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: () => apiFetch<unknown>(`/api/workspaces/${workspaceId}/sections/${sectionId}`, { method: 'DELETE' }),
    onSuccess: () => {
      void qc.invalidateQueries({ queryKey: ['sections', workspaceId] });
      void qc.invalidateQueries({ queryKey: sectionQueryKey(workspaceId, sectionId) });
    },
  });
}

export function useRestoreSection(workspaceId: string) {
  const qc = useQueryClient();
  const router = useRouter();
  return useMutation({
    mutationFn: (sectionId: string) =>
      apiFetch<unknown>(`/api/workspaces/${workspaceId}/sections/${sectionId}/restore`, { method: 'POST' }),
    onSuccess: (_d, sectionId) => {
      void qc.invalidateQueries({ queryKey: ['sections', workspaceId] });
      void qc.invalidateQueries({ queryKey: sectionQueryKey(workspaceId, sectionId) });
      router.refresh();
    },
  });
}
