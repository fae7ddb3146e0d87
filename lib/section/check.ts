/**
 * Checks on a resolved section: everything that would make a solve meaningless or
 * impossible (errors) and things that are probably a slip (warnings). Every message
 * names the shape, net or material concerned, and `shapeIds` lets the editor mark them.
 *
 * Geometric tolerance: two shapes closer than `1e-9 × section size` count as touching
 * (section size = the larger side of the bounding box of all shapes). The editor calls
 * this on every change, so pairs are first filtered by bounding boxes.
 */
import { LIMITS, METRES_PER_UNIT, type ResolvedSection, type ResolvedShape } from './schema';
import type { SectionIssue } from './issues';
import {
  bboxGap,
  bboxUnion,
  polygonArea,
  polygonPerimeter,
  polygonSelfIntersection,
  regionDistance,
  samplePoints,
  shapeBBox,
  shapeRegion,
  type BBox,
  type Region,
} from './geometry';

export type { SectionIssue } from './issues';

/** Relative tolerance for touching and degenerate geometry. */
export const GEOMETRY_TOLERANCE = 1e-9;
/** Largest ratio of section size to its smallest feature. */
export const MAX_SIZE_RATIO = 1e6;
/** Smallest feature and largest section accepted, in metres. */
export const MIN_FEATURE_M = 1e-12;
export const MAX_SIZE_M = 1e6;
/**
 * Largest ratio of section size to an expert finest mesh spacing (`mesh.finest`). Measured on a
 * wire over a plate at the quick preset (multigrid of 2 Dec 2026): ratio 1e4 → 16 CG iterations
 * in all, 1e5 → 111, 1e6 → every linear solve stopped at its 500-iteration cap short of the
 * tolerance (an earlier multigrid: 1e5 → 626). 1e4 keeps a margin below the trouble.
 */
export const MAX_FINEST_RATIO = 1e4;
/**
 * Largest relative permittivity accepted. Far above any insulator in use (ceramic capacitor
 * dielectrics reach about 1e4); at 1e300 the solver's residual norms overflowed (NaN).
 */
export const MAX_EPS_R = 1e6;
/** Short circuits reported at most (one is enough to block a solve). */
const MAX_SHORTS_REPORTED = 50;

const fmt = (v: number) => Number(v.toPrecision(6)).toString();
const q = (s: string) => `"${s}"`;

function shapeKind(s: ResolvedShape): string {
  if (s.conductor !== undefined) return s.type === 'strip' ? 'strip' : 'conductor';
  return 'dielectric';
}

function shapeFeature(s: ResolvedShape): number {
  switch (s.type) {
    case 'rect':
      return Math.min(Math.abs(s.width), Math.abs(s.height));
    case 'circle':
      return 2 * Math.abs(s.r);
    case 'ring':
      return Math.min(Math.abs(s.rOuter - s.rInner), 2 * Math.abs(s.rInner));
    case 'strip':
      return Math.hypot(s.x2 - s.x1, s.y2 - s.y1);
    case 'polygon': {
      let m = Infinity;
      const p = s.points;
      for (let i = 0; i < p.length; i++) {
        const a = p[i]!,
          b = p[(i + 1) % p.length]!;
        m = Math.min(m, Math.hypot(b[0] - a[0], b[1] - a[1]));
      }
      return m;
    }
  }
}

function allFinite(s: ResolvedShape): boolean {
  switch (s.type) {
    case 'rect':
      return [s.x, s.y, s.width, s.height].every(Number.isFinite);
    case 'circle':
      return [s.cx, s.cy, s.r].every(Number.isFinite);
    case 'ring':
      return [s.cx, s.cy, s.rInner, s.rOuter].every(Number.isFinite);
    case 'strip':
      return [s.x1, s.y1, s.x2, s.y2].every(Number.isFinite);
    case 'polygon':
      return s.points.every(([x, y]) => Number.isFinite(x) && Number.isFinite(y));
  }
}

/** True when every point lies within `tol` of one line. */
function collinear(p: readonly (readonly [number, number])[], tol: number): boolean {
  const a = p[0]!;
  let far = a,
    best = -1;
  for (const b of p) {
    const d = Math.hypot(b[0] - a[0], b[1] - a[1]);
    if (d > best) {
      best = d;
      far = b;
    }
  }
  if (best <= tol) return true;
  const ux = (far[0] - a[0]) / best,
    uy = (far[1] - a[1]) / best;
  return p.every((b) => Math.abs((b[0] - a[0]) * uy - (b[1] - a[1]) * ux) <= tol);
}

/** Which geometric problems a single shape has; empty when its geometry is usable. */
function checkShapeGeometry(s: ResolvedShape, i: number, tol: number, out: SectionIssue[]): boolean {
  const id = s.id;
  const err = (code: string, message: string, field?: string | (string | number)[]) => {
    const path: (string | number)[] = ['shapes', i];
    if (field !== undefined) path.push(...(Array.isArray(field) ? field : [field]));
    out.push({ severity: 'error', code, message, path, shapeIds: [id] });
  };
  const before = out.length;
  switch (s.type) {
    case 'rect':
      if (!(s.width > 0)) err('size', `rect ${q(id)}: width must be greater than 0 (is ${fmt(s.width)})`, 'width');
      if (!(s.height > 0)) err('size', `rect ${q(id)}: height must be greater than 0 (is ${fmt(s.height)})`, 'height');
      break;
    case 'circle':
      if (!(s.r > 0)) err('size', `circle ${q(id)}: r must be greater than 0 (is ${fmt(s.r)})`, 'r');
      break;
    case 'ring':
      if (!(s.rInner > 0)) err('size', `ring ${q(id)}: rInner must be greater than 0 (is ${fmt(s.rInner)}; use a circle for a full disc)`, 'rInner');
      if (!(s.rOuter > 0)) err('size', `ring ${q(id)}: rOuter must be greater than 0 (is ${fmt(s.rOuter)})`, 'rOuter');
      else if (!(s.rInner < s.rOuter)) {
        err('size', `ring ${q(id)}: rInner (${fmt(s.rInner)}) must be smaller than rOuter (${fmt(s.rOuter)})`, 'rInner');
      }
      break;
    case 'strip': {
      const dx = Math.abs(s.x2 - s.x1),
        dy = Math.abs(s.y2 - s.y1);
      if (dx <= tol && dy <= tol) err('size', `strip ${q(id)}: has zero length (both ends at ${fmt(s.x1)}, ${fmt(s.y1)})`, 'x2');
      else if (dx > tol && dy > tol) {
        err('strip-not-axis-aligned', `strip ${q(id)}: must be horizontal (y1 = y2) or vertical (x1 = x2); it runs from (${fmt(s.x1)}, ${fmt(s.y1)}) to (${fmt(s.x2)}, ${fmt(s.y2)})`);
      }
      break;
    }
    case 'polygon': {
      const p = s.points;
      let repeated = false;
      for (let k = 0; k < p.length; k++) {
        const a = p[k]!,
          b = p[(k + 1) % p.length]!;
        if (Math.abs(a[0] - b[0]) <= tol && Math.abs(a[1] - b[1]) <= tol) {
          const next = (k + 1) % p.length;
          err(
            'polygon-repeated-point',
            next === 0
              ? `polygon ${q(id)}: the last point repeats the first (${fmt(a[0])}, ${fmt(a[1])}); polygons close by themselves, leave it out`
              : `polygon ${q(id)}: points ${k} and ${next} are the same (${fmt(a[0])}, ${fmt(a[1])})`,
            ['points', next],
          );
          repeated = true;
          break;
        }
      }
      if (repeated) break;
      if (collinear(p, tol)) {
        err('size', `polygon ${q(id)}: has zero area (its points lie on one line)`, 'points');
        break;
      }
      const hit = polygonSelfIntersection(p, tol);
      if (hit) {
        err('polygon-self-intersection', `polygon ${q(id)}: edges ${hit[0]} and ${hit[1]} cross or touch; a polygon must not intersect itself`, 'points');
        break;
      }
      if (Math.abs(polygonArea(p)) <= tol * polygonPerimeter(p)) {
        err('size', `polygon ${q(id)}: has zero area`, 'points');
      }
      break;
    }
  }
  return out.length === before;
}

/** Bounding box of all shapes with finite values (section units), or null. */
export function sectionBBox(section: ResolvedSection): BBox | null {
  return bboxUnion(section.shapes.filter(allFinite).map(shapeBBox));
}

/**
 * Every problem of a resolved section, errors first in file order then warnings.
 * An empty list, or warnings only, means the section can be solved.
 */
export function checkSection(section: ResolvedSection): SectionIssue[] {
  const issues: SectionIssue[] = [];
  const warnings: SectionIssue[] = [];
  const error = (x: Omit<SectionIssue, 'severity'>) => issues.push({ severity: 'error', ...x });
  const warn = (x: Omit<SectionIssue, 'severity'>) => warnings.push({ severity: 'warning', ...x });

  // Names and references.
  const netRole = new Map<string, 'signal' | 'ground'>();
  section.nets.forEach((n, i) => {
    if (netRole.has(n.name)) error({ code: 'duplicate-net', message: `net ${q(n.name)} is defined more than once`, path: ['nets', i, 'name'], net: n.name });
    else netRole.set(n.name, n.role);
    if (n.conductivitySPerM !== undefined && !(n.conductivitySPerM > 0)) {
      error({ code: 'value', message: `net ${q(n.name)}: conductivitySPerM must be greater than 0 (is ${fmt(n.conductivitySPerM)})`, path: ['nets', i, 'conductivitySPerM'], net: n.name });
    }
  });
  const materialIds = new Set<string>();
  section.materials.forEach((m, i) => {
    if (materialIds.has(m.id)) error({ code: 'duplicate-material', message: `material ${q(m.id)} is defined more than once`, path: ['materials', i, 'id'] });
    materialIds.add(m.id);
    if (!(m.epsR >= 1)) error({ code: 'value', message: `material ${q(m.id)}: epsR must be at least 1 (is ${fmt(m.epsR)})`, path: ['materials', i, 'epsR'] });
    else if (!(m.epsR <= MAX_EPS_R)) error({ code: 'limit', message: `material ${q(m.id)}: epsR must be at most ${fmt(MAX_EPS_R)} (is ${fmt(m.epsR)})`, path: ['materials', i, 'epsR'] });
    if (m.lossTangent !== undefined && !(m.lossTangent >= 0)) {
      error({ code: 'value', message: `material ${q(m.id)}: lossTangent must not be negative (is ${fmt(m.lossTangent)})`, path: ['materials', i, 'lossTangent'] });
    }
    if (m.breakdownKVPerMm !== undefined && !(m.breakdownKVPerMm > 0)) {
      error({ code: 'value', message: `material ${q(m.id)}: breakdownKVPerMm must be greater than 0 (is ${fmt(m.breakdownKVPerMm)})`, path: ['materials', i, 'breakdownKVPerMm'] });
    }
  });
  if (!(section.background.epsR >= 1)) {
    error({ code: 'value', message: `background: epsR must be at least 1 (is ${fmt(section.background.epsR)})`, path: ['background', 'epsR'] });
  } else if (!(section.background.epsR <= MAX_EPS_R)) {
    error({ code: 'limit', message: `background: epsR must be at most ${fmt(MAX_EPS_R)} (is ${fmt(section.background.epsR)})`, path: ['background', 'epsR'] });
  }
  if (section.background.lossTangent !== undefined && !(section.background.lossTangent >= 0)) {
    error({ code: 'value', message: `background: lossTangent must not be negative (is ${fmt(section.background.lossTangent)})`, path: ['background', 'lossTangent'] });
  }
  const signalNets = section.nets.filter((n) => n.role === 'signal').length;
  if (signalNets > LIMITS.signalNets) {
    error({ code: 'limit', message: `the section has ${signalNets} signal nets; at most ${LIMITS.signalNets} are allowed`, path: ['nets'] });
  }

  const shapeIds = new Set<string>();
  let totalVertices = 0;
  const netShapes = new Map<string, number[]>();
  section.shapes.forEach((s, i) => {
    if (shapeIds.has(s.id)) error({ code: 'duplicate-shape', message: `shape id ${q(s.id)} is used more than once`, path: ['shapes', i, 'id'], shapeIds: [s.id] });
    shapeIds.add(s.id);
    if (s.conductor !== undefined) {
      if (!netRole.has(s.conductor)) {
        error({ code: 'unknown-net', message: `shape ${q(s.id)}: unknown net ${q(s.conductor)}${section.nets.length ? ` (nets: ${section.nets.map((n) => q(n.name)).join(', ')})` : ''}`, path: ['shapes', i, 'conductor'], shapeIds: [s.id], net: s.conductor });
      } else {
        const list = netShapes.get(s.conductor) ?? [];
        list.push(i);
        netShapes.set(s.conductor, list);
      }
    }
    if (s.dielectric !== undefined && !materialIds.has(s.dielectric)) {
      error({ code: 'unknown-material', message: `shape ${q(s.id)}: unknown material ${q(s.dielectric)}${section.materials.length ? ` (materials: ${section.materials.map((m) => q(m.id)).join(', ')})` : ' (the section defines no materials)'}`, path: ['shapes', i, 'dielectric'], shapeIds: [s.id] });
    }
    if (s.conductor === undefined && s.dielectric === undefined) {
      error({ code: 'shape-role', message: `shape ${q(s.id)}: needs "conductor" (a net name) or "dielectric" (a material id)`, path: ['shapes', i], shapeIds: [s.id] });
    }
    if (s.type === 'polygon') totalVertices += s.points.length;
  });
  if (totalVertices > LIMITS.totalVertices) {
    error({ code: 'limit', message: `the polygons have ${totalVertices} points in all; at most ${LIMITS.totalVertices} are allowed`, path: ['shapes'] });
  }

  // Geometry of each shape.
  const bbox = sectionBBox(section);
  const size = bbox ? Math.max(bbox.xmax - bbox.xmin, bbox.ymax - bbox.ymin) : 0;
  const tol = GEOMETRY_TOLERANCE * (size > 0 ? size : 1);
  const good: boolean[] = section.shapes.map((s, i) => {
    if (!allFinite(s)) {
      error({ code: 'value', message: `shape ${q(s.id)}: has a value that is not a finite number`, path: ['shapes', i], shapeIds: [s.id] });
      return false;
    }
    return checkShapeGeometry(s, i, tol, issues);
  });

  // Size limits.
  const metres = METRES_PER_UNIT[section.units];
  if (size > 0) {
    let smallest = Infinity;
    let smallestId = '';
    section.shapes.forEach((s, i) => {
      if (!good[i]) return;
      const f = shapeFeature(s);
      if (f < smallest) {
        smallest = f;
        smallestId = s.id;
      }
    });
    if (smallest > 0 && size / smallest > MAX_SIZE_RATIO) {
      error({ code: 'limit', message: `shape ${q(smallestId)} is ${fmt(size / smallest)} times smaller than the whole section (${fmt(size)} ${section.units}); at most ${fmt(MAX_SIZE_RATIO)} is allowed`, shapeIds: [smallestId] });
    }
    if (smallest * metres < MIN_FEATURE_M && smallest > 0) {
      error({ code: 'limit', message: `shape ${q(smallestId)} is smaller than ${MIN_FEATURE_M} m`, shapeIds: [smallestId] });
    }
    if (size * metres > MAX_SIZE_M) {
      error({ code: 'limit', message: `the section is ${fmt(size * metres)} m across; at most ${MAX_SIZE_M} m is allowed` });
    }
    // An expert finest spacing far below the section size makes cells so stretched that the
    // linear solves stop converging (1e-12 of the size gave a 320 % error estimate).
    const finest = section.mesh?.finest;
    if (finest !== undefined && size / finest > MAX_FINEST_RATIO) {
      error({ code: 'limit', message: `mesh: finest spacing ${fmt(finest)} ${section.units} is ${fmt(size / finest)} times smaller than the whole section (${fmt(size)} ${section.units}); at most ${fmt(MAX_FINEST_RATIO)} is allowed`, path: ['mesh', 'finest'] });
    }
  }

  // Boundaries: order, and shapes beyond or across ground and mirror lines.
  const b = section.boundary;
  const at = (s: typeof b.left) => (s.type === 'open' ? undefined : s.at);
  const lx = at(b.left),
    rx = at(b.right),
    by = at(b.bottom),
    ty = at(b.top);
  if (lx !== undefined && rx !== undefined && !(lx < rx)) {
    error({ code: 'boundary-order', message: `boundary: left (at ${fmt(lx)}) must lie left of right (at ${fmt(rx)})`, path: ['boundary', 'left', 'at'] });
  }
  if (by !== undefined && ty !== undefined && !(by < ty)) {
    error({ code: 'boundary-order', message: `boundary: bottom (at ${fmt(by)}) must lie below top (at ${fmt(ty)})`, path: ['boundary', 'bottom', 'at'] });
  }
  const sides = [
    { key: 'left' as const, axis: 'x', v: lx, type: b.left.type, beyond: (bb: BBox, v: number) => bb.xmin < v - tol, across: (bb: BBox, v: number) => bb.xmax > v + tol, touches: (bb: BBox, v: number) => bb.xmin <= v + tol },
    { key: 'right' as const, axis: 'x', v: rx, type: b.right.type, beyond: (bb: BBox, v: number) => bb.xmax > v + tol, across: (bb: BBox, v: number) => bb.xmin < v - tol, touches: (bb: BBox, v: number) => bb.xmax >= v - tol },
    { key: 'bottom' as const, axis: 'y', v: by, type: b.bottom.type, beyond: (bb: BBox, v: number) => bb.ymin < v - tol, across: (bb: BBox, v: number) => bb.ymax > v + tol, touches: (bb: BBox, v: number) => bb.ymin <= v + tol },
    { key: 'top' as const, axis: 'y', v: ty, type: b.top.type, beyond: (bb: BBox, v: number) => bb.ymax > v + tol, across: (bb: BBox, v: number) => bb.ymin < v - tol, touches: (bb: BBox, v: number) => bb.ymax >= v - tol },
  ];
  const regions: (Region | null)[] = section.shapes.map((s, i) => (good[i] ? shapeRegion(s) : null));
  section.shapes.forEach((s, i) => {
    const r = regions[i];
    if (!r) return;
    for (const side of sides) {
      if (side.v === undefined) continue;
      const line = `the ${side.key} ${side.type} boundary at ${side.axis} = ${fmt(side.v)}`;
      if (side.beyond(r.bbox, side.v)) {
        error({
          code: 'beyond-boundary',
          message: side.across(r.bbox, side.v) ? `shape ${q(s.id)} crosses ${line}` : `shape ${q(s.id)} lies beyond ${line}`,
          path: ['shapes', i],
          shapeIds: [s.id],
        });
      } else if (side.type === 'ground' && s.conductor !== undefined && netRole.get(s.conductor) === 'signal' && side.touches(r.bbox, side.v)) {
        // Touching the line is only a short when the conductor reaches it, not just its box.
        const v = side.v;
        const lineRegion: Region =
          side.axis === 'x'
            ? { bbox: { xmin: v, xmax: v, ymin: -1e300, ymax: 1e300 }, prims: [{ k: 'seg', ax: v, ay: r.bbox.ymin - 1, bx: v, by: r.bbox.ymax + 1 }], anyPoint: [v, r.bbox.ymin - 1], contains: () => false }
            : { bbox: { xmin: -1e300, xmax: 1e300, ymin: v, ymax: v }, prims: [{ k: 'seg', ax: r.bbox.xmin - 1, ay: v, bx: r.bbox.xmax + 1, by: v }], anyPoint: [r.bbox.xmin - 1, v], contains: () => false };
        if (regionDistance(r, lineRegion, tol) <= tol) {
          error({
            code: 'short-circuit',
            message: `${shapeKind(s)} ${q(s.id)} of signal net ${q(s.conductor)} touches ${line}: a short circuit to ground`,
            path: ['shapes', i],
            shapeIds: [s.id],
            net: s.conductor,
          });
        }
      }
    }
  });

  // Short circuits between conductors of different nets (bounding boxes first).
  const conductors = section.shapes
    .map((s, i) => ({ s, i, r: regions[i] }))
    .filter((c): c is { s: ResolvedShape & { conductor: string }; i: number; r: Region } => c.r !== null && c.s.conductor !== undefined && netRole.has(c.s.conductor));
  conductors.sort((a, b2) => a.r.bbox.xmin - b2.r.bbox.xmin);
  // A gap between nets is a feature too: narrower than size / MAX_SIZE_RATIO it is refused
  // like a shape that small (the mesh cannot hold cells across it).
  const narrow = Math.max(tol, size / MAX_SIZE_RATIO);
  let shorts = 0;
  const insideOf = new Map<number, number>(); // conductor shape index -> index of another net's conductor containing it
  for (let a = 0; a < conductors.length && shorts < MAX_SHORTS_REPORTED; a++) {
    const A = conductors[a]!;
    for (let c = a + 1; c < conductors.length; c++) {
      const B = conductors[c]!;
      if (B.r.bbox.xmin > A.r.bbox.xmax + narrow) break;
      if (A.s.conductor === B.s.conductor) continue;
      if (bboxGap(A.r.bbox, B.r.bbox) >= narrow) continue;
      const d = regionDistance(A.r, B.r, narrow);
      if (d >= narrow) continue;
      if (d > tol) {
        const [first, second] = A.i < B.i ? [A, B] : [B, A];
        error({
          code: 'limit',
          message: `${shapeKind(first.s)} ${q(first.s.id)} (net ${q(first.s.conductor)}) and ${shapeKind(second.s)} ${q(second.s.id)} (net ${q(second.s.conductor)}) are only ${fmt(d)} ${section.units} apart, ${fmt(size / d)} times less than the whole section (${fmt(size)} ${section.units}); at most ${fmt(MAX_SIZE_RATIO)} is allowed`,
          path: ['shapes', second.i],
          shapeIds: [first.s.id, second.s.id],
          net: second.s.conductor,
        });
        if (++shorts >= MAX_SHORTS_REPORTED) break;
        continue;
      }
      const [first, second] = A.i < B.i ? [A, B] : [B, A];
      error({
        code: 'short-circuit',
        message: `${shapeKind(first.s)} ${q(first.s.id)} (net ${q(first.s.conductor)}) touches or overlaps ${shapeKind(second.s)} ${q(second.s.id)} (net ${q(second.s.conductor)}): a short circuit between nets ${q(first.s.conductor)} and ${q(second.s.conductor)}`,
        path: ['shapes', second.i],
        shapeIds: [first.s.id, second.s.id],
        net: second.s.conductor,
      });
      for (const [inner, outer] of [
        [A, B],
        [B, A],
      ] as const) {
        const pts = samplePoints(inner.s, inner.r, 6);
        pts.push(inner.r.anyPoint);
        if (pts.every(([x, y]) => outer.r.contains(x, y))) insideOf.set(inner.i, outer.i);
      }
      if (++shorts >= MAX_SHORTS_REPORTED) break;
    }
  }

  // Reference and something to solve.
  const groundBoundary = [b.left, b.right, b.bottom, b.top].some((s) => s.type === 'ground');
  const groundWithShapes = section.nets.some((n) => n.role === 'ground' && (netShapes.get(n.name)?.length ?? 0) > 0);
  if (!groundBoundary && !groundWithShapes) {
    error({ code: 'no-reference', message: 'the section has no reference: give a ground net at least one conductor shape, or make a boundary side a ground plane', path: ['nets'] });
  }
  const signalWithShapes = section.nets.filter((n) => n.role === 'signal' && (netShapes.get(n.name)?.length ?? 0) > 0);
  if (signalWithShapes.length === 0) {
    error({ code: 'no-signal', message: 'nothing to solve: no signal net has a conductor shape', path: ['nets'] });
  }

  // Warnings.
  section.nets.forEach((n, i) => {
    if ((netShapes.get(n.name)?.length ?? 0) === 0) {
      warn({ code: 'empty-net', message: `${n.role} net ${q(n.name)} has no shapes; it is left out of the solve`, path: ['nets', i], net: n.name });
    }
  });
  for (const n of signalWithShapes) {
    const idx = netShapes.get(n.name)!;
    if (idx.every((i) => insideOf.has(i))) {
      const outer = section.shapes[insideOf.get(idx[0]!)!]!;
      warn({ code: 'net-inside-conductor', message: `signal net ${q(n.name)} lies entirely inside conductor ${q(outer.id)} of net ${q(outer.conductor ?? '')}; it is shorted to that net`, shapeIds: idx.map((i) => section.shapes[i]!.id), net: n.name });
    }
  }
  // Dielectrics covered entirely by later dielectrics or by conductors (sampled).
  section.shapes.forEach((s, i) => {
    const r = regions[i];
    if (!r || s.dielectric === undefined) return;
    const covers: { r: Region; id: string }[] = [];
    const bb = r.bbox;
    for (let j = 0; j < regions.length; j++) {
      const rt = regions[j];
      if (!rt || j === i) continue;
      const t = section.shapes[j]!;
      if (t.conductor === undefined && j < i) continue;
      const tb = rt.bbox;
      if (tb.xmin > bb.xmax || tb.xmax < bb.xmin || tb.ymin > bb.ymax || tb.ymax < bb.ymin) continue;
      covers.push({ r: rt, id: t.id });
    }
    if (covers.length === 0) return;
    // Sample a 12 × 12 grid over the dielectric; stop at the first point nothing covers.
    const used = new Set<string>();
    let inside = 0;
    const N = 12;
    for (let a = 0; a < N; a++) {
      const x = bb.xmin + ((a + 0.5) / N) * (bb.xmax - bb.xmin);
      for (let c = 0; c < N; c++) {
        const y = bb.ymin + ((c + 0.5) / N) * (bb.ymax - bb.ymin);
        if (!r.contains(x, y)) continue;
        inside++;
        let cover: { r: Region; id: string } | undefined;
        for (const cv of covers) {
          if (cv.r.contains(x, y)) {
            cover = cv;
            break;
          }
        }
        if (!cover) return;
        used.add(cover.id);
      }
    }
    if (inside === 0) return;
    warn({
      code: 'hidden-dielectric',
      message: `dielectric ${q(s.id)} is covered entirely by ${[...used].map(q).join(', ')}; it has no effect`,
      path: ['shapes', i],
      shapeIds: [s.id],
    });
  });

  return [...issues, ...warnings];
}
