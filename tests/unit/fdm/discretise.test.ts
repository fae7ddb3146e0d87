/**
 * The finite-volume operator: symmetry, fixed nodes, exactness for fields it must reproduce,
 * Shortley–Weller cut distances, and the Gauss-law charge = discrete energy identity.
 */
import { describe, expect, it } from 'vitest';
import { discretise } from '../../../lib/fdm/discretise';
import { discreteEnergy, netCharges, unitRhs } from '../../../lib/fdm/charges';
import { setupHierarchy, solve, solveProblem, EPSILON_0 } from '../../../lib/fdm';
import type { Problem } from '../../../lib/fdm/types';

const axis = (a: number, b: number, n: number, stretch = 1) => {
  const out = new Float64Array(n + 1);
  let h = 1;
  const hs: number[] = [];
  for (let i = 0; i < n; i++) {
    hs.push(h);
    h *= stretch;
  }
  const tot = hs.reduce((s, v) => s + v, 0);
  let x = a;
  out[0] = a;
  for (let i = 0; i < n; i++) {
    x += ((b - a) * hs[i]) / tot;
    out[i + 1] = x;
  }
  out[n] = b;
  return out;
};

describe('finite-volume discretisation', () => {
  const circle = { type: 'circle' as const, cx: 0.013, cy: -0.021, r: 0.3 };
  const d = discretise({
    xs: axis(-1, 1, 37, 1.03),
    ys: axis(-1, 1, 41, 0.97),
    conductors: [{ geometry: circle, net: 0 }],
    dielectrics: [{ geometry: { type: 'circle', cx: 0.1, cy: 0, r: 0.6 }, epsR: 4 }],
    backgroundEpsR: 1,
    groundSides: { left: true, right: true, bottom: true, top: true },
    planeNet: 1,
    vacuum: false,
  });
  const { nx, ny, c, w, e, s, n } = d.op;

  it('is symmetric with non-negative couplings; fixed nodes are decoupled with c = 1', () => {
    for (let j = 0; j < ny; j++) {
      for (let i = 0; i < nx; i++) {
        const k = j * nx + i;
        expect(Math.min(w[k], e[k], s[k], n[k])).toBeGreaterThanOrEqual(0);
        if (i > 0) expect(w[k]).toBe(e[k - 1]);
        if (j > 0) expect(s[k]).toBe(n[k - nx]);
        if (d.nodeNet[k] >= 0) {
          expect(c[k]).toBe(1);
          expect(w[k] + e[k] + s[k] + n[k]).toBe(0);
          // nobody couples to a fixed node
          if (i > 0) expect(e[k - 1]).toBe(0);
          if (j > 0) expect(n[k - nx]).toBe(0);
        } else {
          expect(c[k]).toBeGreaterThanOrEqual(w[k] + e[k] + s[k] + n[k] - 1e-12);
        }
      }
    }
  });

  it('satisfies the energy identity φᵀAφ = Σ V_k Q_k and the charges sum to zero', () => {
    const rhs = unitRhs(d, 0, new Float64Array(nx * ny));
    const res = solve(setupHierarchy(d.op), rhs, { tolerance: 1e-12, maxIterations: 500 });
    expect(res.converged).toBe(true);
    const V = new Float64Array([1, 0]);
    const q = netCharges(d, res.x, V);
    const W = discreteEnergy(d, res.x, V);
    expect(Math.abs(W - q[0]) / q[0]).toBeLessThan(1e-9);
    expect(Math.abs(q[0] + q[1]) / q[0]).toBeLessThan(1e-9);
  });
});

describe('fields the scheme reproduces exactly (common practice: FV is exact for piecewise-linear potentials)', () => {
  const mirror = (at: number) => ({ type: 'mirror' as const, at });
  const base = (dielectrics: Problem['dielectrics'], bg = 1): Problem => ({
    backgroundEpsR: bg,
    dielectrics,
    conductors: [{ geometry: { type: 'rect', x: 0, y: 1e-3, width: 2e-3, height: 0.2e-3 }, net: 0 }],
    nets: [{ name: 'top', ground: false }],
    boundary: { left: mirror(0), right: mirror(2e-3), bottom: { type: 'ground', at: 0 }, top: mirror(1.2e-3) },
    mesh: { preset: 'quick' },
  });
  it('ideal parallel plates between mirrors: C = εW/d on every mesh', () => {
    const r = solveProblem(base([], 3));
    for (const f of r.error.family) expect(f.maxwell[0][0]).toBeCloseTo((3 * EPSILON_0 * 2e-3) / 1e-3, 20);
    expect(r.maxwell[0][0] / ((3 * EPSILON_0 * 2) / 1) - 1).toBeLessThan(1e-9);
  });
  it('two dielectric layers in series: C = W/(d1/ε1 + d2/ε2) exactly', () => {
    const r = solveProblem(base([{ geometry: { type: 'rect', x: -1, y: 0, width: 3, height: 0.4e-3 }, epsR: 4.4, material: 0 }]));
    const exact = (EPSILON_0 * 2e-3) / (0.4e-3 / 4.4 + 0.6e-3 / 1);
    expect(Math.abs(r.maxwell[0][0] / exact - 1)).toBeLessThan(1e-9);
    expect(Math.abs(r.vacuum[0][0] / ((EPSILON_0 * 2e-3) / 1e-3) - 1)).toBeLessThan(1e-9);
  });
});
