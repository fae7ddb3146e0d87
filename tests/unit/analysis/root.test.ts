import { describe, expect, it } from 'vitest';
import { TargetNotReachableError, findRoot } from '@/lib/analysis/root';

describe('findRoot', () => {
  it('finds √2 as the root of x² − 2 to the requested tolerance', async () => {
    // Known value √2 = 1.41421356237…, common practice, no published source needed.
    const r = await findRoot((x) => x * x - 2, 0, 2, { xTolerance: 1e-12 });
    expect(r.converged).toBe(true);
    expect(Math.abs(r.x - Math.SQRT2)).toBeLessThan(1e-11);
    expect(r.evaluations).toBeLessThan(15);
  });

  it('works with an asynchronous, decreasing function (like Z0 against width)', async () => {
    const z = async (w: number) => 87 / Math.sqrt(1.41 + 4.4) * Math.log(5.98 / (0.8 * w + 0.035)) - 50;
    const r = await findRoot(z, 0.5, 5, { xTolerance: 1e-9 });
    expect(Math.abs(await z(r.x))).toBeLessThan(1e-6);
  });

  it('says plainly when the target is outside the range', async () => {
    await expect(findRoot((x) => x + 10, 0, 1)).rejects.toBeInstanceOf(TargetNotReachableError);
    await expect(findRoot((x) => x + 10, 0, 1)).rejects.toThrow(/not reached anywhere in the range/);
  });

  it('refuses an empty range and a non-finite result', async () => {
    await expect(findRoot((x) => x, 1, 1)).rejects.toBeInstanceOf(RangeError);
    await expect(findRoot(() => Number.NaN, 0, 1)).rejects.toThrow(/not a finite number/);
  });
});
