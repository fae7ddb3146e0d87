/**
 * Paint a field into RGBA pixels for a world rectangle (y up: the first image row is y1).
 * Done once per solve and view mode, not per frame; the canvas then draws the image.
 */
import type { FieldGrid } from './grid';
import { findInterval } from './grid';
import { type ColorScale, scaleValue } from './colormap';

export interface WorldRect {
  x0: number;
  y0: number;
  x1: number;
  y1: number;
}

export interface RasterImage {
  width: number;
  height: number;
  rect: WorldRect;
  /** RGBA, row-major from the top row. */
  data: Uint8ClampedArray;
}

/** For each pixel column (or row), the mesh interval that holds the pixel centre, −1 outside. */
function pixelIntervals(a: Float64Array, lo: number, hi: number, count: number, flip: boolean): { k: Int32Array; t: Float64Array } {
  const k = new Int32Array(count);
  const t = new Float64Array(count);
  for (let p = 0; p < count; p++) {
    const f = (p + 0.5) / count;
    const v = flip ? hi - f * (hi - lo) : lo + f * (hi - lo);
    const q = findInterval(a, v);
    k[p] = q;
    t[p] = q < 0 ? 0 : (v - a[q]!) / (a[q + 1]! - a[q]!);
  }
  return { k, t };
}

/** Node field → pixels, bilinear inside each cell (smooth potential). */
export function rasterNodes(
  grid: FieldGrid,
  nodeValues: Float64Array,
  rect: WorldRect,
  width: number,
  height: number,
  scale: ColorScale,
  lut: Uint8Array,
  mask?: (cell: number) => boolean,
  alpha = 255,
): RasterImage {
  const { nx } = grid;
  const cx = nx - 1;
  const col = pixelIntervals(grid.xs, rect.x0, rect.x1, width, false);
  const row = pixelIntervals(grid.ys, rect.y0, rect.y1, height, true);
  const data = new Uint8ClampedArray(width * height * 4);
  for (let py = 0; py < height; py++) {
    const j = row.k[py]!;
    if (j < 0) continue;
    const t = row.t[py]!;
    for (let px = 0; px < width; px++) {
      const i = col.k[px]!;
      if (i < 0) continue;
      if (mask && mask(j * cx + i)) continue;
      const s = col.t[px]!;
      const k = j * nx + i;
      const v =
        (1 - s) * (1 - t) * nodeValues[k]! +
        s * (1 - t) * nodeValues[k + 1]! +
        (1 - s) * t * nodeValues[k + nx]! +
        s * t * nodeValues[k + nx + 1]!;
      const u = scaleValue(scale, v);
      if (Number.isNaN(u)) continue;
      const q = Math.round(u * 255) * 3;
      const o = (py * width + px) * 4;
      data[o] = lut[q]!;
      data[o + 1] = lut[q + 1]!;
      data[o + 2] = lut[q + 2]!;
      data[o + 3] = alpha;
    }
  }
  return { width, height, rect, data };
}
