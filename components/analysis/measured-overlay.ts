/**
 * Measured capacitance sets on a sweep chart: does a set's first column name the swept
 * quantity, in a unit that converts to the sweep's axis, and is the charted value a
 * capacitance per length the set's columns can be drawn against? Pure functions (no React,
 * no DOM), shared by the sweep card and its unit tests.
 *
 * A set (lib/import/measured-csv.ts) holds its parameter column `{ name, unit }`, the x values
 * as written in the file, and capacitance columns with their values already converted to F/m.
 */
import { METRES_PER_UNIT, type Units } from '@/lib/section/schema';
import type { SweepTarget } from '@/lib/analysis/sweep';
import type { MeasuredData } from '@/lib/import/measured-csv';

/** A measured set as the measurements route lists it. */
export interface MeasuredSet {
  id: string;
  name: string;
  data: MeasuredData;
}

/** What the sweep varies and in which unit its axis is drawn. */
export interface SweepAxis {
  target: SweepTarget;
  /** The section's length unit (the axis unit of a swept dimension). */
  units: Units;
  /** Material id → its display name, for material targets written with the name. */
  materialNames?: Record<string, string>;
}

/** The charted value: its unit and SI value per display unit (lib/analysis/metrics.ts). */
export interface ChartMetric {
  label: string;
  unit: string;
  factor: number;
}

export interface OverlaySeries {
  /** Legend text: file name and column. */
  name: string;
  points: [number, number][];
}

export type OverlayMatch =
  | { ok: true; series: OverlaySeries[]; xFactor: number; notes: string[] }
  | { ok: false; reason: string };

/**
 * Metres per length unit a CSV may name (after "µ" → "u"); 1 in = 25.4 mm and 1 mil =
 * 1 thou = 0.001 in exactly, by definition.
 */
export const LENGTH_UNITS: Record<string, number> = {
  m: 1,
  cm: 1e-2,
  mm: 1e-3,
  um: 1e-6,
  micron: 1e-6,
  nm: 1e-9,
  mil: 25.4e-6,
  mils: 25.4e-6,
  thou: 25.4e-6,
  in: 0.0254,
  inch: 0.0254,
};

/** Units that say "no unit" for εr and tanδ columns. */
const DIMENSIONLESS = new Set(['', '-', '1', 'none', 'unitless']);

/** Capacitance-per-length display units the charted value may have, in F/m per unit. */
const CAPACITANCE_DISPLAY = new Set(['pF/m']);

const norm = (s: string) =>
  s
    .normalize('NFKC')
    .toLowerCase()
    .replace(/ε/g, 'eps')
    .replace(/δ/g, 'd')
    .replace(/[\s_\-.]+/g, '');

const EPS_R_NAMES = new Set(['epsr', 'epsilonr', 'er', 'dk', 'permittivity', 'relativepermittivity'].map(norm));
const TAN_D_NAMES = new Set(['tand', 'tandelta', 'tanδ', 'losstangent', 'df', 'dissipationfactor'].map(norm));

const unitText = (u: Units) => (u === 'um' ? 'µm' : u);

/** Does the first column's name denote the swept quantity? */
export function parameterMatches(name: string, axis: SweepAxis): boolean {
  const n = norm(name);
  const t = axis.target;
  if (t.kind === 'variable') return n === norm(t.name);
  const names = t.property === 'epsR' ? EPS_R_NAMES : t.property === 'lossTangent' ? TAN_D_NAMES : null;
  if (!names) return false;
  if (names.has(n)) return true;
  const prefixes = t.kind === 'background' ? ['background', 'bg', 'air'] : [t.id, axis.materialNames?.[t.id] ?? t.id];
  return prefixes.some((p) => {
    const q = norm(p);
    return q.length > 0 && n.startsWith(q) && names.has(n.slice(q.length));
  });
}

function sweptText(axis: SweepAxis): string {
  const t = axis.target;
  if (t.kind === 'variable') return `the dimension ${t.name} (${unitText(axis.units)})`;
  const what = t.property === 'epsR' ? 'εr' : t.property === 'lossTangent' ? 'tanδ' : t.property;
  return t.kind === 'background' ? `the background ${what}` : `${t.id} ${what}`;
}

function exampleHeader(axis: SweepAxis): string {
  const t = axis.target;
  if (t.kind === 'variable') return `${t.name} (${unitText(axis.units)})`;
  return t.property === 'lossTangent' ? 'tanδ' : 'εr';
}

/**
 * The factor that takes the set's x values to the sweep's axis unit, or a reason it cannot.
 * Dimensions: any length unit of LENGTH_UNITS to the section's unit. εr and tanδ: no unit.
 */
export function parameterFactor(unit: string | null, axis: SweepAxis): { ok: true; factor: number } | { ok: false; reason: string } {
  const t = axis.target;
  if (t.kind === 'variable') {
    if (unit === null) return { ok: false, reason: `its first column gives no unit; write it like "${exampleHeader(axis)}" so it can be put on the sweep's axis.` };
    const m = LENGTH_UNITS[unit.toLowerCase()];
    if (m === undefined) return { ok: false, reason: `"${unit}" is not a length unit Edgefield converts (${Object.keys(LENGTH_UNITS).join(', ')}).` };
    const target = METRES_PER_UNIT[axis.units];
    // Exact ratio where both units are the same; otherwise through metres, rounded to 12 digits.
    return { ok: true, factor: m === target ? 1 : Number((m / target).toPrecision(12)) };
  }
  if (unit === null || DIMENSIONLESS.has(unit.trim().toLowerCase())) return { ok: true, factor: 1 };
  return { ok: false, reason: `${sweptText(axis)} has no unit, but the set's first column is in "${unit}".` };
}

/**
 * Match one measured set against the sweep and the charted value. On success the points are
 * in the sweep's axis unit (x) and the metric's display unit (y); notes say what the chart
 * cannot show (points outside the swept range, x ≤ 0 on a logarithmic axis).
 */
export function matchMeasured(set: MeasuredSet, axis: SweepAxis, metric: ChartMetric, sweptRange?: { min: number; max: number; log?: boolean }): OverlayMatch {
  const { parameter, x, series } = set.data;
  if (!CAPACITANCE_DISPLAY.has(metric.unit)) {
    return { ok: false, reason: `measured sets hold capacitance per length; the chart shows ${metric.label}${metric.unit ? ` (${metric.unit})` : ''}. Choose a capacitance (C11, C' or plates C) to compare.` };
  }
  if (!parameterMatches(parameter.name, axis)) {
    return { ok: false, reason: `its first column is "${parameter.name}${parameter.unit ? ` (${parameter.unit})` : ''}", but this sweep varies ${sweptText(axis)}. Name the first column "${exampleHeader(axis)}" to compare.` };
  }
  const f = parameterFactor(parameter.unit, axis);
  if (!f.ok) return { ok: false, reason: f.reason };
  const xs = x.map((v) => (f.factor === 1 ? v : Number((v * f.factor).toPrecision(12))));
  const out: OverlaySeries[] = series.map((s) => ({
    name: `${set.name} · ${s.name} (${s.unit})`,
    points: xs.map((v, i) => [v, s.valuesFPerM[i]! / metric.factor] as [number, number]),
  }));
  const notes: string[] = [];
  if (sweptRange) {
    const tol = 1e-9 * Math.max(Math.abs(sweptRange.min), Math.abs(sweptRange.max), 1e-300);
    const outside = xs.filter((v) => v < sweptRange.min - tol || v > sweptRange.max + tol).length;
    if (outside > 0) notes.push(`${outside} of ${xs.length} measured ${outside === 1 ? 'point lies' : 'points lie'} outside the swept range; the axis widens to show them.`);
    if (sweptRange.log) {
      const nonPositive = xs.filter((v) => !(v > 0)).length;
      if (nonPositive > 0) notes.push(`${nonPositive} measured ${nonPositive === 1 ? 'point' : 'points'} at zero or below cannot show on a logarithmic axis.`);
    }
  }
  if (f.factor !== 1 && parameter.unit) notes.push(`${parameter.name} converted from ${parameter.unit === 'um' ? 'µm' : parameter.unit} to ${axis.target.kind === 'variable' ? unitText(axis.units) : 'the axis unit'}.`);
  return { ok: true, series: out, xFactor: f.factor, notes };
}
