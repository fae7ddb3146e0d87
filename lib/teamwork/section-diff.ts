/**
 * What changed between two revisions of a section: shapes matched by id (added, removed,
 * changed, unchanged, with the fields that changed), and the section-level settings (units,
 * nets, materials, boundary, variables, mesh, background). Pure data in, pure data out.
 */
import type { Section } from '../section/schema';

export type ShapeChange = 'added' | 'removed' | 'changed' | 'unchanged';

export interface ShapeDiff {
  id: string;
  change: ShapeChange;
  /** Top-level fields that differ (for 'changed'). */
  fields: string[];
}

export interface SectionDiff {
  shapes: ShapeDiff[];
  /** Section-level parts that differ: "units", "nets", "materials", ... */
  settings: string[];
  counts: Record<ShapeChange, number>;
}

/** Stable JSON (sorted keys) for comparing values. */
function canon(v: unknown): string {
  if (v === null || typeof v !== 'object') return JSON.stringify(v);
  if (Array.isArray(v)) return `[${v.map(canon).join(',')}]`;
  const o = v as Record<string, unknown>;
  return `{${Object.keys(o)
    .filter((k) => o[k] !== undefined)
    .sort()
    .map((k) => `${JSON.stringify(k)}:${canon(o[k])}`)
    .join(',')}}`;
}

export function diffSections(before: Section, after: Section): SectionDiff {
  const a = new Map(before.shapes.map((s) => [s.id, s]));
  const b = new Map(after.shapes.map((s) => [s.id, s]));
  const shapes: ShapeDiff[] = [];
  for (const s of after.shapes) {
    const old = a.get(s.id);
    if (!old) {
      shapes.push({ id: s.id, change: 'added', fields: [] });
      continue;
    }
    const keys = new Set([...Object.keys(old), ...Object.keys(s)]);
    const fields = [...keys].filter((k) => canon((old as Record<string, unknown>)[k]) !== canon((s as Record<string, unknown>)[k])).sort();
    shapes.push({ id: s.id, change: fields.length ? 'changed' : 'unchanged', fields });
  }
  for (const s of before.shapes) if (!b.has(s.id)) shapes.push({ id: s.id, change: 'removed', fields: [] });
  const settings = (['units', 'title', 'variables', 'background', 'materials', 'nets', 'boundary', 'mesh'] as const).filter(
    (k) => canon(before[k]) !== canon(after[k]),
  );
  const counts: Record<ShapeChange, number> = { added: 0, removed: 0, changed: 0, unchanged: 0 };
  for (const s of shapes) counts[s.change]++;
  return { shapes, settings, counts };
}
