/**
 * Microstrip of zero thickness against Hammerstad & Jensen (1980, IEEE MTT-S Digest
 * pp. 407–409; formulas as widely reproduced, from memory). Their stated accuracy: the
 * homogeneous (air) impedance Z01 better than 0.01% for u = w/h ≤ 1 and 0.03% for u ≤ 1000;
 * εeff better than 0.2% for 0.01 ≤ u ≤ 100. We allow their stated accuracy plus our own
 * error estimate; Z0 = Z01/√εeff then follows within 0.03% + 0.1% + ours.
 */
import { describe, expect, it } from 'vitest';
import { solveProblem } from '../../lib/fdm';
import { C0, microstripHammerstadJensen } from '../../lib/analytic/formulas';
import { microstripProblem } from './cases';

describe('microstrip vs Hammerstad & Jensen 1980', () => {
  for (const [u, epsR] of [
    [0.5, 4.4],
    [1, 4.4],
    [3, 9.8],
  ] as const) {
    it(`u = ${u}, εr = ${epsR}`, () => {
      const r = solveProblem(microstripProblem(u, 1, epsR, 'standard'));
      const C = r.maxwell[0][0];
      const Cv = r.vacuum[0][0];
      const ours = { z0: 1 / (C0 * Math.sqrt(C * Cv)), epsEff: C / Cv, z0Air: 1 / (C0 * Cv) };
      const hj = microstripHammerstadJensen(u, 1, epsR);
      const est = r.error.relative;
      // Hammerstad & Jensen 1980: Z01 within 0.01% (u ≤ 1) or 0.03% (u ≤ 1000)
      expect(Math.abs(ours.z0Air / hj.z0Air - 1)).toBeLessThanOrEqual((u <= 1 ? 1e-4 : 3e-4) + est);
      // Hammerstad & Jensen 1980: εeff within 0.2% for 0.01 ≤ u ≤ 100
      expect(Math.abs(ours.epsEff / hj.epsEff - 1)).toBeLessThanOrEqual(2e-3 + est);
      expect(Math.abs(ours.z0 / hj.z0 - 1)).toBeLessThanOrEqual(3e-4 + 1e-3 + est);
      // sanity: εeff lies between (εr + 1)/2 and εr (common practice, no published source)
      expect(ours.epsEff).toBeGreaterThan((epsR + 1) / 2);
      expect(ours.epsEff).toBeLessThan(epsR);
    });
  }
});
