/**
 * Sweeps: vary one named dimension (a section variable) or one material value over a linear
 * or logarithmic range or a list, solve at each value, keep every point as it arrives (so a
 * cancelled sweep keeps what it has). The solve function is passed in: the worker uses
 * solveSection, tests may too.
 */
import type { SectionResult } from '../engine/types';
import type { Section } from '../section/schema';
import { toCsv } from './csv';
import { METRICS, type Metric } from './metrics';

export type SweepTarget =
  | { kind: 'variable'; name: string }
  | { kind: 'material'; id: string; property: 'epsR' | 'lossTangent' | 'breakdownKVPerMm' }
  | { kind: 'background'; property: 'epsR' | 'lossTangent' };

export type SweepRange =
  | { kind: 'linear'; from: number; to: number; points: number }
  | { kind: 'log'; from: number; to: number; points: number }
  | { kind: 'list'; values: number[] };

export const MAX_SWEEP_POINTS = 200;

export function sweepValues(range: SweepRange): number[] {
  if (range.kind === 'list') {
    const v = range.values.filter((x) => Number.isFinite(x));
    if (v.length === 0) throw new RangeError('the list holds no numbers');
    if (v.length > MAX_SWEEP_POINTS) throw new RangeError(`at most ${MAX_SWEEP_POINTS} points`);
    return v;
  }
  const { from, to, points } = range;
  if (!Number.isFinite(from) || !Number.isFinite(to)) throw new RangeError('the range needs two finite ends');
  if (!Number.isInteger(points) || points < 2 || points > MAX_SWEEP_POINTS) throw new RangeError(`the number of points must be a whole number from 2 to ${MAX_SWEEP_POINTS}`);
  if (range.kind === 'log') {
    if (!(from > 0 && to > 0)) throw new RangeError('a logarithmic range needs positive ends');
    const a = Math.log(from), b = Math.log(to);
    return Array.from({ length: points }, (_, i) => (i === 0 ? from : i === points - 1 ? to : Math.exp(a + ((b - a) * i) / (points - 1))));
  }
  return Array.from({ length: points }, (_, i) => (i === points - 1 ? to : from + ((to - from) * i) / (points - 1)));
}

export function targetLabel(t: SweepTarget): string {
  if (t.kind === 'variable') return t.name;
  if (t.kind === 'background') return `background ${t.property}`;
  return `${t.id} ${t.property}`;
}

/** A copy of the section with the target set to `value`. */
export function applySweepValue(section: Section, target: SweepTarget, value: number): Section {
  const s = structuredClone(section);
  if (target.kind === 'variable') {
    if (!s.variables || !(target.name in s.variables)) throw new RangeError(`the section has no variable "${target.name}"`);
    s.variables[target.name] = value;
  } else if (target.kind === 'background') {
    s.background = { ...s.background, [target.property]: value };
  } else {
    const m = s.materials.find((x) => x.id === target.id);
    if (!m) throw new RangeError(`the section has no material "${target.id}"`);
    (m as Record<string, unknown>)[target.property] = value;
  }
  return s;
}

export interface SweepPoint {
  value: number;
  /** Present when the solve succeeded. */
  result?: SectionResult;
  /** Present when this point failed (invalid geometry at this value, for example). */
  error?: string;
}

export interface SweepOptions {
  onPoint?: (p: SweepPoint, index: number, total: number) => void;
  isCancelled?: () => boolean;
}

/** Run a sweep; points that fail keep their error and the sweep goes on. */
export async function runSweep(
  section: Section,
  target: SweepTarget,
  values: number[],
  solve: (s: Section) => SectionResult | Promise<SectionResult>,
  opts: SweepOptions = {},
): Promise<{ points: SweepPoint[]; cancelled: boolean }> {
  const points: SweepPoint[] = [];
  for (let i = 0; i < values.length; i++) {
    if (opts.isCancelled?.()) return { points, cancelled: true };
    const value = values[i]!;
    let p: SweepPoint;
    try {
      p = { value, result: await solve(applySweepValue(section, target, value)) };
    } catch (e) {
      if ((e as Error)?.name === 'SolveCancelledError') return { points, cancelled: true };
      p = { value, error: e instanceof Error ? e.message : String(e) };
    }
    points.push(p);
    opts.onPoint?.(p, i, values.length);
  }
  return { points, cancelled: false };
}

/** The metrics that at least one point has. */
export function sweepMetrics(points: readonly SweepPoint[]): Metric[] {
  return METRICS.filter((m) => points.some((p) => p.result && m.get(p.result) !== undefined));
}

/** CSV of a sweep: the swept value, then every metric in its display unit, then the error text. */
export function sweepCsv(label: string, unit: string, points: readonly SweepPoint[]): string {
  const metrics = sweepMetrics(points);
  const head = [`${label}${unit ? ` (${unit})` : ''}`, ...metrics.map((m) => `${m.label}${m.unit ? ` (${m.unit})` : ''}`), 'note'];
  const rows = points.map((p) => [
    p.value,
    ...metrics.map((m) => {
      const v = p.result ? m.get(p.result) : undefined;
      return v === undefined ? null : v / m.factor;
    }),
    p.error ?? '',
  ]);
  return toCsv([head, ...rows]);
}
