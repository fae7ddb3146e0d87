/**
 * The fused fine-level kernels of the red–black cycle (one pass instead of two) and the
 * lexicographic Gauss–Seidel smoother of nearly isotropic coarse levels
 * (lib/fdm/multigrid coarseSmoother 'point'/'auto'): kernels against the separate or
 * straightforward versions, symmetry of the preconditioner, convergence.
 */
import { describe, expect, it } from 'vitest';
import { applyPreconditioner, fineProduct, setupHierarchy, solve } from '../../../lib/fdm/multigrid';
import { applyOperator } from '../../../lib/fdm/operator';
import {
  gaussSeidelResidualRestrict,
  interpolateAdd,
  interpolateAddRed,
  interpolateGaussSeidelBack,
  interpolateSmoothRed,
  residualRestrictRed,
  restrict,
  smoothResidualRestrictRed,
} from '../../../lib/fdm/multigrid-transfer';
import { inverseDiagonal, residualAt, residualFull, sweepGaussSeidel, sweepRedBlack } from '../../../lib/fdm/smoothers';
import { hardSystem, uniformMicrostrip } from '../../../scripts/bench/systems';

const sizes: [number, number][] = [
  [17, 13],
  [16, 12],
  [15, 20],
];

describe('fused red–black fine-level kernels', () => {
  for (const precision of ['double', 'single'] as const) {
    for (const [nx, ny] of sizes) {
      it(`descent (sweep + residual + restriction) and ascent (interpolation + sweep) equal the separate kernels, ${nx}×${ny}, ${precision}`, () => {
        const sys = hardSystem(nx, ny, { maxRatio: 3, robin: 0.1 });
        const h = setupHierarchy(sys.op, { coarsestNodes: 4, fineSmoother: 'point', precision });
        expect(h.precision).toBe(precision);
        const lv = h.levels[0], cl = h.levels[1], t = h.transfers[0];
        const inv = inverseDiagonal(lv);
        const { off } = lv;
        for (let k = 0; k < nx * ny; k++) lv.b[k + off] = Math.sin(0.37 * k) + 0.2;
        // separate: red-first sweep from zero, then red residual + restriction
        lv.x.fill(Math.PI); // a zero-start sweep must not read it
        sweepRedBlack(lv, inv, true, true);
        const refX = lv.x.slice();
        const refR = lv.r.slice().fill(0);
        const refB = cl.b.slice().fill(0);
        residualRestrictRed(lv, t, refR, refB);
        // fused
        lv.x.fill(-1);
        const gotR = refR.slice().fill(0);
        const gotB = refB.slice().fill(0);
        smoothResidualRestrictRed(lv, inv, t, gotR, gotB);
        // the same arithmetic in the same order: identical numbers (common practice, no published source)
        for (let j = 0; j < ny; j++) for (let i = 0; i < nx; i++) expect(lv.x[j * nx + i + off]).toBe(refX[j * nx + i + off]);
        for (let K = cl.off; K < cl.off + cl.nx * cl.ny; K++) expect(gotB[K]).toBe(refB[K]);
        // ascent
        const xc = cl.x.slice().fill(0);
        for (let K = cl.off; K < cl.off + cl.nx * cl.ny; K++) xc[K] = Math.cos(K);
        const start = lv.x.slice();
        interpolateAddRed(t, xc, lv.x);
        sweepRedBlack(lv, inv, false, false);
        const ref2 = lv.x.slice();
        lv.x.set(start);
        interpolateSmoothRed(t, xc, lv, inv);
        for (let k = 0; k < lv.x.length; k++) expect(lv.x[k]).toBe(ref2[k]);
      });
    }
  }
});

describe('lexicographic Gauss–Seidel on coarse levels', () => {
  it('forward and backward sweeps equal node-by-node Gauss–Seidel on 5- and 9-point levels; the zero-start sweep ignores x', () => {
    const sys = hardSystem(41, 37, { maxRatio: 5 });
    const h = setupHierarchy(sys.op, { coarsestNodes: 16, precision: 'double' });
    for (const lv of h.levels.slice(0, -1)) {
      const size = lv.nx * lv.ny, { off } = lv;
      const inv = inverseDiagonal(lv);
      for (let k = 0; k < size; k++) {
        lv.b[k + off] = Math.cos(k);
        lv.x[k + off] = Math.sin(2 * k);
      }
      const x0 = lv.x.slice();
      // straightforward Gauss–Seidel: x_k += r_k / c_k node by node (common practice, no published source)
      const reference = (order: number[]) => {
        lv.x.set(x0);
        for (const k of order) lv.x[k + off] += residualAt(lv, k + off) / lv.c[k + off];
        return lv.x.slice();
      };
      const fwd = Array.from({ length: size }, (_, k) => k);
      const scale = Math.max(...Array.from(x0, Math.abs));
      for (const forward of [true, false]) {
        const ref = reference(forward ? fwd : [...fwd].reverse());
        lv.x.set(x0);
        sweepGaussSeidel(lv, inv, forward, false);
        for (let k = off; k < off + size; k++) expect(Math.abs(lv.x[k] - ref[k])).toBeLessThanOrEqual(1e-12 * Math.max(scale, Math.abs(ref[k])));
      }
      lv.x.fill(0);
      const ref0 = (() => {
        for (let k = 0; k < size; k++) lv.x[k + off] += residualAt(lv, k + off) / lv.c[k + off];
        return lv.x.slice();
      })();
      lv.x.fill(7);
      sweepGaussSeidel(lv, inv, true, true);
      for (let k = off; k < off + size; k++) expect(Math.abs(lv.x[k] - ref0[k])).toBeLessThanOrEqual(1e-12 * Math.max(1, Math.abs(ref0[k])));
    }
  });

  for (const [nx, ny] of [[17, 13], [16, 12], [15, 20], [33, 29]] as [number, number][]) {
    it(`fused descent (forward sweep + residual + restriction) and ascent (interpolation + backward sweep) equal the separate kernels, ${nx}×${ny}`, () => {
      const sys = hardSystem(nx, ny, { maxRatio: 3, robin: 0.1 });
      const h = setupHierarchy(sys.op, { coarsestNodes: 4, precision: 'double', coarseSmoother: 'point' });
      // level 0 (5-point) and level 1 (9-point) both, each with the transfer to the next level
      for (let l = 0; l + 1 < Math.min(h.levels.length, 3); l++) {
        const lv = h.levels[l], cl = h.levels[l + 1], t = h.transfers[l];
        const inv = inverseDiagonal(lv);
        const { off } = lv;
        for (let k = 0; k < lv.nx * lv.ny; k++) lv.b[k + off] = Math.sin(0.37 * k) + 0.2;
        lv.x.fill(Math.E); // a zero-start sweep must not read it
        sweepGaussSeidel(lv, inv, true, true);
        const refX = lv.x.slice();
        const r = lv.r.slice().fill(0);
        residualFull(lv, r);
        const refB = cl.b.slice().fill(0);
        restrict(t, r, refB);
        lv.x.fill(-1);
        const gotB = refB.slice().fill(0);
        gaussSeidelResidualRestrict(lv, inv, t, lv.r.slice().fill(0), gotB);
        for (let k = off; k < off + lv.nx * lv.ny; k++) expect(lv.x[k]).toBe(refX[k]);
        // the residual from the upper couplings only equals b − A x up to round-off (common practice, no published source)
        const scale = Math.max(...Array.from(refB, Math.abs));
        for (let K = cl.off; K < cl.off + cl.nx * cl.ny; K++) expect(Math.abs(gotB[K] - refB[K])).toBeLessThanOrEqual(1e-12 * scale);
        // ascent
        const xc = cl.x.slice().fill(0);
        for (let K = cl.off; K < cl.off + cl.nx * cl.ny; K++) xc[K] = Math.cos(K);
        const start = lv.x.slice();
        interpolateAdd(t, xc, lv.x);
        sweepGaussSeidel(lv, inv, false, false);
        const ref2 = lv.x.slice();
        lv.x.set(start);
        interpolateGaussSeidelBack(t, xc, lv, inv);
        for (let k = 0; k < lv.x.length; k++) expect(lv.x[k]).toBe(ref2[k]);
      }
    });
  }

  it("'auto' picks it on the coarse levels of a uniform grid and keeps lines on stretched cells", () => {
    const uni = setupHierarchy(uniformMicrostrip(257).op);
    expect(uni.levels[1].gsInv).not.toBeNull();
    const str = setupHierarchy(hardSystem(97, 81, { maxRatio: 100 }).op);
    expect(str.levels[1].gsInv).toBeNull();
    expect(setupHierarchy(uniformMicrostrip(257).op, { coarseSmoother: 'line' }).levels[1].gsInv).toBeNull();
  });

  for (const [name, sys] of [
    ['microstrip 64²', uniformMicrostrip(64)],
    ['jumps + strips + block 65×49', hardSystem(65, 49)],
  ] as const) {
    it(`the preconditioner stays symmetric and positive definite: ${name}`, () => {
      const h = setupHierarchy(sys.op, { coarsestNodes: 16, coarseSmoother: 'point', precision: 'double' });
      expect(h.levels[1].gsInv).not.toBeNull();
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
        // backward sweep = adjoint of the forward sweep, restriction = Pᵀ, Galerkin operators: a
        // symmetric cycle (Briggs, Henson & McCormick 2000, ch. 10); equal to round-off (common practice)
        expect(Math.abs(dot(Mx, y) - dot(x, My))).toBeLessThanOrEqual(1e-11 * Math.sqrt(dot(Mx, Mx) * dot(y, y)));
        expect(dot(Mx, x)).toBeGreaterThan(0);
      }
    });

    it(`converges to 1e-10 with a mean reduction ≤ 0.15 per iteration: ${name}`, () => {
      const h = setupHierarchy(sys.op, { coarsestNodes: 16, coarseSmoother: 'point' });
      const res = solve(h, sys.rhs, { tolerance: 1e-10 });
      expect(res.converged).toBe(true);
      // multigrid-preconditioned CG on a nearly isotropic 2D problem: well below 0.15 per iteration
      // (Trottenberg, Oosterlee & Schüller 2001, ch. 4: Gauss–Seidel smoothing factor 0.5 per sweep)
      expect(res.convergenceFactor).toBeLessThanOrEqual(0.15);
    });
  }
});

describe('fineProduct (the product CG uses, for benchmarks)', () => {
  it('equals applyOperator on the padded symmetric-half storage, in both precisions of the hierarchy', () => {
    const sys = hardSystem(41, 30, { maxRatio: 5 });
    for (const precision of ['single', 'double'] as const) {
      const h = setupHierarchy(sys.op, { coarsestNodes: 16, precision });
      const off = h.levels[0].off, size = sys.rhs.length;
      const x = Float64Array.from({ length: size }, (_, k) => Math.cos(0.9 * k));
      const xp = new Float64Array(size + 2 * off), out = new Float64Array(size + 2 * off);
      xp.set(x, off);
      const ref = new Float64Array(size);
      applyOperator(sys.op, x, ref);
      const d = fineProduct(h, xp, out);
      const scale = Math.max(...Array.from(ref, Math.abs));
      // the CG product is double precision whatever the hierarchy's storage: round-off only (common practice, no published source)
      for (let k = 0; k < size; k++) expect(Math.abs(out[k + off] - ref[k])).toBeLessThanOrEqual(1e-13 * scale);
      expect(Math.abs(d - ref.reduce((s, v, k) => s + v * x[k], 0))).toBeLessThanOrEqual(1e-10 * Math.abs(d));
      expect(() => fineProduct(h, x, ref)).toThrow(RangeError);
    }
  });
});
