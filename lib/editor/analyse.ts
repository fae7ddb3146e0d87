/**
 * What the editor knows about the current document after every change: the resolved section
 * (numbers; values that failed to resolve are NaN so the rest can still be drawn), every issue
 * from resolving and from `checkSection`, and whether the section may be solved.
 */
import type { ResolvedSection, Section } from '../section/schema';
import { sectionSchema } from '../section/schema';
import { resolveSection } from '../section/resolve';
import { checkSection } from '../section/check';
import type { SectionIssue } from '../section/issues';

export interface Analysis {
  resolved: ResolvedSection;
  issues: SectionIssue[];
  /** True when there are no errors (warnings do not block solving). */
  canSolve: boolean;
  /** Issues per shape id, for marking the canvas. */
  byShape: Map<string, SectionIssue[]>;
}

export function analyseSection(doc: Section): Analysis {
  const issues: SectionIssue[] = [];
  // Structural check with the same zod schema the API and the solver use.
  const parsed = sectionSchema.safeParse(doc);
  if (!parsed.success) {
    for (const i of parsed.error.issues) {
      const path = i.path.filter((p): p is string | number => typeof p === 'string' || typeof p === 'number');
      const shapeIndex = path[0] === 'shapes' && typeof path[1] === 'number' ? path[1] : -1;
      const shapeId = shapeIndex >= 0 ? doc.shapes[shapeIndex]?.id : undefined;
      issues.push({
        severity: 'error',
        code: 'schema',
        message: `${path.length ? `${path.join('.')}: ` : ''}${i.message}`,
        path,
        ...(shapeId !== undefined ? { shapeIds: [shapeId] } : {}),
      });
    }
  }
  const r = resolveSection(doc);
  const resolved = r.ok ? r.section : r.partial;
  if (!r.ok) issues.push(...r.issues);
  else if (parsed.success) issues.push(...checkSection(resolved));
  else issues.push(...checkSection(resolved).filter((i) => i.severity === 'error'));
  // The same message can come from two layers; show it once.
  const seen = new Set<string>();
  const unique = issues.filter((i) => {
    const k = `${i.severity}|${i.message}`;
    if (seen.has(k)) return false;
    seen.add(k);
    return true;
  });
  const byShape = new Map<string, SectionIssue[]>();
  for (const i of unique) for (const id of i.shapeIds ?? []) byShape.set(id, [...(byShape.get(id) ?? []), i]);
  return { resolved, issues: unique, canSolve: !unique.some((i) => i.severity === 'error'), byShape };
}
