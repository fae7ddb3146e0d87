/**
 * Multigrid-preconditioned conjugate gradients for the symmetric 5-point operator (Operator5).
 *
 * Method (black-box multigrid as a CG preconditioner):
 * - Coarsening: standard (factor 2 in x and y) on the tensor grid, coarse nodes at even (i, j);
 *   any nx, ny ≥ 2 (odd or even). Coarsening stops when a side has ≤ 4 nodes or the grid has
 *   ≤ `coarsestNodes` nodes; the coarsest system is solved exactly by banded Cholesky.
 * - Transfers: operator-dependent interpolation (Alcouffe, Brandt, Dendy & Painter 1981;
 *   Dendy 1982), restriction = its transpose; coarse operators are Galerkin Pᵀ A P (9-point).
 *   See ./multigrid-transfer.
 * - Smoother: alternating zebra line Gauss–Seidel (x-lines then y-lines), exact tridiagonal
 *   line solves, robust for stretched cells in either direction (Trottenberg, Oosterlee &
 *   Schüller 2001, ch. 5). The post-smoother runs the same line steps in reverse order, so the
 *   V-cycle is a symmetric positive definite preconditioner. See ./smoothers.
 * - Stretched meshes (graded far fields): the coarse levels get two sweeps (see
 *   HierarchyOptions.coarseSweeps); a W-cycle is available as an option.
 * - Fixed (Dirichlet) nodes are decoupled identity rows: they are set to rhs/c at the start
 *   and stay exact through the whole hierarchy (interpolation weights towards them are zero).
 *
 * All buffers are allocated in setupHierarchy; solve allocates only its result. The hierarchy
 * is plain data (typed arrays and numbers), usable from a Web Worker or from Node.
 */
import type { IterativeSolveOptions, IterativeSolveResult, Operator5 } from './types';
import { SolveCancelledError } from './types';
import { factorLines, inverseDiagonal, residualFull, sweepColumns, sweepGaussSeidel, sweepRedBlack, sweepRows, type Real, type SweepLevel } from './smoothers';
import {
  buildTransfer,
  galerkin,
  interpolateAdd,
  interpolateAddEven,
  restrict,
  padFor,
  residualRestrictEven,
  residualRestrictRed,
  interpolateAddRed,
  interpolateSmoothRed,
  smoothResidualRestrictRed,
  gaussSeidelResidualRestrict,
  interpolateGaussSeidelBack,
  type Stencil9,
  type Transfer,
} from './multigrid-transfer';

export interface HierarchyOptions {
  /** Largest number of grid levels (1 = no coarsening: exact banded solve of the whole grid). @default 40 */
  maxLevels?: number;
  /** Stop coarsening when a level has at most this many nodes (solved by banded Cholesky). @default 4096 */
  coarsestNodes?: number;
  /** Alternating line sweeps before and after each coarse-grid correction on the finest level. @default 1 */
  sweeps?: number;
  /**
   * The same on the coarser levels. Galerkin operators of strongly stretched meshes lose some
   * accuracy per level, which a second sweep there largely restores at little cost.
   * @default 1, or 2 on stretched meshes (see anisotropyThreshold)
   */
  coarseSweeps?: number;
  /**
   * 'V' (one coarse correction per level), 'W' (two on every level below the finest), 'K'
   * (Krylov-accelerated K-cycle, Notay & Vassilevski 2008: on every coarse level one cycle,
   * scaled optimally, and a second one combined with it by a two-step flexible CG step when
   * the first leaves more than a quarter of the residual) or 'auto': 'K' on stretched meshes
   * (see anisotropyThreshold), where V-cycle iteration counts grow with the number of levels
   * (aspect-1000 test system, 1025²: V 15 iterations, K 6; precise microstrip pipeline 37 →
   * 23), 'V' elsewhere (uniform 1M: V 9, K 10 to 1e-10). The K-cycle is a nonlinear
   * preconditioner; the flexible β of `solve` is made for that. @default 'auto'
   */
  cycle?: 'V' | 'W' | 'K' | 'auto';
  /**
   * A mesh counts as stretched when at least 1% of the nodes with four couplings couple at
   * least this many times more strongly along one axis than along the other (30 ≈ cell aspect
   * ratio 5.5); stretched meshes get `coarseSweeps` = 2 by default. @default 30
   */
  anisotropyThreshold?: number;
  /**
   * Smoother of the finest (5-point) level: 'line' (alternating zebra lines), 'point'
   * (red–black Gauss–Seidel, about a third of the work, enough where cells are nearly square)
   * or 'auto': 'point' when fewer than `pointFraction` of the nodes with four couplings couple
   * `pointRatio` times more strongly along one axis than along the other. @default 'auto'
   */
  fineSmoother?: 'line' | 'point' | 'auto';
  /** @default 2 */
  pointRatio?: number;
  /** @default 0.01 */
  pointFraction?: number;
  /**
   * Smoother of the coarse (9-point Galerkin) levels: 'line' (alternating zebra lines),
   * 'point' (lexicographic Gauss–Seidel, forward before and backward after the coarse
   * correction: one pass over memory instead of about four) or 'auto': 'point' on a level
   * where fewer than `pointFraction` of the nodes couple `pointRatio` times more strongly
   * along one axis than along the other, else 'line'. @default 'auto'
   */
  coarseSmoother?: 'line' | 'point' | 'auto';
  /**
   * Storage of the multigrid hierarchy (operators, transfer weights, line factors, level
   * vectors): 'single' (Float32Array; about half the memory traffic per cycle) or 'double'.
   * CG, its vectors, the fine operator of its products and the residual test stay in double
   * precision either way; the coarsest (banded Cholesky) solve is always double. Single
   * storage makes the preconditioner symmetric only to single-precision round-off, which the
   * flexible (Polak–Ribière) β of the CG in `solve` absorbs (Notay 2000). On strongly
   * stretched meshes single storage costs accuracy where weak couplings are 10⁴–10⁶ times
   * smaller than strong ones next to them (the standard-preset microstrip needed 42 instead
   * of 30 iterations), so 'auto' stores in single precision only where the mesh is not
   * stretched (see anisotropyThreshold).
   *
   * The default is 'double': V8 compiles each kernel for the array types it has seen, and a
   * process that runs both kinds of hierarchy (a stretched graded mesh and a uniform grid, as
   * the solver worker and the benchmark do) gets kernels specialised for neither. Measured on
   * the uniform 1M bench system, 2026-12-02, idle machine, medians of 7: single alone 51.4–51.7
   * work units, double alone 51.9–53.8, single after a double solve in the same process
   * 59.8–61.1. So one precision for everything; 'single' stays available for a process that
   * uses nothing else. @default 'double'
   */
  precision?: 'single' | 'double' | 'auto';
}

/** One grid level: its operator, line factors and padded work vectors (see SweepLevel). */
export interface MgLevel extends SweepLevel {
  size: number;
  /** Residual work vector (padded). */
  r: Real;
  /** 1/c when this coarse level is smoothed by lexicographic Gauss–Seidel, else null. */
  gsInv: Real | null;
  /** K-cycle work vectors (coarse levels of a K-cycle hierarchy), else null: c1, A c1, c2, A c2, saved b. */
  k: Real[] | null;
}

/** Banded Cholesky factor of the coarsest operator (band index m ↔ grid node perm[m]). */
export interface BandCholesky {
  size: number;
  bw: number;
  perm: Int32Array;
  /** L(m, m−d) at m*(bw+1)+d. */
  L: Float64Array;
  invDiag: Float64Array;
  y: Float64Array;
}

export interface Hierarchy {
  nx: number;
  ny: number;
  /** The fine operator as passed in (not copied). */
  op: Operator5;
  levels: MgLevel[];
  /** transfers[l] connects levels[l] (fine) and levels[l+1] (coarse), full coarsening. */
  transfers: Transfer[];
  coarse: BandCholesky;
  /** Alternating line sweeps before and after the coarse correction, per level. */
  sweepsPerLevel: Int32Array;
  /** Coarse corrections per visit of a level: 1 (V-cycle) or 2 (W-cycle). */
  gammaPerLevel: Int32Array;
  /** Decoupled nodes (all couplings zero): x = rhs / c there. */
  fixed: Int32Array;
  /**
   * CG vectors (double precision), padded like level 0: iterate, residual, direction and A·direction.
   * The preconditioner reads the residual from levels[0].b (in double storage the same array
   * as rp, in single storage a rounded copy) and leaves z = M r in levels[0].x.
   */
  xp: Float64Array;
  rp: Float64Array;
  pp: Float64Array;
  qp: Float64Array;
  /** Lower half of the fine operator in double precision, padded like level 0 (for CG's products). */
  fc: Float64Array;
  fw: Float64Array;
  fs: Float64Array;
  /** Storage precision of the hierarchy. */
  precision: 'single' | 'double';
  /** 1/c of the finest level when it is smoothed by red–black point Gauss–Seidel, else null. */
  pointInv: Real | null;
  /** Fraction of the fine nodes with all four couplings whose x/y coupling ratio passes the threshold. */
  anisotropicFraction: number;
  /** Number of nodes on all levels divided by the fine size (grid complexity). */
  gridComplexity: number;
}

function checkOperator(op: Operator5): void {
  const { nx, ny } = op;
  if (!Number.isInteger(nx) || !Number.isInteger(ny) || nx < 2 || ny < 2) {
    throw new RangeError(`operator size must be integers nx, ny >= 2 (got ${nx} x ${ny})`);
  }
  const size = nx * ny;
  for (const key of ['c', 'w', 'e', 's', 'n'] as const) {
    const a = op[key];
    if (!(a instanceof Float64Array) || a.length !== size) {
      throw new RangeError(`operator array ${key} must be a Float64Array of length nx*ny = ${size}`);
    }
  }
  const { c, w, e, s, n } = op;
  for (let j = 0; j < ny; j++) {
    for (let i = 0; i < nx; i++) {
      const k = j * nx + i;
      if (!(c[k] > 0) || !Number.isFinite(c[k])) throw new RangeError(`operator diagonal c must be positive and finite (node i=${i}, j=${j})`);
      if (!(w[k] >= 0 && e[k] >= 0 && s[k] >= 0 && n[k] >= 0) || !Number.isFinite(w[k] + e[k] + s[k] + n[k])) {
        throw new RangeError(`operator couplings must be finite and >= 0 (node i=${i}, j=${j})`);
      }
      if ((i === 0 && w[k] !== 0) || (i === nx - 1 && e[k] !== 0) || (j === 0 && s[k] !== 0) || (j === ny - 1 && n[k] !== 0)) {
        throw new RangeError(`operator couplings leaving the grid must be 0 (node i=${i}, j=${j})`);
      }
      if (i > 0 && Math.abs(w[k] - e[k - 1]) > 1e-12 * Math.max(w[k], e[k - 1])) {
        throw new RangeError(`operator must be symmetric: w at (i=${i}, j=${j}) differs from e of its west neighbour`);
      }
      if (j > 0 && Math.abs(s[k] - n[k - nx]) > 1e-12 * Math.max(s[k], n[k - nx])) {
        throw new RangeError(`operator must be symmetric: s at (i=${i}, j=${j}) differs from n of its south neighbour`);
      }
    }
  }
}

/** Padded copy of an unpadded array. */
function padded(a: Float64Array, off: number, single: boolean): Real {
  const p = single ? new Float32Array(a.length + 2 * off) : new Float64Array(a.length + 2 * off);
  p.set(a, off);
  return p;
}

const f32 = new Float32Array(1);
const i32 = new Int32Array(f32.buffer);

/** The smallest single-precision number ≥ v (v > 0). */
function roundUp32(v: number): number {
  f32[0] = v;
  if (f32[0] < v) i32[0]++;
  return f32[0];
}

/**
 * In single storage, rounding the couplings and the diagonal independently could make a
 * nearly singular row (an isolated region, a Neumann side) lose its diagonal dominance and the
 * stored operator its definiteness. So each diagonal is rounded up to cover the change of its
 * row's rounded couplings: c32 ≥ c + Σ (|a32| − |a|), at most a few units in the last place.
 */
function roundDiagonalUp(A: Stencil9, lv: MgLevel): void {
  const { nx, ny } = A;
  const { off, c, w, s, sw, se } = lv;
  const d = (a32: number, a64: number) => Math.abs(a32) - Math.abs(a64);
  for (let j = 0; j < ny; j++) {
    for (let i = 0; i < nx; i++) {
      const k = j * nx + i;
      const kk = k + off;
      let t = A.c[k] + d(w[kk], A.w[k]) + d(w[kk + 1], A.e[k]) + d(s[kk], A.s[k]) + d(s[kk + nx], A.n[k]);
      if (sw !== null && se !== null && A.sw !== null && A.se !== null && A.nw !== null && A.ne !== null) {
        t += d(sw[kk], A.sw[k]) + d(se[kk], A.se[k]) + d(se[kk + nx - 1], A.nw[k]) + d(sw[kk + nx + 1], A.ne[k]);
      }
      if (c[kk] < t) c[kk] = roundUp32(t);
    }
  }
}

/** Padded symmetric-half storage of a level plus its line factors and work vectors. */
function makeLevel(A: Stencil9, single: boolean): MgLevel {
  const { nx, ny } = A;
  const size = nx * ny;
  const off = padFor(nx);
  const len = size + 2 * off;
  const mk = (): Real => (single ? new Float32Array(len) : new Float64Array(len));
  const lv: MgLevel = {
    nx, ny, size, off,
    c: padded(A.c, off, single), w: padded(A.w, off, single), s: padded(A.s, off, single),
    sw: A.sw === null ? null : padded(A.sw, off, single),
    se: A.se === null ? null : padded(A.se, off, single),
    xInv: mk(), xU: mk(), yInv: mk(), yU: mk(),
    x: mk(), b: mk(), r: mk(), gsInv: null, k: null,
  };
  if (single) roundDiagonalUp(A, lv);
  factorLines(lv);
  return lv;
}

/** Banded Cholesky of a level's (symmetric) stencil, ordered along the shorter side. */
function factorBand(A: Stencil9): BandCholesky {
  const { nx, ny, c, w, s } = A;
  const size = nx * ny;
  const alongX = nx <= ny;
  const bw = (alongX ? nx : ny) + 1;
  const perm = new Int32Array(size);
  const pos = new Int32Array(size);
  for (let j = 0; j < ny; j++) {
    for (let i = 0; i < nx; i++) {
      const k = j * nx + i;
      const m = alongX ? k : i * ny + j;
      perm[m] = k;
      pos[k] = m;
    }
  }
  const W = bw + 1;
  const L = new Float64Array(size * W);
  // lower-triangle entries A(m, q), q < m: minus the coupling between the two nodes
  const put = (k: number, nb: number, coupling: number) => {
    const m = pos[k], q = pos[nb];
    if (q < m) L[m * W + (m - q)] = -coupling;
    else L[q * W + (q - m)] = -coupling;
  };
  for (let j = 0; j < ny; j++) {
    for (let i = 0; i < nx; i++) {
      const k = j * nx + i;
      L[pos[k] * W] = c[k];
      if (i > 0) put(k, k - 1, w[k]);
      if (j > 0) put(k, k - nx, s[k]);
      if (A.sw !== null && i > 0 && j > 0) put(k, k - nx - 1, A.sw[k]);
      if (A.se !== null && i < nx - 1 && j > 0) put(k, k - nx + 1, A.se[k]);
    }
  }
  const invDiag = new Float64Array(size);
  // a local alias (L itself is captured by `put`, so reads of it would go through the closure
  // context) and running indices in the inner product: same operations in the same order,
  // about 1.5× faster in Node 20
  const F = L;
  for (let m = 0; m < size; m++) {
    const lo = Math.max(0, m - bw);
    const rowM = m * W + m;
    for (let q = lo; q <= m; q++) {
      let v = F[rowM - q];
      const tlo = Math.max(lo, q - bw);
      let pm = rowM - tlo, pq = q * W + q - tlo;
      for (let t = tlo; t < q; t++, pm--, pq--) v -= F[pm] * F[pq];
      if (q < m) {
        F[rowM - q] = v * invDiag[q];
      } else {
        const diag = c[perm[m]];
        if (v > 1e-13 * diag) {
          const d = Math.sqrt(v);
          F[m * W] = d;
          invDiag[m] = 1 / d;
        } else {
          F[m * W] = 0;
          invDiag[m] = 0; // singular direction (no reference): dropped
        }
      }
    }
  }
  return { size, bw, perm, L: F, invDiag, y: new Float64Array(size) };
}

/** Exact solve on the coarsest level: writes lv.x (inside the grid) from lv.b; uses ch.y. */
function coarseSolve(ch: BandCholesky, lv: MgLevel): void {
  const { size, bw, perm, L, invDiag, y } = ch;
  const W = bw + 1;
  const { x, b, off } = lv;
  for (let m = 0; m < size; m++) {
    let v = b[perm[m] + off];
    const lo = Math.max(0, m - bw);
    const row = m * W + m;
    for (let t = lo; t < m; t++) v -= L[row - t] * y[t];
    y[m] = v * invDiag[m];
  }
  // backward substitution by rows of L (Lᵀ by columns): once y[q] is final it is removed from
  // the band above it, so L is read contiguously
  for (let q = size - 1; q >= 0; q--) {
    const v = y[q] * invDiag[q];
    y[q] = v;
    x[perm[q] + off] = v;
    const lo = Math.max(0, q - bw);
    const row = q * W + q;
    for (let m = lo; m < q; m++) y[m] -= L[row - m] * v;
  }
}

/** Fraction of the nodes with four positive couplings whose (w+e)/(s+n) or inverse is ≥ threshold. */
function measureAnisotropy(op: { c: Float64Array; w: Float64Array; e: Float64Array; s: Float64Array; n: Float64Array }, threshold: number): number {
  const { c, w, e, s, n } = op;
  let counted = 0, strong = 0;
  for (let k = 0; k < c.length; k++) {
    const a = w[k] + e[k], b = s[k] + n[k];
    if (!(w[k] > 0 && e[k] > 0 && s[k] > 0 && n[k] > 0)) continue;
    counted++;
    if (a >= threshold * b || b >= threshold * a) strong++;
  }
  return counted > 0 ? strong / counted : 0;
}

/**
 * Builds the multigrid hierarchy of a symmetric 5-point operator once per geometry:
 * interpolation weights, Galerkin coarse operators, line factors, the coarsest factor and
 * every work buffer. Throws RangeError on invalid sizes, array lengths or coefficients.
 * Does not copy or modify `op`; keep it unchanged while the hierarchy is in use.
 */
export function setupHierarchy(op: Operator5, opts: HierarchyOptions = {}): Hierarchy {
  const {
    /** @default 40 */ maxLevels = 40,
    /** @default 4096 */ coarsestNodes = 4096,
    /** @default 1 */ sweeps = 1,
    /** @default 'auto' */ cycle: cycleType = 'auto',
    /** @default 30 */ anisotropyThreshold = 30,
    coarseSweeps,
    fineSmoother = 'auto',
    coarseSmoother = 'auto',
    pointRatio = 2,
    pointFraction = 0.01,
    precision = 'double',
  } = opts;
  if (precision !== 'single' && precision !== 'double' && precision !== 'auto') throw new RangeError("precision must be 'single', 'double' or 'auto'");
  if (fineSmoother !== 'line' && fineSmoother !== 'point' && fineSmoother !== 'auto') throw new RangeError("fineSmoother must be 'line', 'point' or 'auto'");
  if (coarseSmoother !== 'line' && coarseSmoother !== 'point' && coarseSmoother !== 'auto') throw new RangeError("coarseSmoother must be 'line', 'point' or 'auto'");
  if (!Number.isInteger(maxLevels) || maxLevels < 1) throw new RangeError('maxLevels must be an integer >= 1');
  if (!Number.isInteger(sweeps) || sweeps < 1) throw new RangeError('sweeps must be an integer >= 1');
  if (coarseSweeps !== undefined && (!Number.isInteger(coarseSweeps) || coarseSweeps < 1)) throw new RangeError('coarseSweeps must be an integer >= 1');
  if (!(coarsestNodes >= 1)) throw new RangeError('coarsestNodes must be >= 1');
  if (cycleType !== 'V' && cycleType !== 'W' && cycleType !== 'K' && cycleType !== 'auto') throw new RangeError("cycle must be 'V', 'W', 'K' or 'auto'");
  if (!(anisotropyThreshold >= 1)) throw new RangeError('anisotropyThreshold must be >= 1');
  checkOperator(op);
  const anisotropicFraction = measureAnisotropy(op, anisotropyThreshold);
  const stretched = anisotropicFraction >= 0.01;
  // single storage only where there is a hierarchy: a grid solved directly stays exact
  const single =
    (precision === 'single' || (precision === 'auto' && !stretched)) &&
    maxLevels > 1 && Math.min(op.nx, op.ny) >= 5 && op.nx * op.ny > coarsestNodes;
  const { nx, ny } = op;
  const size = nx * ny;
  let A: Stencil9 = { nx, ny, c: op.c, w: op.w, e: op.e, s: op.s, n: op.n, sw: null, se: null, nw: null, ne: null };
  const levels: MgLevel[] = [makeLevel(A, single)];
  const transfers: Transfer[] = [];
  let nodes = size;
  while (levels.length < maxLevels && Math.min(A.nx, A.ny) >= 5 && A.nx * A.ny > coarsestNodes) {
    const t = buildTransfer(A, levels[levels.length - 1].off, single);
    A = galerkin(A, t);
    transfers.push(t);
    const lv = makeLevel(A, single);
    if (coarseSmoother === 'point' || (coarseSmoother === 'auto' && measureAnisotropy(A, pointRatio) < pointFraction)) lv.gsInv = inverseDiagonal(lv);
    levels.push(lv);
    nodes += A.nx * A.ny;
  }
  const coarse = factorBand(A);
  const fixedList: number[] = [];
  for (let k = 0; k < size; k++) {
    if (op.w[k] === 0 && op.e[k] === 0 && op.s[k] === 0 && op.n[k] === 0) fixedList.push(k);
  }
  const useW = cycleType === 'W';
  if (cycleType === 'K' || (cycleType === 'auto' && stretched)) {
    for (let l = 1; l < levels.length - 1; l++) {
      const lv = levels[l];
      lv.k = [lv.x, lv.x, lv.x, lv.x, lv.x].map(() => (single ? new Float32Array(lv.x.length) : new Float64Array(lv.x.length)));
    }
  }
  const point = levels.length > 1 && (fineSmoother === 'point' || (fineSmoother === 'auto' && measureAnisotropy(op, pointRatio) < pointFraction));
  const off0 = levels[0].off;
  const padLen = size + 2 * off0;
  return {
    nx, ny, op, levels, transfers, coarse,
    sweepsPerLevel: Int32Array.from(levels, (_, l) => (l === 0 ? sweeps : coarseSweeps ?? (stretched ? 2 : 1))),
    gammaPerLevel: Int32Array.from(levels, (_, l) => (l >= 1 && useW ? 2 : 1)),
    anisotropicFraction,
    pointInv: point ? inverseDiagonal(levels[0]) : null,
    fixed: Int32Array.from(fixedList),
    xp: new Float64Array(padLen),
    // in double storage the preconditioner reads CG's residual directly (no copy per iteration)
    rp: single ? new Float64Array(padLen) : (levels[0].b as Float64Array),
    pp: new Float64Array(padLen),
    qp: new Float64Array(padLen),
    // in double storage level 0 already holds these arrays
    fc: single ? (padded(op.c, off0, false) as Float64Array) : (levels[0].c as Float64Array),
    fw: single ? (padded(op.w, off0, false) as Float64Array) : (levels[0].w as Float64Array),
    fs: single ? (padded(op.s, off0, false) as Float64Array) : (levels[0].s as Float64Array),
    precision: single ? 'single' : 'double',
    gridComplexity: nodes / size,
  };
}

/**
 * One symmetric multigrid cycle with zero initial guess: levels[0].x ≈ A⁻¹ levels[0].b.
 * Writes x, r of every level and b of the coarse levels.
 */
export function applyPreconditioner(h: Hierarchy): void {
  cycle(h, 0);
}

/** Alternating zebra line sweeps before the coarse correction. Writes lv.x. */
function preSmooth(lv: MgLevel, sweeps: number): void {
  for (let v = 0; v < sweeps; v++) {
    sweepRows(lv, 0, v === 0);
    sweepRows(lv, 1, false);
    sweepColumns(lv, 0);
    sweepColumns(lv, 1);
  }
}

/** The adjoint of preSmooth: the same line steps in reverse order. Writes lv.x. */
function postSmooth(lv: MgLevel, sweeps: number): void {
  for (let v = 0; v < sweeps; v++) {
    sweepColumns(lv, 1);
    sweepColumns(lv, 0);
    sweepRows(lv, 1, false);
    sweepRows(lv, 0, false);
  }
}

/** out = A x on a (padded) level, 5- or 9-point. Writes out inside the grid. */
function levelProduct(lv: MgLevel, x: Real, out: Real): void {
  const { nx, ny, off, c, w, s } = lv;
  const sw = lv.sw, se = lv.se;
  const end = off + nx * ny;
  if (sw === null || se === null) {
    for (let kk = off; kk < end; kk++) out[kk] = c[kk] * x[kk] - w[kk] * x[kk - 1] - w[kk + 1] * x[kk + 1] - s[kk] * x[kk - nx] - s[kk + nx] * x[kk + nx];
    return;
  }
  for (let kk = off; kk < end; kk++) {
    out[kk] =
      c[kk] * x[kk] - w[kk] * x[kk - 1] - w[kk + 1] * x[kk + 1] - s[kk] * x[kk - nx] - s[kk + nx] * x[kk + nx] -
      sw[kk] * x[kk - nx - 1] - se[kk] * x[kk - nx + 1] - se[kk + nx - 1] * x[kk + nx - 1] - sw[kk + nx + 1] * x[kk + nx + 1];
  }
}

function levelDot(a: Real, b: Real, off: number, size: number): number {
  let d0 = 0, d1 = 0;
  let k = off;
  for (; k + 1 < off + size; k += 2) {
    d0 += a[k] * b[k];
    d1 += a[k + 1] * b[k + 1];
  }
  if (k < off + size) d0 += a[k] * b[k];
  return d0 + d1;
}

/**
 * Coarse-grid correction on level m: one cycle, or on a K-cycle hierarchy (Notay &
 * Vassilevski 2008) up to two cycles accelerated by a two-step flexible CG on that level: the
 * first cycle's result c1 is scaled optimally in the A-norm, and when that leaves more than a
 * quarter of the residual a second cycle on the remaining residual is combined with it.
 * Writes lv.x (and the work vectors of level m and below).
 */
function coarseCorrect(h: Hierarchy, m: number): void {
  const lv = h.levels[m];
  const kv = lv.k;
  if (kv === null) {
    cycle(h, m);
    return;
  }
  const { off, size, x, b } = lv;
  const [c1, v, c2, wv, bs] = kv;
  cycle(h, m);
  c1.set(x);
  levelProduct(lv, c1, v);
  const rho1 = levelDot(c1, v, off, size);
  if (!(rho1 > 0)) return; // zero right-hand side (or round-off): keep the plain cycle
  const alpha1 = levelDot(c1, b, off, size) / rho1;
  bs.set(b);
  let rr = 0, bb = 0;
  for (let k = off; k < off + size; k++) {
    const bk = bs[k];
    const rk = bk - alpha1 * v[k];
    b[k] = rk;
    rr += rk * rk;
    bb += bk * bk;
  }
  if (rr <= 0.0625 * bb) {
    for (let k = off; k < off + size; k++) x[k] = alpha1 * c1[k];
    b.set(bs);
    return;
  }
  cycle(h, m);
  c2.set(x);
  levelProduct(lv, c2, wv);
  const gamma = levelDot(c2, v, off, size);
  const beta = levelDot(c2, wv, off, size) - (gamma * gamma) / rho1;
  const alpha2 = beta > 0 ? levelDot(c2, b, off, size) / beta : 0;
  const a1 = alpha1 - (gamma * alpha2) / rho1;
  for (let k = off; k < off + size; k++) x[k] = a1 * c1[k] + alpha2 * c2[k];
  b.set(bs);
}

/** Cycle on level l (zero start): V-cycle, or W-cycle (two coarse corrections) where gamma[l] = 2. */
function cycle(h: Hierarchy, l: number): void {
  const { levels, transfers } = h;
  const lv = levels[l];
  if (l === levels.length - 1) {
    coarseSolve(h.coarse, lv);
    return;
  }
  const cl = levels[l + 1];
  const sweeps = h.sweepsPerLevel[l];
  const t = transfers[l];
  if (l === 0 && h.pointInv !== null && h.gammaPerLevel[l] === 1) {
    if (sweeps === 1) {
      // the same steps as below, each fused into one pass over memory
      smoothResidualRestrictRed(lv, h.pointInv, t, lv.r, cl.b);
      coarseCorrect(h, l + 1);
      interpolateSmoothRed(t, cl.x, lv, h.pointInv);
      return;
    }
    // red–black point smoothing: red first before, black first after (the adjoint)
    for (let v = 0; v < sweeps; v++) sweepRedBlack(lv, h.pointInv, true, v === 0);
    // the last half-sweep solved the black nodes: their residual is zero
    residualRestrictRed(lv, t, lv.r, cl.b);
    coarseCorrect(h, l + 1);
    // the first half-sweep recomputes the black nodes, so only the red ones take the correction
    interpolateAddRed(t, cl.x, lv.x);
    for (let v = 0; v < sweeps; v++) sweepRedBlack(lv, h.pointInv, false, false);
    return;
  }
  const gs = lv.gsInv;
  if (gs !== null && sweeps === 1 && h.gammaPerLevel[l] === 1) {
    // the same steps as below, each fused into one pass over memory
    gaussSeidelResidualRestrict(lv, gs, t, lv.r, cl.b);
    coarseCorrect(h, l + 1);
    interpolateGaussSeidelBack(t, cl.x, lv, gs);
    return;
  }
  if (gs !== null) {
    // lexicographic Gauss–Seidel: forward before, backward after (the adjoint)
    for (let v = 0; v < sweeps; v++) sweepGaussSeidel(lv, gs, true, v === 0);
    for (let g = 0; g < h.gammaPerLevel[l]; g++) {
      if (g > 0) interpolateAdd(t, cl.x, lv.x);
      residualFull(lv, lv.r);
      restrict(t, lv.r, cl.b);
      coarseCorrect(h, l + 1);
    }
    interpolateAdd(t, cl.x, lv.x);
    for (let v = 0; v < sweeps; v++) sweepGaussSeidel(lv, gs, false, false);
    return;
  }
  preSmooth(lv, sweeps);
  // the last step solved the odd columns exactly: their residual is zero
  residualRestrictEven(lv, t, cl.b);
  coarseCorrect(h, l + 1);
  for (let g = 1; g < h.gammaPerLevel[l]; g++) {
    interpolateAdd(t, cl.x, lv.x);
    residualFull(lv, lv.r);
    restrict(t, lv.r, cl.b);
    coarseCorrect(h, l + 1);
  }
  // the first step re-solves the odd columns, so only the even ones take the correction
  interpolateAddEven(t, cl.x, lv.x);
  postSmooth(lv, sweeps);
}

/** out = A x with the double-precision fine operator (padded like level 0); returns x·out. Writes out inside the grid. */
function matvecDot(h: Hierarchy, x: Float64Array, out: Float64Array): number {
  const { fc: c, fw: w, fs: s } = h;
  const { nx, off, size } = h.levels[0];
  let d = 0;
  for (let kk = off; kk < off + size; kk++) {
    const xk = x[kk];
    const v = c[kk] * xk - w[kk] * x[kk - 1] - w[kk + 1] * x[kk + 1] - s[kk] * x[kk - nx] - s[kk + nx] * x[kk + nx];
    out[kk] = v;
    d += xk * v;
  }
  return d;
}

/**
 * out = A x with the product CG uses inside `solve` (symmetric-half storage, padded vectors of
 * length nx*ny + 2*levels[0].off with the grid at offset levels[0].off); returns x·out. For
 * benchmarks that compare the solve with one product of this kind. Writes out inside the grid.
 */
export function fineProduct(h: Hierarchy, x: Float64Array, out: Float64Array): number {
  const len = h.nx * h.ny + 2 * h.levels[0].off;
  if (x.length !== len || out.length !== len) throw new RangeError(`fineProduct: padded vectors must have length ${len}`);
  return matvecDot(h, x, out);
}

/**
 * x = x + alpha·p (the previous step, deferred to this pass), p = z + beta·p, then out = A p
 * with the double-precision fine operator; returns p·out. One pass: row j+1 of x and p is
 * updated just before row j of the product needs it. Writes x, p and out inside the grid.
 */
function updateMatvecDot(h: Hierarchy, z: Real, beta: number, p: Float64Array, out: Float64Array, x: Float64Array, alpha: number): number {
  const { fc: c, fw: w, fs: s } = h;
  const { nx, ny, off } = h.levels[0];
  const update = (j: number) => {
    const r = off + j * nx;
    const end = r + nx;
    if (alpha !== 0) {
      for (let kk = r; kk < end; kk++) {
        const pk = p[kk];
        x[kk] += alpha * pk;
        p[kk] = z[kk] + beta * pk;
      }
    } else if (beta === 0) {
      for (let kk = r; kk < end; kk++) p[kk] = z[kk];
    } else {
      for (let kk = r; kk < end; kk++) p[kk] = z[kk] + beta * p[kk];
    }
  };
  update(0);
  // two partial sums break the dependency chain of the reduction; the west value and the
  // coupling to it are the previous node's centre value and east coupling, carried in locals
  let d0 = 0, d1 = 0;
  for (let j = 0; j < ny; j++) {
    if (j + 1 < ny) update(j + 1);
    const r = off + j * nx;
    const end = r + nx;
    let kk = r;
    let pW = p[kk - 1], pC = p[kk], wW = w[kk];
    for (; kk + 1 < end; kk += 2) {
      const p1 = p[kk + 1], w1 = w[kk + 1], p2 = p[kk + 2], w2 = w[kk + 2];
      const v0 = c[kk] * pC - wW * pW - w1 * p1 - s[kk] * p[kk - nx] - s[kk + nx] * p[kk + nx];
      const v1 = c[kk + 1] * p1 - w1 * pC - w2 * p2 - s[kk + 1] * p[kk + 1 - nx] - s[kk + 1 + nx] * p[kk + 1 + nx];
      out[kk] = v0;
      out[kk + 1] = v1;
      d0 += pC * v0;
      d1 += p1 * v1;
      pW = p1;
      pC = p2;
      wW = w2;
    }
    if (kk < end) {
      const v = c[kk] * pC - wW * pW - w[kk + 1] * p[kk + 1] - s[kk] * p[kk - nx] - s[kk + nx] * p[kk + nx];
      out[kk] = v;
      d0 += pC * v;
    }
  }
  return d0 + d1;
}

/** r[off + k] = rhs[k] for the whole grid; returns ‖rhs‖². */
function copyAndSquare(rhs: Float64Array, r: Float64Array, off: number): number {
  let s0 = 0, s1 = 0;
  const n = rhs.length;
  let k = 0;
  for (; k + 1 < n; k += 2) {
    const a = rhs[k], b = rhs[k + 1];
    r[k + off] = a;
    r[k + 1 + off] = b;
    s0 += a * a;
    s1 += b * b;
  }
  if (k < n) {
    r[k + off] = rhs[k];
    s0 += rhs[k] * rhs[k];
  }
  return s0 + s1;
}

/** r = rhs − q over the grid (r, q padded by off, rhs not), also into b when b is another array; returns ‖r‖². */
function residualFromProduct(rhs: Float64Array, q: Float64Array, r: Float64Array, b: Real, off: number): number {
  let rr = 0;
  const n = rhs.length;
  for (let k = 0; k < n; k++) {
    const kk = k + off;
    const v = rhs[k] - q[kk];
    r[kk] = v;
    b[kk] = v;
    rr += v * v;
  }
  return rr;
}

/** x += alpha·p over the grid part of padded vectors. */
function axpyPadded(x: Float64Array, alpha: number, p: Float64Array, off: number, size: number): void {
  for (let k = off; k < off + size; k++) x[k] += alpha * p[k];
}

/**
 * r −= alpha·q over the grid part of padded vectors, copied to b when b is another array (single
 * storage); returns ‖r‖².
 */
function updateResidual(r: Float64Array, alpha: number, q: Float64Array, b: Real, off: number, size: number): number {
  let rr0 = 0, rr1 = 0;
  const end = off + size;
  let k = off;
  if (b === r) {
    for (; k + 1 < end; k += 2) {
      const v0 = r[k] - alpha * q[k];
      const v1 = r[k + 1] - alpha * q[k + 1];
      r[k] = v0;
      r[k + 1] = v1;
      rr0 += v0 * v0;
      rr1 += v1 * v1;
    }
  } else {
    for (; k + 1 < end; k += 2) {
      const v0 = r[k] - alpha * q[k];
      const v1 = r[k + 1] - alpha * q[k + 1];
      r[k] = v0;
      r[k + 1] = v1;
      b[k] = v0;
      b[k + 1] = v1;
      rr0 += v0 * v0;
      rr1 += v1 * v1;
    }
  }
  for (; k < end; k++) {
    const v = r[k] - alpha * q[k];
    r[k] = v;
    b[k] = v;
    rr0 += v * v;
  }
  return rr0 + rr1;
}

/** Σ z_k r_k over the grid part [off, off + size) of two padded vectors (four partial sums). */
function dotPadded(z: Real, r: Float64Array, off: number, size: number): number {
  let d0 = 0, d1 = 0, d2 = 0, d3 = 0;
  const end = off + size;
  let k = off;
  for (; k + 3 < end; k += 4) {
    d0 += z[k] * r[k];
    d1 += z[k + 1] * r[k + 1];
    d2 += z[k + 2] * r[k + 2];
    d3 += z[k + 3] * r[k + 3];
  }
  for (; k < end; k++) d0 += z[k] * r[k];
  return d0 + d1 + d2 + d3;
}

/** Result slots of dotPair. */
const pair = new Float64Array(2);

/** pair = [z·r, z·q] over the grid part of padded vectors, in one pass. */
function dotPair(z: Real, r: Float64Array, q: Float64Array, off: number, size: number): void {
  let a0 = 0, a1 = 0, b0 = 0, b1 = 0;
  const end = off + size;
  let k = off;
  for (; k + 1 < end; k += 2) {
    const z0 = z[k], z1 = z[k + 1];
    a0 += z0 * r[k];
    a1 += z1 * r[k + 1];
    b0 += z0 * q[k];
    b1 += z1 * q[k + 1];
  }
  for (; k < end; k++) {
    a0 += z[k] * r[k];
    b0 += z[k] * q[k];
  }
  pair[0] = a0 + a1;
  pair[1] = b0 + b1;
}

/**
 * Solves A x = rhs by multigrid-preconditioned CG. Tolerance is relative to ‖rhs‖ (absolute
 * when rhs = 0); convergence is confirmed on the true residual b − A x. Calls onIteration after
 * each iteration (returning false stops), checks isCancelled between iterations and then throws
 * SolveCancelledError. Returns a new x; the hierarchy's buffers are overwritten.
 *
 * The direction update uses the Polak–Ribière β = z·(r − r_old) / (z_old·r_old) = −z·q_old /
 * (p_old·q_old) (flexible CG, Notay 2000): equal to the classical β in exact arithmetic with a
 * symmetric preconditioner, and robust when the single-precision hierarchy makes the
 * preconditioner symmetric only to round-off. It costs one more dot product, fused with z·r.
 */
export function solve(
  h: Hierarchy,
  rhs: Float64Array,
  opts: IterativeSolveOptions & { x0?: Float64Array } = {},
): IterativeSolveResult {
  const {
    /** @default 1e-10 */ tolerance = 1e-10,
    /** @default 200 */ maxIterations = 200,
    onIteration,
    isCancelled,
    x0,
  } = opts;
  const { op, xp, rp, pp, qp, fixed } = h;
  const lv0 = h.levels[0];
  const off = lv0.off;
  const bp = lv0.b; // the residual as the preconditioner reads it
  const zp = lv0.x; // the preconditioned residual
  const size = h.nx * h.ny;
  if (!(rhs instanceof Float64Array) || rhs.length !== size) throw new RangeError(`rhs must be a Float64Array of length ${size}`);
  if (x0 !== undefined && (!(x0 instanceof Float64Array) || x0.length !== size)) throw new RangeError(`x0 must be a Float64Array of length ${size}`);
  if (!(tolerance >= 0)) throw new RangeError('tolerance must be >= 0');
  if (!Number.isInteger(maxIterations) || maxIterations < 0) throw new RangeError('maxIterations must be an integer >= 0');

  xp.fill(0);
  if (x0 !== undefined) xp.set(x0, off);
  for (let q = 0; q < fixed.length; q++) {
    const k = fixed[q];
    xp[k + off] = rhs[k] / op.c[k];
  }
  // Every pass over the vectors is a small helper function: `solve` itself runs a few times per
  // process and meets its convergence branch late, so V8 often runs it unoptimised (or
  // deoptimises it there); a loop in its body would then box every double it computes
  // (measured: about 200 MB of garbage and 60 scavenges per 1M solve).
  const bb = copyAndSquare(rhs, rp, off);
  const scale = bb > 0 ? Math.sqrt(bb) : 1;

  // r = b − A x
  const trueResidual = (): number => {
    matvecDot(h, xp, qp);
    return Math.sqrt(residualFromProduct(rhs, qp, rp, bp, off)) / scale;
  };
  const norms = new Float64Array(maxIterations + 1);
  let rel: number;
  if (x0 === undefined) {
    // x is zero except on the decoupled (fixed) nodes, where A x = rhs and nobody couples to
    // them: the residual is rhs elsewhere (copied above) and zero there, no product needed
    let rr = bb;
    for (let q = 0; q < fixed.length; q++) {
      const k = fixed[q];
      rr -= rhs[k] * rhs[k];
      rp[k + off] = 0;
    }
    if (bp !== rp) bp.set(rp);
    rel = Math.sqrt(Math.max(rr, 0)) / scale;
  } else {
    rel = trueResidual();
  }
  norms[0] = rel;
  const rel0 = rel;
  let it = 0;
  let converged = rel <= tolerance;
  let pAp = 0;
  let restart = true;
  /** The step alpha of x += alpha p not yet applied to x. */
  let pending = 0;
  while (!converged && it < maxIterations) {
    if (isCancelled !== undefined && isCancelled()) throw new SolveCancelledError();
    applyPreconditioner(h);
    let rz: number, beta: number;
    if (restart) {
      rz = dotPadded(zp, rp, off, size);
      beta = 0;
    } else {
      // qp still holds A p of the previous direction
      dotPair(zp, rp, qp, off, size);
      rz = pair[0];
      beta = -pair[1] / pAp;
    }
    restart = false;
    // x += alpha_old p_old (deferred), p = z + beta p and q = A p in one pass
    pAp = updateMatvecDot(h, zp, beta, pp, qp, xp, pending);
    pending = 0;
    if (!(pAp > 0)) break; // breakdown: the residual is zero to round-off or A is singular here
    const alpha = rz / pAp;
    // x += alpha p is left to the next pass over p (or done below before x is read)
    pending = alpha;
    const rr = updateResidual(rp, alpha, qp, bp, off, size);
    it++;
    rel = Math.sqrt(rr) / scale;
    if (rel <= tolerance) {
      // confirm on the true residual; continue (restarted) if round-off has drifted
      axpyPadded(xp, pending, pp, off, size);
      pending = 0;
      rel = trueResidual();
      if (rel <= tolerance) converged = true;
      else restart = true;
    }
    norms[it] = rel;
    if (onIteration !== undefined && onIteration(it, rel) === false) break;
  }
  if (pending !== 0) axpyPadded(xp, pending, pp, off, size);
  const x = xp.slice(off, off + size);
  const residualNorms = Array.from(norms.subarray(0, it + 1));
  const convergenceFactor = it > 0 && rel0 > 0 ? Math.pow(rel / rel0, 1 / it) : 0;
  return { x, converged, iterations: it, residualNorms, convergenceFactor };
}
