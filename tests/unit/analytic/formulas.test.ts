import { describe, expect, it } from 'vitest';
import {
  ellipticK,
  ellipticRatio,
  microstripHammerstadJensen,
  striplineZ0,
  cpwZ0,
  coplanarStripsZ0,
  coaxCapacitance,
  ETA0,
  EPS0,
  C0,
  palmerFringingExcess,
} from '../../../lib/analytic/formulas';

describe('elliptic K by the AGM', () => {
  it('K(0) = π/2 (Abramowitz & Stegun 1964, 17.3.11)', () => {
    expect(ellipticK(0)).toBeCloseTo(Math.PI / 2, 15);
  });
  it('K(1/√2) = Γ(1/4)²/(4√π) = 1.854074677301372 (Abramowitz & Stegun 1964, 17.3 lemniscatic case)', () => {
    expect(ellipticK(Math.SQRT1_2)).toBeCloseTo(1.854074677301372, 14);
  });
  it('K(k)/K(k′) = 1 at k = 1/√2 and grows with k (common practice)', () => {
    expect(ellipticRatio(Math.SQRT1_2)).toBeCloseTo(1, 14);
    expect(ellipticRatio(0.9)).toBeGreaterThan(ellipticRatio(0.5));
  });
  it('near k → 1, K(k) ≈ ln(4/k′) (Abramowitz & Stegun 1964, 17.3.26)', () => {
    const kp = 1e-4;
    const k = Math.sqrt(1 - kp * kp);
    expect(ellipticK(k)).toBeCloseTo(Math.log(4 / kp), 6);
  });
  it('refuses k outside [0, 1)', () => {
    expect(() => ellipticK(1)).toThrow(RangeError);
    expect(() => ellipticK(-0.1)).toThrow(RangeError);
  });
});

describe('closed forms', () => {
  it('free-space constants are consistent: η0 = 1/(ε0 c) ≈ 376.730 Ω (CODATA 2018)', () => {
    expect(ETA0).toBeCloseTo(1 / (EPS0 * C0), 9);
    expect(ETA0).toBeCloseTo(376.730313, 5);
  });
  it('stripline (Cohn 1954): a wider strip gives a lower Z0, and w/b → 0 gives high impedance', () => {
    expect(striplineZ0(2, 1)).toBeLessThan(striplineZ0(1, 1));
    expect(striplineZ0(1, 1)).toBeLessThan(striplineZ0(0.2, 1));
    // wide-strip limit: two parallel plates of width w at spacing b/2 each side, Z0 → η0·b/(4w)
    // plus fringing (common practice, no published source): below the plate value
    expect(striplineZ0(10, 1)).toBeLessThan(ETA0 / 40);
    expect(striplineZ0(10, 1)).toBeGreaterThan(0.8 * (ETA0 / 40));
  });
  it('coplanar waveguide (Wen 1969): wider slots raise Z0; CPW and coplanar strips are duals', () => {
    expect(cpwZ0(1, 1, 1)).toBeGreaterThan(cpwZ0(1, 0.5, 1));
    // duality in free space: Z_cpw · Z_cps = (η0/2)² for the same k, with Wen's η0 ≈ 120π (Wen 1969)
    expect(cpwZ0(1, 0.7, 1) * coplanarStripsZ0(1, 0.7, 1)).toBeCloseTo((60 * Math.PI) ** 2, 6);
  });
  it('coax 50 Ω in air at b/a = 2.3 (C = 2πε/ln(b/a), exact): Z0 = 60 ln(b/a) Ω', () => {
    const C = coaxCapacitance(1, 2.3);
    expect(1 / (C0 * C)).toBeCloseTo((ETA0 / (2 * Math.PI)) * Math.log(2.3), 9);
  });
  it('Hammerstad & Jensen 1980 limits: εeff between (εr+1)/2 and εr, tends to εr for wide strips', () => {
    for (const u of [0.05, 0.5, 2, 20]) {
      const v = microstripHammerstadJensen(u, 1, 4.4);
      expect(v.epsEff).toBeGreaterThan(2.7);
      expect(v.epsEff).toBeLessThan(4.4);
    }
    expect(microstripHammerstadJensen(1000, 1, 4.4).epsEff).toBeGreaterThan(4.2);
    // wide strip: Z01 approaches the parallel-plate value η0·h/w (from memory: within ~1% at u = 1000)
    const wide = microstripHammerstadJensen(1000, 1, 1);
    expect(wide.z0Air / (ETA0 / 1000)).toBeGreaterThan(0.98);
    expect(wide.z0Air / (ETA0 / 1000)).toBeLessThan(1);
  });
  it('Palmer 1937 excess vanishes as d/w → 0', () => {
    expect(palmerFringingExcess(1, 1e-4)).toBeLessThan(1e-3);
    expect(palmerFringingExcess(1, 0.1)).toBeGreaterThan(palmerFringingExcess(1, 0.01));
  });
});
