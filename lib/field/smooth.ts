/**
 * A smooth electric field for display: E recovered at the mesh nodes from the cell-centre
 * values, then interpolated bilinearly inside each cell (per screen pixel or per probe point).
 *
 * Node recovery: the cell-centre gradients of the bilinear potential are exact for any
 * quadratic φ, and the four cells around a node are weighted as a tensor-product linear
 * interpolation from their centres to the node (a cell's weight is the width of the opposite
 * cell in x times that in y). So the recovered E is exact wherever E is linear in x and y
 * (φ quadratic) at interior nodes, and exact everywhere for a uniform field. Conductor cells
 * (all four corners on a conductor) hold no field and give no weight.
 *
 * A field jumps across a conductor of zero thickness (a strip: E points away from it on both
 * sides). Values are therefore kept per cell corner: at a conductor node, a cell averages only
 * the cells it reaches around that node without crossing a mesh edge that lies on a conductor
 * (both ends conductor nodes). At free nodes every neighbouring cell counts, so the picture is
 * continuous there; across a strip it stays discontinuous, as the field is. Given the cells'
 * permittivities, an edge between cells of different εr separates too, so the jump of the
 * normal field at a dielectric interface stays sharp instead of being smeared over two cells.
 *
 * Pure TypeScript: no DOM, no Node APIs.
 */
import type { FieldGrid } from './grid';
import { findInterval, locate } from './grid';
import type { CellField } from './gradient';
import { type ColorScale, scaleValue } from './colormap';
import type { RasterImage, WorldRect } from './raster';

export interface SmoothField {
  /**
   * E at the four corners of every cell, V/m per volt of drive, 4 per cell in the order
   * (i, j), (i+1, j), (i, j+1), (i+1, j+1); NaN for conductor cells.
   */
  cornerEx: Float64Array;
  cornerEy: Float64Array;
  /** 1 for conductor cells (transparent, no field). */
  conductorCell: Uint8Array;
}

/** Cells whose four corners are all conductor nodes (nodeNet ≠ −1). */
export function conductorCells(grid: FieldGrid, nodeNet: ArrayLike<number>): Uint8Array {
  const { nx, ny } = grid;
  const cx = nx - 1;
  const out = new Uint8Array(cx * (ny - 1));
  for (let j = 0; j < ny - 1; j++) {
    for (let i = 0; i < cx; i++) {
      const k = j * nx + i;
      if (nodeNet[k] !== -1 && nodeNet[k + 1] !== -1 && nodeNet[k + nx] !== -1 && nodeNet[k + nx + 1] !== -1) out[j * cx + i] = 1;
    }
  }
  return out;
}

// The four cells around a node, counter-clockwise from the north-east one, and the node's
// edges between consecutive ones: NE –(north edge)– NW –(west)– SW –(south)– SE –(east)– NE.
const CELL_DI = [0, -1, -1, 0];
const CELL_DJ = [0, 0, -1, -1];
// edge between around[q] and around[(q + 1) % 4]: the neighbour node's offset
const EDGE_DI = [0, -1, 0, 1];
const EDGE_DJ = [1, 0, -1, 0];
// which corner of a cell the node is, for the cell at around[q] (corner order 00, 10, 01, 11)
const CORNER_OF = [0, 1, 3, 2];

/**
 * Recover E at the corners of every cell (see the module comment). `cells` are the
 * cell-centre values (cellField), `nodeNet` marks conductor nodes (−1 free).
 */
export function smoothField(
  grid: FieldGrid,
  cells: CellField,
  nodeNet: ArrayLike<number>,
  conductorCell?: Uint8Array,
  cellEps?: ArrayLike<number>,
): SmoothField {
  const { xs, ys, nx, ny } = grid;
  const cx = nx - 1;
  const cy = ny - 1;
  const nc = cx * cy;
  if (cells.ex.length !== nc || cells.ey.length !== nc) throw new RangeError(`the cell field has ${cells.ex.length} values, the grid ${nc} cells`);
  if (nodeNet.length !== nx * ny) throw new RangeError(`nodeNet has ${nodeNet.length} values, the grid ${nx * ny} nodes`);
  if (cellEps && cellEps.length !== nc) throw new RangeError(`cellEps has ${cellEps.length} values, the grid ${nc} cells`);
  const metal = conductorCell ?? conductorCells(grid, nodeNet);
  const cornerEx = new Float64Array(4 * nc).fill(Number.NaN);
  const cornerEy = new Float64Array(4 * nc).fill(Number.NaN);
  const { ex, ey } = cells;
  const hx = (i: number) => xs[i + 1]! - xs[i]!;
  const hy = (j: number) => ys[j + 1]! - ys[j]!;

  // per node: the four cells (index or −1), their weights, and which edges are blocked
  const cellAt = new Int32Array(4);
  const w = new Float64Array(4);
  const reach = new Uint8Array(4);
  for (let j = 0; j < ny; j++) {
    for (let i = 0; i < nx; i++) {
      const n = j * nx + i;
      for (let q = 0; q < 4; q++) {
        const ci = i + CELL_DI[q]!;
        const cj = j + CELL_DJ[q]!;
        if (ci < 0 || cj < 0 || ci >= cx || cj >= cy || metal[cj * cx + ci] === 1) {
          cellAt[q] = -1;
          w[q] = 0;
          continue;
        }
        cellAt[q] = cj * cx + ci;
        // weight: the opposite cell's width (this cell's own where the opposite one is missing)
        const oi = ci === i ? i - 1 : i; // the cell column on the other side of the node
        const oj = cj === j ? j - 1 : j;
        const wx = oi >= 0 && oi < cx ? hx(oi) : hx(ci);
        const wy = oj >= 0 && oj < cy ? hy(oj) : hy(cj);
        w[q] = wx * wy;
      }
      // edges that separate: along a conductor (both ends conductor nodes), or between two
      // cells of different permittivity (the normal field jumps at a dielectric interface)
      let blocked = 0;
      const free = nodeNet[n] === -1;
      for (let q = 0; q < 4; q++) {
        const a = cellAt[q]!;
        const b = cellAt[(q + 1) % 4]!;
        if (cellEps && a >= 0 && b >= 0 && cellEps[a] !== cellEps[b]) {
          blocked |= 1 << q;
          continue;
        }
        if (free) continue;
        const mi = i + EDGE_DI[q]!;
        const mj = j + EDGE_DJ[q]!;
        // an edge off the mesh separates nothing
        if (mi >= 0 && mj >= 0 && mi < nx && mj < ny && nodeNet[mj * nx + mi] !== -1) blocked |= 1 << q;
      }
      if (blocked === 0) {
        // every neighbouring cell counts: one value shared by all of them
        let sw = 0;
        let sx = 0;
        let sy = 0;
        for (let q = 0; q < 4; q++) {
          const c = cellAt[q]!;
          if (c < 0) continue;
          sw += w[q]!;
          sx += w[q]! * ex[c]!;
          sy += w[q]! * ey[c]!;
        }
        if (!(sw > 0)) continue;
        const vx = sx / sw;
        const vy = sy / sw;
        for (let q = 0; q < 4; q++) {
          const c = cellAt[q]!;
          if (c < 0) continue;
          cornerEx[4 * c + CORNER_OF[q]!] = vx;
          cornerEy[4 * c + CORNER_OF[q]!] = vy;
        }
        continue;
      }
      // each cell averages the cells it reaches around the node without crossing a separating edge
      for (let q = 0; q < 4; q++) {
        const c = cellAt[q]!;
        if (c < 0) continue;
        reach.fill(0);
        reach[q] = 1;
        // walk counter-clockwise, then clockwise, until metal, a missing cell or a blocked edge
        for (let s = 1; s < 4; s++) {
          const from = (q + s - 1) % 4;
          const to = (q + s) % 4;
          if (blocked & (1 << from) || cellAt[to]! < 0) break;
          reach[to] = 1;
        }
        for (let s = 1; s < 4; s++) {
          const to = (q - s + 4) % 4;
          if (blocked & (1 << to) || cellAt[to]! < 0) break;
          reach[to] = 1;
        }
        let sw = 0;
        let sx = 0;
        let sy = 0;
        for (let r = 0; r < 4; r++) {
          if (!reach[r]) continue;
          const cr = cellAt[r]!;
          sw += w[r]!;
          sx += w[r]! * ex[cr]!;
          sy += w[r]! * ey[cr]!;
        }
        cornerEx[4 * c + CORNER_OF[q]!] = sx / sw;
        cornerEy[4 * c + CORNER_OF[q]!] = sy / sw;
      }
    }
  }
  return { cornerEx, cornerEy, conductorCell: metal };
}

export interface SmoothSample {
  ex: number;
  ey: number;
  mag: number;
}

/** E at a point (metres) from the smooth field; null outside the mesh or inside a conductor cell. */
export function sampleSmooth(grid: FieldGrid, f: SmoothField, x: number, y: number): SmoothSample | null {
  const lx = locate(grid.xs, x);
  const ly = locate(grid.ys, y);
  if (!lx || !ly) return null;
  const c = ly.k * (grid.nx - 1) + lx.k;
  if (f.conductorCell[c] === 1) return null;
  const s = lx.t;
  const t = ly.t;
  const o = 4 * c;
  const a = (1 - s) * (1 - t);
  const b = s * (1 - t);
  const d = (1 - s) * t;
  const e = s * t;
  const vx = a * f.cornerEx[o]! + b * f.cornerEx[o + 1]! + d * f.cornerEx[o + 2]! + e * f.cornerEx[o + 3]!;
  const vy = a * f.cornerEy[o]! + b * f.cornerEy[o + 1]! + d * f.cornerEy[o + 2]! + e * f.cornerEy[o + 3]!;
  return { ex: vx, ey: vy, mag: Math.sqrt(vx * vx + vy * vy) };
}

/**
 * |E| of the smooth field → pixels for a world rectangle (y up: the first image row is y1),
 * interpolated per pixel. Conductor cells and pixels outside the mesh stay transparent.
 */
export function rasterSmoothMagnitude(
  grid: FieldGrid,
  f: SmoothField,
  rect: WorldRect,
  width: number,
  height: number,
  scale: ColorScale,
  lut: Uint8Array,
  alpha = 255,
): RasterImage {
  const cx = grid.nx - 1;
  const colK = new Int32Array(width);
  const colT = new Float64Array(width);
  for (let p = 0; p < width; p++) {
    const v = rect.x0 + ((p + 0.5) / width) * (rect.x1 - rect.x0);
    const k = findInterval(grid.xs, v);
    colK[p] = k;
    colT[p] = k < 0 ? 0 : (v - grid.xs[k]!) / (grid.xs[k + 1]! - grid.xs[k]!);
  }
  const data = new Uint8ClampedArray(width * height * 4);
  const { cornerEx: X, cornerEy: Y, conductorCell } = f;
  const log = scale.kind === 'log';
  const lo = log ? Math.log10(scale.min) : scale.min;
  const span = log ? Math.log10(scale.max) - lo : scale.max - scale.min;
  const inv = span > 0 ? 1 / span : 0;
  for (let py = 0; py < height; py++) {
    const v = rect.y1 - ((py + 0.5) / height) * (rect.y1 - rect.y0);
    const j = findInterval(grid.ys, v);
    if (j < 0) continue;
    const t = (v - grid.ys[j]!) / (grid.ys[j + 1]! - grid.ys[j]!);
    const rowBase = j * cx;
    let o = py * width * 4 - 4;
    for (let px = 0; px < width; px++) {
      o += 4;
      const i = colK[px]!;
      if (i < 0) continue;
      const c = rowBase + i;
      if (conductorCell[c] === 1) continue;
      const s = colT[px]!;
      const q = 4 * c;
      const ax = X[q]! + s * (X[q + 1]! - X[q]!);
      const bx = X[q + 2]! + s * (X[q + 3]! - X[q + 2]!);
      const ay = Y[q]! + s * (Y[q + 1]! - Y[q]!);
      const by = Y[q + 2]! + s * (Y[q + 3]! - Y[q + 2]!);
      const vx = ax + t * (bx - ax);
      const vy = ay + t * (by - ay);
      const m = Math.sqrt(vx * vx + vy * vy);
      if (!(m >= 0)) continue; // NaN
      let u = log ? (m > 0 ? (Math.log10(m) - lo) * inv : 0) : (m - lo) * inv;
      if (!(u >= 0)) u = 0;
      else if (u > 1) u = 1;
      const l = Math.round(u * 255) * 3;
      data[o] = lut[l]!;
      data[o + 1] = lut[l + 1]!;
      data[o + 2] = lut[l + 2]!;
      data[o + 3] = alpha;
    }
  }
  return { width, height, rect, data };
}

/** The colour-scale position of |E| at a point, as the picture paints it (for tests and the probe). */
export function smoothScaleAt(grid: FieldGrid, f: SmoothField, x: number, y: number, scale: ColorScale): number {
  const p = sampleSmooth(grid, f, x, y);
  return p ? scaleValue(scale, p.mag) : Number.NaN;
}
