/**
 * Length units of a section: conversion to metres, converting a whole section to other
 * units, and formatting lengths for people.
 *
 * Converting a section whose values are expressions (convertSection) keeps every
 * resolved length exactly the same physical length. Two strategies, tried in order:
 *   A. "scale the variables": numeric variables that are only used for lengths are
 *      multiplied by the factor, numeric lengths too, and expression strings are kept as
 *      they are. This keeps "w/2 + d" readable. It is used only when it is exact: the
 *      converted section is resolved and every length (and every variable scaled) is
 *      compared with the expected value; an expression like "w + 1", whose literal 1 is
 *      a length in the old units, fails that comparison.
 *   B. "wrap the expressions": variables are kept as they are, numeric lengths are
 *      multiplied, and each length expression becomes "(expr)*factor". Always exact.
 * Values that are not lengths (εr, loss tangent, conductivity, mesh growth and extent)
 * never change. The mesh's expert `finest` spacing is a length and is converted.
 */
import { METRES_PER_UNIT, UNITS, type ResolvedSection, type Section, type Units, type Value } from './schema';
import { expressionDependencies } from './expression';
import { resolveSection } from './resolve';

export { METRES_PER_UNIT, UNITS, type Units } from './schema';

/** Display label of each unit ("µm" for "um"). */
export const UNIT_LABELS: Record<Units, string> = { m: 'm', mm: 'mm', um: 'µm', mil: 'mil', in: 'in' };

/** A length in section units → metres. */
export function toMetres(value: number, units: Units): number {
  return value * METRES_PER_UNIT[units];
}

/** Metres → a length in section units. */
export function fromMetres(metres: number, units: Units): number {
  return metres / METRES_PER_UNIT[units];
}

/** Round to 12 significant digits, removing conversion noise (0.30000000000000004 → 0.3). */
export function roundSignificant(v: number, digits = 12): number {
  if (v === 0 || !Number.isFinite(v)) return v;
  return Number(v.toPrecision(digits));
}

/** Factor that converts a length from one unit to another (value_to = value_from × factor). */
export function unitFactor(from: Units, to: Units): number {
  if (from === to) return 1;
  // Exact ratios where both are metric or both imperial avoid binary noise.
  return METRES_PER_UNIT[from] / METRES_PER_UNIT[to];
}

export function convertLength(value: number, from: Units, to: Units): number {
  return roundSignificant(value * unitFactor(from, to));
}

/** Format a factor as short text for expressions ("25.4", "0.0393700787402"). */
function factorText(f: number): string {
  return String(roundSignificant(f, 15));
}

type LengthField = { get: (s: Section) => Value; set: (s: Section, v: Value) => void; resolved: (r: ResolvedSection) => number };

/** Every length-valued field of a section (geometry and boundary positions). */
function lengthFields(section: Section): LengthField[] {
  const out: LengthField[] = [];
  section.shapes.forEach((shape, i) => {
    const keys: string[] =
      shape.type === 'rect'
        ? ['x', 'y', 'width', 'height']
        : shape.type === 'circle'
          ? ['cx', 'cy', 'r']
          : shape.type === 'ring'
            ? ['cx', 'cy', 'rInner', 'rOuter']
            : shape.type === 'strip'
              ? ['x1', 'y1', 'x2', 'y2']
              : [];
    for (const k of keys) {
      out.push({
        get: (s) => (s.shapes[i] as unknown as Record<string, Value>)[k]!,
        set: (s, v) => {
          (s.shapes[i] as unknown as Record<string, Value>)[k] = v;
        },
        resolved: (r) => (r.shapes[i] as unknown as Record<string, number>)[k]!,
      });
    }
    if (shape.type === 'polygon') {
      shape.points.forEach((_, p) => {
        for (const c of [0, 1] as const) {
          out.push({
            get: (s) => (s.shapes[i] as { points: [Value, Value][] }).points[p]![c],
            set: (s, v) => {
              (s.shapes[i] as { points: [Value, Value][] }).points[p]![c] = v;
            },
            resolved: (r) => (r.shapes[i] as { points: [number, number][] }).points[p]![c],
          });
        }
      });
    }
  });
  for (const side of ['left', 'right', 'bottom', 'top'] as const) {
    const b = section.boundary[side];
    if (b.type !== 'open') {
      out.push({
        get: (s) => (s.boundary[side] as { at: Value }).at,
        set: (s, v) => {
          (s.boundary[side] as { at: Value }).at = v;
        },
        resolved: (r) => (r.boundary[side] as { at: number }).at,
      });
    }
  }
  return out;
}

/** Every value that is not a length (its expressions' variables must not be scaled). */
function nonLengthValues(section: Section): Value[] {
  const out: Value[] = [section.background.epsR];
  if (section.background.lossTangent !== undefined) out.push(section.background.lossTangent);
  for (const m of section.materials) {
    out.push(m.epsR);
    if (m.lossTangent !== undefined) out.push(m.lossTangent);
    if (m.breakdownKVPerMm !== undefined) out.push(m.breakdownKVPerMm);
  }
  for (const n of section.nets) if (n.conductivitySPerM !== undefined) out.push(n.conductivitySPerM);
  return out;
}

const close = (a: number, b: number) => Math.abs(a - b) <= 1e-9 * Math.max(Math.abs(a), Math.abs(b), 1e-300);

export interface ConvertResult {
  section: Section;
  /** Which strategy was used (see the module comment). */
  strategy: 'none' | 'scale-variables' | 'wrap-expressions';
}

/**
 * Convert a section to other units; every resolved length stays the same physical length.
 * A section whose values cannot be resolved is converted with strategy B (always exact
 * where it resolves).
 */
export function convertSectionDetailed(section: Section, newUnits: Units): ConvertResult {
  const from = section.units;
  if (from === newUnits) return { section: structuredClone(section), strategy: 'none' };
  const f = unitFactor(from, newUnits);
  const scaleNum = (v: number) => roundSignificant(v * f);
  const vars = section.variables ?? {};
  const before = resolveSection(section);

  const withMesh = (s: Section) => {
    if (s.mesh?.finest !== undefined) s.mesh.finest = scaleNum(s.mesh.finest);
    s.units = newUnits;
    return s;
  };

  // Strategy A.
  if (before.ok && section.variables && Object.keys(vars).length > 0) {
    const nonLength = new Set<string>();
    const mark = (name: string) => {
      if (nonLength.has(name) || !Object.hasOwn(vars, name)) return;
      nonLength.add(name);
      for (const d of expressionDependencies(vars[name]!)) mark(d);
    };
    for (const v of nonLengthValues(section)) for (const d of expressionDependencies(v)) mark(d);
    const cand = structuredClone(section);
    const scaled: string[] = [];
    for (const [name, v] of Object.entries(vars)) {
      if (!nonLength.has(name) && typeof v === 'number') {
        cand.variables![name] = scaleNum(v);
        scaled.push(name);
      }
    }
    for (const fld of lengthFields(cand)) {
      const v = fld.get(cand);
      if (typeof v === 'number') fld.set(cand, scaleNum(v));
    }
    withMesh(cand);
    const after = resolveSection(cand);
    if (after.ok) {
      const fieldsBefore = lengthFields(section);
      const fieldsAfter = lengthFields(cand);
      let exact = fieldsBefore.every((fb, k) => close(fieldsAfter[k]!.resolved(after.section), fb.resolved(before.section) * f));
      const vb = before.section.variables ?? {};
      const va = after.section.variables ?? {};
      for (const name of Object.keys(vars)) {
        // Expression variables that only feed lengths must scale too; non-length ones must not change.
        const want = nonLength.has(name) ? vb[name]! : vb[name]! * f;
        if (!close(va[name]!, want)) exact = false;
      }
      if (exact) return { section: cand, strategy: 'scale-variables' };
    }
  }

  // Strategy B.
  const out = structuredClone(section);
  for (const fld of lengthFields(out)) {
    const v = fld.get(out);
    if (typeof v === 'number') fld.set(out, scaleNum(v));
    else fld.set(out, `(${v})*${factorText(f)}`);
  }
  withMesh(out);
  return { section: out, strategy: 'wrap-expressions' };
}

/** Convert a section to other units (see convertSectionDetailed). */
export function convertSection(section: Section, newUnits: Units): Section {
  return convertSectionDetailed(section, newUnits).section;
}

/** Convert a resolved section (numbers only) to other units. */
export function convertResolvedSection(section: ResolvedSection, newUnits: Units): ResolvedSection {
  const f = unitFactor(section.units, newUnits);
  const s = structuredClone(section);
  const sc = (v: number) => roundSignificant(v * f);
  for (const shape of s.shapes) {
    switch (shape.type) {
      case 'rect':
        Object.assign(shape, { x: sc(shape.x), y: sc(shape.y), width: sc(shape.width), height: sc(shape.height) });
        break;
      case 'circle':
        Object.assign(shape, { cx: sc(shape.cx), cy: sc(shape.cy), r: sc(shape.r) });
        break;
      case 'ring':
        Object.assign(shape, { cx: sc(shape.cx), cy: sc(shape.cy), rInner: sc(shape.rInner), rOuter: sc(shape.rOuter) });
        break;
      case 'strip':
        Object.assign(shape, { x1: sc(shape.x1), y1: sc(shape.y1), x2: sc(shape.x2), y2: sc(shape.y2) });
        break;
      case 'polygon':
        shape.points = shape.points.map(([x, y]) => [sc(x), sc(y)] as [number, number]);
        break;
    }
  }
  for (const side of ['left', 'right', 'bottom', 'top'] as const) {
    const b = s.boundary[side];
    if (b.type !== 'open') b.at = sc(b.at);
  }
  if (s.mesh?.finest !== undefined) s.mesh.finest = sc(s.mesh.finest);
  s.units = newUnits;
  return s;
}

/** "1.25 mm": a length in section units with its unit label. */
export function formatLength(value: number, units: Units, significant = 4): string {
  if (!Number.isFinite(value)) return `${value} ${UNIT_LABELS[units]}`;
  return `${Number(value.toPrecision(significant))} ${UNIT_LABELS[units]}`;
}

const METRIC_STEPS: { unit: string; m: number }[] = [
  { unit: 'km', m: 1e3 },
  { unit: 'm', m: 1 },
  { unit: 'mm', m: 1e-3 },
  { unit: 'µm', m: 1e-6 },
  { unit: 'nm', m: 1e-9 },
];

/** "350 µm": a length in metres shown in the metric unit that gives 1 ≤ value < 1000. */
export function formatMetres(metres: number, significant = 4): string {
  if (!Number.isFinite(metres)) return `${metres} m`;
  if (metres === 0) return '0 m';
  const a = Math.abs(metres);
  const step = METRIC_STEPS.find((s) => a >= s.m * 0.9995) ?? METRIC_STEPS[METRIC_STEPS.length - 1]!;
  return `${Number((metres / step.m).toPrecision(significant))} ${step.unit}`;
}

export function isUnits(u: unknown): u is Units {
  return typeof u === 'string' && (UNITS as readonly string[]).includes(u);
}
