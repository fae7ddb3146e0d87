/**
 * Unsaved work kept in the browser (localStorage) so it can be offered back after a reload
 * or crash. Storage is passed in, so this stays testable without a DOM.
 */
import { sectionSchema, type Section } from '../section/schema';

export interface Draft {
  content: Section;
  /** The revision the draft was based on (to warn when the server moved on). */
  baseRevisionId: string | null;
  savedAt: string;
}

export interface KeyValueStore {
  getItem(key: string): string | null;
  setItem(key: string, value: string): void;
  removeItem(key: string): void;
}

export const draftKey = (sectionId: string) => `edgefield:draft:${sectionId}`;

export function saveDraft(store: KeyValueStore, sectionId: string, content: Section, baseRevisionId: string | null, now = new Date()): void {
  const d: Draft = { content, baseRevisionId, savedAt: now.toISOString() };
  try {
    store.setItem(draftKey(sectionId), JSON.stringify(d));
  } catch {
    // Storage full or blocked: the draft is a convenience, never an error.
  }
}

/** The stored draft, or null when none is stored or it no longer parses as a section. */
export function loadDraft(store: KeyValueStore, sectionId: string): Draft | null {
  let raw: string | null = null;
  try {
    raw = store.getItem(draftKey(sectionId));
  } catch {
    return null;
  }
  if (!raw) return null;
  try {
    const d = JSON.parse(raw) as Partial<Draft>;
    const parsed = sectionSchema.safeParse(d.content);
    if (!parsed.success || typeof d.savedAt !== 'string') return null;
    return { content: parsed.data, baseRevisionId: typeof d.baseRevisionId === 'string' ? d.baseRevisionId : null, savedAt: d.savedAt };
  } catch {
    return null;
  }
}

export function clearDraft(store: KeyValueStore, sectionId: string): void {
  try {
    store.removeItem(draftKey(sectionId));
  } catch {
    /* ignore */
  }
}
