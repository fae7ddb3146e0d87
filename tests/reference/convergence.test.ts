/**
 * Convergence on the coax (C = 2πε/ln(b/a), exact): over the mesh family (spacings h, 2h, 4h)
 * the error falls at about second order, as the Shortley–Weller treatment of curved surfaces
 * in symmetric finite-volume form promises (Gibou, Fedkiw, Cheng & Kang 2002, J. Comput.
 * Phys. 176:205: potential O(h²)). A staircase boundary would give about first order.
 */
import { describe, expect, it } from 'vitest';
import { solveProblem } from '../../lib/fdm';
import { coaxCapacitance } from '../../lib/analytic/formulas';
import { coaxProblem } from './cases';

describe('coax convergence', () => {
  for (const preset of ['quick', 'standard'] as const) {
    it(`errors fall at about second order (${preset} family)`, () => {
      const exact = coaxCapacitance(1, 2.3);
      const r = solveProblem(coaxProblem(1, 2.3, 1, preset));
      const errs = r.error.family.map((f) => Math.abs(f.maxwell[0][0] / exact - 1));
      // finest first: each halving of h divides the error by about 4
      const p1 = Math.log2(errs[1] / errs[0]);
      const p2 = Math.log2(errs[2] / errs[1]);
      expect(p1).toBeGreaterThan(1.6);
      expect(p1).toBeLessThan(2.4);
      expect(p2).toBeGreaterThan(1.6);
      expect(p2).toBeLessThan(2.4);
      // the order seen by the estimator (from differences between members, not from the exact
      // value) is near 2 once the coarsest member is in the asymptotic range (standard and up;
      // the quick family's coarsest mesh has only ~2.5 cells per radius)
      if (preset === 'standard') {
        expect(r.error.observedOrder!).toBeGreaterThan(1.8);
        expect(r.error.observedOrder!).toBeLessThan(2.2);
      } else {
        expect(r.error.observedOrder!).toBeGreaterThan(1.3);
        expect(r.error.observedOrder!).toBeLessThan(2.5);
      }
      // extrapolation gains at least a factor 10 over the finest mesh in the asymptotic range
      // (standard); on the quick family it still improves and stays within its estimate
      const ext = Math.abs(r.maxwell[0][0] / exact - 1);
      expect(ext).toBeLessThan(preset === 'standard' ? errs[0] / 10 : errs[0]);
      expect(ext).toBeLessThanOrEqual(r.error.relative);
    });
  }
});
