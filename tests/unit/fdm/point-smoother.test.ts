/**
 * Red–black point smoothing of the finest level (lib/fdm/multigrid fineSmoother 'point'/'auto'):
 * kernels against straightforward versions, symmetry of the preconditioner, convergence.
 */
import { describe, expect, it } from 'vitest';
import { applyPreconditioner, setupHierarchy, solve } from '../../../lib/fdm/multigrid';
import { interpolateAdd, interpolateAddRed, restrict, residualRestrictRed } from '../../../lib/fdm/multigrid-transfer';
import { inverseDiagonal, residualFull, sweepRedBlack } from '../../../lib/fdm/smoothers';
import { hardSystem, uniformMicrostrip } from '../../../scripts/bench/systems';

const sizes: [number, number][] = [
  [17, 13],
  [16, 12],
  [15, 20],
];

describe('red–black point smoother kernels', () => {
  for (const [nx, ny] of sizes) {
    it(`one pass equals all red nodes then all black nodes (and the reverse), ${nx}×${ny}`, () => {
      const sys = hardSystem(nx, ny, { maxRatio: 5, robin: 0.2, ground: false });
      const h = setupHierarchy(sys.op, { coarsestNodes: 4, fineSmoother: 'line', precision: 'double' });
      const lv = h.levels[0];
      const inv = inverseDiagonal(lv);
      const { off } = lv;
      for (let k = 0; k < nx * ny; k++) {
        lv.b[k + off] = Math.sin(0.7 * k);
        lv.x[k + off] = Math.cos(1.3 * k);
      }
      const x0 = lv.x.slice();
      // straightforward Gauss–Seidel by colour (common practice, no published source)
      const ref = x0.slice();
      const relaxColour = (colour: number) => {
        for (let j = 0; j < ny; j++) {
          for (let i = 0; i < nx; i++) {
            if (((i + j) & 1) !== colour) continue;
            const k = j * nx + i;
            let v = lv.b[k + off];
            if (i > 0) v += sys.op.w[k] * ref[k - 1 + off];
            if (i < nx - 1) v += sys.op.e[k] * ref[k + 1 + off];
            if (j > 0) v += sys.op.s[k] * ref[k - nx + off];
            if (j < ny - 1) v += sys.op.n[k] * ref[k + nx + off];
            ref[k + off] = v / sys.op.c[k];
          }
        }
      };
      relaxColour(0);
      relaxColour(1);
      sweepRedBlack(lv, inv, true, false);
      for (let k = off; k < off + nx * ny; k++) expect(lv.x[k]).toBeCloseTo(ref[k], 12);
      relaxColour(1);
      relaxColour(0);
      sweepRedBlack(lv, inv, false, false);
      for (let k = off; k < off + nx * ny; k++) expect(lv.x[k]).toBeCloseTo(ref[k], 12);
      // zero guess: the old content of x does not matter
      lv.x.set(x0);
      sweepRedBlack(lv, inv, true, true);
      const a = lv.x.slice();
      lv.x.fill(0);
      sweepRedBlack(lv, inv, true, false);
      for (let k = off; k < off + nx * ny; k++) expect(a[k]).toBeCloseTo(lv.x[k], 14);
    });

    it(`fused red residual + restriction equals residual + Pᵀ after a red-first sweep, ${nx}×${ny}`, () => {
      const sys = hardSystem(nx, ny, { maxRatio: 3 });
      const h = setupHierarchy(sys.op, { coarsestNodes: 4, fineSmoother: 'line', precision: 'double' });
      const lv = h.levels[0], cl = h.levels[1], t = h.transfers[0];
      const { off } = lv;
      for (let k = 0; k < nx * ny; k++) lv.b[k + off] = Math.sin(0.37 * k) + 0.2;
      sweepRedBlack(lv, inverseDiagonal(lv), true, true);
      const r = new Float64Array(lv.b.length);
      residualFull(lv, r);
      const ref = new Float64Array(cl.b.length);
      restrict(t, r, ref);
      const got = new Float64Array(cl.b.length);
      residualRestrictRed(lv, t, new Float64Array(lv.b.length), got);
      const scale = Math.max(...Array.from(ref, Math.abs));
      for (let K = cl.off; K < cl.off + cl.nx * cl.ny; K++) expect(Math.abs(got[K] - ref[K])).toBeLessThanOrEqual(1e-12 * scale);
      // red-node interpolation: the same values as the full interpolation on the red nodes
      const xc = new Float64Array(cl.b.length);
      for (let K = cl.off; K < cl.off + cl.nx * cl.ny; K++) xc[K] = Math.cos(K);
      const full = new Float64Array(lv.b.length), red = new Float64Array(lv.b.length);
      interpolateAdd(t, xc, full);
      interpolateAddRed(t, xc, red);
      for (let j = 0; j < ny; j++) {
        for (let i = 0; i < nx; i++) {
          const k = j * nx + i + off;
          if (((i + j) & 1) === 0) expect(red[k]).toBeCloseTo(full[k], 14);
          else expect(red[k]).toBe(0);
        }
      }
    });
  }
});

describe('multigrid with red–black point smoothing on the finest level', () => {
  it("'auto' picks point smoothing on a uniform grid and line smoothing on stretched cells", () => {
    expect(setupHierarchy(uniformMicrostrip(65).op).pointInv).not.toBeNull();
    expect(setupHierarchy(hardSystem(97, 81, { maxRatio: 100 }).op).pointInv).toBeNull();
  });

  for (const [name, sys] of [
    ['microstrip 64²', uniformMicrostrip(64)],
    ['jumps + strips + block 65×49', hardSystem(65, 49)],
  ] as const) {
    it(`the preconditioner stays symmetric and positive definite: ${name}`, () => {
      const h = setupHierarchy(sys.op, { coarsestNodes: 16, fineSmoother: 'point', precision: 'double' });
      expect(h.pointInv).not.toBeNull();
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
        // adjoint post-smoother, restriction = Pᵀ, Galerkin coarse operators give a symmetric
        // cycle (Briggs, Henson & McCormick 2000, ch. 10); equal to round-off (common practice)
        expect(Math.abs(dot(Mx, y) - dot(x, My))).toBeLessThanOrEqual(1e-11 * Math.sqrt(dot(Mx, Mx) * dot(y, y)));
        expect(dot(Mx, x)).toBeGreaterThan(0);
      }
    });

    it(`converges to 1e-10 with a mean reduction ≤ 0.15 per iteration: ${name}`, () => {
      const h = setupHierarchy(sys.op, { fineSmoother: 'point' });
      const res = solve(h, sys.rhs, { tolerance: 1e-10 });
      expect(res.converged).toBe(true);
      // multigrid-preconditioned CG on an isotropic 2D problem: well below 0.15 per iteration
      // (Trottenberg, Oosterlee & Schüller 2001, ch. 4: red–black Gauss–Seidel smoothing factor 0.25 per sweep)
      expect(res.convergenceFactor).toBeLessThanOrEqual(0.15);
    });
  }
});
