import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { makeGrid } from '@/lib/field/grid';
import { cellField, peakField, samplePoint, superpose } from '@/lib/field/gradient';
import { sampleCut } from '@/lib/field/cut-line';

/** A graded axis: spacings growing geometrically (ratio r) from h0. */
function graded(n: number, h0: number, r: number, start = 0): Float64Array {
  const a = new Float64Array(n);
  a[0] = start;
  let h = h0;
  for (let k = 1; k < n; k++) {
    a[k] = a[k - 1]! + h;
    h *= r;
  }
  return a;
}

function nodeField(xs: Float64Array, ys: Float64Array, f: (x: number, y: number) => number): Float64Array {
  const out = new Float64Array(xs.length * ys.length);
  for (let j = 0; j < ys.length; j++) for (let i = 0; i < xs.length; i++) out[j * xs.length + i] = f(xs[i]!, ys[j]!);
  return out;
}

describe('E = −∇φ on the tensor mesh', () => {
  // Common practice, no published source: the bilinear interpolant reproduces any linear
  // function exactly, so its gradient is exact for linear φ on any spacing.
  it('is exact for a linear potential on graded meshes (cells and points)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -5, max: 5, noNaN: true }),
        fc.double({ min: -5, max: 5, noNaN: true }),
        fc.double({ min: -1, max: 1, noNaN: true }),
        fc.double({ min: 1, max: 1.4, noNaN: true }),
        (a, b, c, r) => {
          const xs = graded(9, 1e-3, r, -2e-3);
          const ys = graded(7, 2e-3, 2.4 - r, 1e-3);
          const g = makeGrid(xs, ys);
          const phi = nodeField(xs, ys, (x, y) => a * x * 1e3 + b * y * 1e3 + c);
          const E = cellField(g, phi);
          for (let k = 0; k < E.ex.length; k++) {
            expect(E.ex[k]).toBeCloseTo(-a * 1e3, 6);
            expect(E.ey[k]).toBeCloseTo(-b * 1e3, 6);
            expect(E.mag[k]).toBeCloseTo(Math.hypot(a, b) * 1e3, 6);
          }
          const p = samplePoint(g, phi, 0.3e-3, 2.7e-3)!;
          expect(p.phi).toBeCloseTo(a * 0.3 + b * 2.7 + c, 9);
          expect(p.ex).toBeCloseTo(-a * 1e3, 6);
          expect(p.ey).toBeCloseTo(-b * 1e3, 6);
        },
      ),
      { numRuns: 50 },
    );
  });

  it('returns null outside the mesh and refuses a field of the wrong length', () => {
    const g = makeGrid(Float64Array.from([0, 1, 2]), Float64Array.from([0, 1]));
    expect(samplePoint(g, new Float64Array(6), 3, 0.5)).toBeNull();
    expect(() => cellField(g, new Float64Array(5))).toThrow(RangeError);
    expect(() => makeGrid(Float64Array.from([0, 0]), Float64Array.from([0, 1]))).toThrow(RangeError);
  });

  // Common practice, no published source: a parallel-plate field between plates at 1 V and 0 V
  // a distance d apart is uniform, |E| = V/d.
  it('finds the uniform field between ideal plates and the peak where the field is strongest', () => {
    const xs = graded(11, 0.1, 1);
    const ys = graded(6, 0.2, 1); // 0 .. 1
    const g = makeGrid(xs, ys);
    const phi = nodeField(xs, ys, (_x, y) => 1 - y);
    phi[2 * 11 + 5] = 1.3; // a bump makes one neighbourhood stronger
    const E = cellField(g, phi);
    const peak = peakField(g, E)!;
    expect(peak.mag).toBeGreaterThan(1);
    expect(Math.abs(peak.x - 0.5)).toBeLessThan(0.11);
    expect(Math.abs(peak.y - 0.4)).toBeLessThan(0.21);
    const cut = sampleCut(g, phi, 0.05, 0, 0.05, 1, 11);
    expect(cut.phi[0]).toBeCloseTo(1, 12);
    expect(cut.phi[10]).toBeCloseTo(0, 12);
    expect(cut.mag[5]).toBeCloseTo(1, 12);
    expect(cut.s[10]).toBeCloseTo(1, 12);
  });

  it('superposes per-net fields linearly', () => {
    const a = Float64Array.from([1, 0, 0.5]);
    const b = Float64Array.from([0, 1, 0.25]);
    expect(Array.from(superpose([a, b], [2, -1]))).toEqual([2, -1, 0.75]);
    expect(() => superpose([a], [1, 2])).toThrow(RangeError);
  });
});
