/**
 * Accuracy bar of the numerical core: exact analytic references at the STANDARD preset.
 * Each case must be within 0.1% of the exact value, and the reported error estimate must
 * bracket the actual error. The source of every reference value is named in cases.ts and
 * in the test title.
 */
import { describe, expect, it } from 'vitest';
import { solveProblem } from '../../lib/fdm';
import { REFERENCE_CASES } from './cases';

describe('exact references at the standard preset', () => {
  for (const c of REFERENCE_CASES) {
    it(`${c.name} (${c.source})`, () => {
      const r = solveProblem(c.problem('standard'));
      expect(r.signalNets).toEqual([0]);
      const C = r.maxwell[0][0];
      const err = Math.abs(C / c.exact - 1);
      expect(err).toBeLessThan(1e-3);
      // the estimate brackets the true error
      expect(err).toBeLessThanOrEqual(r.error.relative);
      if (c.exactVacuum !== undefined) {
        const ev = Math.abs(r.vacuum[0][0] / c.exactVacuum - 1);
        expect(ev).toBeLessThan(1e-3);
        expect(ev).toBeLessThanOrEqual(r.error.relative);
      } else {
        // no dielectric shapes: the vacuum matrix is the Maxwell matrix over the background εr
        const bg = c.problem('standard').backgroundEpsR;
        expect(r.vacuum[0][0] * bg).toBeCloseTo(C, 20);
      }
      // the raw finest-mesh value is also within its own (coarser) reach of the answer
      expect(Math.abs(r.finest.maxwell[0][0] / c.exact - 1)).toBeLessThan(3e-3);
      expect(r.warnings).toEqual([]);
    });
  }
});
