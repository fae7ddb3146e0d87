/**
 * Reference direct solver for tests: the 5-point operator as a dense matrix and a plain dense
 * Cholesky factorisation (Golub & Van Loan, Matrix Computations, §4.2; textbook algorithm).
 * For small grids only (n = nx*ny up to about a thousand).
 */
import type { Operator5 } from '../../lib/fdm/types';

/** Dense row-major n×n matrix of the operator (A x)_k = c_k x_k − Σ couplings · x_neighbour. */
export function operatorToDense(op: Operator5): Float64Array {
  const { nx, ny, c, w, e, s, n } = op;
  const size = nx * ny;
  const A = new Float64Array(size * size);
  for (let j = 0; j < ny; j++) {
    for (let i = 0; i < nx; i++) {
      const k = j * nx + i;
      A[k * size + k] = c[k];
      if (i > 0) A[k * size + k - 1] = -w[k];
      if (i < nx - 1) A[k * size + k + 1] = -e[k];
      if (j > 0) A[k * size + k - nx] = -s[k];
      if (j < ny - 1) A[k * size + k + nx] = -n[k];
    }
  }
  return A;
}

/** y = A x for a dense row-major n×n matrix. */
export function denseMatVec(A: Float64Array, x: Float64Array): Float64Array {
  const size = x.length;
  const y = new Float64Array(size);
  for (let r = 0; r < size; r++) {
    let v = 0;
    for (let q = 0; q < size; q++) v += A[r * size + q] * x[q];
    y[r] = v;
  }
  return y;
}

/** Lower-triangular Cholesky factor L (A = L Lᵀ); throws when A is not positive definite. */
export function choleskyFactor(A: Float64Array, size: number): Float64Array {
  const L = new Float64Array(size * size);
  for (let r = 0; r < size; r++) {
    for (let q = 0; q <= r; q++) {
      let v = A[r * size + q];
      for (let t = 0; t < q; t++) v -= L[r * size + t] * L[q * size + t];
      if (r === q) {
        if (!(v > 0)) throw new Error(`matrix not positive definite at row ${r}`);
        L[r * size + r] = Math.sqrt(v);
      } else {
        L[r * size + q] = v / L[q * size + q];
      }
    }
  }
  return L;
}

/** Solves A x = b by dense Cholesky. */
export function choleskySolve(A: Float64Array, b: Float64Array): Float64Array {
  const size = b.length;
  const L = choleskyFactor(A, size);
  const y = new Float64Array(size);
  for (let r = 0; r < size; r++) {
    let v = b[r];
    for (let t = 0; t < r; t++) v -= L[r * size + t] * y[t];
    y[r] = v / L[r * size + r];
  }
  const x = new Float64Array(size);
  for (let r = size - 1; r >= 0; r--) {
    let v = y[r];
    for (let t = r + 1; t < size; t++) v -= L[t * size + r] * x[t];
    x[r] = v / L[r * size + r];
  }
  return x;
}
