/**
 * Conservative 5-point finite-volume discretisation of div(ε grad φ) = 0 on a tensor mesh.
 *
 * - Potential on nodes, ε per cell (diagonal tensor εx, εy). Cells cut by a slanted or curved
 *   dielectric outline get sub-cell averages: for εx the harmonic mean along each sub-row
 *   (series across the interface) then the arithmetic mean over sub-rows, and likewise for εy,
 *   a diagonal form of the tensor average of Kottke, Farjadpour & Johnson (Phys. Rev. E 77:036611, 2008).
 * - A link i–j has coefficient a = (εx·length of dual face)/h, the dual face split between the
 *   two cells beside the link (length-weighted arithmetic mean).
 * - Conductors: nodes inside (or on) a conductor are fixed. A link from a free node to a
 *   conductor node uses the real distance θh to the conductor surface along the link
 *   (Shortley & Weller 1938) in the symmetric finite-volume form a·h/(θh) on the diagonal,
 *   conductor potential to the right-hand side (Gibou, Fedkiw, Cheng & Kang, J. Comput.
 *   Phys. 176:205, 2002). Free nodes closer than θmin·h to a surface are snapped onto it.
 * - Ground planes at the domain ends are fixed at 0 V; mirror planes and the far ends of open
 *   sides are natural (zero normal flux) boundaries.
 */
import type { Geometry, Operator5 } from './types';
import { geometryBox, insideGeometry, outlineCrossesCell } from './geometry';

export interface DiscreteInput {
  xs: Float64Array;
  ys: Float64Array;
  conductors: { geometry: Geometry; net: number }[];
  dielectrics: { geometry: Geometry; epsR: number }[];
  backgroundEpsR: number;
  /** Which domain ends are ground planes. */
  groundSides: { left: boolean; right: boolean; bottom: boolean; top: boolean };
  /** Net index used for ground-plane nodes (potential 0). */
  planeNet: number;
  /** Replace every permittivity by 1. */
  vacuum: boolean;
}

export interface Discretisation {
  op: Operator5;
  /** Net of each fixed node, −1 for free nodes. */
  nodeNet: Int16Array;
  /** Links from free nodes to conductors: the free node, coefficient and the conductor's net. */
  cutNode: Int32Array;
  cutCoef: Float64Array;
  cutNet: Int16Array;
  /** Links between fixed nodes of different nets (across a gap narrower than a cell). */
  pairA: Int16Array;
  pairB: Int16Array;
  pairCoef: Float64Array;
  /** Scalar cell permittivity (mean of εx, εy), for display. */
  cellEpsR: Float32Array;
  /** Free nodes moved onto a nearby surface. */
  snapped: number;
}

const THETA_MIN = 1e-3;
/**
 * A link between conductors of different nets is kept down to this fraction of its length in
 * the gap. Such links carry no unknown (they only add a·len/free of charge and energy between
 * the two nets), so a thin gap costs no conditioning; dropping them below THETA_MIN lost the
 * whole gap of a coax whose gap was 1e-5 of its radius (−39%).
 */
const PAIR_FREE_MIN = 1e-9;
const SUB = 8;

function lowerIndex(a: Float64Array, v: number): number {
  // first index with a[i] >= v
  let lo = 0, hi = a.length;
  while (lo < hi) {
    const m = (lo + hi) >> 1;
    if (a[m] < v) lo = m + 1;
    else hi = m;
  }
  return lo;
}
function upperIndex(a: Float64Array, v: number): number {
  // last index with a[i] <= v
  let lo = 0, hi = a.length;
  while (lo < hi) {
    const m = (lo + hi) >> 1;
    if (a[m] <= v) lo = m + 1;
    else hi = m;
  }
  return lo - 1;
}

export function discretise(input: DiscreteInput): Discretisation {
  const { xs, ys, conductors, dielectrics } = input;
  const nx = xs.length;
  const ny = ys.length;
  const N = nx * ny;
  // Coordinates are scaled (structure size 1) and nodes on key lines carry the shapes' own
  // coordinates, so a tolerance near round-off suffices; a larger one would shift surfaces.
  const tol = 1e-12;

  // ---- node classes
  const nodeShape = new Int32Array(N).fill(-1);
  const nodeNet = new Int16Array(N).fill(-1);
  for (let s = 0; s < conductors.length; s++) {
    const g = conductors[s].geometry;
    const b = geometryBox(g);
    const i0 = lowerIndex(xs, b.x0 - tol), i1 = upperIndex(xs, b.x1 + tol);
    const j0 = lowerIndex(ys, b.y0 - tol), j1 = upperIndex(ys, b.y1 + tol);
    for (let j = j0; j <= j1; j++) {
      for (let i = i0; i <= i1; i++) {
        const k = j * nx + i;
        if (nodeShape[k] < 0 && insideGeometry(g, xs[i], ys[j], tol)) {
          nodeShape[k] = s;
          nodeNet[k] = conductors[s].net;
        }
      }
    }
  }
  const PLANE = -2;
  const gs = input.groundSides;
  const setPlane = (k: number) => {
    nodeShape[k] = PLANE;
    nodeNet[k] = input.planeNet;
  };
  if (gs.left) for (let j = 0; j < ny; j++) setPlane(j * nx);
  if (gs.right) for (let j = 0; j < ny; j++) setPlane(j * nx + nx - 1);
  if (gs.bottom) for (let i = 0; i < nx; i++) setPlane(i);
  if (gs.top) for (let i = 0; i < nx; i++) setPlane((ny - 1) * nx + i);

  // distance from free node a toward fixed node b to the first surface point
  const cutDistance = (ka: number, kb: number): number => {
    const ia = ka % nx, ja = (ka - ia) / nx, ib = kb % nx, jb = (kb - ib) / nx;
    const xa = xs[ia], ya = ys[ja], xb = xs[ib], yb = ys[jb];
    const len = Math.abs(xb - xa) + Math.abs(yb - ya);
    const s = nodeShape[kb];
    if (s < 0) return len;
    const g = conductors[s].geometry;
    if (!insideGeometry(g, xb, yb, tol)) return len; // snapped node
    if (g.type === 'rect' || g.type === 'strip') {
      // surfaces lie on mesh lines, so the entry point is found directly
      const b = geometryBox(g);
      let t: number;
      if (yb === ya) t = xb > xa ? b.x0 - xa : xa - b.x1;
      else t = yb > ya ? b.y0 - ya : ya - b.y1;
      return Math.min(len, Math.max(t, 0));
    }
    if (g.type === 'circle' || g.type === 'ring') {
      // entry through the outer circle from outside, or through the inner one from the hole
      const dxa = xa - g.cx, dya = ya - g.cy;
      const fromHole = g.type === 'ring' && dxa * dxa + dya * dya < g.rInner * g.rInner;
      const r = g.type === 'circle' ? g.r : fromHole ? g.rInner : g.rOuter;
      const t = circleHit(dxa, dya, (xb - xa) / len, (yb - ya) / len, r, fromHole);
      if (t >= 0 && t <= len) return t;
    }
    let lo = 0, hi = 1;
    for (let it = 0; it < 60; it++) {
      const m = 0.5 * (lo + hi);
      if (insideGeometry(g, xa + m * (xb - xa), ya + m * (yb - ya), tol)) hi = m;
      else lo = m;
    }
    return hi * len;
  };
  // distance from fixed node a (inside its shape) toward b to where the segment leaves shape a
  const exitDistance = (ka: number, kb: number): number => {
    const s = nodeShape[ka];
    if (s < 0) return 0;
    const ia = ka % nx, ja = (ka - ia) / nx, ib = kb % nx, jb = (kb - ib) / nx;
    const xa = xs[ia], ya = ys[ja], xb = xs[ib], yb = ys[jb];
    const len = Math.abs(xb - xa) + Math.abs(yb - ya);
    const g = conductors[s].geometry;
    if (!insideGeometry(g, xa, ya, tol)) return 0;
    if (insideGeometry(g, xb, yb, tol)) return len;
    let lo = 0, hi = 1;
    for (let it = 0; it < 60; it++) {
      const m = 0.5 * (lo + hi);
      if (insideGeometry(g, xa + m * (xb - xa), ya + m * (yb - ya), tol)) lo = m;
      else hi = m;
    }
    return lo * len;
  };

  // ---- snap free nodes that sit almost on a surface
  let snapped = 0;
  {
    const snapTo = new Int32Array(N).fill(-1);
    for (let j = 0; j < ny; j++) {
      for (let i = 0; i < nx; i++) {
        const k = j * nx + i;
        if (nodeNet[k] >= 0) continue;
        for (let dir = 0; dir < 4; dir++) {
          let q: number;
          let h: number;
          if (dir === 0) {
            if (i === 0) continue;
            q = k - 1;
            h = xs[i] - xs[i - 1];
          } else if (dir === 1) {
            if (i === nx - 1) continue;
            q = k + 1;
            h = xs[i + 1] - xs[i];
          } else if (dir === 2) {
            if (j === 0) continue;
            q = k - nx;
            h = ys[j] - ys[j - 1];
          } else {
            if (j === ny - 1) continue;
            q = k + nx;
            h = ys[j + 1] - ys[j];
          }
          const sq = nodeShape[q];
          // rect and strip surfaces lie on mesh lines: no free node sits just off them
          if (sq < 0 || conductors[sq].geometry.type === 'rect' || conductors[sq].geometry.type === 'strip') continue;
          if (cutDistance(k, q) < THETA_MIN * h) {
            snapTo[k] = q;
            break;
          }
        }
      }
    }
    for (let k = 0; k < N; k++) {
      if (snapTo[k] >= 0) {
        nodeShape[k] = nodeShape[snapTo[k]];
        nodeNet[k] = nodeNet[snapTo[k]];
        snapped++;
      }
    }
  }

  // ---- cell permittivities
  const cx = nx - 1, cy = ny - 1;
  const epsX = new Float64Array(cx * cy);
  const epsY = new Float64Array(cx * cy);
  const cellEpsR = new Float32Array(cx * cy);
  if (input.vacuum) {
    epsX.fill(1);
    epsY.fill(1);
    cellEpsR.fill(1);
  } else {
    epsX.fill(input.backgroundEpsR);
    const cut = new Uint8Array(cx * cy);
    for (const d of dielectrics) {
      const g = d.geometry;
      const b = geometryBox(g);
      const i0 = Math.max(0, lowerIndex(xs, b.x0 - tol) - 1), i1 = Math.min(cx - 1, upperIndex(xs, b.x1 + tol));
      const j0 = Math.max(0, lowerIndex(ys, b.y0 - tol) - 1), j1 = Math.min(cy - 1, upperIndex(ys, b.y1 + tol));
      for (let j = j0; j <= j1; j++) {
        for (let i = i0; i <= i1; i++) {
          const c = j * cx + i;
          if (outlineCrossesCell(g, xs[i], ys[j], xs[i + 1], ys[j + 1])) cut[c] = 1;
          else if (insideGeometry(g, 0.5 * (xs[i] + xs[i + 1]), 0.5 * (ys[j] + ys[j + 1]), 0)) epsX[c] = d.epsR;
        }
      }
    }
    epsY.set(epsX);
    const sample = new Float64Array(SUB * SUB);
    const boxes = dielectrics.map((d) => geometryBox(d.geometry));
    const cboxes = conductors.map((c) => geometryBox(c.geometry));
    for (let j = 0; j < cy; j++) {
      for (let i = 0; i < cx; i++) {
        const c = j * cx + i;
        if (!cut[c]) continue;
        const x0 = xs[i], x1 = xs[i + 1], y0 = ys[j], y1 = ys[j + 1];
        const nearC: Geometry[] = [];
        conductors.forEach((q, s) => {
          const b = cboxes[s];
          if (b.x1 >= x0 && b.x0 <= x1 && b.y1 >= y0 && b.y0 <= y1 && q.geometry.type !== 'strip') nearC.push(q.geometry);
        });
        for (let b = 0; b < SUB; b++) {
          const py = y0 + ((b + 0.5) / SUB) * (y1 - y0);
          for (let a = 0; a < SUB; a++) {
            const px = x0 + ((a + 0.5) / SUB) * (x1 - x0);
            let e = input.backgroundEpsR;
            for (let d = dielectrics.length - 1; d >= 0; d--) {
              const bb = boxes[d];
              if (px < bb.x0 || px > bb.x1 || py < bb.y0 || py > bb.y1) continue;
              if (insideGeometry(dielectrics[d].geometry, px, py, 0)) {
                e = dielectrics[d].epsR;
                break;
              }
            }
            // samples inside conductors carry no field: leave them out (NaN)
            for (const g of nearC) {
              if (insideGeometry(g, px, py, 0)) {
                e = NaN;
                break;
              }
            }
            sample[b * SUB + a] = e;
          }
        }
        const ex = seriesParallel(sample, true);
        const ey = seriesParallel(sample, false);
        if (ex > 0) epsX[c] = ex;
        if (ey > 0) epsY[c] = ey;
      }
    }
    for (let c = 0; c < cx * cy; c++) cellEpsR[c] = 0.5 * (epsX[c] + epsY[c]);
  }

  // ---- links
  const c = new Float64Array(N);
  const w = new Float64Array(N);
  const e = new Float64Array(N);
  const s = new Float64Array(N);
  const n = new Float64Array(N);
  const cutNode: number[] = [];
  const cutCoef: number[] = [];
  const cutNet: number[] = [];
  const pairA: number[] = [];
  const pairB: number[] = [];
  const pairCoef: number[] = [];

  const link = (ka: number, kb: number, a: number, len: number, horizontal: boolean) => {
    const fa = nodeNet[ka] < 0, fb = nodeNet[kb] < 0;
    if (fa && fb) {
      if (horizontal) {
        e[ka] = a;
        w[kb] = a;
      } else {
        n[ka] = a;
        s[kb] = a;
      }
      c[ka] += a;
      c[kb] += a;
    } else if (fa || fb) {
      const kf = fa ? ka : kb;
      const kx = fa ? kb : ka;
      const t = cutDistance(kf, kx);
      const coef = (a * len) / Math.max(t, THETA_MIN * len);
      c[kf] += coef;
      cutNode.push(kf);
      cutCoef.push(coef);
      cutNet.push(nodeNet[kx]);
    } else if (nodeNet[ka] !== nodeNet[kb]) {
      const free = len - exitDistance(ka, kb) - exitDistance(kb, ka);
      if (free > PAIR_FREE_MIN * len) {
        pairA.push(nodeNet[ka]);
        pairB.push(nodeNet[kb]);
        pairCoef.push((a * len) / free);
      }
    }
  };

  for (let j = 0; j < ny; j++) {
    const hyS = j > 0 ? ys[j] - ys[j - 1] : 0;
    const hyN = j < ny - 1 ? ys[j + 1] - ys[j] : 0;
    for (let i = 0; i < nx - 1; i++) {
      const hx = xs[i + 1] - xs[i];
      let flux = 0;
      if (j > 0) flux += epsX[(j - 1) * cx + i] * 0.5 * hyS;
      if (j < ny - 1) flux += epsX[j * cx + i] * 0.5 * hyN;
      const k = j * nx + i;
      link(k, k + 1, flux / hx, hx, true);
    }
  }
  for (let j = 0; j < ny - 1; j++) {
    const hy = ys[j + 1] - ys[j];
    for (let i = 0; i < nx; i++) {
      const hxW = i > 0 ? xs[i] - xs[i - 1] : 0;
      const hxE = i < nx - 1 ? xs[i + 1] - xs[i] : 0;
      let flux = 0;
      if (i > 0) flux += epsY[j * cx + i - 1] * 0.5 * hxW;
      if (i < nx - 1) flux += epsY[j * cx + i] * 0.5 * hxE;
      const k = j * nx + i;
      link(k, k + nx, flux / hy, hy, false);
    }
  }
  for (let k = 0; k < N; k++) if (nodeNet[k] >= 0) c[k] = 1;

  return {
    op: { nx, ny, c, w, e, s, n },
    nodeNet,
    cutNode: Int32Array.from(cutNode),
    cutCoef: Float64Array.from(cutCoef),
    cutNet: Int16Array.from(cutNet),
    pairA: Int16Array.from(pairA),
    pairB: Int16Array.from(pairB),
    pairCoef: Float64Array.from(pairCoef),
    cellEpsR,
    snapped,
  };
}

/**
 * Distance along the unit direction (ux, uy) from a point at (dx, dy) relative to a circle's
 * centre to the circle of radius r: the first crossing from outside (entering), or from inside
 * the hole of a ring (`fromInside`, leaving the hole). −1 when there is none.
 */
function circleHit(dx: number, dy: number, ux: number, uy: number, r: number, fromInside: boolean): number {
  const b = dx * ux + dy * uy;
  const c = dx * dx + dy * dy - r * r;
  const disc = b * b - c;
  if (disc < 0) return -1;
  const sq = Math.sqrt(disc);
  if (fromInside) return -b + sq;
  // smaller root, written to avoid cancellation
  const t = b < 0 ? c / (-b + sq) : -b - sq;
  return t >= 0 ? t : -1;
}

/** Series (harmonic) along rows (x) or columns (y), then parallel (arithmetic) across; NaN samples skipped. */
function seriesParallel(sample: Float64Array, alongX: boolean): number {
  let sum = 0, rows = 0;
  for (let r = 0; r < SUB; r++) {
    let inv = 0, cnt = 0;
    for (let q = 0; q < SUB; q++) {
      const v = alongX ? sample[r * SUB + q] : sample[q * SUB + r];
      if (v === v) {
        inv += 1 / v;
        cnt++;
      }
    }
    if (cnt > 0) {
      sum += cnt / inv;
      rows++;
    }
  }
  return rows > 0 ? sum / rows : 0;
}
