/**
 * Closed-form approximations for the capacitance of a pair of equal, thin, parallel
 * plates (strips) of width w at gap d, per unit length, in units of the medium's ε
 * (multiply by ε0·εr for F/m). Used to overlay published curves on the fringing study.
 */

/** Ideal parallel-plate value w/d (no fringing). */
export function idealPlates(wOverD: number): number {
  return wOverD;
}

/**
 * Palmer 1937 (Trans. AIEE 56:363): C/ε = w/d + (1/π)(1 + ln(2πw/d)), for d ≪ w.
 * (As quoted in ../shared/REFERENCES.md §6.)
 */
export function palmerPlates(wOverD: number): number {
  if (!(wOverD > 0)) throw new RangeError('w/d must be positive');
  return wOverD + (1 / Math.PI) * (1 + Math.log(2 * Math.PI * wOverD));
}

/**
 * Via the equipotential mid-plane: two equal strips at gap d are two strip-over-ground
 * halves (height h = d/2) in series, C_plates = C_half/2. C_half from the homogeneous
 * microstrip impedance of Hammerstad & Jensen 1980 (IEEE MTT-S Digest pp. 407–409),
 * stated within 0.01% for u ≤ 1 and 0.03% for u ≤ 1000 of the exact conformal mapping:
 * Z01(u) = (η0/2π) ln(f(u)/u + √(1 + (2/u)²)), f(u) = 6 + (2π − 6) exp(−(30.666/u)^0.7528),
 * and C/ε = η0 / Z01 (homogeneous line, Z = 1/(v C)) — so C/ε = 2π / ln(...).
 */
export function hammerstadJensenPlates(wOverD: number): number {
  if (!(wOverD > 0)) throw new RangeError('w/d must be positive');
  const u = 2 * wOverD; // w/h with h = d/2
  const f = 6 + (2 * Math.PI - 6) * Math.exp(-Math.pow(30.666 / u, 0.7528));
  const cHalf = (2 * Math.PI) / Math.log(f / u + Math.sqrt(1 + (2 / u) ** 2));
  return cHalf / 2;
}
