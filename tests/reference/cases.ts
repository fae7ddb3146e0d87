/**
 * Reference cases with exact (or published) answers, modelled as ordinary Problems. Shared by
 * the accuracy tests and scripts that print the accuracy table. Dimensions are in millimetres
 * (only ratios matter); each case names the source of its reference value.
 */
import type { BoundarySideSpec, MeshPreset, Problem } from '../../lib/fdm/types';
import {
  coaxCapacitance,
  coplanarStripsCapacitance,
  cpwCapacitance,
  eccentricCoaxCapacitance,
  striplineCapacitance,
  twoWireCapacitance,
  wireOverGroundCapacitance,
} from '../../lib/analytic/formulas';

const MM = 1e-3;
export const OPEN: BoundarySideSpec = { type: 'open' };
const allOpen = () => ({ left: OPEN, right: OPEN, bottom: OPEN, top: OPEN });
const nets2 = () => [
  { name: 'sig', ground: false },
  { name: 'gnd', ground: true },
];

export interface ReferenceCase {
  name: string;
  source: string;
  problem: (preset: MeshPreset) => Problem;
  /** Exact C' (F/m) of the signal net (Maxwell C11). */
  exact: number;
  /** Exact vacuum C' (F/m), when it differs (dielectric present). */
  exactVacuum?: number;
}

export function coaxProblem(a: number, b: number, epsR: number, preset: MeshPreset, e = 0): Problem {
  return {
    backgroundEpsR: 1,
    dielectrics: epsR === 1 ? [] : [{ geometry: { type: 'circle', cx: 3 * MM, cy: 2 * MM, r: (b + 0.4) * MM }, epsR, material: 0 }],
    conductors: [
      { geometry: { type: 'circle', cx: (3 + e) * MM, cy: 2 * MM, r: a * MM }, net: 0, shapeId: 'inner' },
      { geometry: { type: 'ring', cx: 3 * MM, cy: 2 * MM, rInner: b * MM, rOuter: (b + 0.4) * MM }, net: 1, shapeId: 'shield' },
    ],
    nets: nets2(),
    boundary: allOpen(),
    mesh: { preset },
  };
}

export function striplineProblem(w: number, b: number, epsR: number, preset: MeshPreset): Problem {
  return {
    backgroundEpsR: epsR,
    dielectrics: [],
    conductors: [{ geometry: { type: 'strip', x1: -w / 2 * MM, y1: b / 2 * MM, x2: w / 2 * MM, y2: b / 2 * MM }, net: 0, shapeId: 'strip' }],
    nets: nets2(),
    boundary: { left: OPEN, right: OPEN, bottom: { type: 'ground', at: 0 }, top: { type: 'ground', at: b * MM } },
    mesh: { preset },
  };
}

/** Substrate "infinitely thick": a dielectric rect reaching far beyond the structure (BIG sizes). */
const BIG = 2000;

export function cpwProblem(s: number, w: number, epsR: number, preset: MeshPreset, ground = 500): Problem {
  const x0 = s / 2 + w;
  return {
    backgroundEpsR: 1,
    dielectrics: [{ geometry: { type: 'rect', x: -BIG * MM, y: -BIG * MM, width: 2 * BIG * MM, height: BIG * MM }, epsR, material: 0 }],
    conductors: [
      { geometry: { type: 'strip', x1: -s / 2 * MM, y1: 0, x2: s / 2 * MM, y2: 0 }, net: 0, shapeId: 'centre' },
      { geometry: { type: 'strip', x1: -(x0 + ground) * MM, y1: 0, x2: -x0 * MM, y2: 0 }, net: 1, shapeId: 'gnd-left' },
      { geometry: { type: 'strip', x1: x0 * MM, y1: 0, x2: (x0 + ground) * MM, y2: 0 }, net: 1, shapeId: 'gnd-right' },
    ],
    nets: nets2(),
    boundary: allOpen(),
    mesh: { preset },
  };
}

export function coplanarStripsProblem(s: number, w: number, epsR: number, preset: MeshPreset): Problem {
  return {
    backgroundEpsR: 1,
    dielectrics: [{ geometry: { type: 'rect', x: -BIG * MM, y: -BIG * MM, width: 2 * BIG * MM, height: BIG * MM }, epsR, material: 0 }],
    conductors: [
      { geometry: { type: 'strip', x1: s / 2 * MM, y1: 0, x2: (s / 2 + w) * MM, y2: 0 }, net: 0, shapeId: 'a' },
      { geometry: { type: 'strip', x1: -(s / 2 + w) * MM, y1: 0, x2: -s / 2 * MM, y2: 0 }, net: 1, shapeId: 'b' },
    ],
    nets: nets2(),
    boundary: allOpen(),
    mesh: { preset },
  };
}

export function microstripProblem(w: number, h: number, epsR: number, preset: MeshPreset): Problem {
  return {
    backgroundEpsR: 1,
    dielectrics: [{ geometry: { type: 'rect', x: -BIG * h * MM, y: 0, width: 2 * BIG * h * MM, height: h * MM }, epsR, material: 0 }],
    conductors: [{ geometry: { type: 'strip', x1: -w / 2 * MM, y1: h * MM, x2: w / 2 * MM, y2: h * MM }, net: 0, shapeId: 'trace' }],
    nets: nets2(),
    boundary: { left: OPEN, right: OPEN, bottom: { type: 'ground', at: 0 }, top: OPEN },
    mesh: { preset },
  };
}

/** Two equal zero-thickness plates of width w, gap d; one at 1 V, the other the reference. */
export function platesProblem(w: number, d: number, preset: MeshPreset): Problem {
  return {
    backgroundEpsR: 1,
    dielectrics: [],
    conductors: [
      { geometry: { type: 'strip', x1: 0, y1: d * MM, x2: w * MM, y2: d * MM }, net: 0, shapeId: 'top' },
      { geometry: { type: 'strip', x1: 0, y1: 0, x2: w * MM, y2: 0 }, net: 1, shapeId: 'bottom' },
    ],
    nets: nets2(),
    boundary: allOpen(),
    mesh: { preset },
  };
}

export const REFERENCE_CASES: ReferenceCase[] = [
  {
    name: 'coax, air, b/a = 2.3',
    source: 'C = 2πε/ln(b/a), exact',
    problem: (p) => coaxProblem(1, 2.3, 1, p),
    exact: coaxCapacitance(1, 2.3),
  },
  {
    name: 'coax, PTFE-like fill εr = 2.1, b/a = 3.5',
    source: 'C = 2πε/ln(b/a), exact',
    problem: (p) => coaxProblem(1, 3.5, 2.1, p),
    exact: coaxCapacitance(1, 3.5, 2.1),
    exactVacuum: coaxCapacitance(1, 3.5),
  },
  {
    // a film-thin gap: far below the mesh spacing, carried by the conductor-to-conductor links
    // of the discretisation (lib/fdm/discretise.ts); they were once dropped below 1e-3 of a
    // cell, which lost 39% of this capacitance
    name: 'coax with a gap of 1e-5 of the inner radius, b/a = 1.00001',
    source: 'C = 2πε/ln(b/a), exact',
    problem: (p) => coaxProblem(1, 1.00001, 1, p),
    exact: coaxCapacitance(1, 1.00001),
  },
  {
    name: 'eccentric coax, a = 1, b = 3, e = 0.8',
    source: 'C = 2πε/arccosh((a²+b²−e²)/2ab), exact (method of images)',
    problem: (p) => coaxProblem(1, 3, 1, p, 0.8),
    exact: eccentricCoaxCapacitance(1, 3, 0.8),
  },
  {
    name: 'two round wires, a = 0.5, D = 2.5',
    source: 'C = πε/arccosh(D/2a), exact (method of images)',
    problem: (preset) => ({
      backgroundEpsR: 1,
      dielectrics: [],
      conductors: [
        { geometry: { type: 'circle', cx: -1.25 * MM, cy: 0.3 * MM, r: 0.5 * MM }, net: 0 },
        { geometry: { type: 'circle', cx: 1.25 * MM, cy: 0.3 * MM, r: 0.5 * MM }, net: 1 },
      ],
      nets: nets2(),
      boundary: allOpen(),
      mesh: { preset },
    }),
    exact: twoWireCapacitance(0.5, 2.5),
  },
  {
    name: 'wire over ground plane, a = 0.5, h = 1.5',
    source: 'C = 2πε/arccosh(h/a), exact (method of images)',
    problem: (preset) => ({
      backgroundEpsR: 1,
      dielectrics: [],
      conductors: [{ geometry: { type: 'circle', cx: 0.2 * MM, cy: 1.5 * MM, r: 0.5 * MM }, net: 0 }],
      nets: [{ name: 'sig', ground: false }],
      boundary: { left: OPEN, right: OPEN, bottom: { type: 'ground', at: 0 }, top: OPEN },
      mesh: { preset },
    }),
    exact: wireOverGroundCapacitance(0.5, 1.5),
  },
  {
    name: 'centred stripline, zero thickness, w/b = 1, εr = 2.2',
    source: 'Cohn 1954, IRE Trans. MTT 2:52 (exact)',
    problem: (p) => striplineProblem(1, 1, 2.2, p),
    exact: striplineCapacitance(1, 1, 2.2),
  },
  {
    name: 'centred stripline, zero thickness, w/b = 0.3, εr = 1',
    source: 'Cohn 1954, IRE Trans. MTT 2:52 (exact)',
    problem: (p) => striplineProblem(0.3, 1, 1, p),
    exact: striplineCapacitance(0.3, 1, 1),
  },
  {
    name: 'coplanar waveguide, s = 1, w = 0.5, thick substrate εr = 9.8',
    source: 'Wen 1969, IEEE Trans. MTT 17:1087 (exact for zero thickness, infinite substrate and grounds)',
    problem: (p) => cpwProblem(1, 0.5, 9.8, p),
    exact: cpwCapacitance(1, 0.5, 9.8),
    exactVacuum: cpwCapacitance(1, 0.5, 1),
  },
  {
    name: 'coplanar strips, s = 1, w = 1, thick substrate εr = 4',
    source: 'Wen 1969, IEEE Trans. MTT 17:1087, dual form (exact for zero thickness, infinite substrate)',
    problem: (p) => coplanarStripsProblem(1, 1, 4, p),
    exact: coplanarStripsCapacitance(1, 1, 4),
    exactVacuum: coplanarStripsCapacitance(1, 1, 1),
  },
];
