import { describe, expect, it } from 'vitest';
import { prolongNested } from '../../../lib/fdm/solve-problem';

describe('prolongNested (first guess from the coarser family member)', () => {
  // graded, nested axes: the coarse axis is every 2nd fine node; one fine axis has an extra
  // node beyond the last coarse line
  const fx = Float64Array.from([0, 0.1, 0.3, 0.7, 1.5, 3.1, 6.3]);
  const fy = Float64Array.from([-2, -1.5, -1.2, -1.1, -1, 0, 4, 5]);
  const cx = Float64Array.from([0, 0.3, 1.5, 6.3]);
  const cy = Float64Array.from([-2, -1.2, -1, 4]);
  const f = (x: number, y: number) => 2 + 3 * x - 0.5 * y + 0.25 * x * y;

  it('copies coarse nodes and reproduces a bilinear function exactly inside the coarse mesh', () => {
    // bilinear interpolation is exact for a + bx + cy + dxy (common practice, no published source)
    const u = new Float64Array(cx.length * cy.length);
    for (let j = 0; j < cy.length; j++) for (let i = 0; i < cx.length; i++) u[j * cx.length + i] = f(cx[i], cy[j]);
    const v = prolongNested(u, cx, cy, fx, fy);
    expect(v.length).toBe(fx.length * fy.length);
    for (let j = 0; j < fy.length - 1; j++) {
      for (let i = 0; i < fx.length; i++) expect(v[j * fx.length + i]).toBeCloseTo(f(fx[i], fy[j]), 12);
    }
    // beyond the last coarse line (fy[7] = 5 > cy[3] = 4) the value of that line is held
    for (let i = 0; i < fx.length; i++) expect(v[7 * fx.length + i]).toBeCloseTo(f(fx[i], 4), 12);
  });
});
