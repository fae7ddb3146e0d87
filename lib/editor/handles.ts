/**
 * Handles for resizing and reshaping shapes, and the geometry a drawing drag produces.
 * World coordinates (section units, y up). Pure functions.
 */
import type { ResolvedShape } from '../section/schema';
import { shapeBox, type Pt } from './geometry';

export interface Handle {
  key: string;
  x: number;
  y: number;
}

export function handlesFor(s: ResolvedShape): Handle[] {
  switch (s.type) {
    case 'rect': {
      const b = shapeBox(s);
      const cx = (b.minX + b.maxX) / 2;
      const cy = (b.minY + b.maxY) / 2;
      return [
        { key: 'sw', x: b.minX, y: b.minY },
        { key: 's', x: cx, y: b.minY },
        { key: 'se', x: b.maxX, y: b.minY },
        { key: 'e', x: b.maxX, y: cy },
        { key: 'ne', x: b.maxX, y: b.maxY },
        { key: 'n', x: cx, y: b.maxY },
        { key: 'nw', x: b.minX, y: b.maxY },
        { key: 'w', x: b.minX, y: cy },
      ];
    }
    case 'circle':
      return [{ key: 'r', x: s.cx + s.r, y: s.cy }];
    case 'ring':
      return [
        { key: 'rOuter', x: s.cx + s.rOuter, y: s.cy },
        { key: 'rInner', x: s.cx, y: s.cy + s.rInner },
      ];
    case 'polygon':
      return s.points.map(([x, y], i) => ({ key: `p${i}`, x, y }));
    case 'strip':
      return [
        { key: 'a', x: s.x1, y: s.y1 },
        { key: 'b', x: s.x2, y: s.y2 },
      ];
  }
}

export interface GeometryPatch {
  points?: [number, number][];
  [field: string]: number | [number, number][] | undefined;
}

/** New geometry when handle `key` of shape `s` is dragged to point `p`. */
export function dragHandle(s: ResolvedShape, key: string, p: Pt): GeometryPatch {
  switch (s.type) {
    case 'rect': {
      const b = shapeBox(s);
      let { minX, minY, maxX, maxY } = b;
      if (key.includes('w')) minX = p.x;
      if (key.includes('e')) maxX = p.x;
      if (key.includes('s')) minY = p.y;
      if (key.includes('n')) maxY = p.y;
      return { x: Math.min(minX, maxX), y: Math.min(minY, maxY), width: Math.abs(maxX - minX), height: Math.abs(maxY - minY) };
    }
    case 'circle':
      return { r: Math.hypot(p.x - s.cx, p.y - s.cy) };
    case 'ring': {
      const d = Math.hypot(p.x - s.cx, p.y - s.cy);
      return key === 'rOuter' ? { rOuter: d } : { rInner: d };
    }
    case 'polygon': {
      const i = Number(key.slice(1));
      return { points: s.points.map(([x, y], j) => (j === i ? [p.x, p.y] : [x, y])) };
    }
    case 'strip': {
      const horizontal = s.y1 === s.y2 && s.x1 !== s.x2 ? true : s.x1 === s.x2 && s.y1 !== s.y2 ? false : undefined;
      const other = key === 'a' ? { x: s.x2, y: s.y2 } : { x: s.x1, y: s.y1 };
      const h = horizontal ?? Math.abs(p.x - other.x) >= Math.abs(p.y - other.y);
      const moved = h ? { x: p.x, y: other.y } : { x: other.x, y: p.y };
      return key === 'a' ? { x1: moved.x, y1: moved.y } : { x2: moved.x, y2: moved.y };
    }
  }
}

/** Apply a geometry patch to a resolved shape (for previews while dragging). */
export function applyPatch(s: ResolvedShape, g: GeometryPatch): ResolvedShape {
  if (s.type === 'polygon') return g.points ? { ...s, points: g.points } : s;
  const rest: Record<string, number> = {};
  for (const [k, v] of Object.entries(g)) if (typeof v === 'number') rest[k] = v;
  return { ...s, ...rest } as ResolvedShape;
}

export type DrawTool = 'rect' | 'circle' | 'ring' | 'strip';

/** Geometry drawn by dragging from `a` to `b` with a drawing tool (null when too small to be meant). */
export function geometryFromDrag(tool: DrawTool, a: Pt, b: Pt, minSize: number): Record<string, number> | null {
  switch (tool) {
    case 'rect': {
      const w = Math.abs(b.x - a.x);
      const h = Math.abs(b.y - a.y);
      if (w < minSize || h < minSize) return null;
      return { x: Math.min(a.x, b.x), y: Math.min(a.y, b.y), width: w, height: h };
    }
    case 'circle': {
      const r = Math.hypot(b.x - a.x, b.y - a.y);
      return r < minSize ? null : { cx: a.x, cy: a.y, r };
    }
    case 'ring': {
      const r = Math.hypot(b.x - a.x, b.y - a.y);
      return r < minSize ? null : { cx: a.x, cy: a.y, rInner: Number((r * 0.6).toPrecision(12)), rOuter: r };
    }
    case 'strip': {
      const horizontal = Math.abs(b.x - a.x) >= Math.abs(b.y - a.y);
      const len = horizontal ? Math.abs(b.x - a.x) : Math.abs(b.y - a.y);
      if (len < minSize) return null;
      return horizontal
        ? { x1: Math.min(a.x, b.x), y1: a.y, x2: Math.max(a.x, b.x), y2: a.y }
        : { x1: a.x, y1: Math.min(a.y, b.y), x2: a.x, y2: Math.max(a.y, b.y) };
    }
  }
}
