/**
 * Snapping: points and moving boxes snap to other shapes' edges, corners and centres
 * (and to boundary lines), or else to the grid. The result says what it snapped to, so the
 * canvas can draw the guide.
 */
import type { ResolvedSection, ResolvedShape } from '../section/schema';
import { boxCentre, shapeAnchors, shapeBox, type AnchorKind, type Box, type Pt } from './geometry';

export type SnapKind = AnchorKind | 'grid' | 'boundary';

export interface SnapLine {
  value: number;
  kind: SnapKind;
  /** The shape the line belongs to (absent for grid and boundary). */
  shapeId?: string;
}

export interface SnapTargets {
  xs: SnapLine[];
  ys: SnapLine[];
  points: (Pt & { kind: SnapKind; shapeId?: string })[];
}

export interface Guide {
  axis: 'x' | 'y';
  value: number;
  kind: SnapKind;
}

export interface SnapOptions {
  /** Snap distance in section units (typically 6 px / scale). */
  tol: number;
  /** Grid step in section units; 0 or absent disables grid snapping. */
  grid?: number;
  /** Snap to shapes and boundaries (default true). */
  objects?: boolean;
}

/** Snap lines from every shape not in `exclude`, plus boundary planes at a coordinate. */
export function buildSnapTargets(
  shapes: readonly ResolvedShape[],
  exclude: ReadonlySet<string> = new Set(),
  boundary?: ResolvedSection['boundary'],
): SnapTargets {
  const xs: SnapLine[] = [];
  const ys: SnapLine[] = [];
  const points: SnapTargets['points'] = [];
  for (const s of shapes) {
    if (exclude.has(s.id)) continue;
    for (const a of shapeAnchors(s)) {
      points.push({ ...a, shapeId: s.id });
      xs.push({ value: a.x, kind: a.kind, shapeId: s.id });
      ys.push({ value: a.y, kind: a.kind, shapeId: s.id });
    }
  }
  if (boundary) {
    for (const side of ['left', 'right'] as const) {
      const b = boundary[side];
      if (b.type !== 'open') xs.push({ value: b.at, kind: 'boundary' });
    }
    for (const side of ['bottom', 'top'] as const) {
      const b = boundary[side];
      if (b.type !== 'open') ys.push({ value: b.at, kind: 'boundary' });
    }
  }
  return { xs, ys, points };
}

const KIND_RANK: Record<SnapKind, number> = { corner: 0, centre: 1, edge: 2, boundary: 3, grid: 4 };

function nearestLine(lines: readonly SnapLine[], v: number, tol: number): SnapLine | undefined {
  let best: SnapLine | undefined;
  let bestD = tol;
  for (const l of lines) {
    const d = Math.abs(l.value - v);
    if (d < bestD - 1e-12 || (best && Math.abs(d - bestD) <= 1e-12 && KIND_RANK[l.kind] < KIND_RANK[best.kind])) {
      best = l;
      bestD = d;
    }
  }
  return best;
}

export function snapToGrid(v: number, grid: number): number {
  if (!(grid > 0)) return v;
  const r = Math.round(v / grid) * grid;
  return Number(r.toPrecision(12));
}

/** Snap one point (for drawing and handle drags). Each axis snaps on its own. */
export function snapPoint(p: Pt, targets: SnapTargets, opts: SnapOptions): { point: Pt; guides: Guide[] } {
  const guides: Guide[] = [];
  const useObjects = opts.objects !== false;
  const lx = useObjects ? nearestLine(targets.xs, p.x, opts.tol) : undefined;
  const ly = useObjects ? nearestLine(targets.ys, p.y, opts.tol) : undefined;
  let x = p.x;
  let y = p.y;
  if (lx) {
    x = lx.value;
    guides.push({ axis: 'x', value: x, kind: lx.kind });
  } else if (opts.grid) {
    x = snapToGrid(p.x, opts.grid);
  }
  if (ly) {
    y = ly.value;
    guides.push({ axis: 'y', value: y, kind: ly.kind });
  } else if (opts.grid) {
    y = snapToGrid(p.y, opts.grid);
  }
  return { point: { x, y }, guides };
}

/**
 * Snap a box being moved by (dx, dy): its left, centre or right (bottom, middle, top) lines
 * snap to the nearest target line; without one, its lower-left corner snaps to the grid.
 */
export function snapMove(box: Box, dx: number, dy: number, targets: SnapTargets, opts: SnapOptions): { dx: number; dy: number; guides: Guide[] } {
  const c = boxCentre(box);
  const guides: Guide[] = [];
  const useObjects = opts.objects !== false;
  const axis = (cands: number[], lines: SnapLine[], delta: number, axisName: 'x' | 'y', lower: number) => {
    let best: { d: number; shift: number; line: SnapLine } | undefined;
    if (useObjects) {
      for (const v of cands) {
        const l = nearestLine(lines, v + delta, opts.tol);
        if (!l) continue;
        const d = Math.abs(l.value - (v + delta));
        if (!best || d < best.d) best = { d, shift: l.value - (v + delta), line: l };
      }
    }
    if (best) {
      guides.push({ axis: axisName, value: best.line.value, kind: best.line.kind });
      return delta + best.shift;
    }
    if (opts.grid) return snapToGrid(lower + delta, opts.grid) - lower;
    return delta;
  };
  const ndx = axis([box.minX, c.x, box.maxX], targets.xs, dx, 'x', box.minX);
  const ndy = axis([box.minY, c.y, box.maxY], targets.ys, dy, 'y', box.minY);
  return { dx: ndx, dy: ndy, guides };
}

/** Bounding box of a set of shapes by id (for moves of a selection). */
export function selectionBox(shapes: readonly ResolvedShape[], ids: ReadonlySet<string>): Box | undefined {
  let b: Box | undefined;
  for (const s of shapes) {
    if (!ids.has(s.id)) continue;
    const sb = shapeBox(s);
    b = b
      ? { minX: Math.min(b.minX, sb.minX), minY: Math.min(b.minY, sb.minY), maxX: Math.max(b.maxX, sb.maxX), maxY: Math.max(b.maxY, sb.maxY) }
      : sb;
  }
  return b;
}
