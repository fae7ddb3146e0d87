/**
 * Complete elliptic integral of the first kind by the arithmetic–geometric mean:
 * K(k) = π / (2 · AGM(1, √(1 − k²))) (Abramowitz & Stegun 1964, §17.6). Converges
 * quadratically; accurate to machine precision for 0 ≤ k < 1.
 */
export function ellipticK(k: number): number {
  if (!(k >= 0 && k < 1)) throw new RangeError(`ellipticK: modulus must be in [0, 1) (got ${k})`);
  let a = 1;
  let b = Math.sqrt((1 - k) * (1 + k));
  for (let i = 0; i < 40 && Math.abs(a - b) > 1e-16 * a; i++) {
    const an = 0.5 * (a + b);
    b = Math.sqrt(a * b);
    a = an;
  }
  return Math.PI / (2 * a);
}

/** The ratio K(k)/K(k′) with k′ = √(1 − k²), computed without cancellation for k near 0 or 1. */
export function ellipticRatio(k: number): number {
  if (!(k > 0 && k < 1)) throw new RangeError(`ellipticRatio: modulus must be in (0, 1) (got ${k})`);
  const kp = Math.sqrt((1 - k) * (1 + k));
  return ellipticK(k) / ellipticK(kp);
}
