/**
 * Electric field E = −∇φ from a node potential on the tensor mesh.
 *
 * Inside each cell φ is taken bilinear in the four corner values (the natural interpolant of
 * a node field on a rectilinear mesh). Its gradient is exact for any φ that is linear in x
 * and y, whatever the spacings. Cell values use the gradient at the cell centre.
 */
import { type FieldGrid, locate } from './grid';

export interface CellField {
  /** E components and magnitude at cell centres, V/m per volt of drive; length (nx−1)*(ny−1). */
  ex: Float64Array;
  ey: Float64Array;
  mag: Float64Array;
}

/** E at every cell centre. Writes nothing it does not return. */
export function cellField(grid: FieldGrid, phi: Float64Array): CellField {
  const { xs, ys, nx, ny } = grid;
  if (phi.length !== nx * ny) throw new RangeError(`phi has ${phi.length} values, the grid ${nx * ny} nodes`);
  const cx = nx - 1;
  const cy = ny - 1;
  const ex = new Float64Array(cx * cy);
  const ey = new Float64Array(cx * cy);
  const mag = new Float64Array(cx * cy);
  for (let j = 0; j < cy; j++) {
    const hy = ys[j + 1]! - ys[j]!;
    const row = j * nx;
    for (let i = 0; i < cx; i++) {
      const hx = xs[i + 1]! - xs[i]!;
      const p00 = phi[row + i]!;
      const p10 = phi[row + i + 1]!;
      const p01 = phi[row + nx + i]!;
      const p11 = phi[row + nx + i + 1]!;
      const gx = (p10 - p00 + p11 - p01) / (2 * hx);
      const gy = (p01 - p00 + p11 - p10) / (2 * hy);
      const k = j * cx + i;
      ex[k] = -gx;
      ey[k] = -gy;
      mag[k] = Math.hypot(gx, gy);
    }
  }
  return { ex, ey, mag };
}

export interface PointSample {
  phi: number;
  ex: number;
  ey: number;
  mag: number;
}

/**
 * φ and E at a point (metres) from the bilinear interpolant of the cell that holds it;
 * null outside the mesh.
 */
export function samplePoint(grid: FieldGrid, phi: Float64Array, x: number, y: number): PointSample | null {
  const lx = locate(grid.xs, x);
  const ly = locate(grid.ys, y);
  if (!lx || !ly) return null;
  const { nx, xs, ys } = grid;
  const i = lx.k;
  const j = ly.k;
  const s = lx.t;
  const t = ly.t;
  const k = j * nx + i;
  const p00 = phi[k]!;
  const p10 = phi[k + 1]!;
  const p01 = phi[k + nx]!;
  const p11 = phi[k + nx + 1]!;
  const hx = xs[i + 1]! - xs[i]!;
  const hy = ys[j + 1]! - ys[j]!;
  const v = (1 - s) * (1 - t) * p00 + s * (1 - t) * p10 + (1 - s) * t * p01 + s * t * p11;
  const gx = ((1 - t) * (p10 - p00) + t * (p11 - p01)) / hx;
  const gy = ((1 - s) * (p01 - p00) + s * (p11 - p10)) / hy;
  return { phi: v, ex: -gx, ey: -gy, mag: Math.hypot(gx, gy) };
}

export interface PeakField {
  /** Largest cell-centre |E|, V/m per volt of drive. */
  mag: number;
  /** Where (metres): the centre of that cell. */
  x: number;
  y: number;
  cell: number;
}

/**
 * The largest |E| over the cells (optionally only where `include(cell)` is true).
 * At sharp conductor corners the true field is singular, so this value depends on the mesh.
 */
export function peakField(grid: FieldGrid, field: CellField, include?: (cell: number) => boolean): PeakField | null {
  const { xs, ys, nx } = grid;
  const cx = nx - 1;
  let best = -1;
  let bestK = -1;
  const m = field.mag;
  for (let k = 0; k < m.length; k++) {
    const v = m[k]!;
    if (v > best && (!include || include(k))) {
      best = v;
      bestK = k;
    }
  }
  if (bestK < 0) return null;
  const i = bestK % cx;
  const j = (bestK - i) / cx;
  return { mag: best, x: 0.5 * (xs[i]! + xs[i + 1]!), y: 0.5 * (ys[j]! + ys[j + 1]!), cell: bestK };
}

/** Superpose per-net potentials: φ = Σ v_k φ_k (each φ_k has net k at 1 V, the others at 0 V). */
export function superpose(potentials: readonly Float64Array[], volts: readonly number[]): Float64Array {
  if (potentials.length === 0) throw new RangeError('no potential fields to superpose');
  if (volts.length !== potentials.length) {
    throw new RangeError(`${volts.length} voltages for ${potentials.length} potential fields`);
  }
  const n = potentials[0]!.length;
  const out = new Float64Array(n);
  for (let k = 0; k < potentials.length; k++) {
    const p = potentials[k]!;
    const v = volts[k]!;
    if (p.length !== n) throw new RangeError('potential fields differ in length');
    if (v === 0) continue;
    for (let q = 0; q < n; q++) out[q] += v * p[q]!;
  }
  return out;
}
