/**
 * Fringing study of a plate pair: set the gap-to-width ratio d/w by moving the upper (or
 * right) plate, keeping the width; solve over a log range; compare solved / ideal with the
 * published curves of fringing.ts (Palmer 1937; Hammerstad & Jensen 1980 via the mid-plane),
 * and find the ratio below which the ideal εw/d is within 1%, 5% and 10%.
 * The curves are for two equal thin strips in one medium; thick plates, unequal widths or
 * dielectrics that do not fill the whole space differ from them (said on screen).
 */
import { detectPlates } from '../engine/plates';
import { validateSection } from '../engine/solve-section';
import type { SectionResult } from '../engine/types';
import type { ResolvedSection, Section } from '../section/schema';
import { toCsv } from './csv';
import { hammerstadJensenPlates, palmerPlates } from './fringing';

export const FRINGING_RATIOS = { from: 0.01, to: 10, points: 13 } as const;
export const FRINGING_TOLERANCES = [0.01, 0.05, 0.1] as const;

/** A numeric copy of a plate-pair section with gap = ratio × width (throws when it is no plate pair). */
export function withGapToWidth(section: Section, ratio: number): Section {
  if (!(ratio > 0) || !Number.isFinite(ratio)) throw new RangeError('the gap-to-width ratio must be positive');
  const { resolved } = validateSection(section);
  const pair = detectPlates(resolved);
  if (!pair) throw new RangeError('the fringing study needs a plate pair: exactly two strips or rectangles on different nets, facing each other');
  if (pair.mirrored) throw new RangeError('the fringing study works on a whole plate pair, not halves on a mirror boundary');
  const s = structuredClone(resolved) as ResolvedSection;
  delete s.variables;
  const gap = ratio * pair.width;
  const [lowId, highId] = pair.shapeIds;
  const low = s.shapes.find((x) => x.id === lowId)!;
  const high = s.shapes.find((x) => x.id === highId)!;
  const vertical = pair.arrangement === 'vertical';
  const lowFar = (() => {
    if (low.type === 'strip') return vertical ? low.y1 : low.x1;
    if (low.type === 'rect') return vertical ? low.y + low.height : low.x + low.width;
    throw new RangeError('plates must be strips or rectangles');
  })();
  const target = lowFar + gap;
  if (high.type === 'strip') {
    if (vertical) high.y1 = high.y2 = target;
    else high.x1 = high.x2 = target;
  } else if (high.type === 'rect') {
    if (vertical) high.y = target;
    else high.x = target;
  }
  return s as unknown as Section;
}

export interface FringingRow {
  gapToWidth: number;
  solvedOverIdeal: number;
  palmerOverIdeal: number;
  hammerstadJensenOverIdeal: number;
  /** (ideal − solved) / solved: how far εw/d is off. */
  idealError: number;
  relativeErrorEstimate: number;
}

export function fringingRow(r: SectionResult): FringingRow | null {
  const p = r.plates;
  if (!p) return null;
  const wd = 1 / p.gapToWidth;
  return {
    gapToWidth: p.gapToWidth,
    solvedOverIdeal: p.solvedOverIdeal,
    palmerOverIdeal: palmerPlates(wd) / wd,
    hammerstadJensenOverIdeal: hammerstadJensenPlates(wd) / wd,
    idealError: 1 / p.solvedOverIdeal - 1,
    relativeErrorEstimate: r.errorEstimate.relative,
  };
}

export interface Threshold {
  tolerance: number;
  /** Largest d/w up to which |ideal error| ≤ tolerance at every point, log-interpolated to the crossing. */
  ratio?: number;
  /** 'below' when even the smallest ratio swept misses the tolerance; 'above' when every ratio meets it. */
  outside?: 'below' | 'above';
}

export function fringingThresholds(rows: readonly FringingRow[], tolerances: readonly number[] = FRINGING_TOLERANCES): Threshold[] {
  const sorted = [...rows].sort((a, b) => a.gapToWidth - b.gapToWidth);
  return tolerances.map((tol) => {
    if (sorted.length === 0 || Math.abs(sorted[0]!.idealError) > tol) return { tolerance: tol, outside: 'below' as const };
    for (let i = 1; i < sorted.length; i++) {
      const a = sorted[i - 1]!, b = sorted[i]!;
      if (Math.abs(b.idealError) > tol) {
        const ea = Math.abs(a.idealError), eb = Math.abs(b.idealError);
        const t = (tol - ea) / (eb - ea);
        const ratio = Math.exp(Math.log(a.gapToWidth) + t * (Math.log(b.gapToWidth) - Math.log(a.gapToWidth)));
        return { tolerance: tol, ratio };
      }
    }
    return { tolerance: tol, outside: 'above' as const };
  });
}

export function thresholdText(t: Threshold, range: { from: number; to: number }): string {
  const pct = `${Math.round(t.tolerance * 100)}%`;
  if (t.outside === 'below') return `within ${pct}: not even at d/w = ${range.from} (the smallest ratio swept)`;
  if (t.outside === 'above') return `within ${pct}: over the whole range up to d/w = ${range.to}`;
  return `within ${pct}: for d/w below ${t.ratio!.toPrecision(3)}`;
}

export function fringingCsv(rows: readonly FringingRow[], thresholds: readonly Threshold[], range: { from: number; to: number }): string {
  return toCsv([
    ['gap/width', 'solved/ideal', 'Palmer 1937 / ideal', 'Hammerstad-Jensen mid-plane / ideal', 'ideal formula off by (%)', 'estimated solve error (%)'],
    ...rows.map((r) => [r.gapToWidth, r.solvedOverIdeal, r.palmerOverIdeal, r.hammerstadJensenOverIdeal, 100 * r.idealError, 100 * r.relativeErrorEstimate]),
    [],
    ['ideal formula'],
    ...thresholds.map((t) => [thresholdText(t, range)]),
  ]);
}
