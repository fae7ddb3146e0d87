/**
 * Small geometry helpers for the drawing readers: 2D affine transforms, curve flattening,
 * polygon clean-up and bounding boxes. Plain functions over plain arrays.
 */
import { CURVE_SEGMENTS, type ImportedShape } from './types';

/** Affine transform [a, b, c, d, e, f]: x' = a x + c y + e, y' = b x + d y + f (SVG's order). */
export type Affine = [number, number, number, number, number, number];

export const IDENTITY: Affine = [1, 0, 0, 1, 0, 0];

export function multiply(m: Affine, n: Affine): Affine {
  return [
    m[0] * n[0] + m[2] * n[1],
    m[1] * n[0] + m[3] * n[1],
    m[0] * n[2] + m[2] * n[3],
    m[1] * n[2] + m[3] * n[3],
    m[0] * n[4] + m[2] * n[5] + m[4],
    m[1] * n[4] + m[3] * n[5] + m[5],
  ];
}

export function apply(m: Affine, x: number, y: number): [number, number] {
  return [m[0] * x + m[2] * y + m[4], m[1] * x + m[3] * y + m[5]];
}

/** True when the transform is a translation with a uniform scale (no rotation, skew or mirror). */
export function isScaleTranslate(m: Affine, eps = 1e-12): boolean {
  return Math.abs(m[1]) <= eps && Math.abs(m[2]) <= eps && m[0] > 0 && Math.abs(m[0] - m[3]) <= eps * Math.max(1, m[0]);
}

/** True when the transform is a similarity (rotation, mirror, uniform scale, translation). */
export function isSimilarity(m: Affine, eps = 1e-9): boolean {
  const sx = Math.hypot(m[0], m[1]);
  const sy = Math.hypot(m[2], m[3]);
  const dot = m[0] * m[2] + m[1] * m[3];
  return sx > 0 && Math.abs(sx - sy) <= eps * sx && Math.abs(dot) <= eps * sx * sy;
}

/** True when the transform keeps axis-aligned rectangles axis-aligned (no rotation or skew). */
export function isAxisAligned(m: Affine, eps = 1e-12): boolean {
  return Math.abs(m[1]) <= eps && Math.abs(m[2]) <= eps;
}

/** Segments for an arc of `sweep` radians (at least 2). */
export function arcSegments(sweep: number): number {
  return Math.max(4, Math.ceil((Math.abs(sweep) / (2 * Math.PI)) * CURVE_SEGMENTS));
}

/** Points along an ellipse arc (centre, radii, x-axis rotation φ, start angle, sweep), excluding the start point. */
export function ellipseArcPoints(cx: number, cy: number, rx: number, ry: number, phi: number, t0: number, dt: number): [number, number][] {
  const n = arcSegments(dt);
  const cos = Math.cos(phi);
  const sin = Math.sin(phi);
  const out: [number, number][] = [];
  for (let k = 1; k <= n; k++) {
    const t = t0 + (dt * k) / n;
    const ex = rx * Math.cos(t);
    const ey = ry * Math.sin(t);
    out.push([cx + cos * ex - sin * ey, cy + sin * ex + cos * ey]);
  }
  return out;
}

/** Cubic Bézier from p0 through control points to p3, excluding p0. */
export function cubicPoints(p0: [number, number], p1: [number, number], p2: [number, number], p3: [number, number]): [number, number][] {
  const len = Math.hypot(p1[0] - p0[0], p1[1] - p0[1]) + Math.hypot(p2[0] - p1[0], p2[1] - p1[1]) + Math.hypot(p3[0] - p2[0], p3[1] - p2[1]);
  const chord = Math.hypot(p3[0] - p0[0], p3[1] - p0[1]);
  const n = len <= 0 ? 1 : Math.min(64, Math.max(4, Math.ceil((CURVE_SEGMENTS / 4) * Math.sqrt(len / Math.max(chord, len * 1e-3)))));
  const out: [number, number][] = [];
  for (let k = 1; k <= n; k++) {
    const t = k / n;
    const u = 1 - t;
    const a = u * u * u;
    const b = 3 * u * u * t;
    const c = 3 * u * t * t;
    const d = t * t * t;
    out.push([a * p0[0] + b * p1[0] + c * p2[0] + d * p3[0], a * p0[1] + b * p1[1] + c * p2[1] + d * p3[1]]);
  }
  return out;
}

/** Quadratic Bézier as a cubic. */
export function quadPoints(p0: [number, number], q: [number, number], p2: [number, number]): [number, number][] {
  const c1: [number, number] = [p0[0] + (2 / 3) * (q[0] - p0[0]), p0[1] + (2 / 3) * (q[1] - p0[1])];
  const c2: [number, number] = [p2[0] + (2 / 3) * (q[0] - p2[0]), p2[1] + (2 / 3) * (q[1] - p2[1])];
  return cubicPoints(p0, c1, c2, p2);
}

/**
 * SVG elliptical arc (endpoint parameterisation) to points, excluding the start point.
 * Conversion to centre form as in the SVG 1.1 specification, appendix F.6 (W3C, 2011).
 */
export function svgArcPoints(
  p0: [number, number],
  rxIn: number,
  ryIn: number,
  angleDeg: number,
  largeArc: boolean,
  sweep: boolean,
  p1: [number, number],
): [number, number][] {
  let rx = Math.abs(rxIn);
  let ry = Math.abs(ryIn);
  if (rx === 0 || ry === 0 || (p0[0] === p1[0] && p0[1] === p1[1])) return [p1];
  const phi = (angleDeg * Math.PI) / 180;
  const cos = Math.cos(phi);
  const sin = Math.sin(phi);
  const dx = (p0[0] - p1[0]) / 2;
  const dy = (p0[1] - p1[1]) / 2;
  const x1 = cos * dx + sin * dy;
  const y1 = -sin * dx + cos * dy;
  const lambda = (x1 * x1) / (rx * rx) + (y1 * y1) / (ry * ry);
  if (lambda > 1) {
    const s = Math.sqrt(lambda);
    rx *= s;
    ry *= s;
  }
  const num = rx * rx * ry * ry - rx * rx * y1 * y1 - ry * ry * x1 * x1;
  const den = rx * rx * y1 * y1 + ry * ry * x1 * x1;
  let co = Math.sqrt(Math.max(0, num / den));
  if (largeArc === sweep) co = -co;
  const cxp = (co * rx * y1) / ry;
  const cyp = (-co * ry * x1) / rx;
  const cx = cos * cxp - sin * cyp + (p0[0] + p1[0]) / 2;
  const cy = sin * cxp + cos * cyp + (p0[1] + p1[1]) / 2;
  const ang = (ux: number, uy: number, vx: number, vy: number) => Math.atan2(ux * vy - uy * vx, ux * vx + uy * vy);
  const t0 = ang(1, 0, (x1 - cxp) / rx, (y1 - cyp) / ry);
  let dt = ang((x1 - cxp) / rx, (y1 - cyp) / ry, (-x1 - cxp) / rx, (-y1 - cyp) / ry);
  if (!sweep && dt > 0) dt -= 2 * Math.PI;
  else if (sweep && dt < 0) dt += 2 * Math.PI;
  const pts = ellipseArcPoints(cx, cy, rx, ry, phi, t0, dt);
  pts[pts.length - 1] = p1; // exact end point
  return pts;
}

/**
 * Points along a DXF polyline segment with a bulge (tan of a quarter of the included angle,
 * positive counter-clockwise), excluding the start point.
 */
export function bulgePoints(p0: [number, number], p1: [number, number], bulge: number): [number, number][] {
  if (!bulge || !Number.isFinite(bulge)) return [p1];
  const theta = 4 * Math.atan(bulge);
  const chord = Math.hypot(p1[0] - p0[0], p1[1] - p0[1]);
  if (chord === 0) return [p1];
  const r = chord / (2 * Math.sin(Math.abs(theta) / 2));
  const mx = (p0[0] + p1[0]) / 2;
  const my = (p0[1] + p1[1]) / 2;
  // The centre lies on the chord's perpendicular bisector, left of the chord for a
  // counter-clockwise (positive) bulge under a half turn, right of it for a clockwise one.
  const nx = -(p1[1] - p0[1]) / chord;
  const ny = (p1[0] - p0[0]) / chord;
  const h = Math.sign(bulge) * r * Math.cos(Math.abs(theta) / 2);
  const cx = mx + nx * h;
  const cy = my + ny * h;
  const a0 = Math.atan2(p0[1] - cy, p0[0] - cx);
  const pts = ellipseArcPoints(cx, cy, r, r, 0, a0, theta);
  pts[pts.length - 1] = p1;
  return pts;
}

/** Remove repeated points and a closing point equal to the first. */
export function cleanRing(points: [number, number][], eps: number): [number, number][] {
  const out: [number, number][] = [];
  for (const p of points) {
    const last = out[out.length - 1];
    if (!last || Math.abs(last[0] - p[0]) > eps || Math.abs(last[1] - p[1]) > eps) out.push(p);
  }
  while (out.length > 1) {
    const a = out[0]!;
    const b = out[out.length - 1]!;
    if (Math.abs(a[0] - b[0]) <= eps && Math.abs(a[1] - b[1]) <= eps) out.pop();
    else break;
  }
  return out;
}

/** Signed area (positive counter-clockwise). */
export function signedArea(points: readonly [number, number][]): number {
  let a = 0;
  for (let i = 0; i < points.length; i++) {
    const p = points[i]!;
    const q = points[(i + 1) % points.length]!;
    a += p[0] * q[1] - q[0] * p[1];
  }
  return a / 2;
}

/** If the 4-point ring is an axis-aligned rectangle, return it. */
export function asAxisRect(points: readonly [number, number][], eps: number): { x: number; y: number; width: number; height: number } | null {
  if (points.length !== 4) return null;
  let horizontal = 0;
  for (let i = 0; i < 4; i++) {
    const p = points[i]!;
    const q = points[(i + 1) % 4]!;
    const h = Math.abs(p[1] - q[1]) <= eps;
    const v = Math.abs(p[0] - q[0]) <= eps;
    if (h === v) return null; // slanted, or a zero-length edge
    if (h) horizontal++;
  }
  if (horizontal !== 2) return null;
  const x0 = Math.min(...points.map((p) => p[0]));
  const x1 = Math.max(...points.map((p) => p[0]));
  const y0 = Math.min(...points.map((p) => p[1]));
  const y1 = Math.max(...points.map((p) => p[1]));
  return { x: x0, y: y0, width: x1 - x0, height: y1 - y0 };
}

export function shapesBBox(shapes: readonly ImportedShape[]) {
  let xmin = Infinity;
  let ymin = Infinity;
  let xmax = -Infinity;
  let ymax = -Infinity;
  const add = (x: number, y: number) => {
    if (x < xmin) xmin = x;
    if (x > xmax) xmax = x;
    if (y < ymin) ymin = y;
    if (y > ymax) ymax = y;
  };
  for (const s of shapes) {
    if (s.type === 'rect') {
      add(s.x, s.y);
      add(s.x + s.width, s.y + s.height);
    } else if (s.type === 'circle') {
      add(s.cx - s.r, s.cy - s.r);
      add(s.cx + s.r, s.cy + s.r);
    } else for (const p of s.points) add(p[0], p[1]);
  }
  return Number.isFinite(xmin) ? { xmin, ymin, xmax, ymax } : null;
}

export function summariseLayers(shapes: readonly ImportedShape[]) {
  const m = new Map<string, number>();
  for (const s of shapes) m.set(s.layer, (m.get(s.layer) ?? 0) + 1);
  return [...m.entries()].map(([name, n]) => ({ name, shapes: n })).sort((a, b) => a.name.localeCompare(b.name));
}
