/**
 * Line relaxation kernels of the multigrid cycle: zebra (odd/even) line Gauss–Seidel along x
 * (rows) and along y (columns), for the 5-point fine operator and the 9-point Galerkin coarse
 * operators. Each line is solved exactly with the Thomas algorithm from factors computed once
 * in set-up (factorLines).
 *
 * Storage (a "level"): every array is padded with `off` zero entries before and after the
 * grid (off ≥ nx + 2) and node (i, j) sits at kk = off + j*nx + i. Only the lower half of the
 * symmetric stencil is stored: c, w (to i−1), s (to j−1), sw (to i−1, j−1), se (to i+1, j−1);
 * the other couplings are read from the neighbour (e_k = w_{k+1}, n_k = s_{k+nx},
 * ne_k = sw_{k+nx+1}, nw_k = se_{k+nx−1}). Couplings that leave the grid are zero, so reads
 * across the grid edge meet zeros or finite values times a zero coupling, and the inner loops
 * need no edge tests.
 *
 * Sign convention (as Operator5): (A x)_k = c_k x_k − Σ coupling · x_neighbour, couplings ≥ 0.
 */

/**
 * Storage of a level: Float64Array by default, Float32Array when `precision: 'single'` (or
 * 'auto' on an unstretched mesh) is asked for (see HierarchyOptions.precision in
 * ./multigrid). Arithmetic is always in double precision; only stored values are rounded.
 */
export type Real = Float32Array | Float64Array;

/** A new zeroed array of the same element type as `like`. */
export function realLike(like: Real, length: number): Real {
  return like instanceof Float32Array ? new Float32Array(length) : new Float64Array(length);
}

export interface SweepLevel {
  nx: number;
  ny: number;
  /** Offset of node 0 in every array. */
  off: number;
  c: Real;
  w: Real;
  s: Real;
  /** Diagonal couplings (null on the 5-point fine level). */
  sw: Real | null;
  se: Real | null;
  /** Thomas factors of the x-lines: 1/pivot and e/pivot. */
  xInv: Real;
  xU: Real;
  /** Thomas factors of the y-lines: 1/pivot and n/pivot. */
  yInv: Real;
  yU: Real;
  /** Work vectors: iterate (correction) and right-hand side. */
  x: Real;
  b: Real;
}

/**
 * Thomas factors of the tridiagonal x-lines (−w, c, −e) and y-lines (−s, c, −n).
 * Writes lv.xInv, lv.xU, lv.yInv, lv.yU (1/pivot is 0 where a pivot is not positive).
 */
export function factorLines(lv: SweepLevel): void {
  const { nx, ny, off, c, w, s, xInv, xU, yInv, yU } = lv;
  for (let j = 0; j < ny; j++) {
    const r = off + j * nx;
    let prevU = 0;
    for (let kk = r; kk < r + nx; kk++) {
      const d = c[kk] - w[kk] * prevU;
      const iv = d > 0 ? 1 / d : 0;
      xInv[kk] = iv;
      prevU = w[kk + 1] * iv; // e_k = w_{k+1}; zero at the row end
      xU[kk] = prevU;
    }
  }
  for (let j = 0; j < ny; j++) {
    const r = off + j * nx;
    for (let kk = r; kk < r + nx; kk++) {
      const d = c[kk] - s[kk] * yU[kk - nx];
      const iv = d > 0 ? 1 / d : 0;
      yInv[kk] = iv;
      yU[kk] = s[kk + nx] * iv; // n_k = s_{k+nx}; zero on the top row
    }
  }
}

/**
 * Zebra x-line Gauss–Seidel on rows j ≡ parity (mod 2): solves each such row exactly with the
 * other rows held fixed. With `zeroGuess` the neighbouring rows are taken as zero (first sweep
 * from a zero start; they are not read). Writes lv.x on those rows only. Rows of one colour are
 * independent, so they are eliminated two at a time: the two recurrences overlap in the CPU.
 */
export function sweepRows(lv: SweepLevel, parity: number, zeroGuess: boolean): void {
  const { ny } = lv;
  let j = parity;
  if (lv.sw === null) for (; j + 6 < ny; j += 8) sweepRowQuad5(lv, j, zeroGuess);
  for (; j + 2 < ny; j += 4) sweepRowPair(lv, j, j + 2, zeroGuess);
  if (j < ny) sweepRowPair(lv, j, -1, zeroGuess);
}

/** Line solves of the 5-point rows j, j+2, j+4, j+6 in one loop (four independent recurrences). Writes lv.x. */
function sweepRowQuad5(lv: SweepLevel, j: number, zeroGuess: boolean): void {
  const { nx, off, w, s, xInv: inv, xU: u, x, b } = lv;
  const r = off + j * nx;
  const d = 2 * nx, d2 = 4 * nx, d3 = 6 * nx;
  let g0 = 0, g1 = 0, g2 = 0, g3 = 0;
  if (zeroGuess) {
    for (let k0 = r; k0 < r + nx; k0++) {
      const k1 = k0 + d, k2 = k0 + d2, k3 = k0 + d3;
      g0 = (b[k0] + w[k0] * g0) * inv[k0];
      g1 = (b[k1] + w[k1] * g1) * inv[k1];
      g2 = (b[k2] + w[k2] * g2) * inv[k2];
      g3 = (b[k3] + w[k3] * g3) * inv[k3];
      x[k0] = g0;
      x[k1] = g1;
      x[k2] = g2;
      x[k3] = g3;
    }
  } else {
    for (let k0 = r; k0 < r + nx; k0++) {
      const k1 = k0 + d, k2 = k0 + d2, k3 = k0 + d3;
      g0 = (b[k0] + s[k0] * x[k0 - nx] + s[k0 + nx] * x[k0 + nx] + w[k0] * g0) * inv[k0];
      g1 = (b[k1] + s[k1] * x[k1 - nx] + s[k1 + nx] * x[k1 + nx] + w[k1] * g1) * inv[k1];
      g2 = (b[k2] + s[k2] * x[k2 - nx] + s[k2 + nx] * x[k2 + nx] + w[k2] * g2) * inv[k2];
      g3 = (b[k3] + s[k3] * x[k3 - nx] + s[k3 + nx] * x[k3 + nx] + w[k3] * g3) * inv[k3];
      x[k0] = g0;
      x[k1] = g1;
      x[k2] = g2;
      x[k3] = g3;
    }
  }
  for (let k0 = r + nx - 2; k0 >= r; k0--) {
    const k1 = k0 + d, k2 = k0 + d2, k3 = k0 + d3;
    x[k0] += u[k0] * x[k0 + 1];
    x[k1] += u[k1] * x[k1 + 1];
    x[k2] += u[k2] * x[k2 + 1];
    x[k3] += u[k3] * x[k3 + 1];
  }
}

/** Line solves of rows j1 and j2 (j2 = −1: only j1); the rows must not be neighbours. Writes lv.x. */
function sweepRowPair(lv: SweepLevel, j1: number, j2: number, zeroGuess: boolean): void {
  const { nx, off, w, s, xInv: inv, xU: u, x, b } = lv;
  const sw = lv.sw, se = lv.se as Real;
  const r1 = off + j1 * nx;
  const d = j2 >= 0 ? (j2 - j1) * nx : 0; // second row = first + d
  const two = j2 >= 0;
  let g1 = 0, g2 = 0;
  if (zeroGuess) {
    if (two) {
      for (let kk = r1; kk < r1 + nx; kk++) {
        const k2 = kk + d;
        g1 = (b[kk] + w[kk] * g1) * inv[kk];
        g2 = (b[k2] + w[k2] * g2) * inv[k2];
        x[kk] = g1;
        x[k2] = g2;
      }
    } else {
      for (let kk = r1; kk < r1 + nx; kk++) {
        g1 = (b[kk] + w[kk] * g1) * inv[kk];
        x[kk] = g1;
      }
    }
  } else if (sw === null) {
    if (two) {
      for (let kk = r1; kk < r1 + nx; kk++) {
        const k2 = kk + d;
        g1 = (b[kk] + s[kk] * x[kk - nx] + s[kk + nx] * x[kk + nx] + w[kk] * g1) * inv[kk];
        g2 = (b[k2] + s[k2] * x[k2 - nx] + s[k2 + nx] * x[k2 + nx] + w[k2] * g2) * inv[k2];
        x[kk] = g1;
        x[k2] = g2;
      }
    } else {
      for (let kk = r1; kk < r1 + nx; kk++) {
        g1 = (b[kk] + s[kk] * x[kk - nx] + s[kk + nx] * x[kk + nx] + w[kk] * g1) * inv[kk];
        x[kk] = g1;
      }
    }
  } else if (two) {
    for (let kk = r1; kk < r1 + nx; kk++) {
      const k2 = kk + d;
      const f1 =
        b[kk] + s[kk] * x[kk - nx] + s[kk + nx] * x[kk + nx] +
        sw[kk] * x[kk - nx - 1] + se[kk] * x[kk - nx + 1] + se[kk + nx - 1] * x[kk + nx - 1] + sw[kk + nx + 1] * x[kk + nx + 1];
      const f2 =
        b[k2] + s[k2] * x[k2 - nx] + s[k2 + nx] * x[k2 + nx] +
        sw[k2] * x[k2 - nx - 1] + se[k2] * x[k2 - nx + 1] + se[k2 + nx - 1] * x[k2 + nx - 1] + sw[k2 + nx + 1] * x[k2 + nx + 1];
      g1 = (f1 + w[kk] * g1) * inv[kk];
      g2 = (f2 + w[k2] * g2) * inv[k2];
      x[kk] = g1;
      x[k2] = g2;
    }
  } else {
    for (let kk = r1; kk < r1 + nx; kk++) {
      const f =
        b[kk] + s[kk] * x[kk - nx] + s[kk + nx] * x[kk + nx] +
        sw[kk] * x[kk - nx - 1] + se[kk] * x[kk - nx + 1] + se[kk + nx - 1] * x[kk + nx - 1] + sw[kk + nx + 1] * x[kk + nx + 1];
      g1 = (f + w[kk] * g1) * inv[kk];
      x[kk] = g1;
    }
  }
  // back substitution
  if (two) {
    for (let kk = r1 + nx - 2; kk >= r1; kk--) {
      const k2 = kk + d;
      x[kk] += u[kk] * x[kk + 1];
      x[k2] += u[k2] * x[k2 + 1];
    }
  } else {
    for (let kk = r1 + nx - 2; kk >= r1; kk--) x[kk] += u[kk] * x[kk + 1];
  }
}

/**
 * Zebra y-line Gauss–Seidel on columns i ≡ parity (mod 2), all columns of that colour advanced
 * together row by row (cache-friendly forward and back substitution). Writes lv.x on those
 * columns only.
 */
export function sweepColumns(lv: SweepLevel, parity: number): void {
  const { nx, ny, off, w, s, yInv: inv, yU: u, x, b } = lv;
  const sw = lv.sw, se = lv.se as Real;
  // forward elimination; x holds the intermediate values of this colour's columns
  for (let j = 0; j < ny; j++) {
    const r = off + j * nx;
    const end = r + nx;
    if (sw === null) {
      for (let kk = r + parity; kk < end; kk += 2) {
        x[kk] = (b[kk] + w[kk] * x[kk - 1] + w[kk + 1] * x[kk + 1] + s[kk] * x[kk - nx]) * inv[kk];
      }
    } else {
      for (let kk = r + parity; kk < end; kk += 2) {
        const f =
          b[kk] +
          w[kk] * x[kk - 1] +
          w[kk + 1] * x[kk + 1] +
          sw[kk] * x[kk - nx - 1] +
          se[kk] * x[kk - nx + 1] +
          se[kk + nx - 1] * x[kk + nx - 1] +
          sw[kk + nx + 1] * x[kk + nx + 1];
        x[kk] = (f + s[kk] * x[kk - nx]) * inv[kk];
      }
    }
  }
  // back substitution
  for (let j = ny - 2; j >= 0; j--) {
    const r = off + j * nx;
    const end = r + nx;
    for (let kk = r + parity; kk < end; kk += 2) x[kk] += u[kk] * x[kk + nx];
  }
}

/** (b − A x) at padded index kk of the level. Reads only. */
export function residualAt(lv: SweepLevel, kk: number): number {
  const { nx, c, w, s, x, b } = lv;
  let v = b[kk] - c[kk] * x[kk] + w[kk] * x[kk - 1] + w[kk + 1] * x[kk + 1] + s[kk] * x[kk - nx] + s[kk + nx] * x[kk + nx];
  if (lv.sw !== null) {
    const sw = lv.sw, se = lv.se as Real;
    v += sw[kk] * x[kk - nx - 1] + se[kk] * x[kk - nx + 1] + se[kk + nx - 1] * x[kk + nx - 1] + sw[kk + nx + 1] * x[kk + nx + 1];
  }
  return v;
}

/** r = b − A x on the whole level (padded). Writes r inside the grid. */
export function residualFull(lv: SweepLevel, r: Real): void {
  const { nx, ny, off } = lv;
  for (let kk = off; kk < off + nx * ny; kk++) r[kk] = residualAt(lv, kk);
}

/**
 * One red–black point Gauss–Seidel sweep on a 5-point level (sw = null), red = (i + j) even:
 * `redFirst` true updates every red node then every black node, false the reverse (the adjoint,
 * so a red-first pre-sweep and a black-first post-sweep keep the cycle symmetric). The second
 * colour of row j − 1 is updated right after the first colour of row j, in one pass over memory;
 * on a 5-point stencil nodes of one colour couple only to the other colour, so this equals the
 * two full half-sweeps. With `zeroGuess` (red first only) x is taken as zero on entry: red
 * nodes get b/c and the old content of x is never read. `cInv` holds 1/c (padded).
 * Point smoothing suits levels whose cells are nearly square; stretched cells need the line
 * sweeps above.
 */
export function sweepRedBlack(lv: SweepLevel, cInv: Real, redFirst: boolean, zeroGuess: boolean): void {
  const { nx, ny, off, w, s, x, b } = lv;
  const first = redFirst ? 0 : 1;
  const relax = (j: number, colour: number, zero: boolean) => {
    const r = off + j * nx;
    const end = r + nx;
    if (zero) {
      for (let kk = r + ((colour + j) & 1); kk < end; kk += 2) x[kk] = b[kk] * cInv[kk];
      return;
    }
    for (let kk = r + ((colour + j) & 1); kk < end; kk += 2) {
      x[kk] = (b[kk] + w[kk] * x[kk - 1] + w[kk + 1] * x[kk + 1] + s[kk] * x[kk - nx] + s[kk + nx] * x[kk + nx]) * cInv[kk];
    }
  };
  const zero = zeroGuess && redFirst;
  relax(0, first, zero);
  for (let j = 1; j < ny; j++) {
    relax(j, first, zero);
    relax(j - 1, 1 - first, false);
  }
  relax(ny - 1, 1 - first, false);
}

/** 1/c on a level (0 where c is not positive), padded like the level. */
export function inverseDiagonal(lv: SweepLevel): Real {
  const { nx, ny, off, c } = lv;
  const out = realLike(c, c.length);
  for (let kk = off; kk < off + nx * ny; kk++) out[kk] = c[kk] > 0 ? 1 / c[kk] : 0;
  return out;
}

/**
 * One lexicographic point Gauss–Seidel sweep on a 5- or 9-point level: `forward` visits the
 * nodes in increasing index order, otherwise in decreasing order (the adjoint: a forward
 * pre-sweep and a backward post-sweep keep the cycle symmetric). With `zeroGuess` (forward
 * only) x is taken as zero on entry: only the already updated lower neighbours contribute and
 * the old content of x is never read. `cInv` holds 1/c (padded). One pass over memory; a
 * cheap smoother for coarse levels whose couplings are nearly isotropic.
 * Writes lv.x inside the grid.
 */
export function sweepGaussSeidel(lv: SweepLevel, cInv: Real, forward: boolean, zeroGuess: boolean): void {
  const { nx, ny, off, w, s, x, b } = lv;
  const sw = lv.sw, se = lv.se;
  const end = off + nx * ny;
  if (sw === null || se === null) {
    if (forward && zeroGuess) {
      for (let kk = off; kk < end; kk++) x[kk] = (b[kk] + w[kk] * x[kk - 1] + s[kk] * x[kk - nx]) * cInv[kk];
    } else if (forward) {
      for (let kk = off; kk < end; kk++) {
        x[kk] = (b[kk] + w[kk] * x[kk - 1] + w[kk + 1] * x[kk + 1] + s[kk] * x[kk - nx] + s[kk + nx] * x[kk + nx]) * cInv[kk];
      }
    } else {
      for (let kk = end - 1; kk >= off; kk--) {
        x[kk] = (b[kk] + w[kk] * x[kk - 1] + w[kk + 1] * x[kk + 1] + s[kk] * x[kk - nx] + s[kk + nx] * x[kk + nx]) * cInv[kk];
      }
    }
    return;
  }
  if (forward && zeroGuess) {
    for (let kk = off; kk < end; kk++) {
      x[kk] = (b[kk] + w[kk] * x[kk - 1] + s[kk] * x[kk - nx] + sw[kk] * x[kk - nx - 1] + se[kk] * x[kk - nx + 1]) * cInv[kk];
    }
  } else if (forward) {
    for (let kk = off; kk < end; kk++) {
      const f =
        b[kk] + w[kk] * x[kk - 1] + w[kk + 1] * x[kk + 1] + s[kk] * x[kk - nx] + s[kk + nx] * x[kk + nx] +
        sw[kk] * x[kk - nx - 1] + se[kk] * x[kk - nx + 1] + se[kk + nx - 1] * x[kk + nx - 1] + sw[kk + nx + 1] * x[kk + nx + 1];
      x[kk] = f * cInv[kk];
    }
  } else {
    for (let kk = end - 1; kk >= off; kk--) {
      const f =
        b[kk] + w[kk] * x[kk - 1] + w[kk + 1] * x[kk + 1] + s[kk] * x[kk - nx] + s[kk + nx] * x[kk + nx] +
        sw[kk] * x[kk - nx - 1] + se[kk] * x[kk - nx + 1] + se[kk + nx - 1] * x[kk + nx - 1] + sw[kk + nx + 1] * x[kk + nx + 1];
      x[kk] = f * cInv[kk];
    }
  }
}
