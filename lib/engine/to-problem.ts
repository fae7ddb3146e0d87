/**
 * A checked, resolved section (section units) → the numerical core's `Problem` (metres).
 * Nets that have no conductor shape are left out (the checks warn about them); the
 * remaining nets keep the section's order, and `netNames[k]` is the name of problem net k.
 */
import type { BoundarySideSpec, Geometry, MeshPreset, Problem } from '../fdm/types';
import { METRES_PER_UNIT, type ResolvedSection, type ResolvedShape } from '../section/schema';

export interface ToProblemOptions {
  /** Mesh preset; overrides the section's own `mesh.preset`. */
  preset?: MeshPreset;
}

export interface ProblemWithNames {
  problem: Problem;
  /** Section net name of each problem net index. */
  netNames: string[];
  /** Metres per section unit. */
  scale: number;
}

export function shapeGeometry(s: ResolvedShape, k: number): Geometry {
  switch (s.type) {
    case 'rect':
      return { type: 'rect', x: s.x * k, y: s.y * k, width: s.width * k, height: s.height * k };
    case 'circle':
      return { type: 'circle', cx: s.cx * k, cy: s.cy * k, r: s.r * k };
    case 'ring':
      return { type: 'ring', cx: s.cx * k, cy: s.cy * k, rInner: s.rInner * k, rOuter: s.rOuter * k };
    case 'strip':
      return { type: 'strip', x1: s.x1 * k, y1: s.y1 * k, x2: s.x2 * k, y2: s.y2 * k };
    case 'polygon':
      return { type: 'polygon', points: s.points.map(([x, y]) => [x * k, y * k] as [number, number]) };
  }
}

function side(b: ResolvedSection['boundary']['left'], k: number): BoundarySideSpec {
  return b.type === 'open' ? { type: 'open' } : { type: b.type, at: b.at * k };
}

export function toProblem(section: ResolvedSection, opts: ToProblemOptions = {}): ProblemWithNames {
  const k = METRES_PER_UNIT[section.units];
  const used = new Set(section.shapes.flatMap((s) => (s.conductor !== undefined ? [s.conductor] : [])));
  const nets = section.nets.filter((n) => used.has(n.name));
  const netIndex = new Map(nets.map((n, i) => [n.name, i]));
  const materialIndex = new Map(section.materials.map((m, i) => [m.id, i]));

  const problem: Problem = {
    backgroundEpsR: section.background.epsR,
    dielectrics: [],
    conductors: [],
    nets: nets.map((n) => ({ name: n.name, ground: n.role === 'ground' })),
    boundary: {
      left: side(section.boundary.left, k),
      right: side(section.boundary.right, k),
      bottom: side(section.boundary.bottom, k),
      top: side(section.boundary.top, k),
    },
    mesh: { preset: opts.preset ?? section.mesh?.preset ?? 'standard' },
  };
  if (section.mesh?.finest !== undefined) problem.mesh.finest = section.mesh.finest * k;
  if (section.mesh?.growth !== undefined) problem.mesh.growth = section.mesh.growth;
  if (section.mesh?.extent !== undefined) problem.mesh.extent = section.mesh.extent;

  for (const s of section.shapes) {
    if (s.conductor !== undefined) {
      const net = netIndex.get(s.conductor);
      if (net === undefined) throw new RangeError(`shape "${s.id}": unknown net "${s.conductor}"`);
      problem.conductors.push({ geometry: shapeGeometry(s, k), net, shapeId: s.id });
    } else if (s.dielectric !== undefined) {
      const m = materialIndex.get(s.dielectric);
      if (m === undefined) throw new RangeError(`shape "${s.id}": unknown material "${s.dielectric}"`);
      problem.dielectrics.push({ geometry: shapeGeometry(s, k), epsR: section.materials[m]!.epsR, material: m });
    }
  }
  return { problem, netNames: nets.map((n) => n.name), scale: k };
}
