/**
 * The public entry solveProblem: input checks (RangeError), cancellation, progress, fields,
 * mesh in metres, and the dielectric/vacuum bookkeeping.
 */
import { describe, expect, it } from 'vitest';
import { EPSILON_0, SolveCancelledError, solveProblem } from '../../../lib/fdm';
import type { Problem, SolveProgress } from '../../../lib/fdm/types';

const OPEN = { type: 'open' as const };
const MM = 1e-3;
const wireOverGround = (): Problem => ({
  backgroundEpsR: 1,
  dielectrics: [{ geometry: { type: 'rect', x: -5 * MM, y: 0, width: 10 * MM, height: 0.5 * MM }, epsR: 3, material: 0 }],
  conductors: [{ geometry: { type: 'circle', cx: 0, cy: 1 * MM, r: 0.25 * MM }, net: 0, shapeId: 'wire' }],
  nets: [{ name: 'w', ground: false }],
  boundary: { left: OPEN, right: OPEN, bottom: { type: 'ground', at: 0 }, top: OPEN },
  mesh: { preset: 'quick' },
});

describe('solveProblem input checks', () => {
  it('refuses a problem without a reference', () => {
    const p = wireOverGround();
    p.boundary.bottom = OPEN;
    expect(() => solveProblem(p)).toThrow(/no reference/);
  });
  it('refuses a signal net without conductors', () => {
    const p = wireOverGround();
    p.nets.push({ name: 'orphan', ground: false });
    expect(() => solveProblem(p)).toThrow(/signal net "orphan" has no conductors/);
  });
  it('refuses zero sizes and bad permittivities, naming the shape', () => {
    const p = wireOverGround();
    p.conductors[0].geometry = { type: 'circle', cx: 0, cy: 1, r: 0 };
    expect(() => solveProblem(p)).toThrow(/shape "wire".*radius/);
    const q = wireOverGround();
    q.dielectrics[0].epsR = 0.5;
    expect(() => solveProblem(q)).toThrow(RangeError);
  });
  it('refuses a signal conductor that lies beyond a ground boundary', () => {
    const p = wireOverGround();
    p.conductors[0].geometry = { type: 'circle', cx: 0, cy: -1 * MM, r: 0.25 * MM };
    expect(() => solveProblem(p)).toThrow(/outside the domain/);
  });
  it('refuses a mesh beyond the node limit before building it', () => {
    const p = wireOverGround();
    p.conductors.push({ geometry: { type: 'rect', x: 1 * MM, y: 1 * MM, width: 1 * MM, height: 1 * MM }, net: 0 });
    p.mesh = { preset: 'precise', finest: 1e-15 };
    expect(() => solveProblem(p)).toThrow(/more than the limit/);
  });
});

describe('solveProblem behaviour', () => {
  it('cancels with SolveCancelledError', () => {
    let calls = 0;
    expect(() => solveProblem(wireOverGround(), { isCancelled: () => ++calls > 3 })).toThrow(SolveCancelledError);
  });

  it('reports progress, returns fields on the finest mesh and the mesh in metres', () => {
    const seen: SolveProgress[] = [];
    const r = solveProblem(wireOverGround(), { keepFields: true, onProgress: (p) => seen.push(p) });
    expect(seen.some((p) => p.stage === 'solve')).toBe(true);
    expect(seen[seen.length - 1].fraction).toBe(1);
    const { nx, ny, xs, ys } = r.mesh;
    expect(r.mesh.nodes).toBe(nx * ny);
    expect(ys[0]).toBe(0); // the ground plane
    expect(Array.from(xs).some((x) => Math.abs(x - 0.25 * MM) < 1e-12)).toBe(true);
    expect(r.fields!.potentials).toHaveLength(1);
    const phi = r.fields!.potentials[0];
    expect(phi).toHaveLength(nx * ny);
    expect(r.fields!.cellEpsR).toHaveLength((nx - 1) * (ny - 1));
    let onWire = 0, onPlane = 0;
    for (let k = 0; k < nx * ny; k++) {
      const net = r.fields!.nodeNet[k];
      if (net === 0) {
        expect(phi[k]).toBe(1);
        onWire++;
      } else if (net === -2) {
        expect(phi[k]).toBe(0);
        onPlane++;
      } else {
        expect(net).toBe(-1);
        expect(phi[k]).toBeGreaterThanOrEqual(-1e-9);
        expect(phi[k]).toBeLessThanOrEqual(1 + 1e-9); // maximum principle (common practice)
      }
    }
    expect(onWire).toBeGreaterThan(10);
    expect(onPlane).toBe(nx);
    // dielectric present: a separate vacuum family, and εeff between 1 and 3
    const epsEff = r.maxwell[0][0] / r.vacuum[0][0];
    expect(epsEff).toBeGreaterThan(1);
    expect(epsEff).toBeLessThan(3);
    expect(r.error.family).toHaveLength(3);
    expect(r.error.family[0].nodes).toBeGreaterThan(r.error.family[1].nodes);
  });

  it('a uniform background εr scales C with no vacuum solve (vacuum = C/εr)', () => {
    const p = wireOverGround();
    p.dielectrics = [];
    p.backgroundEpsR = 2.5;
    const r = solveProblem(p);
    expect(r.vacuum[0][0]).toBeCloseTo(r.maxwell[0][0] / 2.5, 25);
    // wire over ground, exact 2πε/arccosh(h/a) (method of images), quick preset within 0.5%
    const exact = (2 * Math.PI * EPSILON_0 * 2.5) / Math.acosh(1 / 0.25);
    expect(Math.abs(r.maxwell[0][0] / exact - 1)).toBeLessThan(5e-3);
    expect(Math.abs(r.maxwell[0][0] / exact - 1)).toBeLessThanOrEqual(r.error.relative);
  });
});
