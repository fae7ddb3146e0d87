/**
 * Exact plane-geometry predicates on section shapes (section units), used by the checks:
 * bounding boxes, point containment, and the distance between two shapes' regions
 * (0 when they touch or overlap). Each shape is a closed region bounded by line segments
 * and full circles: rect and polygon (segments), circle (one circle), ring (two circles,
 * the hole is not part of the region), strip (a segment with no interior).
 */
import type { ResolvedShape } from './schema';

export interface BBox {
  xmin: number;
  ymin: number;
  xmax: number;
  ymax: number;
}

export type Prim =
  | { k: 'seg'; ax: number; ay: number; bx: number; by: number }
  | { k: 'circ'; cx: number; cy: number; r: number };

export interface Region {
  bbox: BBox;
  prims: Prim[];
  /** A point on the region's boundary. */
  anyPoint: [number, number];
  /** Point containment (boundary counts as inside within rounding). */
  contains(x: number, y: number): boolean;
}

export function shapeBBox(s: ResolvedShape): BBox {
  switch (s.type) {
    case 'rect':
      return {
        xmin: Math.min(s.x, s.x + s.width),
        xmax: Math.max(s.x, s.x + s.width),
        ymin: Math.min(s.y, s.y + s.height),
        ymax: Math.max(s.y, s.y + s.height),
      };
    case 'circle':
      return { xmin: s.cx - Math.abs(s.r), xmax: s.cx + Math.abs(s.r), ymin: s.cy - Math.abs(s.r), ymax: s.cy + Math.abs(s.r) };
    case 'ring': {
      const r = Math.max(Math.abs(s.rOuter), Math.abs(s.rInner));
      return { xmin: s.cx - r, xmax: s.cx + r, ymin: s.cy - r, ymax: s.cy + r };
    }
    case 'strip':
      return {
        xmin: Math.min(s.x1, s.x2),
        xmax: Math.max(s.x1, s.x2),
        ymin: Math.min(s.y1, s.y2),
        ymax: Math.max(s.y1, s.y2),
      };
    case 'polygon': {
      let xmin = Infinity,
        ymin = Infinity,
        xmax = -Infinity,
        ymax = -Infinity;
      for (const [x, y] of s.points) {
        if (x < xmin) xmin = x;
        if (x > xmax) xmax = x;
        if (y < ymin) ymin = y;
        if (y > ymax) ymax = y;
      }
      return { xmin, ymin, xmax, ymax };
    }
  }
}

export function bboxGap(a: BBox, b: BBox): number {
  const dx = Math.max(0, a.xmin - b.xmax, b.xmin - a.xmax);
  const dy = Math.max(0, a.ymin - b.ymax, b.ymin - a.ymax);
  return Math.hypot(dx, dy);
}

export function bboxUnion(boxes: readonly BBox[]): BBox | null {
  if (boxes.length === 0) return null;
  const out = { ...boxes[0]! };
  for (const b of boxes) {
    out.xmin = Math.min(out.xmin, b.xmin);
    out.ymin = Math.min(out.ymin, b.ymin);
    out.xmax = Math.max(out.xmax, b.xmax);
    out.ymax = Math.max(out.ymax, b.ymax);
  }
  return out;
}

function polygonSegments(points: readonly (readonly [number, number])[]): Prim[] {
  const out: Prim[] = [];
  for (let i = 0; i < points.length; i++) {
    const a = points[i]!;
    const b = points[(i + 1) % points.length]!;
    out.push({ k: 'seg', ax: a[0], ay: a[1], bx: b[0], by: b[1] });
  }
  return out;
}

/** Even-odd point-in-polygon test. */
export function pointInPolygon(x: number, y: number, pts: readonly (readonly [number, number])[]): boolean {
  let inside = false;
  for (let i = 0, j = pts.length - 1; i < pts.length; j = i++) {
    const xi = pts[i]![0],
      yi = pts[i]![1],
      xj = pts[j]![0],
      yj = pts[j]![1];
    if (yi > y !== yj > y && x < ((xj - xi) * (y - yi)) / (yj - yi) + xi) inside = !inside;
  }
  return inside;
}

export function rectPoints(s: { x: number; y: number; width: number; height: number }): [number, number][] {
  return [
    [s.x, s.y],
    [s.x + s.width, s.y],
    [s.x + s.width, s.y + s.height],
    [s.x, s.y + s.height],
  ];
}

export function shapeRegion(s: ResolvedShape): Region {
  const bbox = shapeBBox(s);
  switch (s.type) {
    case 'rect': {
      const pts = rectPoints(s);
      return {
        bbox,
        prims: polygonSegments(pts),
        anyPoint: pts[0]!,
        contains: (x, y) => x >= bbox.xmin && x <= bbox.xmax && y >= bbox.ymin && y <= bbox.ymax,
      };
    }
    case 'circle':
      return {
        bbox,
        prims: [{ k: 'circ', cx: s.cx, cy: s.cy, r: s.r }],
        anyPoint: [s.cx + s.r, s.cy],
        contains: (x, y) => Math.hypot(x - s.cx, y - s.cy) <= s.r,
      };
    case 'ring':
      return {
        bbox,
        prims: [
          { k: 'circ', cx: s.cx, cy: s.cy, r: s.rOuter },
          { k: 'circ', cx: s.cx, cy: s.cy, r: s.rInner },
        ],
        anyPoint: [s.cx + s.rOuter, s.cy],
        contains: (x, y) => {
          const d = Math.hypot(x - s.cx, y - s.cy);
          return d >= s.rInner && d <= s.rOuter;
        },
      };
    case 'strip':
      return {
        bbox,
        prims: [{ k: 'seg', ax: s.x1, ay: s.y1, bx: s.x2, by: s.y2 }],
        anyPoint: [s.x1, s.y1],
        contains: () => false,
      };
    case 'polygon':
      return {
        bbox,
        prims: polygonSegments(s.points),
        anyPoint: [s.points[0]![0], s.points[0]![1]],
        contains: (x, y) =>
          x >= bbox.xmin && x <= bbox.xmax && y >= bbox.ymin && y <= bbox.ymax && pointInPolygon(x, y, s.points),
      };
  }
}

/** Distance from point p to segment ab. */
export function pointSegDist(px: number, py: number, ax: number, ay: number, bx: number, by: number): number {
  const dx = bx - ax,
    dy = by - ay;
  const l2 = dx * dx + dy * dy;
  let t = l2 > 0 ? ((px - ax) * dx + (py - ay) * dy) / l2 : 0;
  t = t < 0 ? 0 : t > 1 ? 1 : t;
  return Math.hypot(px - (ax + t * dx), py - (ay + t * dy));
}

function orient(ax: number, ay: number, bx: number, by: number, cx: number, cy: number): number {
  return (bx - ax) * (cy - ay) - (by - ay) * (cx - ax);
}

/** True when segments ab and cd properly cross (each separates the other's end points). */
function segmentsCross(ax: number, ay: number, bx: number, by: number, cx: number, cy: number, dx: number, dy: number): boolean {
  const d1 = orient(cx, cy, dx, dy, ax, ay);
  const d2 = orient(cx, cy, dx, dy, bx, by);
  const d3 = orient(ax, ay, bx, by, cx, cy);
  const d4 = orient(ax, ay, bx, by, dx, dy);
  return ((d1 > 0 && d2 < 0) || (d1 < 0 && d2 > 0)) && ((d3 > 0 && d4 < 0) || (d3 < 0 && d4 > 0));
}

/** Distance between segments ab and cd (0 when they cross). */
export function segSegDist(ax: number, ay: number, bx: number, by: number, cx: number, cy: number, dx: number, dy: number): number {
  if (segmentsCross(ax, ay, bx, by, cx, cy, dx, dy)) return 0;
  return Math.min(
    pointSegDist(ax, ay, cx, cy, dx, dy),
    pointSegDist(bx, by, cx, cy, dx, dy),
    pointSegDist(cx, cy, ax, ay, bx, by),
    pointSegDist(dx, dy, ax, ay, bx, by),
  );
}

/** Distance between the circle curve (c, r) and segment ab. */
function segCircDist(ax: number, ay: number, bx: number, by: number, cx: number, cy: number, r: number): number {
  const dmin = pointSegDist(cx, cy, ax, ay, bx, by);
  const dmax = Math.max(Math.hypot(ax - cx, ay - cy), Math.hypot(bx - cx, by - cy));
  if (r < dmin) return dmin - r;
  if (r > dmax) return r - dmax;
  return 0;
}

function circCircDist(a: { cx: number; cy: number; r: number }, b: { cx: number; cy: number; r: number }): number {
  const d = Math.hypot(a.cx - b.cx, a.cy - b.cy);
  if (d > a.r + b.r) return d - a.r - b.r;
  if (d < Math.abs(a.r - b.r)) return Math.abs(a.r - b.r) - d;
  return 0;
}

export function primDist(p: Prim, q: Prim): number {
  if (p.k === 'seg' && q.k === 'seg') return segSegDist(p.ax, p.ay, p.bx, p.by, q.ax, q.ay, q.bx, q.by);
  if (p.k === 'seg' && q.k === 'circ') return segCircDist(p.ax, p.ay, p.bx, p.by, q.cx, q.cy, q.r);
  if (p.k === 'circ' && q.k === 'seg') return segCircDist(q.ax, q.ay, q.bx, q.by, p.cx, p.cy, p.r);
  return circCircDist(p as Extract<Prim, { k: 'circ' }>, q as Extract<Prim, { k: 'circ' }>);
}

function primBBox(p: Prim): BBox {
  if (p.k === 'seg') {
    return { xmin: Math.min(p.ax, p.bx), xmax: Math.max(p.ax, p.bx), ymin: Math.min(p.ay, p.by), ymax: Math.max(p.ay, p.by) };
  }
  return { xmin: p.cx - p.r, xmax: p.cx + p.r, ymin: p.cy - p.r, ymax: p.cy + p.r };
}

/**
 * Distance between two regions: 0 when they overlap (one inside the other counts) or
 * touch; otherwise the smallest distance between their boundaries. Distances above
 * `cutoff` may be reported as any value above `cutoff` (early exit).
 */
export function regionDistance(a: Region, b: Region, cutoff = Infinity): number {
  if (bboxGap(a.bbox, b.bbox) > cutoff) return bboxGap(a.bbox, b.bbox);
  let best = Infinity;
  const bBoxes = b.prims.map(primBBox);
  for (const p of a.prims) {
    const pb = primBBox(p);
    for (let j = 0; j < b.prims.length; j++) {
      // A circle's bounding box says nothing about the distance to something inside it.
      const q = b.prims[j]!;
      if (p.k === 'seg' && q.k === 'seg' && bboxGap(pb, bBoxes[j]!) >= best) continue;
      const d = primDist(p, q);
      if (d < best) best = d;
      if (best === 0) return 0;
    }
  }
  if (a.contains(b.anyPoint[0], b.anyPoint[1]) || b.contains(a.anyPoint[0], a.anyPoint[1])) return 0;
  return best;
}

/** Signed area (shoelace), positive counter-clockwise. */
export function polygonArea(points: readonly (readonly [number, number])[]): number {
  let a = 0;
  for (let i = 0; i < points.length; i++) {
    const p = points[i]!;
    const q = points[(i + 1) % points.length]!;
    a += p[0] * q[1] - q[0] * p[1];
  }
  return a / 2;
}

export function polygonPerimeter(points: readonly (readonly [number, number])[]): number {
  let l = 0;
  for (let i = 0; i < points.length; i++) {
    const p = points[i]!;
    const q = points[(i + 1) % points.length]!;
    l += Math.hypot(q[0] - p[0], q[1] - p[1]);
  }
  return l;
}

/**
 * First self-intersection of a closed polygon, as the two edge indices (edge i runs from
 * point i to point i+1), or null. Non-adjacent edges closer than `tol` count as
 * intersecting; adjacent edges that fold back on each other too.
 */
export function polygonSelfIntersection(points: readonly (readonly [number, number])[], tol: number): [number, number] | null {
  const n = points.length;
  if (n < 3) return null;
  const segs = polygonSegments(points) as Extract<Prim, { k: 'seg' }>[];
  const boxes = segs.map(primBBox);
  // Adjacent edges folding back (a spike): collinear and pointing in opposite directions.
  for (let i = 0; i < n; i++) {
    const s = segs[i]!;
    const t = segs[(i + 1) % n]!;
    const ux = s.bx - s.ax,
      uy = s.by - s.ay,
      vx = t.bx - t.ax,
      vy = t.by - t.ay;
    const lu = Math.hypot(ux, uy),
      lv = Math.hypot(vx, vy);
    if (lu === 0 || lv === 0) continue;
    const cross = (ux * vy - uy * vx) / (lu * lv);
    const dot = (ux * vx + uy * vy) / (lu * lv);
    if (Math.abs(cross) < 1e-12 && dot < 0) return [i, (i + 1) % n];
  }
  if (n === 3) return null;
  // Sort edges by xmin so the sweep only compares edges whose x ranges meet.
  const order = [...Array(n).keys()].sort((p, q) => boxes[p]!.xmin - boxes[q]!.xmin);
  for (let a = 0; a < n; a++) {
    const i = order[a]!;
    const bi = boxes[i]!;
    for (let b = a + 1; b < n; b++) {
      const j = order[b]!;
      const bj = boxes[j]!;
      if (bj.xmin > bi.xmax + tol) break;
      if (bj.ymin > bi.ymax + tol || bj.ymax < bi.ymin - tol) continue;
      const adjacent = j === (i + 1) % n || i === (j + 1) % n;
      if (adjacent) continue;
      const s = segs[i]!,
        t = segs[j]!;
      if (segSegDist(s.ax, s.ay, s.bx, s.by, t.ax, t.ay, t.bx, t.by) <= tol) return i < j ? [i, j] : [j, i];
    }
  }
  return null;
}

/**
 * Points inside a shape's region for sampling tests (a grid over its bounding box, kept
 * where the region contains it; a strip gives points along itself).
 */
export function samplePoints(s: ResolvedShape, region: Region, perSide = 12): [number, number][] {
  const b = region.bbox;
  const out: [number, number][] = [];
  if (s.type === 'strip') {
    for (let k = 0; k <= perSide; k++) {
      const t = k / perSide;
      out.push([s.x1 + t * (s.x2 - s.x1), s.y1 + t * (s.y2 - s.y1)]);
    }
    return out;
  }
  for (let i = 0; i < perSide; i++) {
    for (let j = 0; j < perSide; j++) {
      const x = b.xmin + ((i + 0.5) / perSide) * (b.xmax - b.xmin);
      const y = b.ymin + ((j + 0.5) / perSide) * (b.ymax - b.ymin);
      if (region.contains(x, y)) out.push([x, y]);
    }
  }
  return out;
}
