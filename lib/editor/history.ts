/**
 * Undo/redo history of whole documents. Documents are immutable and share unchanged parts,
 * so keeping snapshots is cheap. Consecutive commits with the same `coalesce` key (typing in
 * one field, nudging with the arrow keys) merge into one undo step.
 */
export interface History<T> {
  past: T[];
  present: T;
  future: T[];
  /** Key of the last commit, for coalescing. */
  lastKey?: string;
  /** Label of each step, parallel to `past` (for tooltips: "Undo move"). */
  labels: string[];
  /** Labels of the redo steps, parallel to `future`. */
  futureLabels: string[];
}

export const HISTORY_LIMIT = 300;

export function createHistory<T>(present: T): History<T> {
  return { past: [], present, future: [], labels: [], futureLabels: [] };
}

export function commit<T>(h: History<T>, next: T, label = 'change', coalesce?: string): History<T> {
  if (next === h.present) return h;
  if (coalesce !== undefined && coalesce === h.lastKey && h.past.length > 0) {
    return { ...h, present: next, future: [], futureLabels: [] };
  }
  const past = [...h.past, h.present];
  const labels = [...h.labels, label];
  if (past.length > HISTORY_LIMIT) {
    past.shift();
    labels.shift();
  }
  return { past, present: next, future: [], labels, futureLabels: [], ...(coalesce !== undefined ? { lastKey: coalesce } : {}) };
}

export function undo<T>(h: History<T>): History<T> {
  if (h.past.length === 0) return h;
  const prev = h.past[h.past.length - 1]!;
  return {
    past: h.past.slice(0, -1),
    labels: h.labels.slice(0, -1),
    present: prev,
    future: [h.present, ...h.future],
    futureLabels: [h.labels[h.labels.length - 1]!, ...h.futureLabels],
  };
}

export function redo<T>(h: History<T>): History<T> {
  if (h.future.length === 0) return h;
  const [next, ...rest] = h.future;
  const [label, ...restLabels] = h.futureLabels;
  return { past: [...h.past, h.present], labels: [...h.labels, label ?? 'change'], present: next!, future: rest, futureLabels: restLabels };
}

export const canUndo = <T>(h: History<T>) => h.past.length > 0;
export const canRedo = <T>(h: History<T>) => h.future.length > 0;

/** Start a new undo step even if the next commit has the same coalesce key. */
export function breakCoalescing<T>(h: History<T>): History<T> {
  if (h.lastKey === undefined) return h;
  const { lastKey: _k, ...rest } = h;
  return rest;
}
