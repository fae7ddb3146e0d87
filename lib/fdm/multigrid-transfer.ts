/**
 * Operator-dependent transfers and Galerkin coarse operators of the black-box multigrid
 * (Alcouffe, Brandt, Dendy & Painter 1981; Dendy 1982): coarse nodes are the fine nodes with
 * even i and even j; every other fine node is interpolated from the fine stencil collapsed
 * along the line through it, so interpolation follows dielectric jumps and stops at fixed
 * (Dirichlet) nodes. Restriction is the transpose of interpolation and the coarse operator is
 * Pᵀ A P (9-point), so the cycle stays symmetric.
 *
 * Weight arrays live on the coarse grid, padded like the coarse vectors (offset `off`):
 *   pxW[K], pxE[K]  weights of fine (2I+1, 2J) to coarse (I, J) and (I+1, J)
 *   pyS[K], pyN[K]  weights of fine (2I, 2J+1) to coarse (I, J) and (I, J+1)
 *   pcSW, pcSE, pcNW, pcNE[K]  weights of fine (2I+1, 2J+1) to coarse (I,J), (I+1,J), (I,J+1), (I+1,J+1)
 * with K = J*ncx + I + off. Weights of missing fine nodes and to missing coarse nodes are 0.
 */
import type { Real, SweepLevel } from './smoothers';

/** A 9-point stencil on an nx × ny grid (unpadded arrays; diagonals null for a 5-point one). */
export interface Stencil9 {
  nx: number;
  ny: number;
  c: Float64Array;
  w: Float64Array;
  e: Float64Array;
  s: Float64Array;
  n: Float64Array;
  sw: Float64Array | null;
  se: Float64Array | null;
  nw: Float64Array | null;
  ne: Float64Array | null;
}

export interface Transfer {
  /** Fine grid size. */
  nx: number;
  ny: number;
  fineOff: number;
  /** Coarse grid size. */
  ncx: number;
  ncy: number;
  off: number;
  pxW: Real;
  pxE: Real;
  pyS: Real;
  pyN: Real;
  pcSW: Real;
  pcSE: Real;
  pcNW: Real;
  pcNE: Real;
}

/** Number of coarse nodes along a line of m fine nodes (the even ones). */
export function coarseCount(m: number): number {
  return (m + 1) >> 1;
}

/** Padding of vectors on an nx-wide grid (one row and a little more on each side). */
export function padFor(nx: number): number {
  return nx + 2;
}

/** Builds the interpolation weights from the fine stencil. Allocates the Transfer. */
export function buildTransfer(A: Stencil9, fineOff: number, single = false): Transfer {
  const { nx, ny, c, w, e, s, n } = A;
  const ncx = coarseCount(nx), ncy = coarseCount(ny);
  const off = padFor(ncx);
  const len = ncx * ncy + 2 * off;
  const mk = (): Real => (single ? new Float32Array(len) : new Float64Array(len));
  const t: Transfer = {
    nx, ny, fineOff, ncx, ncy, off,
    pxW: mk(), pxE: mk(), pyS: mk(), pyN: mk(),
    pcSW: mk(), pcSE: mk(), pcNW: mk(), pcNE: mk(),
  };
  const d9 = (a: Float64Array | null, k: number) => (a === null ? 0 : a[k]);
  const { sw, se, nw, ne } = A;
  // edge-type fine nodes
  for (let J = 0; J < ncy; J++) {
    for (let I = 0; I < ncx; I++) {
      const K = J * ncx + I + off;
      // x-type: fine (2I+1, 2J)
      if (2 * I + 1 < nx) {
        const k = 2 * J * nx + 2 * I + 1;
        const aW = w[k] + d9(sw, k) + d9(nw, k);
        const aE = I + 1 < ncx ? e[k] + d9(se, k) + d9(ne, k) : 0;
        let den = c[k] - s[k] - n[k];
        if (!(den >= aW + aE)) den = aW + aE;
        if (den > 0) {
          t.pxW[K] = Math.max(aW, 0) / den;
          t.pxE[K] = Math.max(aE, 0) / den;
        }
      }
      // y-type: fine (2I, 2J+1)
      if (2 * J + 1 < ny) {
        const k = (2 * J + 1) * nx + 2 * I;
        const aS = s[k] + d9(sw, k) + d9(se, k);
        const aN = J + 1 < ncy ? n[k] + d9(nw, k) + d9(ne, k) : 0;
        let den = c[k] - w[k] - e[k];
        if (!(den >= aS + aN)) den = aS + aN;
        if (den > 0) {
          t.pyS[K] = Math.max(aS, 0) / den;
          t.pyN[K] = Math.max(aN, 0) / den;
        }
      }
    }
  }
  // centre-type fine nodes (2I+1, 2J+1): the full stencil with the edge interpolation substituted
  const { pxW, pxE, pyS, pyN } = t;
  for (let J = 0; J < ncy; J++) {
    if (2 * J + 1 >= ny) continue;
    for (let I = 0; I < ncx; I++) {
      if (2 * I + 1 >= nx) continue;
      const K = J * ncx + I + off;
      const k = (2 * J + 1) * nx + 2 * I + 1;
      const cc = c[k];
      if (!(cc > 0)) continue;
      const hasE = I + 1 < ncx, hasN = J + 1 < ncy;
      t.pcSW[K] = Math.max(d9(sw, k) + w[k] * pyS[K] + s[k] * pxW[K], 0) / cc;
      if (hasE) t.pcSE[K] = Math.max(d9(se, k) + e[k] * pyS[K + 1] + s[k] * pxE[K], 0) / cc;
      if (hasN) t.pcNW[K] = Math.max(d9(nw, k) + w[k] * pyN[K] + n[k] * pxW[K + ncx], 0) / cc;
      if (hasE && hasN) t.pcNE[K] = Math.max(d9(ne, k) + e[k] * pyN[K + 1] + n[k] * pxE[K + ncx], 0) / cc;
    }
  }
  return t;
}

/**
 * Weight of coarse node (I, J) at fine node (2I+di, 2J+dj), di, dj ∈ {−1, 0, 1}.
 * The caller makes sure both nodes exist.
 */
function weightAt(t: Transfer, I: number, J: number, di: number, dj: number): number {
  const K = J * t.ncx + I + t.off;
  const ncx = t.ncx;
  if (dj === 0) {
    if (di === 0) return 1;
    return di > 0 ? t.pxW[K] : t.pxE[K - 1];
  }
  if (dj > 0) {
    if (di === 0) return t.pyS[K];
    return di > 0 ? t.pcSW[K] : t.pcSE[K - 1];
  }
  if (di === 0) return t.pyN[K - ncx];
  return di > 0 ? t.pcNW[K - ncx] : t.pcNE[K - ncx - 1];
}

/**
 * Galerkin coarse operator Pᵀ A P as a 9-point stencil on the coarse grid. Only the couplings
 * to the east, north, north-east and north-west are computed and mirrored, so the result is
 * exactly symmetric. Allocates the coarse stencil.
 */
export function galerkin(A: Stencil9, t: Transfer): Stencil9 {
  const { nx, ny, c, w, e, s, n } = A;
  const { ncx, ncy } = t;
  const size = ncx * ncy;
  const C: Stencil9 = {
    nx: ncx, ny: ncy,
    c: new Float64Array(size), w: new Float64Array(size), e: new Float64Array(size),
    s: new Float64Array(size), n: new Float64Array(size),
    sw: new Float64Array(size), se: new Float64Array(size),
    nw: new Float64Array(size), ne: new Float64Array(size),
  };
  const sw = A.sw, se = A.se, nw = A.nw, ne = A.ne;
  // the nine interpolation weights of every coarse node (I, J) at fine (2I+di, 2J+dj), row-major in
  // (dj, di), 0 where that fine node is missing: one table read instead of a weightAt call
  const wt = new Float64Array(9 * size);
  for (let J = 0; J < ncy; J++) {
    for (let I = 0; I < ncx; I++) {
      const o = 9 * (J * ncx + I);
      for (let dj = -1; dj <= 1; dj++) {
        const fj = 2 * J + dj;
        if (fj < 0 || fj >= ny) continue;
        for (let di = -1; di <= 1; di++) {
          const fi = 2 * I + di;
          if (fi < 0 || fi >= nx) continue;
          wt[o + (dj + 1) * 3 + di + 1] = weightAt(t, I, J, di, dj);
        }
      }
    }
  }
  // phi on a 7×7 local patch (5×5 window plus a zero border); local (li, lj) ∈ −1..5 ↦ (lj+1)*7 + li+1,
  // window position (li, lj) ∈ 0..4 ↔ fine (2I−2+li, 2J−2+lj)
  const phi = new Float64Array(49);
  const aphi = new Float64Array(25);
  const nbI = [0, 1, 0, 1, -1];
  const nbJ = [0, 0, 1, 1, 1];
  // window rows/columns that neighbour q's weights reach: di from diLo[q], dj from djLo[q] (to 1 or 0)
  const diLo = [-1, -1, -1, -1, 0], diHi = [1, 0, 1, 0, 1];
  const djLo = [-1, -1, -1, -1, -1], djHi = [1, 1, 0, 0, 0];
  for (let J = 0; J < ncy; J++) {
    for (let I = 0; I < ncx; I++) {
      const fi0 = 2 * I - 2, fj0 = 2 * J - 2;
      const o = 9 * (J * ncx + I);
      phi[16] = wt[o]; phi[17] = wt[o + 1]; phi[18] = wt[o + 2];
      phi[23] = wt[o + 3]; phi[24] = wt[o + 4]; phi[25] = wt[o + 5];
      phi[30] = wt[o + 6]; phi[31] = wt[o + 7]; phi[32] = wt[o + 8];
      // A phi on the part of the 5×5 window that the products below read (row lj = 0 and
      // (li = 0, lj < 3) lie outside the supports of the east/north/north-east/north-west neighbours)
      for (let lj = 1; lj < 5; lj++) {
        const fj = fj0 + lj;
        for (let li = lj < 3 ? 1 : 0; li < 5; li++) {
          const fi = fi0 + li;
          const a = lj * 5 + li;
          if (fi < 0 || fi >= nx || fj < 0 || fj >= ny) {
            aphi[a] = 0;
            continue;
          }
          const k = fj * nx + fi;
          const p = (lj + 1) * 7 + li + 1;
          let v = c[k] * phi[p] - w[k] * phi[p - 1] - e[k] * phi[p + 1] - s[k] * phi[p - 7] - n[k] * phi[p + 7];
          if (sw !== null) {
            v -= sw[k] * phi[p - 8] + (se as Float64Array)[k] * phi[p - 6] + (nw as Float64Array)[k] * phi[p + 6] + (ne as Float64Array)[k] * phi[p + 8];
          }
          aphi[a] = v;
        }
      }
      const K = J * ncx + I;
      for (let q = 0; q < 5; q++) {
        const I2 = I + nbI[q], J2 = J + nbJ[q];
        if (I2 < 0 || I2 >= ncx || J2 >= ncy) continue;
        // aphi is 0 at fine nodes outside the grid and the table 0 at missing fine nodes, so only
        // the window bounds need checking (they depend on q alone)
        const o2 = 9 * (J2 * ncx + I2);
        const li0 = 2 * nbI[q] + 2, lj0 = 2 * nbJ[q] + 2;
        const d0 = diLo[q], d1 = diHi[q];
        let val = 0;
        for (let dj = djLo[q]; dj <= djHi[q]; dj++) {
          const row = (lj0 + dj) * 5 + li0;
          const wrow = o2 + (dj + 1) * 3 + 1;
          for (let di = d0; di <= d1; di++) {
            const a = aphi[row + di];
            if (a !== 0) val += wt[wrow + di] * a;
          }
        }
        switch (q) {
          case 0:
            C.c[K] = val;
            break;
          case 1:
            C.e[K] = -val;
            C.w[K + 1] = -val;
            break;
          case 2:
            C.n[K] = -val;
            C.s[K + ncx] = -val;
            break;
          case 3:
            (C.ne as Float64Array)[K] = -val;
            (C.sw as Float64Array)[K + ncx + 1] = -val;
            break;
          default:
            (C.nw as Float64Array)[K] = -val;
            (C.se as Float64Array)[K + ncx - 1] = -val;
        }
      }
    }
  }
  return C;
}

/**
 * Restriction bc = Pᵀ rf (padded vectors; rf's margins are zero). Writes bc inside the coarse grid.
 */
export function restrict(t: Transfer, rf: Real, bc: Real): void {
  for (let J = 0; J < t.ncy; J++) restrictRow(t, rf, bc, J);
}

/** Interpolation xf += P xc (padded vectors; xc's margins are zero). Writes xf inside the fine grid. */
export function interpolateAdd(t: Transfer, xc: Real, xf: Real): void {
  for (let j = 0; j < t.ny; j++) interpolateRow(t, xc, xf, j);
}

/**
 * Fused residual and restriction for a cycle whose last pre-smoothing step solved the odd
 * columns exactly: the residual there is zero, so bc = Pᵀ r needs r only on the even columns
 * (weights 1, pyS, pyN). Computes r = b − A x on the even columns of the fine level `lv`
 * (padded storage, see ./smoothers) and writes bc inside the coarse grid. Same result as a
 * full residual followed by `restrict`, up to round-off.
 */
export function residualRestrictEven(lv: SweepLevel, t: Transfer, bc: Real): void {
  const { nx, ny, off: fo, c, w, s, x, b } = lv;
  const { ncx, ncy, off, pyS, pyN } = t;
  bc.fill(0, off, off + ncx * ncy);
  const sw = lv.sw, se = lv.se as Real;
  for (let j = 0; j < ny; j++) {
    const J = j >> 1;
    const odd = (j & 1) === 1;
    const top = J + 1 >= ncy;
    let K = J * ncx + off;
    const r0 = fo + j * nx;
    for (let kk = r0; kk < r0 + nx; kk += 2, K++) {
      let rv = b[kk] - c[kk] * x[kk] + w[kk] * x[kk - 1] + w[kk + 1] * x[kk + 1] + s[kk] * x[kk - nx] + s[kk + nx] * x[kk + nx];
      if (sw !== null) {
        rv += sw[kk] * x[kk - nx - 1] + se[kk] * x[kk - nx + 1] + se[kk + nx - 1] * x[kk + nx - 1] + sw[kk + nx + 1] * x[kk + nx + 1];
      }
      if (!odd) {
        bc[K] += rv;
      } else {
        bc[K] += pyS[K] * rv;
        if (!top) bc[K + ncx] += pyN[K] * rv;
      }
    }
  }
}

/**
 * Interpolation xf += P xc on the even columns only, for a cycle whose first post-smoothing
 * step solves the odd columns exactly (their new values do not depend on the old ones, so the
 * interpolated values there would be overwritten anyway). Writes xf on the even columns.
 */
export function interpolateAddEven(t: Transfer, xc: Real, xf: Real): void {
  const { nx, ny, ncx, off, fineOff, pyS, pyN } = t;
  for (let j = 0; j < ny; j++) {
    let K = (j >> 1) * ncx + off;
    const fr = j * nx + fineOff;
    const end = fr + nx;
    if ((j & 1) === 0) {
      for (let f = fr; f < end; f += 2, K++) xf[f] += xc[K];
    } else {
      for (let f = fr; f < end; f += 2, K++) xf[f] += pyS[K] * xc[K] + pyN[K] * xc[K + ncx];
    }
  }
}

/**
 * Fused residual and restriction after a red–black pre-smoothing sweep on a 5-point level
 * whose last half-sweep updated the black nodes ((i + j) odd): their residual is zero, so
 * bc = Pᵀ r needs r only at the red nodes, i.e. the coarse nodes (even, even), weight 1, and
 * the cell centres (odd, odd), weights pcSW/SE/NW/NE. Writes the centre residuals into `r`
 * (padded fine vector; other entries are left as they are and meet zero weights) and bc
 * inside the coarse grid. Same result as a full residual and `restrict`, up to round-off.
 */
export function residualRestrictRed(lv: SweepLevel, t: Transfer, r: Real, bc: Real): void {
  const { nx, ny, off: fo, c, w, s, x, b } = lv;
  const { ncx, ncy, off, pcSW, pcSE, pcNW, pcNE } = t;
  for (let j = 1; j < ny; j += 2) {
    const r0 = fo + j * nx;
    for (let kk = r0 + 1; kk < r0 + nx; kk += 2) {
      r[kk] = b[kk] - c[kk] * x[kk] + w[kk] * x[kk - 1] + w[kk + 1] * x[kk + 1] + s[kk] * x[kk - nx] + s[kk + nx] * x[kk + nx];
    }
  }
  for (let J = 0; J < ncy; J++) {
    let K = J * ncx + off;
    let f = 2 * J * nx + fo;
    for (let I = 0; I < ncx; I++, K++, f += 2) {
      const rv = b[f] - c[f] * x[f] + w[f] * x[f - 1] + w[f + 1] * x[f + 1] + s[f] * x[f - nx] + s[f + nx] * x[f + nx];
      bc[K] = rv + pcSW[K] * r[f + nx + 1] + pcSE[K - 1] * r[f + nx - 1] + pcNW[K - ncx] * r[f - nx + 1] + pcNE[K - ncx - 1] * r[f - nx - 1];
    }
  }
}

/**
 * Interpolation xf += P xc at the red nodes only ((i + j) even: coarse nodes and cell
 * centres), for a cycle whose first post-smoothing half-sweep recomputes every black node from
 * its red neighbours (5-point level). Writes xf at the red nodes.
 */
export function interpolateAddRed(t: Transfer, xc: Real, xf: Real): void {
  const { nx, ny, ncx, off, fineOff, pcSW, pcSE, pcNW, pcNE } = t;
  for (let j = 0; j < ny; j++) {
    let K = (j >> 1) * ncx + off;
    const fr = j * nx + fineOff;
    const end = fr + nx;
    if ((j & 1) === 0) {
      for (let f = fr; f < end; f += 2, K++) xf[f] += xc[K];
    } else {
      for (let f = fr + 1; f < end; f += 2, K++) xf[f] += pcSW[K] * xc[K] + pcSE[K] * xc[K + 1] + pcNW[K] * xc[K + ncx] + pcNE[K] * xc[K + ncx + 1];
    }
  }
}

/**
 * The whole fine-level descent of a cycle with red–black point smoothing, in one pass over
 * memory: a red-first sweep from a zero start (red nodes x = b/c, then black nodes from
 * their red neighbours), the residual at the red nodes (the black ones are zero after the
 * sweep) and the restriction bc = Pᵀ r. Rows are pipelined: red row j, black row j − 1,
 * residual row j − 2, then the coarse row whose three fine rows are complete. Same arithmetic
 * as sweepRedBlack(lv, cInv, true, true) followed by residualRestrictRed(lv, t, r, bc), so the
 * same result. Writes lv.x, r at the red nodes and bc inside the coarse grid.
 */
export function smoothResidualRestrictRed(lv: SweepLevel, cInv: Real, t: Transfer, r: Real, bc: Real): void {
  const { nx, ny, off: fo, c, w, s, x, b } = lv;
  const { ncx, off, pcSW, pcSE, pcNW, pcNE } = t;
  for (let j = 0; j < ny + 3; j++) {
    const jr = j; // red row
    if (jr < ny) {
      const r0 = fo + jr * nx;
      for (let kk = r0 + (jr & 1); kk < r0 + nx; kk += 2) x[kk] = b[kk] * cInv[kk];
    }
    const jb = j - 1; // black row
    if (jb >= 0 && jb < ny) blackRow(lv, cInv, jb);
    const jq = j - 2; // residual row: its red nodes are final, and so are their neighbours
    if (jq >= 0 && jq < ny) {
      if ((jq & 1) === 1) {
        // odd row: the red nodes are the cell centres (odd columns), kept in r
        const r0 = fo + jq * nx;
        let xW = x[r0];
        for (let kk = r0 + 1; kk < r0 + nx; kk += 2) {
          const xE = x[kk + 1];
          r[kk] = b[kk] - c[kk] * x[kk] + w[kk] * xW + w[kk + 1] * xE + s[kk] * x[kk - nx] + s[kk + nx] * x[kk + nx];
          xW = xE;
        }
      }
      // coarse row J is complete once fine rows 2J − 1, 2J, 2J + 1 (those that exist) are;
      // the coarse nodes' own residuals (row 2J, even columns) are computed here
      if ((jq & 1) === 1 || jq === ny - 1) {
        const J = jq >> 1;
        let K = J * ncx + off;
        let f = 2 * J * nx + fo;
        // the west values of a coarse node are the previous one's east values: carried
        let xW = x[f - 1], rNW = r[f + nx - 1], rSW = r[f - nx - 1];
        for (let I = 0; I < ncx; I++, K++, f += 2) {
          const xE = x[f + 1], rNE = r[f + nx + 1], rSE = r[f - nx + 1];
          const rv = b[f] - c[f] * x[f] + w[f] * xW + w[f + 1] * xE + s[f] * x[f - nx] + s[f + nx] * x[f + nx];
          bc[K] = rv + pcSW[K] * rNE + pcSE[K - 1] * rNW + pcNW[K - ncx] * rSE + pcNE[K - ncx - 1] * rSW;
          xW = xE;
          rNW = rNE;
          rSW = rSE;
        }
      }
    }
  }
}

/**
 * The whole fine-level ascent of a cycle with red–black point smoothing, in one pass over
 * memory: the correction xf += P xc at the red nodes, then a black-first sweep (the adjoint
 * of the descent's red-first sweep). Rows are pipelined: interpolation row j, black row j − 1,
 * red row j − 2. Same arithmetic as interpolateAddRed(t, xc, lv.x) followed by
 * sweepRedBlack(lv, cInv, false, false). Writes lv.x.
 */
export function interpolateSmoothRed(t: Transfer, xc: Real, lv: SweepLevel, cInv: Real): void {
  const { nx, ny, off: fo, w, s, x, b } = lv;
  const { ncx, off, pcSW, pcSE, pcNW, pcNE } = t;
  for (let j = 0; j < ny + 2; j++) {
    if (j < ny) {
      let K = (j >> 1) * ncx + off;
      const fr = j * nx + fo;
      const end = fr + nx;
      if ((j & 1) === 0) {
        for (let f = fr; f < end; f += 2, K++) x[f] += xc[K];
      } else {
        let vs = xc[K], vn = xc[K + ncx];
        for (let f = fr + 1; f < end; f += 2, K++) {
          const vse = xc[K + 1], vne = xc[K + ncx + 1];
          x[f] += pcSW[K] * vs + pcSE[K] * vse + pcNW[K] * vn + pcNE[K] * vne;
          vs = vse;
          vn = vne;
        }
      }
    }
    const jb = j - 1; // black row
    if (jb >= 0 && jb < ny) blackRow(lv, cInv, jb);
    const jr = j - 2; // red row
    if (jr >= 0) colourRow(lv, cInv, jr, jr & 1);
  }
}

/**
 * Gauss–Seidel update of one colour of fine row j of a 5-point level: the nodes i = first,
 * first + 2, … get (b + Σ couplings × neighbours) / c. The west neighbour of one node is the
 * east neighbour of the previous one and is carried in a local (fewer loads; the same
 * arithmetic in the same order as the plain loop). Writes x on those nodes.
 */
function colourRow(lv: SweepLevel, cInv: Real, j: number, first: number): void {
  const { nx, off, w, s, x, b } = lv;
  const r0 = off + j * nx;
  const end = r0 + nx;
  let xW = x[r0 + first - 1];
  for (let kk = r0 + first; kk < end; kk += 2) {
    const xE = x[kk + 1];
    x[kk] = (b[kk] + w[kk] * xW + w[kk + 1] * xE + s[kk] * x[kk - nx] + s[kk + nx] * x[kk + nx]) * cInv[kk];
    xW = xE;
  }
}

/** The black nodes ((i + j) odd) of fine row j: see colourRow. */
function blackRow(lv: SweepLevel, cInv: Real, j: number): void {
  colourRow(lv, cInv, j, 1 - (j & 1));
}


/** xf += P xc on fine row j only (padded vectors). Writes xf on that row. */
function interpolateRow(t: Transfer, xc: Real, xf: Real, j: number): void {
  const { nx, ncx, off, fineOff, pxW, pxE, pyS, pyN, pcSW, pcSE, pcNW, pcNE } = t;
  const nxEven = nx & ~1;
  let K = (j >> 1) * ncx + off;
  const fr = j * nx + fineOff;
  // coarse values shared by neighbouring fine nodes are carried in locals (fewer loads; the
  // same arithmetic in the same order)
  if ((j & 1) === 0) {
    let v = xc[K];
    for (let i = 0; i < nxEven; i += 2, K++) {
      const ve = xc[K + 1];
      xf[fr + i] += v;
      xf[fr + i + 1] += pxW[K] * v + pxE[K] * ve;
      v = ve;
    }
    if (nx & 1) xf[fr + nx - 1] += xc[K];
  } else {
    let vs = xc[K], vn = xc[K + ncx];
    for (let i = 0; i < nxEven; i += 2, K++) {
      const vse = xc[K + 1], vne = xc[K + ncx + 1];
      xf[fr + i] += pyS[K] * vs + pyN[K] * vn;
      xf[fr + i + 1] += pcSW[K] * vs + pcSE[K] * vse + pcNW[K] * vn + pcNE[K] * vne;
      vs = vse;
      vn = vne;
    }
    if (nx & 1) xf[fr + nx - 1] += pyS[K] * xc[K] + pyN[K] * xc[K + ncx];
  }
}

/** bc = Pᵀ r on coarse row J only, from fine rows 2J − 1 … 2J + 1 of r (padded). Writes bc on that row. */
function restrictRow(t: Transfer, rf: Real, bc: Real, J: number): void {
  const { nx, ncx, off, fineOff, pxW, pxE, pyS, pyN, pcSW, pcSE, pcNW, pcNE } = t;
  let K = J * ncx + off;
  let f = 2 * J * nx + fineOff;
  // the west column of fine values of one coarse node is the east column of the previous one:
  // carried in locals (fewer loads; the same arithmetic in the same order)
  let rW = rf[f - 1], rNW = rf[f + nx - 1], rSW = rf[f - nx - 1];
  for (let I = 0; I < ncx; I++, K++, f += 2) {
    const rE = rf[f + 1], rNE = rf[f + nx + 1], rSE = rf[f - nx + 1];
    bc[K] =
      rf[f] +
      pxW[K] * rE +
      pxE[K - 1] * rW +
      pyS[K] * rf[f + nx] +
      pyN[K - ncx] * rf[f - nx] +
      pcSW[K] * rNE +
      pcSE[K - 1] * rNW +
      pcNW[K - ncx] * rSE +
      pcNE[K - ncx - 1] * rSW;
    rW = rE;
    rNW = rNE;
    rSW = rSE;
  }
}

/**
 * The descent of a coarse level smoothed by lexicographic Gauss–Seidel, in one pass over
 * memory: a forward sweep from a zero start, the residual and the restriction bc = Pᵀ r.
 * After a forward sweep from zero, node k's equation holds with its lower neighbours' new
 * values and its upper neighbours at zero, so its residual is Σ (upper couplings × new x):
 * r_k = e_k x_{k+1} + n_k x_{k+nx} + ne_k x_{k+nx+1} + nw_k x_{k+nx−1}, four terms instead of
 * ten (equal to b − A x up to round-off). Rows are pipelined: sweep row j, residual row j − 1,
 * then the coarse row whose three fine rows are complete. Writes lv.x, r and bc.
 */
export function gaussSeidelResidualRestrict(lv: SweepLevel, cInv: Real, t: Transfer, r: Real, bc: Real): void {
  const { nx, ny, off: fo, w, s, x, b } = lv;
  const sw = lv.sw, se = lv.se;
  for (let j = 0; j <= ny; j++) {
    if (j < ny) {
      const r0 = fo + j * nx;
      const end = r0 + nx;
      if (sw === null || se === null) {
        for (let kk = r0; kk < end; kk++) x[kk] = (b[kk] + w[kk] * x[kk - 1] + s[kk] * x[kk - nx]) * cInv[kk];
      } else {
        // neighbours shared with the previous node are carried in locals (fewer loads; the
        // same arithmetic in the same order)
        let xW = x[r0 - 1], xSW = x[r0 - nx - 1], xS = x[r0 - nx];
        for (let kk = r0; kk < end; kk++) {
          const xSE = x[kk - nx + 1];
          const v = (b[kk] + w[kk] * xW + s[kk] * xS + sw[kk] * xSW + se[kk] * xSE) * cInv[kk];
          x[kk] = v;
          xW = v;
          xSW = xS;
          xS = xSE;
        }
      }
    }
    const jq = j - 1;
    if (jq < 0) continue;
    const r0 = fo + jq * nx;
    const end = r0 + nx;
    if (jq === ny - 1) {
      // top row: no upper row; only the east neighbour
      for (let kk = r0; kk < end; kk++) r[kk] = w[kk + 1] * x[kk + 1];
    } else if (sw === null || se === null) {
      for (let kk = r0; kk < end; kk++) r[kk] = w[kk + 1] * x[kk + 1] + s[kk + nx] * x[kk + nx];
    } else {
      let xNW = x[r0 + nx - 1], xN = x[r0 + nx];
      for (let kk = r0; kk < end; kk++) {
        const xNE = x[kk + nx + 1];
        r[kk] = w[kk + 1] * x[kk + 1] + s[kk + nx] * xN + sw[kk + nx + 1] * xNE + se[kk + nx - 1] * xNW;
        xNW = xN;
        xN = xNE;
      }
    }
    if ((jq & 1) === 1 || jq === ny - 1) restrictRow(t, r, bc, jq >> 1);
  }
}

/**
 * The ascent of a coarse level smoothed by lexicographic Gauss–Seidel, in one pass over
 * memory: the correction xf += P xc, then a backward sweep (the adjoint of the forward one).
 * Rows are pipelined from the top: interpolation of row j − 1, then the backward sweep of row
 * j (which reads row j − 1 before it is swept). Same arithmetic as interpolateAdd followed by
 * sweepGaussSeidel(lv, cInv, false, false). Writes lv.x.
 */
export function interpolateGaussSeidelBack(t: Transfer, xc: Real, lv: SweepLevel, cInv: Real): void {
  const { nx, ny, off: fo, w, s, x, b } = lv;
  const sw = lv.sw, se = lv.se;
  interpolateRow(t, xc, x, ny - 1);
  for (let j = ny - 1; j >= 0; j--) {
    if (j > 0) interpolateRow(t, xc, x, j - 1);
    const r0 = fo + j * nx;
    if (sw === null || se === null) {
      for (let kk = r0 + nx - 1; kk >= r0; kk--) {
        x[kk] = (b[kk] + w[kk] * x[kk - 1] + w[kk + 1] * x[kk + 1] + s[kk] * x[kk - nx] + s[kk + nx] * x[kk + nx]) * cInv[kk];
      }
    } else {
      // moving west, the east neighbour, its coupling and two of the three values of the rows
      // below and above are the previous node's: carried in locals (fewer loads; the same
      // arithmetic in the same order)
      const last = r0 + nx - 1;
      let xE = x[last + 1], wE = w[last + 1];
      let xS = x[last - nx], xSE = x[last - nx + 1], xN = x[last + nx], xNE = x[last + nx + 1];
      for (let kk = last; kk >= r0; kk--) {
        const wW = w[kk], xW = x[kk - 1], xSW = x[kk - nx - 1], xNW = x[kk + nx - 1];
        const f =
          b[kk] + wW * xW + wE * xE + s[kk] * xS + s[kk + nx] * xN +
          sw[kk] * xSW + se[kk] * xSE + se[kk + nx - 1] * xNW + sw[kk + nx + 1] * xNE;
        const v = f * cInv[kk];
        x[kk] = v;
        xE = v;
        wE = wW;
        xSE = xS;
        xS = xSW;
        xNE = xN;
        xN = xNW;
      }
    }
  }
}
