/**
 * Tests of the multigrid-preconditioned CG solver (lib/fdm/multigrid.ts) and its parts.
 * Systems come from scripts/bench/systems.ts (finite-volume assembly; invented test geometry).
 * Each numeric bound names its source beside it.
 */
import { describe, expect, it } from 'vitest';
import { applyPreconditioner, setupHierarchy, solve } from '../../../lib/fdm/multigrid';
import { applyOperator } from '../../../lib/fdm/operator';
import { interpolateAdd, restrict } from '../../../lib/fdm/multigrid-transfer';
import { residualAt, sweepColumns, sweepRows } from '../../../lib/fdm/smoothers';
import { SolveCancelledError, type Operator5 } from '../../../lib/fdm/types';
import { choleskySolve, denseMatVec, operatorToDense } from '../../reference/dense-solve';
import { hardSystem, uniformMicrostrip, type LinearSystem } from '../../../scripts/bench/systems';

function maxAbs(a: Float64Array): number {
  let m = 0;
  for (let k = 0; k < a.length; k++) m = Math.max(m, Math.abs(a[k]));
  return m;
}

function relResidual(op: Operator5, x: Float64Array, b: Float64Array): number {
  const q = new Float64Array(b.length);
  applyOperator(op, x, q);
  let rr = 0, bb = 0;
  for (let k = 0; k < b.length; k++) {
    rr += (b[k] - q[k]) ** 2;
    bb += b[k] ** 2;
  }
  return Math.sqrt(rr / bb);
}

/** Hard cases: jumps 1/4.4/12/80, strips both ways, isolated fixed nodes, a conductor block, stretched cells, Robin edges. */
const hardCases: [string, () => LinearSystem][] = [
  ['jumps + strips + block, uniform, 65×65', () => hardSystem(65, 65)],
  ['jumps + strips + block, even sizes 64×50', () => hardSystem(64, 50)],
  ['graded to aspect 100, 97×81', () => hardSystem(97, 81, { maxRatio: 100 })],
  ['graded to aspect 1000, 120×99', () => hardSystem(120, 99, { maxRatio: 1000 })],
  ['graded to aspect 1000, 257×257', () => hardSystem(257, 257, { maxRatio: 1000 })],
  ['no ground, Robin edges, graded 300, 100×130', () => hardSystem(100, 130, { robin: 0.01, ground: false, maxRatio: 300 })],
  ['Robin edges, 77×60', () => hardSystem(77, 60, { robin: 0.3, ground: false })],
];

describe('applyOperator', () => {
  it('equals the dense matrix product (exact arithmetic on small grids)', () => {
    const sys = hardSystem(9, 7, { maxRatio: 20, robin: 0.2 });
    const x = Float64Array.from({ length: 63 }, (_, k) => Math.sin(k + 0.5));
    const out = new Float64Array(63);
    applyOperator(sys.op, x, out);
    const ref = denseMatVec(operatorToDense(sys.op), x);
    for (let k = 0; k < 63; k++) expect(out[k]).toBeCloseTo(ref[k], 12); // round-off only (common practice, no published source)
  });

  it('rejects arrays of the wrong length', () => {
    const sys = hardSystem(5, 5);
    expect(() => applyOperator(sys.op, new Float64Array(24), new Float64Array(25))).toThrow(RangeError);
  });
});

describe('multigrid-preconditioned CG against a dense Cholesky solve', () => {
  const cases: [string, LinearSystem][] = [
    ['microstrip 17×13', uniformMicrostrip(17)],
    ['hard 23×18 graded 50', hardSystem(23, 18, { maxRatio: 50 })],
    ['hard 31×20 graded 1000 Robin', hardSystem(31, 20, { maxRatio: 1000, robin: 0.05 })],
    ['hard 20×31 no ground Robin', hardSystem(20, 31, { ground: false, robin: 0.1 })],
    ['2×2', hardSystem(2, 2, { strips: false, block: false })],
    ['3×3', hardSystem(3, 3, { strips: false, block: false, ground: false, robin: 1 })],
    ['2×9', hardSystem(2, 9, { strips: false, block: false })],
  ];
  for (const [name, sys] of cases) {
    it(`agrees on ${name}`, () => {
      const { op, rhs } = sys;
      // a non-trivial right-hand side on the free nodes as well
      const b = Float64Array.from(rhs, (v, k) => (op.w[k] + op.e[k] + op.s[k] + op.n[k] > 0 ? v + 0.3 * Math.cos(k) : v));
      const ref = choleskySolve(operatorToDense(op), b);
      const h = setupHierarchy(op, { coarsestNodes: 4 });
      const res = solve(h, b, { tolerance: 1e-13 });
      expect(res.converged).toBe(true);
      let err = 0;
      for (let k = 0; k < b.length; k++) err = Math.max(err, Math.abs(res.x[k] - ref[k]));
      // tolerance 1e-13 on the residual ⇒ error ≤ cond·1e-13; 1e-9 of max|x| is ample (common practice, no published source)
      expect(err).toBeLessThanOrEqual(1e-9 * maxAbs(ref));
    });
  }

  it('keeps fixed nodes exactly at their prescribed values', () => {
    const sys = hardSystem(40, 33, { maxRatio: 30 });
    const res = solve(setupHierarchy(sys.op), sys.rhs);
    const { w, e, s, n } = sys.op;
    let checked = 0;
    for (let k = 0; k < sys.rhs.length; k++) {
      if (w[k] === 0 && e[k] === 0 && s[k] === 0 && n[k] === 0) {
        expect(res.x[k]).toBe(sys.rhs[k]); // c = 1 on fixed nodes: x = rhs exactly (the Operator5 contract)
        checked++;
      }
    }
    expect(checked).toBeGreaterThan(40);
  });
});

describe('convergence on hard cases', () => {
  for (const [name, build] of hardCases) {
    it(`mean residual reduction per PCG iteration ≤ 0.15: ${name}`, () => {
      const sys = build();
      const res = solve(setupHierarchy(sys.op), sys.rhs, { tolerance: 1e-10 });
      expect(res.converged).toBe(true);
      // Bound 0.15: black-box multigrid with Galerkin coarse operators and line relaxation reaches
      // V-cycle factors around 0.1 on discontinuous-coefficient problems (Dendy 1982, J. Comput.
      // Phys. 48:366, from memory); as a CG preconditioner it should not do worse. The number 0.15
      // is our own bar (common practice, no published source).
      expect(res.convergenceFactor).toBeLessThanOrEqual(0.15);
      expect(relResidual(sys.op, res.x, sys.rhs)).toBeLessThanOrEqual(1e-10);
    });
  }

  it('needs nearly the same number of iterations on 65² and 257² grids', () => {
    // Grid-independent convergence is the defining property of multigrid
    // (Briggs, Henson & McCormick 2000, A Multigrid Tutorial, 2nd ed., ch. 4 and 6).
    const counts = [65, 257].map((n) => {
      const sys = hardSystem(n, n);
      return solve(setupHierarchy(sys.op), sys.rhs, { tolerance: 1e-10 }).iterations;
    });
    expect(Math.abs(counts[0] - counts[1])).toBeLessThanOrEqual(3);
    const ms = [65, 257].map((n) => {
      const sys = uniformMicrostrip(n);
      return solve(setupHierarchy(sys.op), sys.rhs, { tolerance: 1e-10 }).iterations;
    });
    expect(Math.abs(ms[0] - ms[1])).toBeLessThanOrEqual(3);
    expect(Math.max(...ms)).toBeLessThanOrEqual(12); // our own bar for a textbook-efficient solver (common practice, no published source)
  });

  it('on cells stretched to aspect 1000 the K-cycle keeps the iteration count flat as levels are added (129², 257², 513²)', () => {
    // level-independent convergence of the K-cycle (Notay & Vassilevski 2008, Numer. Linear
    // Algebra Appl. 15); the bounds are ours (common practice, no published source): the
    // V-cycle needs 8, 8 and 11 iterations here, the K-cycle 9, 8, 9
    const counts = [129, 257, 513].map((n) => {
      const sys = hardSystem(n, n, { maxRatio: 1000 });
      const h = setupHierarchy(sys.op);
      expect(h.levels[1].k).not.toBeNull(); // 'auto' picks the K-cycle on stretched cells
      const res = solve(h, sys.rhs, { tolerance: 1e-10 });
      expect(res.converged).toBe(true);
      expect(relResidual(sys.op, res.x, sys.rhs)).toBeLessThanOrEqual(1e-10);
      return res.iterations;
    });
    expect(Math.max(...counts)).toBeLessThanOrEqual(10);
    expect(Math.max(...counts) - Math.min(...counts)).toBeLessThanOrEqual(2);
    // and the V-cycle stays the choice on a uniform grid
    expect(setupHierarchy(uniformMicrostrip(129).op).levels[1].k).toBeNull();
    expect(setupHierarchy(uniformMicrostrip(129).op, { cycle: 'K' }).levels[1].k).not.toBeNull();
  });

  it('reports decreasing residuals through onIteration', () => {
    const sys = hardSystem(129, 97, { maxRatio: 100 });
    const seen: [number, number][] = [];
    const res = solve(setupHierarchy(sys.op), sys.rhs, {
      onIteration: (it, rel) => {
        seen.push([it, rel]);
      },
    });
    expect(seen.length).toBe(res.iterations);
    expect(seen.map((s) => s[0])).toEqual(seen.map((_, i) => i + 1));
    for (let i = 1; i < seen.length; i++) expect(seen[i][1]).toBeLessThan(seen[i - 1][1]);
    expect(res.residualNorms.length).toBe(res.iterations + 1);
    expect(res.residualNorms[res.iterations]).toBe(seen[seen.length - 1][1]);
  });

  it('stops when onIteration returns false', () => {
    const sys = hardSystem(65, 65);
    const res = solve(setupHierarchy(sys.op), sys.rhs, { onIteration: (it) => it < 2 });
    expect(res.iterations).toBe(2);
    expect(res.converged).toBe(false);
  });

  it('honours maxIterations and a starting guess', () => {
    const sys = hardSystem(65, 65);
    const h = setupHierarchy(sys.op);
    const capped = solve(h, sys.rhs, { maxIterations: 1 });
    expect(capped.iterations).toBe(1);
    expect(capped.converged).toBe(false);
    const full = solve(h, sys.rhs, { tolerance: 1e-12 });
    const warm = solve(h, sys.rhs, { x0: full.x, tolerance: 1e-10 });
    expect(warm.iterations).toBe(0);
    expect(warm.converged).toBe(true);
  });
});

describe('the preconditioner', () => {
  for (const [name, sys, cycle] of [
    ['hard 65×49 graded 1000, W-cycle', hardSystem(65, 49, { maxRatio: 1000 }), 'W'],
    ['hard 65×49 graded 1000, V-cycle', hardSystem(65, 49, { maxRatio: 1000 }), 'V'],
    ['microstrip 64², V-cycle', uniformMicrostrip(64), 'V'],
  ] as const) {
    it(`is symmetric and positive definite (double-precision storage): ${name}`, () => {
      const h = setupHierarchy(sys.op, { coarsestNodes: 16, cycle, precision: 'double' });
      expect(h.levels.length).toBeGreaterThanOrEqual(3);
      const size = sys.rhs.length, off = h.levels[0].off;
      const apply = (v: Float64Array): Float64Array => {
        h.levels[0].b.fill(0);
        h.levels[0].b.set(v, off);
        applyPreconditioner(h);
        return Float64Array.from(h.levels[0].x.subarray(off, off + size));
      };
      const dot = (a: Float64Array, b: Float64Array) => a.reduce((s, v, k) => s + v * b[k], 0);
      for (let trial = 0; trial < 3; trial++) {
        const x = Float64Array.from({ length: size }, (_, k) => Math.sin(1.7 * k + trial));
        const y = Float64Array.from({ length: size }, (_, k) => Math.cos(0.3 * k * (trial + 1)));
        const Mx = apply(x), My = apply(y);
        const a = dot(Mx, y), b = dot(x, My);
        // symmetric cycle: post-smoother = adjoint of pre-smoother, restriction = Pᵀ, Galerkin coarse
        // operators (Briggs, Henson & McCormick 2000, ch. 10); equal to round-off (common practice)
        expect(Math.abs(a - b)).toBeLessThanOrEqual(1e-11 * Math.sqrt(dot(Mx, Mx) * dot(y, y)));
        expect(dot(Mx, x)).toBeGreaterThan(0);
      }
    });
  }

  for (const [name, sys, cycle] of [
    ['hard 65×49 graded 1000, W-cycle', hardSystem(65, 49, { maxRatio: 1000 }), 'W'],
    ['hard 65×49 graded 1000, V-cycle', hardSystem(65, 49, { maxRatio: 1000 }), 'V'],
    ['microstrip 64², V-cycle', uniformMicrostrip(64), 'V'],
    ['no ground, Robin edges, graded 300', hardSystem(60, 70, { robin: 0.01, ground: false, maxRatio: 300 }), 'V'],
  ] as const) {
    it(`is symmetric to single-precision round-off and positive definite (single storage): ${name}`, () => {
      const h = setupHierarchy(sys.op, { coarsestNodes: 16, cycle, precision: 'single' });
      expect(h.precision).toBe('single');
      expect(h.levels[1].c).toBeInstanceOf(Float32Array);
      const size = sys.rhs.length, off = h.levels[0].off;
      const apply = (v: Float64Array): Float64Array => {
        h.levels[0].b.fill(0);
        h.levels[0].b.set(v, off);
        applyPreconditioner(h);
        return Float64Array.from(h.levels[0].x.subarray(off, off + size));
      };
      const dot = (a: Float64Array, b: Float64Array) => a.reduce((s, v, k) => s + v * b[k], 0);
      for (let trial = 0; trial < 3; trial++) {
        const x = Float64Array.from({ length: size }, (_, k) => Math.sin(1.7 * k + trial));
        const y = Float64Array.from({ length: size }, (_, k) => Math.cos(0.3 * k * (trial + 1)));
        const Mx = apply(x), My = apply(y);
        // stored values rounded to single precision (unit round-off 2^-24 ≈ 6e-8): symmetric to
        // a small multiple of that (common practice, no published source)
        expect(Math.abs(dot(Mx, y) - dot(x, My))).toBeLessThanOrEqual(1e-6 * Math.sqrt(dot(Mx, Mx) * dot(y, y)));
        expect(dot(Mx, x)).toBeGreaterThan(0);
      }
    });
  }

  it("double storage by default; 'auto': single on a uniform grid, double on stretched cells", () => {
    const def = setupHierarchy(uniformMicrostrip(129).op);
    expect(def.precision).toBe('double');
    expect(def.levels[1].c).toBeInstanceOf(Float64Array);
    const uni = setupHierarchy(uniformMicrostrip(129).op, { precision: 'auto' });
    expect(uni.precision).toBe('single');
    expect(uni.levels[0].x).toBeInstanceOf(Float32Array);
    const str = setupHierarchy(hardSystem(97, 81, { maxRatio: 100 }).op, { precision: 'auto' });
    expect(str.precision).toBe('double');
    expect(str.levels[1].c).toBeInstanceOf(Float64Array);
    // a grid solved directly (no coarse levels) stays double whatever is asked
    expect(setupHierarchy(uniformMicrostrip(20).op, { precision: 'single' }).precision).toBe('double');
  });

  it('uses restriction = transpose of interpolation and Galerkin coarse operators Pᵀ A P', () => {
    const sys = hardSystem(23, 18, { maxRatio: 50 });
    const h = setupHierarchy(sys.op, { coarsestNodes: 4, precision: 'double' });
    expect(h.levels.length).toBeGreaterThanOrEqual(3);
    for (let l = 0; l + 1 < h.levels.length; l++) {
      const F = h.levels[l], C = h.levels[l + 1], t = h.transfers[l];
      const nf = F.nx * F.ny, nc = C.nx * C.ny, lenF = nf + 2 * F.off;
      const P: Float64Array[] = [];
      for (let q = 0; q < nc; q++) {
        const xc = new Float64Array(nc + 2 * C.off);
        xc[q + C.off] = 1;
        const xf = new Float64Array(lenF);
        interpolateAdd(t, xc, xf);
        P.push(xf);
      }
      F.b.fill(0);
      const AP = P.map((p) => {
        F.x.set(p);
        const v = new Float64Array(lenF);
        for (let k = 0; k < nf; k++) v[k + F.off] = -residualAt(F, k + F.off);
        return v;
      });
      C.b.fill(0);
      let err = 0, scale = 0;
      for (let q = 0; q < nc; q++) {
        C.x.fill(0);
        C.x[q + C.off] = 1;
        for (let p = 0; p < nc; p++) {
          const ac = -residualAt(C, p + C.off);
          let g = 0;
          for (let k = 0; k < lenF; k++) g += P[p][k] * AP[q][k];
          err = Math.max(err, Math.abs(ac - g));
          scale = Math.max(scale, Math.abs(g));
        }
      }
      expect(err).toBeLessThanOrEqual(1e-13 * scale); // round-off (common practice, no published source)
      const rf = new Float64Array(lenF);
      for (let k = 0; k < nf; k++) rf[k + F.off] = Math.sin(3 * k + 1);
      const bc = new Float64Array(nc + 2 * C.off);
      restrict(t, rf, bc);
      for (let q = 0; q < nc; q++) {
        let g = 0;
        for (let k = 0; k < lenF; k++) g += P[q][k] * rf[k];
        expect(bc[q + C.off]).toBeCloseTo(g, 13);
      }
    }
  });

  it('interpolates constants exactly where the operator has zero row sums (pure Neumann interior)', () => {
    const sys = hardSystem(33, 27, { maxRatio: 40, strips: false, block: false, ground: false });
    const h = setupHierarchy(sys.op, { coarsestNodes: 4, precision: 'double' });
    const t = h.transfers[0], C = h.levels[1], F = h.levels[0];
    const xc = new Float64Array(C.nx * C.ny + 2 * C.off);
    xc.fill(1, C.off, C.off + C.nx * C.ny);
    const xf = new Float64Array(F.nx * F.ny + 2 * F.off);
    interpolateAdd(t, xc, xf);
    // operator-dependent interpolation reproduces the null space of a Neumann operator (Dendy 1982, from memory)
    for (let k = 0; k < F.nx * F.ny; k++) expect(xf[k + F.off]).toBeCloseTo(1, 12);
  });

  it('line sweeps solve their lines exactly, on the 5-point and the 9-point levels', () => {
    const sys = hardSystem(41, 37, { maxRatio: 200 });
    const h = setupHierarchy(sys.op, { coarsestNodes: 16, precision: 'double', coarseSmoother: 'line' });
    for (const lv of h.levels.slice(0, -1)) {
      const size = lv.nx * lv.ny;
      for (let k = 0; k < size; k++) {
        lv.b[k + lv.off] = Math.cos(k);
        lv.x[k + lv.off] = Math.sin(2 * k);
      }
      const scale = maxAbs(Float64Array.from(lv.c));
      sweepRows(lv, 1, false);
      for (let j = 1; j < lv.ny; j += 2) for (let i = 0; i < lv.nx; i++) expect(Math.abs(residualAt(lv, lv.off + j * lv.nx + i))).toBeLessThan(1e-11 * scale);
      sweepColumns(lv, 0);
      for (let j = 0; j < lv.ny; j++) for (let i = 0; i < lv.nx; i += 2) expect(Math.abs(residualAt(lv, lv.off + j * lv.nx + i))).toBeLessThan(1e-11 * scale);
    }
  });
});

describe('edge cases', () => {
  it('zero right-hand side gives zero solution in 0 iterations', () => {
    const sys = hardSystem(33, 33);
    const res = solve(setupHierarchy(sys.op), new Float64Array(33 * 33));
    expect(res.iterations).toBe(0);
    expect(res.converged).toBe(true);
    expect(maxAbs(res.x)).toBe(0);
  });

  it('solves the smallest grids (2×2, 3×3) exactly', () => {
    for (const n of [2, 3]) {
      const sys = hardSystem(n, n, { strips: false, block: false, ground: false, robin: 0.5 });
      const b = Float64Array.from({ length: n * n }, (_, k) => k + 1);
      const res = solve(setupHierarchy(sys.op), b);
      const ref = choleskySolve(operatorToDense(sys.op), b);
      for (let k = 0; k < n * n; k++) expect(res.x[k]).toBeCloseTo(ref[k], 10);
      expect(res.iterations).toBeLessThanOrEqual(1);
    }
  });

  it('throws RangeError on invalid sizes, lengths and coefficients', () => {
    const good = hardSystem(6, 5).op;
    const mk = (nx: number, ny: number): Operator5 => ({
      nx, ny,
      c: new Float64Array(Math.max(0, nx * ny)).fill(1), w: new Float64Array(Math.max(0, nx * ny)), e: new Float64Array(Math.max(0, nx * ny)),
      s: new Float64Array(Math.max(0, nx * ny)), n: new Float64Array(Math.max(0, nx * ny)),
    });
    expect(() => setupHierarchy(mk(1, 5))).toThrow(RangeError);
    expect(() => setupHierarchy(mk(5, 1))).toThrow(RangeError);
    expect(() => setupHierarchy(mk(2.5, 4))).toThrow(RangeError);
    expect(() => setupHierarchy({ ...good, c: new Float64Array(29) })).toThrow(RangeError);
    expect(() => setupHierarchy({ ...good, nx: 5, ny: 6 })).toThrow(RangeError); // same length, wrong shape: couplings no longer fit the grid
    const neg = { ...good, w: good.w.slice() };
    neg.w[7] = -1;
    expect(() => setupHierarchy(neg)).toThrow(RangeError);
    const asym = { ...good, e: good.e.slice() };
    asym.e[7] *= 2;
    expect(() => setupHierarchy(asym)).toThrow(RangeError);
    const edge = { ...good, w: good.w.slice() };
    edge.w[6] = 1; // node i = 0 of row 1 coupling out of the grid
    expect(() => setupHierarchy(edge)).toThrow(RangeError);
    const h = setupHierarchy(good);
    expect(() => solve(h, new Float64Array(29))).toThrow(RangeError);
    expect(() => solve(h, new Float64Array(30), { x0: new Float64Array(3) })).toThrow(RangeError);
  });

  it('throws SolveCancelledError when cancelled between iterations', () => {
    const sys = hardSystem(65, 65);
    let calls = 0;
    expect(() => solve(setupHierarchy(sys.op), sys.rhs, { isCancelled: () => ++calls > 2 })).toThrow(SolveCancelledError);
    expect(calls).toBe(3);
  });
});
