import { describe, expect, it } from 'vitest';
import { coupledPair, crosstalk, inductanceMatrix, modalAnalysis } from '@/lib/analysis/lines';
import { C_LIGHT, EPS0, ETA0, MU0 } from '@/lib/analysis/constants';

describe('inductanceMatrix', () => {
  it('gives the coax inductance mu0/(2 pi) ln(b/a) from its vacuum capacitance', () => {
    // Source: Pozar 2012, Microwave Engineering, 4th ed., §2.2 (coaxial line L and C, exact).
    const ratio = 3.2;
    const c0 = (2 * Math.PI * EPS0) / Math.log(ratio);
    const [[l]] = inductanceMatrix([[c0]]);
    expect(l).toBeCloseTo((MU0 / (2 * Math.PI)) * Math.log(ratio), 15);
    expect(l / ((MU0 / (2 * Math.PI)) * Math.log(ratio))).toBeCloseTo(1, 12);
  });

  it('refuses a matrix with a non-finite entry', () => {
    expect(() => inductanceMatrix([[Number.NaN]])).toThrow(RangeError);
  });
});

describe('modalAnalysis', () => {
  // An inhomogeneous symmetric pair (invented matrices: microstrip-like, the dielectric
  // raises the odd mode less than the even mode).
  const vacuum = [
    [40e-12, -8e-12],
    [-8e-12, 40e-12],
  ];
  const maxwell = [
    [130e-12, -20e-12],
    [-20e-12, 130e-12],
  ];

  it('reproduces the even- and odd-mode formulas for a symmetric pair', () => {
    // Source: Pozar 2012, §7.6: C_e = C11 + C12, C_o = C11 − C12 (Maxwell form),
    // Z = 1/(c √(C·C0)), εeff = C/C0.
    const modes = modalAnalysis(maxwell, vacuum);
    const ce = 110e-12, c0e = 32e-12, co = 150e-12, c0o = 48e-12;
    const even = modes.find((m) => m.voltages[0] * m.voltages[1] > 0)!;
    const odd = modes.find((m) => m !== even)!;
    expect(even.epsEff).toBeCloseTo(ce / c0e, 10);
    expect(odd.epsEff).toBeCloseTo(co / c0o, 10);
    expect(even.z0Ohm / (1 / (C_LIGHT * Math.sqrt(ce * c0e)))).toBeCloseTo(1, 10);
    expect(odd.z0Ohm / (1 / (C_LIGHT * Math.sqrt(co * c0o)))).toBeCloseTo(1, 10);
    const pair = coupledPair(maxwell, vacuum);
    expect(pair.symmetric).toBe(true);
    expect(pair.even.z0Ohm).toBeCloseTo(even.z0Ohm, 9);
    expect(pair.differentialOhm).toBeCloseTo(2 * odd.z0Ohm, 9);
    expect(pair.commonOhm).toBeCloseTo(even.z0Ohm / 2, 9);
  });

  it('gives one mode with the coax impedance for a homogeneous single line', () => {
    // Source: Pozar 2012, §2.2: Z0 = (η0 / (2π √εr)) ln(b/a) for a coaxial line (exact).
    const epsR = 2.1;
    const ratio = 3;
    const c0 = (2 * Math.PI * EPS0) / Math.log(ratio);
    const [mode] = modalAnalysis([[epsR * c0]], [[c0]]);
    expect(mode.epsEff).toBeCloseTo(epsR, 12);
    expect(mode.z0Ohm / ((ETA0 / (2 * Math.PI * Math.sqrt(epsR))) * Math.log(ratio))).toBeCloseTo(1, 10);
  });

  it('treats an asymmetric pair by its modes and keeps the velocities ordered', () => {
    const asym = [
      [140e-12, -18e-12],
      [-18e-12, 100e-12],
    ];
    const pair = coupledPair(asym, vacuum);
    expect(pair.symmetric).toBe(false);
    const modes = modalAnalysis(asym, vacuum);
    expect(modes[0].epsEff).toBeLessThanOrEqual(modes[1].epsEff);
    for (const m of modes) expect(m.z0Ohm).toBeGreaterThan(0);
  });
});

describe('crosstalk', () => {
  it('has no far-end crosstalk in a homogeneous medium, where Cm/C = Lm/L', () => {
    // Source: Bogatin 2009, Signal and Power Integrity — Simplified, 2nd ed., ch. 10
    // (far-end noise vanishes in a homogeneous dielectric); from memory.
    const vacuum = [
      [40e-12, -8e-12],
      [-8e-12, 40e-12],
    ];
    const maxwell = vacuum.map((r) => r.map((x) => 4 * x));
    const x = crosstalk(maxwell, vacuum, 0, 1, { lengthM: 0.1, riseTimeS: 1e-10 });
    expect(Math.abs(x.farEndPerLength)).toBeLessThan(1e-15);
    // Near end ¼(Cm/C + Lm/L) = ½ Cm/C here, since L = μ0ε0 C0⁻¹ gives Lm/L = 8/40.
    expect(x.nearEnd).toBeCloseTo(0.5 * (8 / 40), 12);
  });
});
