/**
 * Properties over random valid problems (fast-check, fixed seeds so CI is reproducible):
 * the Maxwell matrix is symmetric, positive definite, with non-positive off-diagonal terms
 * and non-negative row sums (Paul, Analysis of Multiconductor Transmission Lines, 2nd ed.
 * 2008, ch. 3–5); capacitance per unit length is unchanged by uniform scaling and by
 * translation (2D electrostatics, common practice); multiplying every εr by k multiplies C
 * by k (linearity, common practice); a mirror-symmetric problem solved whole and as a half
 * with a mirror boundary agree within the two error estimates.
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { solveProblem } from '../../../lib/fdm';
import type { BoundarySideSpec, Geometry, Problem } from '../../../lib/fdm/types';

const OPEN: BoundarySideSpec = { type: 'open' };
const MM = 1e-3;

/** Up to 4 conductors in separate 1 mm slots of a 4 × 2 lattice, so they never touch. */
const shapeArb = fc.record({
  kind: fc.constantFrom('rect', 'circle', 'polygon', 'strip'),
  a: fc.double({ min: 0.15, max: 0.8, noNaN: true }),
  b: fc.double({ min: 0.1, max: 0.8, noNaN: true }),
});
const problemArb = fc.record({
  slots: fc.uniqueArray(fc.integer({ min: 0, max: 7 }), { minLength: 2, maxLength: 4 }),
  shapes: fc.array(shapeArb, { minLength: 4, maxLength: 4 }),
  signals: fc.integer({ min: 1, max: 3 }),
  bg: fc.double({ min: 1, max: 5, noNaN: true }),
  layer: fc.option(fc.double({ min: 1.5, max: 10, noNaN: true }), { nil: undefined }),
  plane: fc.boolean(),
});

function geometryIn(slot: number, s: { kind: string; a: number; b: number }): Geometry {
  const cx = (slot % 4) * 1.2 + 0.6;
  const cy = Math.floor(slot / 4) * 1.2 + 0.6;
  switch (s.kind) {
    case 'rect':
      return { type: 'rect', x: (cx - s.a / 2) * MM, y: (cy - s.b / 2) * MM, width: s.a * MM, height: s.b * MM };
    case 'circle':
      return { type: 'circle', cx: cx * MM, cy: cy * MM, r: (s.a / 2) * MM };
    case 'strip':
      return { type: 'strip', x1: (cx - s.a / 2) * MM, y1: cy * MM, x2: (cx + s.a / 2) * MM, y2: cy * MM };
    default:
      return {
        type: 'polygon',
        points: [
          [(cx - s.a / 2) * MM, (cy - s.b / 2) * MM],
          [(cx + s.a / 2) * MM, (cy - s.b / 3) * MM],
          [cx * MM, (cy + s.b / 2) * MM],
        ],
      };
  }
}

type ProblemValue = typeof problemArb extends fc.Arbitrary<infer T> ? T : never;

function build(v: ProblemValue): Problem {
  const n = v.slots.length;
  const signals = Math.min(v.signals, v.plane ? n : n - 1);
  const nets = [
    ...Array.from({ length: signals }, (_, i) => ({ name: `s${i}`, ground: false })),
    { name: 'gnd', ground: true },
  ];
  const conductors = v.slots.map((slot, i) => ({ geometry: geometryIn(slot, v.shapes[i]), net: i < signals ? i : signals }));
  return {
    backgroundEpsR: v.bg,
    dielectrics: v.layer ? [{ geometry: { type: 'rect', x: -1 * MM, y: -0.5 * MM, width: 7 * MM, height: 1.3 * MM }, epsR: v.layer, material: 0 }] : [],
    conductors,
    nets,
    boundary: { left: OPEN, right: OPEN, bottom: v.plane ? { type: 'ground', at: -0.5 * MM } : OPEN, top: OPEN },
    mesh: { preset: 'quick', growth: 1.4 }, // coarse on purpose: these properties hold on any mesh
  };
}

function transform(p: Problem, f: (x: number, y: number) => [number, number], s: number, epsK = 1): Problem {
  const g = (q: Geometry): Geometry => {
    switch (q.type) {
      case 'rect': {
        const [x, y] = f(q.x, q.y);
        return { type: 'rect', x, y, width: q.width * s, height: q.height * s };
      }
      case 'circle': {
        const [cx, cy] = f(q.cx, q.cy);
        return { type: 'circle', cx, cy, r: q.r * s };
      }
      case 'ring': {
        const [cx, cy] = f(q.cx, q.cy);
        return { type: 'ring', cx, cy, rInner: q.rInner * s, rOuter: q.rOuter * s };
      }
      case 'strip': {
        const [x1, y1] = f(q.x1, q.y1);
        const [x2, y2] = f(q.x2, q.y2);
        return { type: 'strip', x1, y1, x2, y2 };
      }
      case 'polygon':
        return { type: 'polygon', points: q.points.map(([x, y]) => f(x, y)) };
    }
  };
  const side = (b: BoundarySideSpec, axis: 0 | 1): BoundarySideSpec =>
    b.type === 'open' ? b : { type: b.type, at: axis === 0 ? f(b.at, 0)[0] : f(0, b.at)[1] };
  return {
    ...p,
    backgroundEpsR: p.backgroundEpsR * epsK,
    dielectrics: p.dielectrics.map((d) => ({ ...d, geometry: g(d.geometry), epsR: d.epsR * epsK })),
    conductors: p.conductors.map((c) => ({ ...c, geometry: g(c.geometry) })),
    boundary: { left: side(p.boundary.left, 0), right: side(p.boundary.right, 0), bottom: side(p.boundary.bottom, 1), top: side(p.boundary.top, 1) },
  };
}

function cholesky(C: number[][]): boolean {
  const n = C.length;
  const L = C.map((r) => r.map(() => 0));
  for (let i = 0; i < n; i++) {
    for (let j = 0; j <= i; j++) {
      let v = C[i][j];
      for (let k = 0; k < j; k++) v -= L[i][k] * L[j][k];
      if (i === j) {
        if (!(v > 0)) return false;
        L[i][i] = Math.sqrt(v);
      } else L[i][j] = v / L[j][j];
    }
  }
  return true;
}

const relDiff = (A: number[][], B: number[][]) => {
  let m = 0;
  for (let i = 0; i < A.length; i++) for (let j = 0; j < A.length; j++) m = Math.max(m, Math.abs(A[i][j] - B[i][j]) / Math.abs(A[i][i]));
  return m;
};

describe('Maxwell matrix properties over random problems', () => {
  it('symmetric, positive definite, off-diagonal ≤ 0, row sums ≥ 0, no NaN', () => {
    fc.assert(
      fc.property(problemArb, (v) => {
        const r = solveProblem(build(v));
        const C = r.maxwell;
        for (let i = 0; i < C.length; i++) {
          expect(Number.isFinite(C[i][i]) && C[i][i] > 0).toBe(true);
          let row = 0;
          for (let j = 0; j < C.length; j++) {
            row += C[i][j];
            expect(C[i][j]).toBe(C[j][i]);
            if (i !== j) expect(C[i][j]).toBeLessThanOrEqual(0);
          }
          expect(row).toBeGreaterThanOrEqual(-1e-9 * C[i][i]);
        }
        expect(cholesky(C)).toBe(true);
        // the raw finest matrix was symmetric before symmetrising (no warning)
        expect(r.warnings.filter((w) => w.includes('asymmetric'))).toEqual([]);
        expect(r.warnings.filter((w) => w.includes('energy'))).toEqual([]);
      }),
      { numRuns: 12, seed: 20261202 },
    );
  });

  it('unchanged by uniform scaling and translation; εr × k gives C × k', () => {
    fc.assert(
      fc.property(
        problemArb,
        fc.constantFrom(1e-3, 0.37, 25.4),
        fc.double({ min: -50, max: 50, noNaN: true }),
        fc.double({ min: 1.1, max: 6, noNaN: true }),
        (v, s, shift, k) => {
          const p = build(v);
          const C = solveProblem(p).maxwell;
          const scaled = solveProblem(transform(p, (x, y) => [x * s, y * s], s)).maxwell;
          const moved = solveProblem(transform(p, (x, y) => [x + shift * MM, y - 0.5 * shift * MM], 1)).maxwell;
          const eps = solveProblem(transform(p, (x, y) => [x, y], 1, k));
          // exact in the model; the numbers differ only by round-off in the geometry and the
          // solver's 1e-10 residual (~1e-8 in C). A changed mesh would show as ~1e-4.
          expect(relDiff(C, scaled)).toBeLessThan(1e-6);
          expect(relDiff(C, moved)).toBeLessThan(1e-6);
          expect(relDiff(C.map((r) => r.map((c) => c * k)), eps.maxwell)).toBeLessThan(1e-6);
        },
      ),
      { numRuns: 6, seed: 4242 },
    );
  });

  it('a mirror-symmetric problem: whole = 2 × half with a mirror boundary, within the estimates', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0.2, max: 1.5, noNaN: true }), // half-width of the centre trace
        fc.double({ min: 0.1, max: 0.6, noNaN: true }), // radius of the side wires
        fc.double({ min: 0.3, max: 2, noNaN: true }), // gap between trace and wires
        fc.double({ min: 1, max: 6, noNaN: true }), // substrate εr
        (hw, r, gap, er) => {
          const whole: Problem = {
            backgroundEpsR: 1,
            dielectrics: [{ geometry: { type: 'rect', x: -20 * MM, y: 0, width: 40 * MM, height: 1 * MM }, epsR: er, material: 0 }],
            conductors: [
              { geometry: { type: 'rect', x: -hw * MM, y: 1 * MM, width: 2 * hw * MM, height: 0.1 * MM }, net: 0 },
              { geometry: { type: 'circle', cx: (hw + gap + r) * MM, cy: 1.5 * MM, r: r * MM }, net: 1 },
              { geometry: { type: 'circle', cx: -(hw + gap + r) * MM, cy: 1.5 * MM, r: r * MM }, net: 1 },
            ],
            nets: [
              { name: 'trace', ground: false },
              { name: 'gnd', ground: true },
            ],
            boundary: { left: OPEN, right: OPEN, bottom: { type: 'ground', at: 0 }, top: OPEN },
            mesh: { preset: 'quick', growth: 1.4 }, // coarse on purpose: these properties hold on any mesh
          };
          const half: Problem = {
            ...whole,
            dielectrics: [{ geometry: { type: 'rect', x: 0, y: 0, width: 20 * MM, height: 1 * MM }, epsR: er, material: 0 }],
            conductors: [
              { geometry: { type: 'rect', x: 0, y: 1 * MM, width: hw * MM, height: 0.1 * MM }, net: 0 },
              { geometry: { type: 'circle', cx: (hw + gap + r) * MM, cy: 1.5 * MM, r: r * MM }, net: 1 },
            ],
            boundary: { ...whole.boundary, left: { type: 'mirror', at: 0 } },
          };
          const a = solveProblem(whole);
          const b = solveProblem(half);
          const d = Math.abs(a.maxwell[0][0] / (2 * b.maxwell[0][0]) - 1);
          expect(d).toBeLessThanOrEqual(a.error.relative + b.error.relative);
        },
      ),
      { numRuns: 6, seed: 7 },
    );
  });
});
