/**
 * Shape queries in scaled coordinates: bounding boxes, point-inside tests (inclusive, with a
 * small tolerance so that nodes on a surface count as inside) and key lines for the mesh.
 */
import type { Geometry } from './types';

export interface Box {
  x0: number;
  y0: number;
  x1: number;
  y1: number;
}

/** Transform a geometry by x' = (x − ox)·s, y' = (y − oy)·s. */
export function transformGeometry(g: Geometry, ox: number, oy: number, s: number): Geometry {
  const X = (x: number) => (x - ox) * s;
  const Y = (y: number) => (y - oy) * s;
  switch (g.type) {
    case 'rect': {
      // normalise negative sizes defensively (the section checker refuses them anyway)
      const x = Math.min(g.x, g.x + g.width);
      const y = Math.min(g.y, g.y + g.height);
      return { type: 'rect', x: X(x), y: Y(y), width: Math.abs(g.width) * s, height: Math.abs(g.height) * s };
    }
    case 'circle':
      return { type: 'circle', cx: X(g.cx), cy: Y(g.cy), r: g.r * s };
    case 'ring':
      return { type: 'ring', cx: X(g.cx), cy: Y(g.cy), rInner: g.rInner * s, rOuter: g.rOuter * s };
    case 'polygon':
      return { type: 'polygon', points: g.points.map(([x, y]) => [X(x), Y(y)] as [number, number]) };
    case 'strip':
      return { type: 'strip', x1: X(Math.min(g.x1, g.x2)), y1: Y(Math.min(g.y1, g.y2)), x2: X(Math.max(g.x1, g.x2)), y2: Y(Math.max(g.y1, g.y2)) };
  }
}

export function geometryBox(g: Geometry): Box {
  switch (g.type) {
    case 'rect':
      return { x0: g.x, y0: g.y, x1: g.x + g.width, y1: g.y + g.height };
    case 'circle':
      return { x0: g.cx - g.r, y0: g.cy - g.r, x1: g.cx + g.r, y1: g.cy + g.r };
    case 'ring':
      return { x0: g.cx - g.rOuter, y0: g.cy - g.rOuter, x1: g.cx + g.rOuter, y1: g.cy + g.rOuter };
    case 'polygon': {
      let x0 = Infinity, y0 = Infinity, x1 = -Infinity, y1 = -Infinity;
      for (const [x, y] of g.points) {
        if (x < x0) x0 = x;
        if (x > x1) x1 = x;
        if (y < y0) y0 = y;
        if (y > y1) y1 = y;
      }
      return { x0, y0, x1, y1 };
    }
    case 'strip':
      return { x0: Math.min(g.x1, g.x2), y0: Math.min(g.y1, g.y2), x1: Math.max(g.x1, g.x2), y1: Math.max(g.y1, g.y2) };
  }
}

/** True when (x, y) lies inside or on the shape (within tol). Strips: on the segment within tol. */
export function insideGeometry(g: Geometry, x: number, y: number, tol: number): boolean {
  switch (g.type) {
    case 'rect':
      return x >= g.x - tol && x <= g.x + g.width + tol && y >= g.y - tol && y <= g.y + g.height + tol;
    case 'circle': {
      const dx = x - g.cx, dy = y - g.cy;
      const r = g.r + tol;
      return dx * dx + dy * dy <= r * r;
    }
    case 'ring': {
      const dx = x - g.cx, dy = y - g.cy;
      const d2 = dx * dx + dy * dy;
      const ro = g.rOuter + tol;
      const ri = Math.max(0, g.rInner - tol);
      return d2 <= ro * ro && d2 >= ri * ri;
    }
    case 'strip': {
      const x0 = Math.min(g.x1, g.x2) - tol, x1 = Math.max(g.x1, g.x2) + tol;
      const y0 = Math.min(g.y1, g.y2) - tol, y1 = Math.max(g.y1, g.y2) + tol;
      return x >= x0 && x <= x1 && y >= y0 && y <= y1;
    }
    case 'polygon':
      return insidePolygon(g.points, x, y) || nearPolygonEdge(g.points, x, y, tol);
  }
}

/** Even–odd point-in-polygon test (boundary points may go either way; see nearPolygonEdge). */
export function insidePolygon(pts: [number, number][], x: number, y: number): boolean {
  let inside = false;
  const n = pts.length;
  for (let i = 0, j = n - 1; i < n; j = i++) {
    const xi = pts[i][0], yi = pts[i][1], xj = pts[j][0], yj = pts[j][1];
    if (yi > y !== yj > y) {
      const xc = xi + ((y - yi) * (xj - xi)) / (yj - yi);
      if (x < xc) inside = !inside;
    }
  }
  return inside;
}

function nearPolygonEdge(pts: [number, number][], x: number, y: number, tol: number): boolean {
  const n = pts.length;
  const t2 = tol * tol;
  for (let i = 0, j = n - 1; i < n; j = i++) {
    const ax = pts[j][0], ay = pts[j][1], bx = pts[i][0], by = pts[i][1];
    const dx = bx - ax, dy = by - ay;
    const l2 = dx * dx + dy * dy;
    let t = l2 > 0 ? ((x - ax) * dx + (y - ay) * dy) / l2 : 0;
    t = t < 0 ? 0 : t > 1 ? 1 : t;
    const px = ax + t * dx - x, py = ay + t * dy - y;
    if (px * px + py * py <= t2) return true;
  }
  return false;
}

/** Is the shape's outline made only of axis-aligned segments lying on its key lines? */
export function isAxisAligned(g: Geometry): boolean {
  if (g.type === 'rect' || g.type === 'strip') return true;
  if (g.type === 'polygon') {
    const n = g.points.length;
    for (let i = 0, j = n - 1; i < n; j = i++) {
      if (g.points[i][0] !== g.points[j][0] && g.points[i][1] !== g.points[j][1]) return false;
    }
    return true;
  }
  return false;
}

/**
 * Does the outline of the shape pass through the open cell [x0,x1]×[y0,y1]? Used to find
 * cells that need sub-cell sampling of the permittivity. Conservative (may say yes).
 */
export function outlineCrossesCell(g: Geometry, x0: number, y0: number, x1: number, y1: number): boolean {
  switch (g.type) {
    case 'rect':
    case 'strip':
      return false; // edges lie on mesh lines
    case 'circle':
      return circleCrosses(g.cx, g.cy, g.r, x0, y0, x1, y1);
    case 'ring':
      return circleCrosses(g.cx, g.cy, g.rInner, x0, y0, x1, y1) || circleCrosses(g.cx, g.cy, g.rOuter, x0, y0, x1, y1);
    case 'polygon': {
      const pts = g.points;
      const n = pts.length;
      for (let i = 0, j = n - 1; i < n; j = i++) {
        if (segmentCrossesCell(pts[j][0], pts[j][1], pts[i][0], pts[i][1], x0, y0, x1, y1)) return true;
      }
      return false;
    }
  }
}

function circleCrosses(cx: number, cy: number, r: number, x0: number, y0: number, x1: number, y1: number): boolean {
  const nx = Math.max(x0, Math.min(cx, x1)) - cx;
  const ny = Math.max(y0, Math.min(cy, y1)) - cy;
  const dmin2 = nx * nx + ny * ny;
  const fx = Math.max(Math.abs(x0 - cx), Math.abs(x1 - cx));
  const fy = Math.max(Math.abs(y0 - cy), Math.abs(y1 - cy));
  const dmax2 = fx * fx + fy * fy;
  return dmin2 < r * r && dmax2 > r * r;
}

/** Does segment (ax,ay)-(bx,by) pass through the open interior of the cell? (Liang–Barsky clipping.) */
function segmentCrossesCell(ax: number, ay: number, bx: number, by: number, x0: number, y0: number, x1: number, y1: number): boolean {
  const dx = bx - ax, dy = by - ay;
  // axis-aligned segments on mesh lines never cut cells
  if (dx === 0 || dy === 0) return false;
  let t0 = 0, t1 = 1;
  const p = [-dx, dx, -dy, dy];
  const q = [ax - x0, x1 - ax, ay - y0, y1 - ay];
  for (let k = 0; k < 4; k++) {
    if (p[k] === 0) {
      if (q[k] <= 0) return false;
    } else {
      const t = q[k] / p[k];
      if (p[k] < 0) {
        if (t > t1) return false;
        if (t > t0) t0 = t;
      } else {
        if (t < t0) return false;
        if (t < t1) t1 = t;
      }
    }
  }
  return t1 - t0 > 1e-12;
}
