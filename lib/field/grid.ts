/**
 * The tensor-product mesh a field lives on, and point location on it.
 * Coordinates are in metres. Node fields are row-major Float64Array(nx*ny) indexed j*nx + i;
 * cell fields are row-major ((nx−1)*(ny−1)) indexed j*(nx−1) + i (cell i spans xs[i]..xs[i+1]).
 * Pure TypeScript: no DOM, no Node APIs.
 */
export interface FieldGrid {
  xs: Float64Array;
  ys: Float64Array;
  nx: number;
  ny: number;
}

export function makeGrid(xs: Float64Array, ys: Float64Array): FieldGrid {
  if (xs.length < 2 || ys.length < 2) throw new RangeError('a field grid needs at least 2 nodes along each axis');
  for (let i = 1; i < xs.length; i++) {
    if (!(xs[i]! > xs[i - 1]!)) throw new RangeError(`xs must increase strictly (index ${i})`);
  }
  for (let j = 1; j < ys.length; j++) {
    if (!(ys[j]! > ys[j - 1]!)) throw new RangeError(`ys must increase strictly (index ${j})`);
  }
  return { xs, ys, nx: xs.length, ny: ys.length };
}

/**
 * Index of the interval [a[k], a[k+1]] that holds v (binary search), clamped to
 * 0..a.length−2; returns −1 when v lies outside [a[0], a[last]].
 */
export function findInterval(a: Float64Array, v: number): number {
  const n = a.length;
  if (!(v >= a[0]!) || !(v <= a[n - 1]!)) return -1;
  let lo = 0;
  let hi = n - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (a[mid]! <= v) lo = mid;
    else hi = mid;
  }
  return lo;
}

/** Position of v inside its interval: cell index and the fraction t in [0, 1]. */
export function locate(a: Float64Array, v: number): { k: number; t: number } | null {
  const k = findInterval(a, v);
  if (k < 0) return null;
  const h = a[k + 1]! - a[k]!;
  return { k, t: h > 0 ? (v - a[k]!) / h : 0 };
}

/** Fractional index → coordinate, linear inside each interval (inverse of `locate`). */
export function coordAt(a: Float64Array, f: number): number {
  const n = a.length;
  if (f <= 0) return a[0]!;
  if (f >= n - 1) return a[n - 1]!;
  const k = Math.floor(f);
  const t = f - k;
  return a[k]! + t * (a[k + 1]! - a[k]!);
}
