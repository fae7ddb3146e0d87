/**
 * Read conductor/dielectric outlines from a DXF drawing (ASCII), parsed with the
 * well-known `dxf-parser` package.
 *
 * Understood entities: CIRCLE (a circle), closed LWPOLYLINE / POLYLINE (a polygon, or a
 * rectangle when it is an axis-aligned box; bulges flattened to arcs), and LINE, ARC and
 * open polylines, which are joined end to end into closed outlines (an outline that does
 * not close is skipped with a warning). ELLIPSE becomes a polygon with a warning. Layers are
 * the entities' layers. $INSUNITS, when set, suggests the units. Blocks (INSERT), text,
 * dimensions and hatches are skipped with a warning.
 */
import DxfParser from 'dxf-parser';
import { asAxisRect, bulgePoints, cleanRing, ellipseArcPoints, shapesBBox, summariseLayers } from './geometry';
import { CURVE_SEGMENTS, ImportError, type ImportedDrawing, type ImportedShape } from './types';

type Pt = [number, number];

interface Vertex {
  x: number;
  y: number;
  bulge?: number;
}
interface DxfEntity {
  type: string;
  layer?: string;
  handle?: string;
  vertices?: Vertex[];
  shape?: boolean;
  center?: { x: number; y: number };
  radius?: number;
  startAngle?: number;
  endAngle?: number;
  majorAxisEndPoint?: { x: number; y: number };
  axisRatio?: number;
}

/** $INSUNITS codes (DXF reference, header section) that a section can use directly. */
const INSUNITS: Record<number, ImportedDrawing['declaredUnits']> = { 1: 'in', 4: 'mm', 6: 'm', 9: 'mil', 13: 'um' };

function finitePt(v: { x: number; y: number } | undefined, where: string): Pt {
  if (!v || !Number.isFinite(v.x) || !Number.isFinite(v.y)) throw new ImportError(`${where}: a coordinate is missing or not a number.`);
  return [v.x, v.y];
}

/** Polyline vertices (with bulges) to points; `closed` adds the closing segment's bulge. */
function polylinePoints(vs: Vertex[], closed: boolean, where: string): Pt[] {
  const pts: Pt[] = [];
  for (let k = 0; k < vs.length; k++) {
    const p = finitePt(vs[k], where);
    if (k === 0) pts.push(p);
    else pts.push(...bulgePoints(finitePt(vs[k - 1], where), p, vs[k - 1]!.bulge ?? 0));
  }
  if (closed && vs.length > 1) {
    const last = vs[vs.length - 1]!;
    if (last.bulge) pts.push(...bulgePoints(finitePt(last, where), finitePt(vs[0], where), last.bulge));
  }
  return pts;
}

/** Join open pieces end to end into closed rings (per layer). */
function chain(pieces: Pt[][], eps: number): { rings: Pt[][]; open: number } {
  const left = pieces.map((p) => [...p]);
  const rings: Pt[][] = [];
  let open = 0;
  const same = (a: Pt, b: Pt) => Math.abs(a[0] - b[0]) <= eps && Math.abs(a[1] - b[1]) <= eps;
  while (left.length) {
    let cur = left.pop()!;
    let grew = true;
    while (grew && !same(cur[0]!, cur[cur.length - 1]!)) {
      grew = false;
      const end = cur[cur.length - 1]!;
      for (let k = 0; k < left.length; k++) {
        const p = left[k]!;
        if (same(p[0]!, end)) cur = cur.concat(p.slice(1));
        else if (same(p[p.length - 1]!, end)) cur = cur.concat([...p].reverse().slice(1));
        else continue;
        left.splice(k, 1);
        grew = true;
        break;
      }
    }
    if (cur.length >= 4 && same(cur[0]!, cur[cur.length - 1]!)) rings.push(cur);
    else open++;
  }
  return { rings, open };
}

/** Read a DXF document. Throws ImportError with a sentence naming the problem. */
export function readDxf(text: string): ImportedDrawing {
  if (!/(^|\n)\s*0\s*\r?\n\s*SECTION\b/.test(text)) {
    throw new ImportError('This is not a DXF drawing (ASCII): no SECTION was found. Binary DXF is not supported; save as ASCII DXF.');
  }
  let dxf: { header?: Record<string, unknown>; entities?: DxfEntity[] } | null;
  try {
    dxf = new DxfParser().parseSync(text) as typeof dxf;
  } catch (e) {
    throw new ImportError(`The DXF could not be read: ${e instanceof Error ? e.message : String(e)}.`);
  }
  if (!dxf || !Array.isArray(dxf.entities)) throw new ImportError('The DXF has no ENTITIES section.');
  const shapes: ImportedShape[] = [];
  const warnings: string[] = [];
  const skipped = new Map<string, number>();
  const pieces = new Map<string, Pt[][]>();
  let xmin = Infinity;
  let xmax = -Infinity;
  const seeX = (x: number) => {
    if (x < xmin) xmin = x;
    if (x > xmax) xmax = x;
  };
  const addPiece = (layer: string, p: Pt[]) => {
    const list = pieces.get(layer) ?? [];
    list.push(p);
    pieces.set(layer, list);
    p.forEach((q) => seeX(q[0]));
  };
  const pushRing = (layer: string, source: string, pts: Pt[]) => {
    const scale = Math.max(...pts.map((q) => Math.max(Math.abs(q[0]), Math.abs(q[1]))), 1e-300);
    const ring = cleanRing(pts, scale * 1e-12);
    if (ring.length < 3) {
      warnings.push(`${source}: fewer than 3 distinct points, skipped.`);
      return;
    }
    ring.forEach((q) => seeX(q[0]));
    const size = Math.max(...ring.map((p) => Math.abs(p[0])), ...ring.map((p) => Math.abs(p[1])), 1e-300);
    const rect = asAxisRect(ring, size * 1e-12);
    if (rect) shapes.push({ type: 'rect', layer, source, ...rect });
    else shapes.push({ type: 'polygon', layer, source, points: ring });
  };

  dxf.entities.forEach((e, idx) => {
    const layer = e.layer ?? '0';
    const source = `DXF ${e.type} ${e.handle ? `(handle ${e.handle})` : `number ${idx + 1}`} on layer "${layer}"`;
    switch (e.type) {
      case 'CIRCLE': {
        const c = finitePt(e.center, source);
        if (!(Number(e.radius) > 0)) {
          warnings.push(`${source}: radius is not positive, skipped.`);
          return;
        }
        shapes.push({ type: 'circle', layer, source, cx: c[0], cy: c[1], r: e.radius! });
        seeX(c[0] - e.radius!);
        seeX(c[0] + e.radius!);
        return;
      }
      case 'LWPOLYLINE':
      case 'POLYLINE': {
        const vs = e.vertices ?? [];
        if (vs.length < 2) {
          warnings.push(`${source}: fewer than 2 vertices, skipped.`);
          return;
        }
        const pts = polylinePoints(vs, Boolean(e.shape), source);
        if (e.shape) pushRing(layer, source, pts);
        else addPiece(layer, pts);
        return;
      }
      case 'LINE': {
        const vs = e.vertices ?? [];
        addPiece(layer, [finitePt(vs[0], source), finitePt(vs[1], source)]);
        return;
      }
      case 'ARC': {
        const c = finitePt(e.center, source);
        const r = Number(e.radius);
        if (!(r > 0)) {
          warnings.push(`${source}: radius is not positive, skipped.`);
          return;
        }
        const a0 = e.startAngle ?? 0;
        let sweep = (e.endAngle ?? 0) - a0;
        while (sweep <= 0) sweep += 2 * Math.PI; // DXF arcs run counter-clockwise
        const start: Pt = [c[0] + r * Math.cos(a0), c[1] + r * Math.sin(a0)];
        addPiece(layer, [start, ...ellipseArcPoints(c[0], c[1], r, r, 0, a0, sweep)]);
        return;
      }
      case 'ELLIPSE': {
        const c = finitePt(e.center, source);
        const major = finitePt(e.majorAxisEndPoint, source);
        const a = Math.hypot(major[0], major[1]);
        const b = a * Number(e.axisRatio ?? 1);
        if (!(a > 0) || !(b > 0)) {
          warnings.push(`${source}: axes are not positive, skipped.`);
          return;
        }
        const phi = Math.atan2(major[1], major[0]);
        const a0 = e.startAngle ?? 0;
        let sweep = (e.endAngle ?? 2 * Math.PI) - a0;
        while (sweep <= 0) sweep += 2 * Math.PI;
        const first: Pt = [c[0] + a * Math.cos(phi) * Math.cos(a0) - b * Math.sin(phi) * Math.sin(a0), c[1] + a * Math.sin(phi) * Math.cos(a0) + b * Math.cos(phi) * Math.sin(a0)];
        const pts: Pt[] = [first, ...ellipseArcPoints(c[0], c[1], a, b, phi, a0, sweep)];
        if (Math.abs(sweep - 2 * Math.PI) < 1e-9) {
          warnings.push(`${source}: an ellipse is not a section shape; it became a polygon of ${CURVE_SEGMENTS} points.`);
          pushRing(layer, source, pts);
        } else addPiece(layer, pts);
        return;
      }
      default:
        skipped.set(e.type, (skipped.get(e.type) ?? 0) + 1);
    }
  });

  const span = Number.isFinite(xmin) ? Math.max(xmax - xmin, 1e-300) : 1;
  for (const [layer, list] of pieces) {
    const { rings, open } = chain(list, span * 1e-9);
    rings.forEach((r, k) => pushRing(layer, `Outline ${k + 1} joined from lines and arcs on layer "${layer}"`, r));
    if (open) warnings.push(`Layer "${layer}": ${open} chain${open === 1 ? '' : 's'} of lines/arcs did not close into an outline and ${open === 1 ? 'was' : 'were'} skipped.`);
  }
  for (const [type, n] of skipped) warnings.push(`${n} ${type} entit${n === 1 ? 'y was' : 'ies were'} skipped (not an outline).`);
  if (shapes.length === 0) throw new ImportError('The DXF has no closed outlines to import (CIRCLE, closed polylines, or LINE/ARC chains that close).');
  const code = Number(dxf.header?.$INSUNITS);
  return { kind: 'dxf', shapes, layers: summariseLayers(shapes), warnings, declaredUnits: INSUNITS[code], bbox: shapesBBox(shapes) };
}
