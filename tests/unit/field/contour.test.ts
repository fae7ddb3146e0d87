import { describe, expect, it } from 'vitest';
import { makeGrid } from '@/lib/field/grid';
import { isoLine, pointAlong, polylineLength } from '@/lib/field/contour';

function axis(n: number, lo: number, hi: number, grade = 1): Float64Array {
  const a = new Float64Array(n);
  for (let k = 0; k < n; k++) a[k] = lo + (hi - lo) * Math.pow(k / (n - 1), grade);
  return a;
}

describe('iso-lines by marching squares on a tensor mesh', () => {
  // Common practice, no published source: linear interpolation along cell edges places the
  // iso-line of a linear field exactly (φ = x gives the vertical line x = level).
  it('finds the straight iso-line of a linear field exactly, on a graded mesh', () => {
    const xs = axis(17, 0, 1, 1.7);
    const ys = axis(9, -1, 1, 1);
    const g = makeGrid(xs, ys);
    const phi = new Float64Array(17 * 9);
    for (let j = 0; j < 9; j++) for (let i = 0; i < 17; i++) phi[j * 17 + i] = xs[i]!;
    const iso = isoLine(g, phi, 0.37);
    expect(iso.lines).toHaveLength(1);
    const line = iso.lines[0]!;
    expect(line.length / 2).toBe(9); // one point on every horizontal grid line
    for (let q = 0; q < line.length; q += 2) expect(line[q]).toBeCloseTo(0.37, 12);
    expect(polylineLength(line)).toBeCloseTo(2, 12);
    const mid = pointAlong(line, 0.5);
    expect(mid.y).toBeCloseTo(0, 12);
  });

  // Known fact: the iso-lines of r = sqrt(x² + y²) are circles; a closed loop whose points
  // all lie near radius R (error of linear interpolation, O(h²)).
  it('closes the circular iso-line of a radial field', () => {
    const n = 81;
    const xs = axis(n, -1, 1);
    const ys = axis(n, -1, 1);
    const g = makeGrid(xs, ys);
    const f = new Float64Array(n * n);
    for (let j = 0; j < n; j++) for (let i = 0; i < n; i++) f[j * n + i] = Math.hypot(xs[i]!, ys[j]!);
    const iso = isoLine(g, f, 0.6);
    expect(iso.lines).toHaveLength(1);
    const loop = iso.lines[0]!;
    expect(loop[0]).toBeCloseTo(loop[loop.length - 2]!, 12);
    expect(loop[1]).toBeCloseTo(loop[loop.length - 1]!, 12);
    for (let q = 0; q < loop.length; q += 2) expect(Math.abs(Math.hypot(loop[q]!, loop[q + 1]!) - 0.6)).toBeLessThan(2e-3);
    expect(polylineLength(loop)).toBeGreaterThan(2 * Math.PI * 0.6 * 0.995);
    expect(polylineLength(loop)).toBeLessThan(2 * Math.PI * 0.6 * 1.001);
  });

  it('returns nothing for a level outside the field', () => {
    const g = makeGrid(axis(3, 0, 1), axis(3, 0, 1));
    expect(isoLine(g, new Float64Array(9).fill(0.5), 2).lines).toHaveLength(0);
  });
});
