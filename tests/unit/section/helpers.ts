import { sectionSchema, type Section, type ResolvedSection } from '@/lib/section/schema';
import { resolveSection } from '@/lib/section/resolve';

/** A section from loose input, defaults applied by the schema (throws on schema errors). */
export function section(input: Record<string, unknown>): Section {
  return sectionSchema.parse({ format: 'edgefield.section/1', units: 'mm', ...input });
}

/** Resolve a section that must resolve. */
export function resolved(input: Record<string, unknown>): ResolvedSection {
  const r = resolveSection(section(input));
  if (!r.ok) throw new Error(r.issues.map((i) => i.message).join('; '));
  return r.section;
}

export const twoNets = [
  { name: 'a', role: 'signal' },
  { name: 'g', role: 'ground' },
];
