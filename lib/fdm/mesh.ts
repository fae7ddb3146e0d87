/**
 * Graded tensor-product mesh from the geometry (scaled lengths: structure size 1).
 *
 * Key lines: every rect edge, polygon vertex, strip, circle extremes and centre, and every
 * ground/mirror plane lie on mesh lines. A spacing function h(x) per axis is the minimum over
 * key lines of (h_k + (g − 1)·|x − x_k|) (geometric growth with ratio about g away from each
 * key line), capped at hStruct inside the structure box and growing at gFar beyond it. Each
 * interval between key lines gets a multiple of 2^(levels−1) cells placed by inverting
 * ∫dx/h, so the coarser members of the mesh family (every 2nd, every 4th node) are the
 * same smooth mapping with all spacings doubled: a clean family for Richardson extrapolation.
 */
import type { Geometry, MeshPreset } from './types';
import { geometryBox, type Box } from './geometry';

export interface MeshParams {
  /** Finest spacing at singular points (conductor corners, strip edges). */
  hSing: number;
  /** Spacing at dielectric corners. */
  hDiel: number;
  /** Largest spacing inside the structure box. */
  hStruct: number;
  /** Circle radius divided by the spacing along curved surfaces. */
  nCurve: number;
  /** Least number of cells across the gap between neighbouring key lines. */
  mGap: number;
  /** Growth ratio near features. */
  growth: number;
  /** Growth ratio beyond the structure box (open sides). */
  growthFar: number;
  /** Open sides carried this many structure sizes beyond the outermost shape. */
  extent: number;
}

/** Finest-member parameters of the presets, in units of the structure size. */
export const MESH_PRESET_PARAMS: Record<MeshPreset, MeshParams> = {
  quick: { hSing: 1e-2, hDiel: 4e-2, hStruct: 0.06, nCurve: 10, mGap: 6, growth: 1.25, growthFar: 1.5, extent: 60 },
  standard: { hSing: 1e-3, hDiel: 4e-3, hStruct: 0.025, nCurve: 32, mGap: 16, growth: 1.1, growthFar: 1.25, extent: 200 },
  precise: { hSing: 2.5e-4, hDiel: 1e-3, hStruct: 0.0125, nCurve: 64, mGap: 32, growth: 1.05, growthFar: 1.15, extent: 400 },
};

/** Most nodes along one axis. */
export const MAX_AXIS = 100_000;

/** Number of members in the mesh family (finest, ×2, ×4 spacing). */
export const FAMILY_LEVELS = 3;
const STEP = 1 << (FAMILY_LEVELS - 1);

export interface AxisFeature {
  /** Coordinate of the key line. */
  at: number;
  /** Spacing wanted at the key line. */
  h: number;
}

export interface MeshInput {
  conductors: Geometry[];
  dielectrics: Geometry[];
  /** Domain limits: a number where a ground/mirror plane ends the domain, undefined where open. */
  limits: { left?: number; right?: number; bottom?: number; top?: number };
  /** Structure box (conductors and planes), scaled so that its larger side is about 1. */
  structure: Box;
}

interface Point {
  x: number;
  y: number;
  /** Base spacing wanted at the point. */
  h: number;
  /** Whether the field is singular there (the base spacing is scaled by the local size). */
  singular: boolean;
  /** Size of the point's own shape near it (thickness, edge length, radius). */
  own: number;
  shape: number;
}
interface Span {
  lo: number;
  hi: number;
  h: number;
}
type Outline = { segs: number[]; circles: number[] };

function outlineOf(g: Geometry): Outline {
  const segs: number[] = [];
  const circles: number[] = [];
  switch (g.type) {
    case 'rect': {
      const x0 = g.x, y0 = g.y, x1 = g.x + g.width, y1 = g.y + g.height;
      segs.push(x0, y0, x1, y0, x1, y0, x1, y1, x1, y1, x0, y1, x0, y1, x0, y0);
      break;
    }
    case 'strip':
      segs.push(g.x1, g.y1, g.x2, g.y2);
      break;
    case 'polygon': {
      const n = g.points.length;
      for (let i = 0, j = n - 1; i < n; j = i++) segs.push(g.points[j][0], g.points[j][1], g.points[i][0], g.points[i][1]);
      break;
    }
    case 'circle':
      circles.push(g.cx, g.cy, g.r);
      break;
    case 'ring':
      circles.push(g.cx, g.cy, g.rInner, g.cx, g.cy, g.rOuter);
      break;
  }
  return { segs, circles };
}

function segDist(px: number, py: number, ax: number, ay: number, bx: number, by: number): number {
  const dx = bx - ax, dy = by - ay;
  const l2 = dx * dx + dy * dy;
  let t = l2 > 0 ? ((px - ax) * dx + (py - ay) * dy) / l2 : 0;
  t = t < 0 ? 0 : t > 1 ? 1 : t;
  return Math.hypot(ax + t * dx - px, ay + t * dy - py);
}

/** Build the finest mesh of the family; coarser members are every 2nd and 4th node. */
export function buildMesh(input: MeshInput, p: MeshParams, maxNodes = Infinity): { xs: Float64Array; ys: Float64Array } {
  const points: Point[] = [];
  const xLines: AxisFeature[] = [];
  const yLines: AxisFeature[] = [];
  const xSpans: Span[] = [];
  const ySpans: Span[] = [];
  const shapes = [...input.conductors, ...input.dielectrics];
  const outlines = shapes.map(outlineOf);

  shapes.forEach((g, si) => {
    const conductor = si < input.conductors.length;
    const hc = conductor ? p.hSing : p.hDiel;
    switch (g.type) {
      case 'rect': {
        const own = Math.min(g.width, g.height);
        for (const x of [g.x, g.x + g.width]) for (const y of [g.y, g.y + g.height]) points.push({ x, y, h: hc, singular: true, own, shape: si });
        break;
      }
      case 'strip': {
        const own = Math.abs(g.x2 - g.x1) + Math.abs(g.y2 - g.y1);
        points.push({ x: g.x1, y: g.y1, h: p.hSing, singular: true, own, shape: si }, { x: g.x2, y: g.y2, h: p.hSing, singular: true, own, shape: si });
        break;
      }
      case 'polygon': {
        const n = g.points.length;
        for (let i = 0; i < n; i++) {
          const [x, y] = g.points[i];
          const prev = g.points[(i + n - 1) % n];
          const next = g.points[(i + 1) % n];
          const own = Math.min(Math.hypot(x - prev[0], y - prev[1]), Math.hypot(x - next[0], y - next[1]));
          points.push({ x, y, h: hc, singular: true, own, shape: si });
        }
        break;
      }
      case 'circle':
      case 'ring': {
        const radii = g.type === 'circle' ? [g.r] : [g.rInner, g.rOuter];
        const own = g.type === 'circle' ? g.r : Math.min(g.rInner, g.rOuter - g.rInner);
        for (const r of radii) {
          const h = r / p.nCurve;
          for (const [x, y] of [[g.cx - r, g.cy], [g.cx + r, g.cy], [g.cx, g.cy - r], [g.cx, g.cy + r]]) {
            points.push({ x, y, h, singular: false, own, shape: si });
          }
          xSpans.push({ lo: g.cx - r, hi: g.cx + r, h });
          ySpans.push({ lo: g.cy - r, hi: g.cy + r, h });
        }
        xLines.push({ at: g.cx, h: Infinity });
        yLines.push({ at: g.cy, h: Infinity });
        break;
      }
    }
  });

  const { left, right, bottom, top } = input.limits;
  const planeLines: { axis: 0 | 1; at: number }[] = [];
  if (left !== undefined) planeLines.push({ axis: 0, at: left });
  if (right !== undefined) planeLines.push({ axis: 0, at: right });
  if (bottom !== undefined) planeLines.push({ axis: 1, at: bottom });
  if (top !== undefined) planeLines.push({ axis: 1, at: top });

  // Local sizes at each point: `gap`, the distance to every other conductor outline and plane
  // (and to its own shape's edges that do not end at the point), `gapD` the same to dielectric outlines,
  // and `own`, its own shape's size there. Singular points get spacing hSing × min(1, gap);
  // every point gets ≤ min(gap, gapD, own)/mGap, so each gap and each thin feature holds at
  // least mGap cells on the finest mesh.
  const nCond = input.conductors.length;
  for (const q of points) {
    let gap = Infinity;
    let gapD = Infinity;
    outlines.forEach((o, si) => {
      const own = si === q.shape;
      let best = Infinity;
      const sg = o.segs;
      for (let k = 0; k < sg.length; k += 4) {
        if (own && ((sg[k] === q.x && sg[k + 1] === q.y) || (sg[k + 2] === q.x && sg[k + 3] === q.y))) continue;
        const d = segDist(q.x, q.y, sg[k], sg[k + 1], sg[k + 2], sg[k + 3]);
        if (d > 1e-9 && d < best) best = d;
      }
      const c = o.circles;
      for (let k = 0; k < c.length; k += 3) {
        const d = Math.abs(Math.hypot(q.x - c[k], q.y - c[k + 1]) - c[k + 2]);
        if (d > 1e-9 && d < best) best = d;
      }
      if (si < nCond) gap = Math.min(gap, best);
      else gapD = Math.min(gapD, best);
    });
    for (const l of planeLines) {
      const d = Math.abs((l.axis === 0 ? q.x : q.y) - l.at);
      if (d > 1e-9 && d < gap) gap = d;
    }
    const own = q.own > 0 ? q.own : Infinity;
    const h = Math.min(q.singular ? q.h * Math.min(1, gap) : q.h, Math.min(gap, gapD, own) / p.mGap, p.hStruct);
    xLines.push({ at: q.x, h });
    yLines.push({ at: q.y, h });
  }
  // planes: limited by the gap to the nearest key line along their axis
  const xKeys = uniqueSorted(xLines.map((l) => l.at));
  const yKeys = uniqueSorted(yLines.map((l) => l.at));
  for (const l of planeLines) {
    const keys = l.axis === 0 ? xKeys : yKeys;
    (l.axis === 0 ? xLines : yLines).push({ at: l.at, h: Math.min(p.hStruct, localGap(keys, l.at) / p.mGap) });
  }

  // Domain: planes end it; open sides are carried extent sizes beyond every shape.
  const all = boxOf([...input.conductors, ...input.dielectrics], input.structure);
  const ext = p.extent * Math.max(input.structure.x1 - input.structure.x0, input.structure.y1 - input.structure.y0);
  const x0 = left ?? all.x0 - ext;
  const x1 = right ?? all.x1 + ext;
  const y0 = bottom ?? all.y0 - ext;
  const y1 = top ?? all.y1 + ext;
  const sx = input.structure;
  const margin = 0.3 * Math.max(sx.x1 - sx.x0, sx.y1 - sx.y0);
  // one axis beyond MAX_AXIS nodes is refused too (it stops absurd requests early)
  // Guard (robustness work): every distinct y key line inside the domain is a node of ys and
  // every interval between them gets at least STEP cells, so xs may hold at most maxNodes over
  // that many nodes (2 kept in hand for key lines merged with the domain ends); without it a
  // refused mesh with many vertices first built its whole x axis (14 s for a 2000-point polygon).
  const nyKeys = yKeys.filter((y) => y >= y0 - 1e-9 && y <= y1 + 1e-9).length;
  const xs = buildAxis(x0, x1, xLines, xSpans, sx.x0 - margin, sx.x1 + margin, p, Math.min(MAX_AXIS, Math.floor(maxNodes / Math.max(5, STEP * (nyKeys - 3)))));
  const ys = buildAxis(y0, y1, yLines, ySpans, sx.y0 - margin, sx.y1 + margin, p, Math.min(MAX_AXIS, Math.floor(maxNodes / xs.length)));
  return { xs, ys };
}

function boxOf(gs: Geometry[], start: Box): Box {
  const b = { ...start };
  for (const g of gs) {
    const q = geometryBox(g);
    b.x0 = Math.min(b.x0, q.x0);
    b.y0 = Math.min(b.y0, q.y0);
    b.x1 = Math.max(b.x1, q.x1);
    b.y1 = Math.max(b.y1, q.y1);
  }
  return b;
}

function uniqueSorted(v: number[]): number[] {
  const s = v.filter((x) => Number.isFinite(x)).sort((a, b) => a - b);
  const out: number[] = [];
  for (const x of s) if (out.length === 0 || x - out[out.length - 1] > 1e-9) out.push(x);
  return out;
}

/** Distance from key x to its nearest distinct neighbour among keys (Infinity if alone). */
function localGap(keys: number[], x: number): number {
  let best = Infinity;
  for (const k of keys) {
    const d = Math.abs(k - x);
    if (d > 1e-9 && d < best) best = d;
  }
  return best;
}

/**
 * One axis. Features with spacing h_k influence h(x) = h_k + (g−1)|x − x_k|; spans cap h
 * inside them; inside [b0, b1] h ≤ hStruct, outside it h grows at gFar from the value at b0/b1.
 */
export function buildAxis(
  lo: number,
  hi: number,
  lines: AxisFeature[],
  spans: Span[],
  b0: number,
  b1: number,
  p: MeshParams,
  maxLength = Infinity,
): Float64Array {
  const feats = lines.filter((l) => l.at >= lo - 1e-9 && l.at <= hi + 1e-9);
  const keys = uniqueSorted([lo, hi, ...feats.map((l) => l.at)]).filter((x) => x >= lo - 1e-9 && x <= hi + 1e-9);
  keys[0] = lo;
  keys[keys.length - 1] = hi;
  const slope = p.growth - 1;
  const slopeFar = p.growthFar - 1;
  const active = feats.filter((l) => Number.isFinite(l.h));
  // Key lines outside the structure box need not be fine.
  const fx = new Float64Array(active.length);
  const fh = new Float64Array(active.length);
  active.forEach((l, i) => {
    const d = l.at < b0 ? b0 - l.at : l.at > b1 ? l.at - b1 : 0;
    fx[i] = l.at;
    fh[i] = Math.max(l.h, 0.25 * slopeFar * d);
  });
  const near = (x: number): number => {
    let h = Infinity;
    for (let i = 0; i < fx.length; i++) {
      const v = fh[i] + slope * Math.abs(x - fx[i]);
      if (v < h) h = v;
    }
    for (const s of spans) {
      if (x >= s.lo && x <= s.hi && s.h < h) h = s.h;
    }
    return h;
  };
  const inner = (x: number) => Math.min(near(x), p.hStruct);
  const hb0 = inner(b0);
  const hb1 = inner(b1);
  const h = (x: number): number => {
    if (x < b0) return Math.min(hb0 + slopeFar * (b0 - x), near(x));
    if (x > b1) return Math.min(hb1 + slopeFar * (x - b1), near(x));
    return inner(x);
  };

  const out: number[] = [lo];
  const delta = 1 / 4;
  const tx: number[] = [];
  const tf: number[] = [];
  for (let k = 0; k + 1 < keys.length; k++) {
    const a = keys[k];
    const b = keys[k + 1];
    if (b - a <= 1e-12) continue;
    // march x ← x + δ·h(x) (midpoint rule) to tabulate F(x) = ∫ dx/h
    tx.length = 0;
    tf.length = 0;
    tx.push(a);
    tf.push(0);
    let x = a;
    let f = 0;
    for (let guard = 0; guard < 1_000_000; guard++) {
      const h1 = h(x);
      const hm = h(Math.min(b, x + 0.5 * delta * h1));
      const dx = delta * hm;
      if (x + dx >= b) {
        f += (b - x) / hm;
        x = b;
        tx.push(x);
        tf.push(f);
        break;
      }
      x += dx;
      f += delta;
      if (out.length + f > maxLength) throw new MeshTooLargeError();
      tx.push(x);
      tf.push(f);
    }
    const nCoarse = Math.max(1, Math.ceil(f / STEP - 1e-9));
    const n = nCoarse * STEP;
    if (out.length + n > maxLength) throw new MeshTooLargeError();
    let m = 0;
    for (let c = 1; c < n; c++) {
      const target = (c * f) / n;
      while (m + 1 < tf.length - 1 && tf[m + 1] < target) m++;
      const t = (target - tf[m]) / (tf[m + 1] - tf[m]);
      out.push(tx[m] + t * (tx[m + 1] - tx[m]));
    }
    out.push(b);
  }
  return Float64Array.from(out);
}

/** Thrown by buildMesh when the mesh would exceed its node limit (caught by solveProblem). */
export class MeshTooLargeError extends RangeError {
  constructor() {
    super('mesh too large');
    this.name = 'MeshTooLargeError';
  }
}

/** Every `step`-th entry of a finest axis (a coarser member of the family). */
export function subsampleAxis(xs: Float64Array, step: number): Float64Array {
  const n = Math.floor((xs.length - 1) / step) + 1;
  const out = new Float64Array(n);
  for (let i = 0; i < n; i++) out[i] = xs[i * step];
  return out;
}

export { STEP as FAMILY_STEP };
