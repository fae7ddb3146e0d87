/** Sampling φ and |E| along a straight cut across the section. */
import type { FieldGrid } from './grid';
import { samplePoint } from './gradient';
import { sampleSmooth, type SmoothField } from './smooth';

export interface CutSamples {
  /** Distance from the first point, metres. */
  s: Float64Array;
  x: Float64Array;
  y: Float64Array;
  /** Potential, V (NaN outside the mesh). */
  phi: Float64Array;
  /** |E|, V/m (NaN outside the mesh). */
  mag: Float64Array;
}

/**
 * `count` evenly spaced samples from (x0, y0) to (x1, y1), both ends included (metres).
 * With `smooth`, |E| is read from the smooth field the |E| picture shows (0 inside conductor
 * cells); without it, from the gradient of the bilinear potential of the cell.
 */
export function sampleCut(grid: FieldGrid, phi: Float64Array, x0: number, y0: number, x1: number, y1: number, count = 400, smooth?: SmoothField): CutSamples {
  if (!(count >= 2)) throw new RangeError('a cut line needs at least 2 samples');
  const len = Math.hypot(x1 - x0, y1 - y0);
  const out: CutSamples = {
    s: new Float64Array(count),
    x: new Float64Array(count),
    y: new Float64Array(count),
    phi: new Float64Array(count),
    mag: new Float64Array(count),
  };
  for (let q = 0; q < count; q++) {
    const f = q / (count - 1);
    const x = x0 + f * (x1 - x0);
    const y = y0 + f * (y1 - y0);
    const p = samplePoint(grid, phi, x, y);
    out.s[q] = f * len;
    out.x[q] = x;
    out.y[q] = y;
    out.phi[q] = p ? p.phi : Number.NaN;
    out.mag[q] = !p ? Number.NaN : smooth ? (sampleSmooth(grid, smooth, x, y)?.mag ?? 0) : p.mag;
  }
  return out;
}
