/**
 * Slanted conductor and dielectric outlines (polygons cut by the mesh at an angle, handled by
 * Shortley–Weller cut distances and sub-cell permittivity averages): a square conductor in a
 * round shield must have the same capacitance however it is turned (rotation invariance,
 * common practice, no published source). The rotated cases must agree with the axis-aligned
 * one within the two error estimates. A polygon that is an axis-aligned rectangle must give
 * the rect's result to round-off.
 */
import { describe, expect, it } from 'vitest';
import { solveProblem } from '../../lib/fdm';
import type { Geometry, Problem } from '../../lib/fdm/types';

const MM = 1e-3;
const OPEN = { type: 'open' as const };

function squareInShield(angleDeg: number, asPolygon: boolean, withDielectric: boolean): Problem {
  const a = (angleDeg * Math.PI) / 180;
  const corners: [number, number][] = [
    [-0.5, -0.5],
    [0.5, -0.5],
    [0.5, 0.5],
    [-0.5, 0.5],
  ].map(([x, y]) => [(x * Math.cos(a) - y * Math.sin(a)) * MM, (x * Math.sin(a) + y * Math.cos(a)) * MM] as [number, number]);
  const inner: Geometry = asPolygon ? { type: 'polygon', points: corners } : { type: 'rect', x: -0.5 * MM, y: -0.5 * MM, width: MM, height: MM };
  // a dielectric sleeve turned with the square (a larger square, εr = 3)
  const sleeve: [number, number][] = [
    [-1, -1],
    [1, -1],
    [1, 1],
    [-1, 1],
  ].map(([x, y]) => [(x * Math.cos(a) - y * Math.sin(a)) * MM, (x * Math.sin(a) + y * Math.cos(a)) * MM] as [number, number]);
  return {
    backgroundEpsR: 1,
    dielectrics: withDielectric ? [{ geometry: { type: 'polygon', points: sleeve }, epsR: 3, material: 0 }] : [],
    conductors: [
      { geometry: inner, net: 0 },
      { geometry: { type: 'ring', cx: 0, cy: 0, rInner: 2.5 * MM, rOuter: 2.8 * MM }, net: 1 },
    ],
    nets: [
      { name: 'core', ground: false },
      { name: 'shield', ground: true },
    ],
    boundary: { left: OPEN, right: OPEN, bottom: OPEN, top: OPEN },
    mesh: { preset: 'quick' }, // quick keeps CI fast; the comparison is within the estimates
  };
}

describe('rotation invariance of slanted outlines', () => {
  it('a polygon that is an axis-aligned square equals the rect', () => {
    const r = solveProblem(squareInShield(0, false, false));
    const p = solveProblem(squareInShield(0, true, false));
    expect(Math.abs(p.maxwell[0][0] / r.maxwell[0][0] - 1)).toBeLessThan(1e-9);
  });
  for (const angle of [45, 30]) {
    it(`a square conductor turned by ${angle}° (air)`, () => {
      const r = solveProblem(squareInShield(0, false, false));
      const t = solveProblem(squareInShield(angle, true, false));
      expect(Math.abs(t.maxwell[0][0] / r.maxwell[0][0] - 1)).toBeLessThanOrEqual(r.error.relative + t.error.relative);
      expect(Math.abs(t.maxwell[0][0] / r.maxwell[0][0] - 1)).toBeLessThan(3e-3);
    });
  }
  it('a square conductor in a square dielectric sleeve, both turned by 30°', () => {
    const r = solveProblem(squareInShield(0, true, true));
    const t = solveProblem(squareInShield(30, true, true));
    const d = Math.abs(t.maxwell[0][0] / r.maxwell[0][0] - 1);
    expect(d).toBeLessThanOrEqual(r.error.relative + t.error.relative);
    expect(d).toBeLessThan(5e-3);
    expect(Math.abs(t.vacuum[0][0] / r.vacuum[0][0] - 1)).toBeLessThanOrEqual(r.error.relative + t.error.relative);
  });
});
