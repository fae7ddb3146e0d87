/**
 * Unit display and conversion of a whole section when its units change.
 *
 * Every length (geometry, boundary planes, expert mesh spacing) is multiplied by the factor
 * between the old and the new unit, and so is every number-valued variable that lengths
 * depend on. An expression is kept when it still gives the converted value after its
 * variables are converted (true of "w/2 + d" and of any expression that scales with its
 * length variables); otherwise it is replaced by the converted number and reported, so
 * nothing silently changes size.
 */
import { METRES_PER_UNIT, type ResolvedSection, type Section, type Units, type Value } from '../section/schema';
import { resolveSection } from '../section/resolve';
import { forEachValue } from './commands';
import { identifiersOf, tidy } from './values';

export const UNIT_LABELS: Record<Units, string> = { m: 'm', mm: 'mm', um: 'µm', mil: 'mil', in: 'in' };
export const UNIT_NAMES: Record<Units, string> = {
  m: 'metres',
  mm: 'millimetres',
  um: 'micrometres',
  mil: 'mils (thousandths of an inch)',
  in: 'inches',
};

/** Is this value path a length (in section units)? */
export function isLengthPath(path: string): boolean {
  return path.startsWith('shapes.') || path.startsWith('boundary.');
}

/** Variables that lengths depend on, directly or through other variables. */
export function lengthVariables(doc: Section): Set<string> {
  const vars = doc.variables ?? {};
  const out = new Set<string>();
  const visit = (name: string) => {
    if (out.has(name) || !(name in vars)) return;
    out.add(name);
    const v = vars[name];
    if (typeof v === 'string') for (const d of identifiersOf(v)) visit(d);
  };
  forEachValue(doc, (v, path) => {
    if (isLengthPath(path) && typeof v === 'string') for (const d of identifiersOf(v)) visit(d);
    return v;
  });
  return out;
}

export interface UnitConversion {
  doc: Section;
  /** What could not stay an expression and became a number. */
  notes: string[];
}

const close = (a: number, b: number) => Math.abs(a - b) <= 1e-9 * Math.max(Math.abs(a), Math.abs(b), 1e-300);

export function convertUnits(doc: Section, to: Units): UnitConversion {
  if (doc.units === to) return { doc, notes: [] };
  const k = METRES_PER_UNIT[doc.units] / METRES_PER_UNIT[to];
  const notes: string[] = [];
  const before = resolveSection(doc);
  const oldR = before.ok ? before.section : before.partial;
  const lengthVars = lengthVariables(doc);
  const oldVars = oldR.variables ?? {};

  // 1. Number-valued length variables scale; expression-valued ones are checked below.
  let next: Section = forEachValue(doc, (v, path) => {
    if (path.startsWith('variables.')) {
      const name = path.slice('variables.'.length);
      return lengthVars.has(name) && typeof v === 'number' ? tidy(v * k) : v;
    }
    if (isLengthPath(path) && typeof v === 'number') return tidy(v * k);
    return v;
  });
  if (next.mesh?.finest !== undefined) next = { ...next, mesh: { ...next.mesh, finest: tidy(next.mesh.finest * k) } };
  next = { ...next, units: to };

  // 2. Expression-valued length variables must scale too; freeze the ones that do not.
  let mid = resolveSection(next);
  let midVars = (mid.ok ? mid.section : mid.partial).variables ?? {};
  const frozenVars: Record<string, Value> = {};
  for (const name of lengthVars) {
    const v = next.variables?.[name];
    if (typeof v !== 'string') continue;
    const want = (oldVars[name] ?? NaN) * k;
    if (Number.isFinite(want) && !close(midVars[name] ?? NaN, want)) {
      frozenVars[name] = tidy(want);
      notes.push(`variable ${name} = "${v}" does not scale with its variables and became ${tidy(want)}`);
    }
  }
  if (Object.keys(frozenVars).length) {
    next = { ...next, variables: { ...next.variables, ...frozenVars } };
    mid = resolveSection(next);
    midVars = (mid.ok ? mid.section : mid.partial).variables ?? {};
  }

  // 3. Every length expression must give the converted value; freeze the ones that do not.
  const oldValues = new Map<string, number>();
  collectResolvedLengths(oldR, oldValues);
  const newValues = new Map<string, number>();
  collectResolvedLengths(mid.ok ? mid.section : mid.partial, newValues);
  next = forEachValue(next, (v, path) => {
    if (!isLengthPath(path) || typeof v !== 'string') return v;
    const want = (oldValues.get(path) ?? NaN) * k;
    const got = newValues.get(path) ?? NaN;
    if (!Number.isFinite(want) || close(got, want)) return v;
    notes.push(`${path.replace(/^shapes\./, 'shape ')} = "${v}" does not scale with its variables and became ${tidy(want)}`);
    return tidy(want);
  });
  return { doc: next, notes };
}

function collectResolvedLengths(r: ResolvedSection, into: Map<string, number>) {
  for (const s of r.shapes) {
    if (s.type === 'polygon') {
      s.points.forEach(([x, y], i) => {
        into.set(`shapes.${s.id}.points.${i}.0`, x);
        into.set(`shapes.${s.id}.points.${i}.1`, y);
      });
      continue;
    }
    for (const [key, val] of Object.entries(s)) if (typeof val === 'number') into.set(`shapes.${s.id}.${key}`, val);
  }
  for (const side of ['left', 'right', 'bottom', 'top'] as const) {
    const b = r.boundary[side];
    if (b.type !== 'open') into.set(`boundary.${side}.at`, b.at);
  }
}

/** Format a length for display: up to 6 significant digits, no trailing zeros. */
export function formatLength(v: number, units?: Units): string {
  if (!Number.isFinite(v)) return '—';
  const s = Math.abs(v) >= 1e6 || (Math.abs(v) < 1e-4 && v !== 0) ? v.toExponential(4) : String(Number(v.toPrecision(6)));
  return units ? `${s} ${UNIT_LABELS[units]}` : s;
}
