/**
 * Test systems for the solver benchmarks and tests: a finite-volume 5-point assembly of
 * div(ε grad φ) = 0 on a rectilinear grid (ε constant per cell, Dirichlet nodes moved to the
 * right-hand side), a microstrip-like uniform-grid system and a port of the performance
 * anchor's system (../shared/bench/amg_anchor.py, build(n)).
 */
import type { Operator5 } from '../../lib/fdm/types';

export interface LinearSystem {
  op: Operator5;
  rhs: Float64Array;
  /** Free (non-fixed) nodes: the unknowns. */
  unknowns: number;
}

/**
 * Assembles the symmetric 5-point system. xs, ys: node coordinates; eps(i, j): permittivity of
 * cell i, j (between nodes i..i+1, j..j+1); fixed(i, j): prescribed potential or null (free);
 * robin(i, j): optional extra diagonal term.
 */
export function assembleSystem(
  xs: Float64Array,
  ys: Float64Array,
  eps: (i: number, j: number) => number,
  fixed: (i: number, j: number) => number | null,
  robin?: (i: number, j: number) => number,
): LinearSystem {
  const nx = xs.length, ny = ys.length, size = nx * ny;
  const op: Operator5 = {
    nx, ny,
    c: new Float64Array(size), w: new Float64Array(size), e: new Float64Array(size),
    s: new Float64Array(size), n: new Float64Array(size),
  };
  const rhs = new Float64Array(size);
  const val = new Float64Array(size);
  const isFixed = new Uint8Array(size);
  for (let j = 0; j < ny; j++) {
    for (let i = 0; i < nx; i++) {
      const v = fixed(i, j);
      if (v !== null) {
        isFixed[j * nx + i] = 1;
        val[j * nx + i] = v;
      }
    }
  }
  const epsCell = new Float64Array((nx - 1) * (ny - 1));
  for (let j = 0; j < ny - 1; j++) for (let i = 0; i < nx - 1; i++) epsCell[j * (nx - 1) + i] = eps(i, j);
  const link = (k: number, m: number, g: number, dirK: 'e' | 'n', dirM: 'w' | 's') => {
    const fk = isFixed[k], fm = isFixed[m];
    if (fk && fm) return;
    if (!fk && !fm) {
      op[dirK][k] = g;
      op[dirM][m] = g;
      op.c[k] += g;
      op.c[m] += g;
    } else if (!fk) {
      op.c[k] += g;
      rhs[k] += g * val[m];
    } else {
      op.c[m] += g;
      rhs[m] += g * val[k];
    }
  };
  for (let j = 0; j < ny; j++) {
    for (let i = 0; i < nx - 1; i++) {
      const hx = xs[i + 1] - xs[i];
      let face = 0;
      if (j > 0) face += 0.5 * epsCell[(j - 1) * (nx - 1) + i] * (ys[j] - ys[j - 1]);
      if (j < ny - 1) face += 0.5 * epsCell[j * (nx - 1) + i] * (ys[j + 1] - ys[j]);
      link(j * nx + i, j * nx + i + 1, face / hx, 'e', 'w');
    }
  }
  for (let j = 0; j < ny - 1; j++) {
    const hy = ys[j + 1] - ys[j];
    for (let i = 0; i < nx; i++) {
      let face = 0;
      if (i > 0) face += 0.5 * epsCell[j * (nx - 1) + i - 1] * (xs[i] - xs[i - 1]);
      if (i < nx - 1) face += 0.5 * epsCell[j * (nx - 1) + i] * (xs[i + 1] - xs[i]);
      link(j * nx + i, (j + 1) * nx + i, face / hy, 'n', 's');
    }
  }
  let unknowns = 0;
  for (let k = 0; k < size; k++) {
    if (isFixed[k]) {
      op.c[k] = 1;
      rhs[k] = val[k];
    } else {
      unknowns++;
      if (robin) op.c[k] += robin(k % nx, Math.floor(k / nx));
    }
  }
  return { op, rhs, unknowns };
}

/** Uniform node coordinates 0..1. */
export function uniformAxis(n: number, length = 1): Float64Array {
  const a = new Float64Array(n);
  for (let i = 0; i < n; i++) a[i] = (length * i) / (n - 1);
  return a;
}

/**
 * Microstrip-like system on a uniform n × n grid of the unit square: fixed bottom row (ground
 * plane, 0 V), εr = 4.4 substrate up to y = 0.1, a conductor block at 1 V (x 0.45..0.55,
 * y 0.1..0.12), natural Neumann on the sides and top.
 */
export function uniformMicrostrip(n: number): LinearSystem {
  const xs = uniformAxis(n), ys = uniformAxis(n);
  const h = 1 / (n - 1);
  return assembleSystem(
    xs, ys,
    (_i, j) => ((j + 0.5) * h < 0.1 ? 4.4 : 1),
    (i, j) => {
      if (j === 0) return 0;
      const x = xs[i], y = ys[j];
      if (x >= 0.45 - 1e-12 && x <= 0.55 + 1e-12 && y >= 0.1 - 1e-12 && y <= 0.12 + 1e-12) return 1;
      return null;
    },
  );
}

/** The anchor's graded axis: spacing ∝ 1 + (ratio − 1) s², s ∈ [−1, 1] (amg_anchor.py, graded). */
export function anchorAxis(n: number, ratio = 4): Float64Array {
  const wv = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const s = -1 + (2 * i) / (n - 1);
    wv[i] = 1 + (ratio - 1) * s * s;
  }
  const h = new Float64Array(n - 1);
  let sum = 0;
  for (let i = 0; i < n - 1; i++) {
    h[i] = 0.5 * (wv[i + 1] + wv[i]);
    sum += h[i];
  }
  const x = new Float64Array(n);
  for (let i = 0; i < n - 1; i++) x[i + 1] = x[i] + h[i] / sum;
  return x;
}

/**
 * Port of build(n) in amg_anchor.py: graded n × n grid of the unit square, εr = 4.4 in the
 * cells below y = 1/3, conductor block at 1 V (0.35 ≤ x ≤ 0.65, 1/3 + 0.02 ≤ y ≤ 1/3 + 0.06),
 * 0 V on the outer boundary.
 */
export function anchorSystem(n: number): LinearSystem {
  const xs = anchorAxis(n), ys = anchorAxis(n);
  const yc = (j: number) => 0.5 * (ys[j] + ys[j + 1]);
  return assembleSystem(
    xs, ys,
    (_i, j) => (yc(j) < 1 / 3 ? 4.4 : 1),
    (i, j) => {
      const x = xs[i], y = ys[j];
      if (x >= 0.35 && x <= 0.65 && y >= 1 / 3 + 0.02 && y <= 1 / 3 + 0.06) return 1;
      if (i === 0 || j === 0 || i === n - 1 || j === n - 1) return 0;
      return null;
    },
  );
}

/**
 * Geometrically graded axis on [0, 1]: spacing grows by a constant factor from the middle
 * outwards so that the largest spacing is `maxRatio` times the smallest (1 = uniform).
 */
export function gradedAxis(n: number, maxRatio: number): Float64Array {
  const cells = n - 1;
  const mid = (cells - 1) / 2;
  const g = mid > 0 ? Math.pow(maxRatio, 1 / mid) : 1;
  const h = new Float64Array(cells);
  let sum = 0;
  for (let i = 0; i < cells; i++) {
    h[i] = Math.pow(g, Math.abs(i - mid));
    sum += h[i];
  }
  const x = new Float64Array(n);
  for (let i = 0; i < cells; i++) x[i + 1] = x[i] + h[i] / sum;
  x[n - 1] = 1;
  return x;
}

function nearest(axis: Float64Array, v: number): number {
  let best = 0;
  for (let i = 1; i < axis.length; i++) if (Math.abs(axis[i] - v) < Math.abs(axis[best] - v)) best = i;
  return best;
}

export interface HardSystemOptions {
  /** Largest / smallest spacing along each axis (geometric growth from the middle). @default 1 */
  maxRatio?: number;
  /** Dielectric bands εr 1 / 4.4 / 12 / 80 side by side below y = 0.6. @default true */
  jumps?: boolean;
  /** One-node-thick fixed lines (horizontal and vertical strips) and isolated fixed nodes. @default true */
  strips?: boolean;
  /** A fully fixed block (conductor interior). @default true */
  block?: boolean;
  /** Fixed bottom row (ground plane); otherwise all edges natural Neumann. @default true */
  ground?: boolean;
  /** Extra diagonal (Robin) term added on the left, right and top edge nodes. @default 0 */
  robin?: number;
}

/**
 * A deliberately hard system for solver tests: dielectric jumps, zero-thickness strips in both
 * directions, isolated fixed nodes, a conductor block, graded cells, Neumann or Robin edges.
 * Invented test geometry (no physical reference needed: tests compare with a direct solve).
 */
export function hardSystem(nx: number, ny: number, opts: HardSystemOptions = {}): LinearSystem {
  const { maxRatio = 1, jumps = true, strips = true, block = true, ground = true, robin = 0 } = opts;
  const xs = gradedAxis(nx, maxRatio), ys = gradedAxis(ny, maxRatio);
  const bands = [1, 4.4, 12, 80];
  const eps = (i: number, j: number) => {
    if (!jumps) return 1;
    const xc = 0.5 * (xs[i] + xs[i + 1]), yc = 0.5 * (ys[j] + ys[j + 1]);
    if (yc > 0.6) return 1;
    return bands[Math.min(3, Math.floor(xc * 4))];
  };
  const hRow = nearest(ys, 0.45), hI0 = nearest(xs, 0.3), hI1 = nearest(xs, 0.7);
  const vCol = nearest(xs, 0.85), vJ0 = nearest(ys, 0.2), vJ1 = nearest(ys, 0.5);
  const iso1 = [nearest(xs, 0.15), nearest(ys, 0.75)], iso2 = [nearest(xs, 0.62), nearest(ys, 0.85)];
  const fixed = (i: number, j: number): number | null => {
    if (ground && j === 0) return 0;
    if (strips) {
      if (j === hRow && i >= hI0 && i <= hI1) return 1;
      if (i === vCol && j >= vJ0 && j <= vJ1) return 0.5;
      if (i === iso1[0] && j === iso1[1]) return -1;
      if (i === iso2[0] && j === iso2[1]) return 0.3;
    }
    if (block && xs[i] >= 0.35 && xs[i] <= 0.55 && ys[j] >= 0.65 && ys[j] <= 0.78) return 1;
    return null;
  };
  const robinTerm = robin > 0
    ? (i: number, j: number) => (i === 0 || i === nx - 1 || j === ny - 1 ? robin : 0)
    : undefined;
  return assembleSystem(xs, ys, eps, fixed, robinTerm);
}
