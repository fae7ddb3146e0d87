/**
 * Open boundaries: the domain is carried `extent` structure sizes out and closed with zero
 * normal flux. A neutral structure's far field is a dipole, so truncation costs about
 * (1/extent)² (REFERENCES §2, common practice); the bar is < 0.02%. Verified here the way
 * REFERENCES §2 suggests: doubling the extent must change the result by less than 0.02%.
 */
import { describe, expect, it } from 'vitest';
import { solveProblem } from '../../lib/fdm';
import { coplanarStripsProblem, microstripProblem } from './cases';

describe('open-boundary truncation at the standard preset', () => {
  for (const [name, make] of [
    ['microstrip u = 1, εr = 4.4 (ground plane, open above and aside)', () => microstripProblem(1, 1, 4.4, 'standard')],
    ['coplanar strips (all sides open)', () => coplanarStripsProblem(1, 1, 4, 'standard')],
  ] as const) {
    it(`doubling the extent changes ${name} by < 0.02%`, () => {
      const a = solveProblem(make());
      const p = make();
      const b = solveProblem({ ...p, mesh: { ...p.mesh, extent: 400 } });
      // the open top is carried twice as far beyond the highest shape (at y = h or 0)
      const top = Math.max(...p.conductors.map((c) => (c.geometry.type === 'strip' ? c.geometry.y1 : 0)));
      expect(b.mesh.ys[b.mesh.ny - 1] - top).toBeGreaterThan(1.99 * (a.mesh.ys[a.mesh.ny - 1] - top));
      expect(Math.abs(a.maxwell[0][0] / b.maxwell[0][0] - 1)).toBeLessThan(2e-4);
      expect(Math.abs(a.vacuum[0][0] / b.vacuum[0][0] - 1)).toBeLessThan(2e-4);
    });
  }
});
