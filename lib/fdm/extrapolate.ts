/**
 * Richardson extrapolation over a mesh family with refinement ratio 2 and an error estimate
 * in the spirit of the grid convergence index (Roache, J. Fluids Eng. 116:405, 1994).
 * Values are given finest first: f[0] on the finest mesh, f[1] with every spacing doubled,
 * f[2] with every spacing ×4.
 */
export interface Extrapolated {
  /** Reported value: extrapolated where convergence is monotone with a plausible order, else the finest. */
  value: number;
  /** Estimated absolute error of `value`. */
  error: number;
  /** Observed order, when convergence is monotone. */
  order?: number;
  monotone: boolean;
  extrapolated: boolean;
}

/** Orders outside this range are not trusted for extrapolation. */
export const ORDER_RANGE: [number, number] = [0.7, 4];
/** Theoretical order of the scheme on smooth problems. */
const P_THEORY = 2;

export function richardson(f: number[]): Extrapolated {
  const [f0, f1, f2] = f;
  const d1 = f1 - f0;
  const d2 = f2 - f1;
  const floor = 1e-12 * Math.abs(f0);
  if (Math.abs(d1) <= floor && Math.abs(d2) <= floor) {
    return { value: f0, error: floor, monotone: true, extrapolated: false };
  }
  const monotone = d1 * d2 > 0 && Math.abs(d2) > Math.abs(d1);
  if (!monotone) {
    // oscillating or diverging: keep the finest value, claim no better than the largest change
    return { value: f0, error: Math.max(Math.abs(d1), Math.abs(d2)), monotone: false, extrapolated: false };
  }
  const p = Math.log2(d2 / d1);
  if (p < ORDER_RANGE[0] || p > ORDER_RANGE[1]) {
    // monotone but the order is implausible: finest value, GCI-like estimate with order 1
    return { value: f0, error: 1.25 * Math.abs(d1), order: p, monotone: true, extrapolated: false };
  }
  const ext = f0 - d1 / (Math.pow(2, p) - 1);
  const extTheory = f0 - d1 / (Math.pow(2, P_THEORY) - 1);
  const error = Math.max(Math.abs(ext - extTheory), 0.5 * Math.abs(ext - f0));
  return { value: ext, error, order: p, monotone: true, extrapolated: true };
}
