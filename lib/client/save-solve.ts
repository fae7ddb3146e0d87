'use client';
/**
 * Store a finished solve through the solves API: the result JSON first (POST, which returns
 * the existing solve for the same revision and settings), then the compressed field blob
 * (PUT …/field) when the stored solve has none yet.
 */
import type { SectionFields, SectionResult } from '@/lib/engine/types';
import { sectionSchema, type Section } from '@/lib/section/schema';
import { encodeFieldBlob } from '@/lib/field/codec';
import { apiFetch } from '@/components/ui/api';
import type { SolveSettings } from '@/workers/protocol';
import { canonicalJson, settingsHash } from './settings-hash';

export interface SavedSolveRef {
  id: string;
  created: boolean;
  revisionId: string;
  revisionNumber: number;
  fieldStored: boolean;
}

interface SolveJson {
  id: string;
  revisionId: string;
  revisionNumber: number;
  hasField: boolean;
}

export class NotSavedError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'NotSavedError';
  }
}

/** The section's latest saved revision (id, number, content). */
export async function latestRevision(workspaceId: string, sectionId: string) {
  const list = await apiFetch<{ revisions: { id: string; number: number }[] } | { id: string; number: number }[]>(
    `/api/workspaces/${workspaceId}/sections/${sectionId}/revisions`,
  );
  const revs = Array.isArray(list) ? list : list.revisions;
  const top = [...revs].sort((a, b) => b.number - a.number)[0];
  if (!top) throw new NotSavedError('This section has no saved revision yet. Save the section first.');
  const one = await apiFetch<{ revision: { id: string; number: number; content: unknown } } | { id: string; number: number; content: unknown }>(
    `/api/workspaces/${workspaceId}/sections/${sectionId}/revisions/${top.id}`,
  );
  return 'revision' in one ? one.revision : one;
}

export async function saveSolve(opts: {
  workspaceId: string;
  sectionId: string;
  section: Section;
  settings: SolveSettings;
  result: SectionResult;
  fields: SectionFields;
}): Promise<SavedSolveRef> {
  const { workspaceId, sectionId, section, settings, result, fields } = opts;
  const rev = await latestRevision(workspaceId, sectionId);
  if (canonicalJson(normalise(rev.content)) !== canonicalJson(normalise(section))) {
    throw new NotSavedError('The drawing has changed since its last save. Save the section, solve again, then save the solve.');
  }
  const hash = await settingsHash(settings);
  const res = await apiFetch<{ solve: SolveJson; created: boolean }>(`/api/workspaces/${workspaceId}/solves`, {
    method: 'POST',
    json: { sectionId, revisionId: rev.id, settings, settingsHash: hash, result, status: 'done' },
  });
  let fieldStored = res.solve.hasField;
  if (!fieldStored) {
    const blob = encodeFieldBlob(fields);
    await apiFetch<{ stored: boolean }>(`/api/workspaces/${workspaceId}/solves/${res.solve.id}/field`, {
      method: 'PUT',
      headers: { 'content-type': 'application/octet-stream' },
      body: blob as BodyInit,
    });
    fieldStored = true;
  }
  return { id: res.solve.id, created: res.created, revisionId: rev.id, revisionNumber: rev.number, fieldStored };
}

/** The section as the schema reads it (defaults filled in), so equal drawings compare equal. */
function normalise(v: unknown): unknown {
  const r = sectionSchema.safeParse(v);
  return r.success ? r.data : v;
}
