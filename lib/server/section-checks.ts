/**
 * Checks reported with every saved revision. A save needs only a structurally valid section
 * (the zod schema: 422 otherwise), because a designer may save a drawing that is not yet
 * solvable (a short circuit being fixed, a net without shapes ...). Resolving expressions and
 * the geometric checks (lib/section/parse.ts) run here, and their outcome comes back with the
 * saved revision as `checks`, so the editor can show it; solving stays blocked by errors.
 */
import { parseSectionValue, type SectionIssue } from '@/lib/section/parse';

export type SectionChecks =
  | { ok: true; warnings: SectionIssue[] }
  | { ok: false; stage: string; message: string; issues: SectionIssue[] };

export function checkSavedSection(content: unknown): SectionChecks {
  try {
    const r = parseSectionValue(content);
    if (r.ok) return { ok: true, warnings: r.warnings };
    return { ok: false, stage: r.stage, message: r.message, issues: r.issues };
  } catch (e) {
    console.error('Edgefield: section checks failed unexpectedly', e);
    return { ok: false, stage: 'check', message: 'The section could not be checked.', issues: [] };
  }
}
