/**
 * Kernels of the symmetric 5-point operator (see Operator5 in ./types).
 * Free functions over typed arrays; each says what it writes.
 */
import type { Operator5 } from './types';

/**
 * out = A x for the 5-point operator. Writes `out` only (must not alias `x`).
 * Row-major layout k = j*nx + i; couplings that leave the grid are zero and are skipped.
 */
export function applyOperator(op: Operator5, x: Float64Array, out: Float64Array): void {
  const { nx, ny, c, w, e, s, n } = op;
  const size = nx * ny;
  if (x.length !== size || out.length !== size) {
    throw new RangeError(`applyOperator: arrays must have length nx*ny = ${size}`);
  }
  applyOperatorKernel(nx, ny, c, w, e, s, n, x, out);
}

/** Unchecked kernel of applyOperator. Writes `out`. */
export function applyOperatorKernel(
  nx: number,
  ny: number,
  c: Float64Array,
  w: Float64Array,
  e: Float64Array,
  s: Float64Array,
  n: Float64Array,
  x: Float64Array,
  out: Float64Array,
): void {
  if (nx === 1 || ny === 1) {
    // Degenerate grids: generic guarded loop.
    for (let j = 0; j < ny; j++) {
      for (let i = 0; i < nx; i++) {
        const k = j * nx + i;
        let v = c[k] * x[k];
        if (i > 0) v -= w[k] * x[k - 1];
        if (i < nx - 1) v -= e[k] * x[k + 1];
        if (j > 0) v -= s[k] * x[k - nx];
        if (j < ny - 1) v -= n[k] * x[k + nx];
        out[k] = v;
      }
    }
    return;
  }
  // bottom row
  {
    const k0 = 0;
    out[k0] = c[k0] * x[k0] - e[k0] * x[k0 + 1] - n[k0] * x[k0 + nx];
    for (let k = 1; k < nx - 1; k++) {
      out[k] = c[k] * x[k] - w[k] * x[k - 1] - e[k] * x[k + 1] - n[k] * x[k + nx];
    }
    const k1 = nx - 1;
    out[k1] = c[k1] * x[k1] - w[k1] * x[k1 - 1] - n[k1] * x[k1 + nx];
  }
  for (let j = 1; j < ny - 1; j++) {
    const r = j * nx;
    out[r] = c[r] * x[r] - e[r] * x[r + 1] - s[r] * x[r - nx] - n[r] * x[r + nx];
    const end = r + nx - 1;
    for (let k = r + 1; k < end; k++) {
      out[k] = c[k] * x[k] - w[k] * x[k - 1] - e[k] * x[k + 1] - s[k] * x[k - nx] - n[k] * x[k + nx];
    }
    out[end] = c[end] * x[end] - w[end] * x[end - 1] - s[end] * x[end - nx] - n[end] * x[end + nx];
  }
  // top row
  {
    const r = (ny - 1) * nx;
    out[r] = c[r] * x[r] - e[r] * x[r + 1] - s[r] * x[r - nx];
    const end = r + nx - 1;
    for (let k = r + 1; k < end; k++) {
      out[k] = c[k] * x[k] - w[k] * x[k - 1] - e[k] * x[k + 1] - s[k] * x[k - nx];
    }
    out[end] = c[end] * x[end] - w[end] * x[end - 1] - s[end] * x[end - nx];
  }
}
