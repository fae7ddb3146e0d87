/**
 * Plate-pair detection for the fringing comparison: the section holds exactly two
 * conductor shapes, each a strip or a rectangle, on different nets, facing each other
 * across a gap (parallel facing surfaces, horizontal or vertical, with overlap > 0).
 *   width = the overlap of the facing surfaces, gap = the clear distance between them,
 *   both in section units; the medium is the one painted at the centre of the gap.
 * Mirror boundaries: when both plates end on one mirror line perpendicular to them, the
 * drawn plates are halves of the real ones, and the pair is described whole (width
 * doubled, `mirrored` true). Any other mirror boundary makes images that are further
 * plates, so the section is then not a plate pair.
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
  /**
   * True when both plates end on the same mirror boundary perpendicular to them: the
   * drawn plates are halves, and `width` is the overlap of the whole (mirrored) plates,
   * twice the drawn overlap.
   */
  mirrored: boolean;
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
  const bd = section.boundary;
  const mirrorAt = (side: 'left' | 'right' | 'bottom' | 'top') => {
    const b = bd[side];
    return b.type === 'mirror' ? b.at : undefined;
  };
  const finish = (arrangement: 'vertical' | 'horizontal', lo: typeof a, hi: typeof a, gap: number, width: number, centre: [number, number]): PlatePair | null => {
    // Sides perpendicular to the plates, and the plates' extent along them.
    const [sLo, sHi, parallel] =
      arrangement === 'vertical' ? (['left', 'right', ['bottom', 'top']] as const) : (['bottom', 'top', ['left', 'right']] as const);
    if (parallel.some((p) => mirrorAt(p) !== undefined)) return null;
    const minOf = (bb: typeof ba) => (arrangement === 'vertical' ? bb.xmin : bb.ymin);
    const maxOf = (bb: typeof ba) => (arrangement === 'vertical' ? bb.xmax : bb.ymax);
    let mirrored = false;
    const mLo = mirrorAt(sLo),
      mHi = mirrorAt(sHi);
    if (mLo !== undefined) {
      if (!(Math.abs(minOf(ba) - mLo) <= tol && Math.abs(minOf(bb) - mLo) <= tol)) return null;
      mirrored = true;
    }
    if (mHi !== undefined) {
      if (mirrored || !(Math.abs(maxOf(ba) - mHi) <= tol && Math.abs(maxOf(bb) - mHi) <= tol)) return null;
      mirrored = true;
    }
    return {
      shapeIds: [lo.id, hi.id],
      nets: [lo.conductor, hi.conductor],
      arrangement,
      gap,
      width: mirrored ? 2 * width : width,
      centre,
      epsR: epsRAt(section, centre[0], centre[1]),
      mirrored,
    };
  };

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
