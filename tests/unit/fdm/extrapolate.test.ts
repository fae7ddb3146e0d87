import { describe, expect, it } from 'vitest';
import { richardson } from '../../../lib/fdm/extrapolate';

describe('Richardson extrapolation (Roache 1994, J. Fluids Eng. 116:405)', () => {
  it('recovers the limit of f = f* + c·h^p exactly and reports the order', () => {
    for (const p of [1, 1.5, 2, 3]) {
      const f = [1, 2, 4].map((h) => 3 + 0.01 * Math.pow(h * 0.1, p));
      const r = richardson(f);
      expect(r.monotone).toBe(true);
      expect(r.extrapolated).toBe(true);
      expect(r.order!).toBeCloseTo(p, 10);
      expect(r.value).toBeCloseTo(3, 12);
    }
  });
  it('the estimate covers the error when a higher-order term is present', () => {
    const f = [1, 2, 4].map((h) => 1 + 1e-3 * h * h + 2e-5 * h * h * h);
    const r = richardson(f);
    expect(Math.abs(r.value - 1)).toBeLessThanOrEqual(r.error);
  });
  it('flags oscillating convergence and keeps the finest value with a larger estimate', () => {
    const r = richardson([1.001, 0.998, 1.004]);
    expect(r.monotone).toBe(false);
    expect(r.extrapolated).toBe(false);
    expect(r.value).toBe(1.001);
    expect(r.error).toBeCloseTo(0.006, 12);
  });
  it('does not extrapolate with an implausible order', () => {
    const r = richardson([1.0, 1.0001, 1.2]); // order ≈ 11
    expect(r.extrapolated).toBe(false);
    expect(r.value).toBe(1.0);
    expect(r.error).toBeGreaterThanOrEqual(1e-4);
  });
  it('treats identical values as converged', () => {
    const r = richardson([2, 2, 2]);
    expect(r.value).toBe(2);
    expect(r.error).toBeLessThan(1e-11);
  });
});
