/**
 * Plate-pair detection for the fringing comparison: the section holds exactly two
 * conductor shapes, each a strip or a rectangle, on different nets, facing each other
 * across a gap (parallel facing surfaces, horizontal or vertical, with overlap > 0).
 *   width = the overlap of the facing surfaces, gap = the clear distance between them,
 *   both in section units; the medium is the one painted at the centre of the gap.
 */
import type { ResolvedSection, ResolvedShape } from '../section/schema';
import { shapeBBox, shapeRegion } from '../section/geometry';

export interface PlatePair {
  /** The two conductor shapes, lower/left one first. */
  shapeIds: [string, string];
  nets: [string, string];
  /** 'vertical': one plate above the other; 'horizontal': side by side. */
  arrangement: 'vertical' | 'horizontal';
  /** Section units. */
  gap: number;
  width: number;
  /** Centre of the gap, section units. */
  centre: [number, number];
  /** Relative permittivity of the medium at the centre of the gap. */
  epsR: number;
}

/** εr painted at a point: the last dielectric containing it, else the background. */
export function epsRAt(section: ResolvedSection, x: number, y: number): number {
  const materials = new Map(section.materials.map((m) => [m.id, m.epsR]));
  let eps = section.background.epsR;
  for (const s of section.shapes) {
    if (s.dielectric === undefined) continue;
    if (shapeRegion(s).contains(x, y)) eps = materials.get(s.dielectric) ?? eps;
  }
  return eps;
}

export function detectPlates(section: ResolvedSection): PlatePair | null {
  const conductors = section.shapes.filter((s): s is ResolvedShape & { conductor: string } => s.conductor !== undefined);
  if (conductors.length !== 2) return null;
  const [a, b] = conductors as [ResolvedShape & { conductor: string }, ResolvedShape & { conductor: string }];
  if (!(a.type === 'rect' || a.type === 'strip') || !(b.type === 'rect' || b.type === 'strip')) return null;
  if (a.conductor === b.conductor) return null;
  const ba = shapeBBox(a),
    bb = shapeBBox(b);
  const size = Math.max(ba.xmax, bb.xmax) - Math.min(ba.xmin, bb.xmin) + Math.max(ba.ymax, bb.ymax) - Math.min(ba.ymin, bb.ymin);
  const tol = 1e-9 * size;

  const overlapX = Math.min(ba.xmax, bb.xmax) - Math.max(ba.xmin, bb.xmin);
  const overlapY = Math.min(ba.ymax, bb.ymax) - Math.max(ba.ymin, bb.ymin);
  const finish = (arrangement: 'vertical' | 'horizontal', lo: typeof a, hi: typeof a, gap: number, width: number, centre: [number, number]): PlatePair => ({
    shapeIds: [lo.id, hi.id],
    nets: [lo.conductor, hi.conductor],
    arrangement,
    gap,
    width,
    centre,
    epsR: epsRAt(section, centre[0], centre[1]),
  });

  if (overlapX > tol) {
    const [lo, hi, blo, bhi] = ba.ymax <= bb.ymin + tol ? [a, b, ba, bb] : [b, a, bb, ba];
    const gap = bhi.ymin - blo.ymax;
    if (gap > tol) {
      const cx = (Math.max(ba.xmin, bb.xmin) + Math.min(ba.xmax, bb.xmax)) / 2;
      return finish('vertical', lo, hi, gap, overlapX, [cx, (blo.ymax + bhi.ymin) / 2]);
    }
  }
  if (overlapY > tol) {
    const [lo, hi, blo, bhi] = ba.xmax <= bb.xmin + tol ? [a, b, ba, bb] : [b, a, bb, ba];
    const gap = bhi.xmin - blo.xmax;
    if (gap > tol) {
      const cy = (Math.max(ba.ymin, bb.ymin) + Math.min(ba.ymax, bb.ymax)) / 2;
      return finish('horizontal', lo, hi, gap, overlapY, [(blo.xmax + bhi.xmin) / 2, cy]);
    }
  }
  return null;
}
