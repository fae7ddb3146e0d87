/**
 * Geometry of resolved shapes for the editor: bounding boxes, snap anchors, hit-testing
 * and box selection. Pure functions over plain data; coordinates in section units, y up.
 */
import type { ResolvedShape } from '../section/schema';

export interface Pt {
  x: number;
  y: number;
}
export interface Box {
  minX: number;
  minY: number;
  maxX: number;
  maxY: number;
}

export const EMPTY_BOX: Box = { minX: Infinity, minY: Infinity, maxX: -Infinity, maxY: -Infinity };

export function isEmptyBox(b: Box): boolean {
  return !(b.maxX >= b.minX && b.maxY >= b.minY);
}

export function unionBox(a: Box, b: Box): Box {
  return {
    minX: Math.min(a.minX, b.minX),
    minY: Math.min(a.minY, b.minY),
    maxX: Math.max(a.maxX, b.maxX),
    maxY: Math.max(a.maxY, b.maxY),
  };
}

export function boxFromPoints(a: Pt, b: Pt): Box {
  return { minX: Math.min(a.x, b.x), minY: Math.min(a.y, b.y), maxX: Math.max(a.x, b.x), maxY: Math.max(a.y, b.y) };
}

/** Axis-aligned bounding box of one shape. */
export function shapeBox(s: ResolvedShape): Box {
  switch (s.type) {
    case 'rect': {
      const x2 = s.x + s.width;
      const y2 = s.y + s.height;
      return { minX: Math.min(s.x, x2), minY: Math.min(s.y, y2), maxX: Math.max(s.x, x2), maxY: Math.max(s.y, y2) };
    }
    case 'circle':
      return { minX: s.cx - Math.abs(s.r), minY: s.cy - Math.abs(s.r), maxX: s.cx + Math.abs(s.r), maxY: s.cy + Math.abs(s.r) };
    case 'ring': {
      const r = Math.max(Math.abs(s.rOuter), Math.abs(s.rInner));
      return { minX: s.cx - r, minY: s.cy - r, maxX: s.cx + r, maxY: s.cy + r };
    }
    case 'polygon': {
      let b = EMPTY_BOX;
      for (const [x, y] of s.points) b = unionBox(b, { minX: x, minY: y, maxX: x, maxY: y });
      return b;
    }
    case 'strip':
      return boxFromPoints({ x: s.x1, y: s.y1 }, { x: s.x2, y: s.y2 });
  }
}

export function boxOfShapes(shapes: readonly ResolvedShape[]): Box {
  let b = EMPTY_BOX;
  for (const s of shapes) b = unionBox(b, shapeBox(s));
  return b;
}

export function boxCentre(b: Box): Pt {
  return { x: (b.minX + b.maxX) / 2, y: (b.minY + b.maxY) / 2 };
}

export function boxesIntersect(a: Box, b: Box): boolean {
  return a.minX <= b.maxX && b.minX <= a.maxX && a.minY <= b.maxY && b.minY <= a.maxY;
}

export function boxContains(outer: Box, inner: Box): boolean {
  return inner.minX >= outer.minX && inner.maxX <= outer.maxX && inner.minY >= outer.minY && inner.maxY <= outer.maxY;
}

export type AnchorKind = 'edge' | 'corner' | 'centre';
export interface Anchor {
  x: number;
  y: number;
  kind: AnchorKind;
}

/** Points another shape may snap to: corners, edge midpoints, centre, polygon vertices, strip ends. */
export function shapeAnchors(s: ResolvedShape): Anchor[] {
  switch (s.type) {
    case 'rect': {
      const b = shapeBox(s);
      const c = boxCentre(b);
      return [
        { x: b.minX, y: b.minY, kind: 'corner' },
        { x: b.maxX, y: b.minY, kind: 'corner' },
        { x: b.maxX, y: b.maxY, kind: 'corner' },
        { x: b.minX, y: b.maxY, kind: 'corner' },
        { x: c.x, y: b.minY, kind: 'edge' },
        { x: c.x, y: b.maxY, kind: 'edge' },
        { x: b.minX, y: c.y, kind: 'edge' },
        { x: b.maxX, y: c.y, kind: 'edge' },
        { x: c.x, y: c.y, kind: 'centre' },
      ];
    }
    case 'circle':
    case 'ring': {
      const r = s.type === 'circle' ? s.r : s.rOuter;
      const out: Anchor[] = [
        { x: s.cx, y: s.cy, kind: 'centre' },
        { x: s.cx - r, y: s.cy, kind: 'edge' },
        { x: s.cx + r, y: s.cy, kind: 'edge' },
        { x: s.cx, y: s.cy - r, kind: 'edge' },
        { x: s.cx, y: s.cy + r, kind: 'edge' },
      ];
      if (s.type === 'ring') {
        out.push(
          { x: s.cx - s.rInner, y: s.cy, kind: 'edge' },
          { x: s.cx + s.rInner, y: s.cy, kind: 'edge' },
          { x: s.cx, y: s.cy - s.rInner, kind: 'edge' },
          { x: s.cx, y: s.cy + s.rInner, kind: 'edge' },
        );
      }
      return out;
    }
    case 'polygon': {
      const out: Anchor[] = s.points.map(([x, y]) => ({ x, y, kind: 'corner' as const }));
      const c = boxCentre(shapeBox(s));
      out.push({ ...c, kind: 'centre' });
      return out;
    }
    case 'strip':
      return [
        { x: s.x1, y: s.y1, kind: 'corner' },
        { x: s.x2, y: s.y2, kind: 'corner' },
        { x: (s.x1 + s.x2) / 2, y: (s.y1 + s.y2) / 2, kind: 'centre' },
      ];
  }
}

export function distToSegment(p: Pt, a: Pt, b: Pt): number {
  const dx = b.x - a.x;
  const dy = b.y - a.y;
  const len2 = dx * dx + dy * dy;
  let t = len2 > 0 ? ((p.x - a.x) * dx + (p.y - a.y) * dy) / len2 : 0;
  t = Math.max(0, Math.min(1, t));
  return Math.hypot(p.x - (a.x + t * dx), p.y - (a.y + t * dy));
}

export function pointInPolygon(p: Pt, pts: readonly (readonly [number, number])[]): boolean {
  let inside = false;
  for (let i = 0, j = pts.length - 1; i < pts.length; j = i++) {
    const [xi, yi] = pts[i]!;
    const [xj, yj] = pts[j]!;
    if (yi > p.y !== yj > p.y && p.x < ((xj - xi) * (p.y - yi)) / (yj - yi) + xi) inside = !inside;
  }
  return inside;
}

/** Does the point hit the shape? `tol` (section units) widens outlines: thin strips and ring edges stay clickable. */
export function hitShape(s: ResolvedShape, p: Pt, tol: number): boolean {
  switch (s.type) {
    case 'rect': {
      const b = shapeBox(s);
      return p.x >= b.minX - tol && p.x <= b.maxX + tol && p.y >= b.minY - tol && p.y <= b.maxY + tol;
    }
    case 'circle':
      return Math.hypot(p.x - s.cx, p.y - s.cy) <= Math.abs(s.r) + tol;
    case 'ring': {
      const d = Math.hypot(p.x - s.cx, p.y - s.cy);
      return d <= Math.abs(s.rOuter) + tol && d >= Math.abs(s.rInner) - tol;
    }
    case 'polygon': {
      if (pointInPolygon(p, s.points)) return true;
      const n = s.points.length;
      for (let i = 0; i < n; i++) {
        const [ax, ay] = s.points[i]!;
        const [bx, by] = s.points[(i + 1) % n]!;
        if (distToSegment(p, { x: ax, y: ay }, { x: bx, y: by }) <= tol) return true;
      }
      return false;
    }
    case 'strip':
      return distToSegment(p, { x: s.x1, y: s.y1 }, { x: s.x2, y: s.y2 }) <= tol;
  }
}

/**
 * The shape under a point, as drawn: conductors cover dielectrics, and later shapes cover
 * earlier ones within each kind. Returns the index into `shapes`, or -1.
 */
export function hitTest(shapes: readonly ResolvedShape[], p: Pt, tol: number, hidden?: { conductors?: boolean; dielectrics?: boolean }): number {
  if (!hidden?.conductors) {
    for (let i = shapes.length - 1; i >= 0; i--) {
      const s = shapes[i]!;
      if (s.conductor !== undefined && hitShape(s, p, tol)) return i;
    }
  }
  if (!hidden?.dielectrics) {
    for (let i = shapes.length - 1; i >= 0; i--) {
      const s = shapes[i]!;
      if (s.conductor === undefined && hitShape(s, p, 0)) return i;
    }
  }
  return -1;
}

/** Ids of shapes whose bounding box lies entirely inside `box` (a drag-select rectangle). */
export function shapesInBox(shapes: readonly ResolvedShape[], box: Box): string[] {
  return shapes.filter((s) => boxContains(box, shapeBox(s))).map((s) => s.id);
}
