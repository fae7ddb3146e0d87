/**
 * Multi-conductor transmission-line values from the per-unit-length Maxwell capacitance
 * matrices of the dielectric (C) and vacuum (C0) solves, for non-magnetic media (quasi-TEM).
 *
 * L = μ0 ε0 C0⁻¹ (Paul 2008, Analysis of Multiconductor Transmission Lines, 2nd ed., ch. 3–5).
 * Modes: C v = εeff C0 v, a symmetric-definite generalised eigenproblem; each mode travels
 * at c/√εeff (Paul 2008, ch. 7). Modal impedance: Z = (vᵀv)/(vᵀI) with I = c √εeff C0 v,
 * which for a symmetric pair reduces to the even- and odd-mode impedances
 * 1/(c √(C_e C0_e)) (Pozar 2012, Microwave Engineering, 4th ed., §7.6).
 */
import { CholeskyDecomposition, EigenvalueDecomposition, Matrix, inverse } from 'ml-matrix';
import { C_LIGHT, EPS0, MU0 } from './constants';

export interface Mode {
  z0Ohm: number;
  epsEff: number;
  velocityMPerS: number;
  /** Modal voltage vector, unit length, largest component positive. */
  voltages: number[];
}

export interface CoupledPair {
  even: { z0Ohm: number; epsEff: number };
  odd: { z0Ohm: number; epsEff: number };
  differentialOhm: number;
  commonOhm: number;
  /** True when the two lines are electrically symmetric (C11 ≈ C22 within 1e-3). */
  symmetric: boolean;
}

function checkSquare(m: number[][], what: string): number {
  const n = m.length;
  if (n === 0) throw new RangeError(`${what}: empty matrix`);
  for (const row of m) {
    if (row.length !== n) throw new RangeError(`${what}: not a square matrix`);
    for (const v of row) if (!Number.isFinite(v)) throw new RangeError(`${what}: non-finite entry`);
  }
  return n;
}

/** Inductance matrix per unit length, H/m, from the vacuum Maxwell matrix (F/m). */
export function inductanceMatrix(vacuum: number[][]): number[][] {
  checkSquare(vacuum, 'vacuum capacitance');
  return inverse(new Matrix(vacuum)).mul(MU0 * EPS0).to2DArray();
}

/**
 * Propagation modes of an N-conductor line, sorted by increasing εeff.
 * @param maxwell Maxwell matrix with dielectrics, F/m
 * @param vacuum Maxwell matrix with every dielectric replaced by vacuum, F/m
 */
export function modalAnalysis(maxwell: number[][], vacuum: number[][]): Mode[] {
  const n = checkSquare(maxwell, 'capacitance');
  if (checkSquare(vacuum, 'vacuum capacitance') !== n) throw new RangeError('capacitance matrices differ in size');
  const C = new Matrix(maxwell);
  const C0 = new Matrix(vacuum);
  const chol = new CholeskyDecomposition(C0);
  if (!chol.isPositiveDefinite()) throw new RangeError('vacuum capacitance matrix is not positive definite');
  const R = chol.lowerTriangularMatrix; // C0 = R Rᵀ
  const Rinv = inverse(R);
  // S = R⁻¹ C R⁻ᵀ is symmetric; symmetrise against round-off.
  let S = Rinv.mmul(C).mmul(Rinv.transpose());
  S = S.add(S.transpose()).mul(0.5);
  const eig = new EigenvalueDecomposition(S, { assumeSymmetric: true });
  const lambdas = eig.realEigenvalues;
  const W = eig.eigenvectorMatrix;
  const RinvT = Rinv.transpose();
  const modes: Mode[] = [];
  for (let k = 0; k < n; k++) {
    const epsEff = lambdas[k];
    if (!(epsEff > 0)) throw new RangeError('capacitance matrix is not positive definite');
    const v = RinvT.mmul(W.getColumnVector(k)).getColumn(0);
    let norm = Math.hypot(...v);
    let sign = 1;
    let big = 0;
    for (const x of v) if (Math.abs(x) > Math.abs(big)) big = x;
    if (big < 0) sign = -1;
    norm *= sign;
    const vn = v.map((x) => x / norm);
    const I = C0.mmul(Matrix.columnVector(vn)).mul(C_LIGHT * Math.sqrt(epsEff)).getColumn(0);
    let vv = 0;
    let vi = 0;
    for (let i = 0; i < n; i++) {
      vv += vn[i] * vn[i];
      vi += vn[i] * I[i];
    }
    modes.push({ z0Ohm: vv / vi, epsEff, velocityMPerS: C_LIGHT / Math.sqrt(epsEff), voltages: vn });
  }
  modes.sort((a, b) => a.epsEff - b.epsEff);
  return modes;
}

/**
 * Even- and odd-mode values of a pair of signal lines. For a symmetric pair:
 * C_e = C11 + C12, C_o = C11 − C12 (Maxwell entries, C12 ≤ 0), Z = 1/(c √(C·C0)),
 * Z_diff = 2 Z_odd, Z_common = Z_even / 2 (Pozar 2012, §7.6). For an asymmetric pair the
 * two modes of `modalAnalysis` are used: "even" is the one whose voltages share a sign.
 */
export function coupledPair(maxwell: number[][], vacuum: number[][]): CoupledPair {
  if (checkSquare(maxwell, 'capacitance') !== 2) throw new RangeError('a coupled pair needs exactly two signal nets');
  const symmetric =
    Math.abs(maxwell[0][0] - maxwell[1][1]) <= 1e-3 * Math.max(maxwell[0][0], maxwell[1][1]) &&
    Math.abs(vacuum[0][0] - vacuum[1][1]) <= 1e-3 * Math.max(vacuum[0][0], vacuum[1][1]);
  let even: { z0Ohm: number; epsEff: number };
  let odd: { z0Ohm: number; epsEff: number };
  if (symmetric) {
    const ce = 0.5 * (maxwell[0][0] + maxwell[1][1]) + maxwell[0][1];
    const co = 0.5 * (maxwell[0][0] + maxwell[1][1]) - maxwell[0][1];
    const c0e = 0.5 * (vacuum[0][0] + vacuum[1][1]) + vacuum[0][1];
    const c0o = 0.5 * (vacuum[0][0] + vacuum[1][1]) - vacuum[0][1];
    even = { z0Ohm: 1 / (C_LIGHT * Math.sqrt(ce * c0e)), epsEff: ce / c0e };
    odd = { z0Ohm: 1 / (C_LIGHT * Math.sqrt(co * c0o)), epsEff: co / c0o };
  } else {
    const modes = modalAnalysis(maxwell, vacuum);
    const isEven = (m: Mode) => m.voltages[0] * m.voltages[1] > 0;
    const e = modes.find(isEven) ?? modes[0];
    const o = modes.find((m) => m !== e) ?? modes[1];
    even = { z0Ohm: e.z0Ohm, epsEff: e.epsEff };
    odd = { z0Ohm: o.z0Ohm, epsEff: o.epsEff };
  }
  return { even, odd, differentialOhm: 2 * odd.z0Ohm, commonOhm: even.z0Ohm / 2, symmetric };
}

export interface Crosstalk {
  /** Saturated near-end (backward) coefficient ¼(Cm/C + Lm/L), dimensionless. */
  nearEnd: number;
  /** Far-end coefficient ½(Cm/C − Lm/L)/v, s/m: far-end noise ≈ this × length / rise time. */
  farEndPerLength: number;
  /** Far-end noise ratio for the given length and rise time (when both are given). */
  farEnd?: number;
  /** Length below which the near-end noise does not saturate: v·t_r/2, m (when t_r is given). */
  saturationLengthM?: number;
}

/**
 * Weak-coupling crosstalk between signal lines `a` (aggressor) and `b` (victim), both
 * matched (Bogatin 2009, Signal and Power Integrity — Simplified, 2nd ed., ch. 10; from memory).
 * Cm = −C_ab (Maxwell), C = C_bb (Maxwell), Lm = L_ab, L = L_bb.
 */
export function crosstalk(
  maxwell: number[][],
  vacuum: number[][],
  a: number,
  b: number,
  opts: { lengthM?: number; riseTimeS?: number } = {},
): Crosstalk {
  const n = checkSquare(maxwell, 'capacitance');
  if (a === b || a < 0 || b < 0 || a >= n || b >= n) throw new RangeError('crosstalk needs two different line indices');
  const L = inductanceMatrix(vacuum);
  const cm = -maxwell[a][b];
  const cRatio = cm / maxwell[b][b];
  const lRatio = L[a][b] / L[b][b];
  const epsEff = maxwell[b][b] / vacuum[b][b];
  const v = C_LIGHT / Math.sqrt(epsEff);
  const out: Crosstalk = { nearEnd: 0.25 * (cRatio + lRatio), farEndPerLength: (0.5 * (cRatio - lRatio)) / v };
  if (opts.riseTimeS !== undefined && opts.riseTimeS > 0) {
    out.saturationLengthM = (v * opts.riseTimeS) / 2;
    if (opts.lengthM !== undefined) out.farEnd = (out.farEndPerLength * opts.lengthM) / opts.riseTimeS;
  }
  return out;
}
