/**
 * Every starting section must solve. Where an exact formula exists, the result is compared
 * with it (quick preset, so within 1 %; the solver's own accuracy tests live with the solver).
 */
import { describe, expect, it } from 'vitest';
import { TEMPLATES, templateSection } from '@/lib/section/templates';
import { solveSection } from '@/lib/engine/solve-section';

const EPS0 = 8.8541878128e-12; // CODATA 2018 vacuum permittivity, F/m

function solveQuick(id: Parameters<typeof templateSection>[0]) {
  const s = templateSection(id);
  s.mesh = { preset: 'quick' };
  return solveSection(s, {}).result;
}

describe('starting sections solve', () => {
  it.each(TEMPLATES.map((t) => t.id))('%s gives a positive, symmetric Maxwell matrix', (id) => {
    const r = solveQuick(id);
    const m = r.capacitance.maxwell;
    expect(m.length).toBeGreaterThan(0);
    for (let i = 0; i < m.length; i++) {
      expect(m[i]![i]!).toBeGreaterThan(0);
      for (let j = 0; j < m.length; j++) {
        if (i !== j) expect(m[i]![j]!).toBeLessThanOrEqual(0);
        expect(Math.abs(m[i]![j]! - m[j]![i]!)).toBeLessThanOrEqual(1e-6 * m[i]![i]!);
      }
    }
  }, 120_000);

  it('coaxial line matches C = 2πε/ln(b/a) (exact; e.g. Pozar, Microwave Engineering, 4th ed., §2.2)', () => {
    const r = solveQuick('coax');
    const exact = (2 * Math.PI * EPS0 * 2.3) / Math.log(1.5 / 0.45);
    expect(Math.abs(r.capacitance.maxwell[0]![0]! / exact - 1)).toBeLessThan(0.01);
  }, 120_000);

  it('twin lead matches C = πε/arccosh(D/2a) (exact, method of images; REFERENCES.md §6)', () => {
    const r = solveQuick('twin-lead');
    const exact = (Math.PI * EPS0) / Math.acosh(4 / (2 * 0.5));
    // One lead is the ground net, so the Maxwell entry of the other is the two-wire capacitance.
    expect(Math.abs(r.capacitance.maxwell[0]![0]! / exact - 1)).toBeLessThan(0.01);
  }, 120_000);

  it('wire over ground matches C = 2πε/arccosh(h/a) (exact, method of images; REFERENCES.md §6)', () => {
    const r = solveQuick('wire-over-ground');
    const exact = (2 * Math.PI * EPS0) / Math.acosh(2 / 0.5);
    expect(Math.abs(r.capacitance.maxwell[0]![0]! / exact - 1)).toBeLessThan(0.01);
  }, 120_000);
});
