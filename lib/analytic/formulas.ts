/**
 * Closed-form capacitance and line values used as references for the numerical core.
 * Every function says where its formula comes from. Capacitances are per unit length
 * in F/m; lengths in any consistent unit (only ratios enter).
 */
import { ellipticK, ellipticRatio } from './elliptic';

/** Vacuum permittivity, F/m (CODATA 2018). */
export const EPS0 = 8.8541878128e-12;
/** Speed of light in vacuum, m/s (exact by definition of the metre). */
export const C0 = 299_792_458;
/** Vacuum permeability μ0 = 1/(ε0 c²), H/m. */
export const MU0 = 1 / (EPS0 * C0 * C0);
/** Wave impedance of free space √(μ0/ε0), Ω. */
export const ETA0 = MU0 * C0;

/** Coaxial line, inner radius a, outer radius b: C' = 2πε/ln(b/a) (exact; any electromagnetics text). */
export function coaxCapacitance(a: number, b: number, epsR = 1): number {
  if (!(a > 0 && b > a)) throw new RangeError('coax: need 0 < a < b');
  return (2 * Math.PI * EPS0 * epsR) / Math.log(b / a);
}

/**
 * Eccentric coax: inner radius a, outer radius b, centre offset e:
 * C' = 2πε / arccosh((a² + b² − e²)/(2ab)) (exact, method of images).
 */
export function eccentricCoaxCapacitance(a: number, b: number, e: number, epsR = 1): number {
  if (!(a > 0 && b > a && e >= 0 && e < b - a)) throw new RangeError('eccentric coax: need 0 < a < b, 0 ≤ e < b − a');
  return (2 * Math.PI * EPS0 * epsR) / Math.acosh((a * a + b * b - e * e) / (2 * a * b));
}

/** Two round wires, radius a, centre spacing D, charged ±: C' = πε / arccosh(D/2a) (exact, method of images). */
export function twoWireCapacitance(a: number, D: number, epsR = 1): number {
  if (!(a > 0 && D > 2 * a)) throw new RangeError('two wires: need D > 2a');
  return (Math.PI * EPS0 * epsR) / Math.acosh(D / (2 * a));
}

/** Wire of radius a, centre at height h over an infinite ground plane: C' = 2πε / arccosh(h/a) (exact, images). */
export function wireOverGroundCapacitance(a: number, h: number, epsR = 1): number {
  if (!(a > 0 && h > a)) throw new RangeError('wire over ground: need h > a');
  return (2 * Math.PI * EPS0 * epsR) / Math.acosh(h / a);
}

/**
 * Centred stripline, zero thickness, strip width w between grounds b apart (Cohn 1954,
 * IRE Trans. MTT 2:52): Z0 = (30π/√εr) K(k)/K(k′), k = sech(πw/2b). Equivalently
 * C' = 4 ε0 εr K(k′)/K(k) (both sides of the strip together).
 */
export function striplineCapacitance(w: number, b: number, epsR = 1): number {
  const k = 1 / Math.cosh((Math.PI * w) / (2 * b));
  return (4 * EPS0 * epsR) / ellipticRatio(k);
}
export function striplineZ0(w: number, b: number, epsR = 1): number {
  const k = 1 / Math.cosh((Math.PI * w) / (2 * b));
  return ((30 * Math.PI) / Math.sqrt(epsR)) * ellipticRatio(k);
}

/**
 * Coplanar waveguide, zero-thickness metal, centre strip s, slots w, semi-infinite grounds,
 * on an infinitely thick substrate (Wen 1969, IEEE Trans. MTT 17:1087):
 * k = s/(s + 2w), εeff = (εr + 1)/2, C' = 2 ε0 (εr + 1) K(k)/K(k′), Z0 = (30π/√εeff) K(k′)/K(k).
 */
export function cpwCapacitance(s: number, w: number, epsR = 1): number {
  const k = s / (s + 2 * w);
  return 2 * EPS0 * (epsR + 1) * ellipticRatio(k);
}
export function cpwZ0(s: number, w: number, epsR = 1): number {
  const k = s / (s + 2 * w);
  return ((30 * Math.PI) / Math.sqrt((epsR + 1) / 2)) / ellipticRatio(k);
}

/**
 * Coplanar strips, zero thickness: two strips of width w with a gap s, on an infinitely thick
 * substrate (Wen 1969 and its dual): k = s/(s + 2w), εeff = (εr + 1)/2,
 * C' = ε0 (εr + 1)/2 · K(k′)/K(k), Z0 = (120π/√εeff) K(k)/K(k′).
 */
export function coplanarStripsCapacitance(s: number, w: number, epsR = 1): number {
  const k = s / (s + 2 * w);
  return (EPS0 * (epsR + 1)) / 2 / ellipticRatio(k);
}
export function coplanarStripsZ0(s: number, w: number, epsR = 1): number {
  const k = s / (s + 2 * w);
  return ((120 * Math.PI) / Math.sqrt((epsR + 1) / 2)) * ellipticRatio(k);
}

/**
 * Microstrip of zero thickness, width w, on a substrate of height h (Hammerstad & Jensen 1980,
 * IEEE MTT-S Digest pp. 407–409; formulas as widely reproduced, from memory): stated accuracy
 * Z0 (homogeneous part) better than 0.01% for u ≤ 1 and 0.03% for u ≤ 1000; εeff better than
 * 0.2% for 0.01 ≤ u ≤ 100 and εr ≤ 128.
 */
export function microstripHammerstadJensen(w: number, h: number, epsR: number): { z0: number; epsEff: number; z0Air: number } {
  const u = w / h;
  const f = 6 + (2 * Math.PI - 6) * Math.exp(-Math.pow(30.666 / u, 0.7528));
  const z0Air = (ETA0 / (2 * Math.PI)) * Math.log(f / u + Math.sqrt(1 + 4 / (u * u)));
  const a =
    1 +
    (1 / 49) * Math.log((Math.pow(u, 4) + Math.pow(u / 52, 2)) / (Math.pow(u, 4) + 0.432)) +
    (1 / 18.7) * Math.log(1 + Math.pow(u / 18.1, 3));
  const b = 0.564 * Math.pow((epsR - 0.9) / (epsR + 3), 0.053);
  const epsEff = (epsR + 1) / 2 + ((epsR - 1) / 2) * Math.pow(1 + 10 / u, -a * b);
  return { z0: z0Air / Math.sqrt(epsEff), epsEff, z0Air };
}

/**
 * Parallel plates of width w at gap d, with fringing (Palmer 1937, Trans. AIEE 56:363):
 * C' = ε [w/d + (1/π)(1 + ln(2πw/d))], valid for d ≪ w. Returns the fringing excess
 * C'/(εw/d) − 1 = (d/(πw))(1 + ln(2πw/d)).
 */
export function palmerFringingExcess(w: number, d: number): number {
  return (d / (Math.PI * w)) * (1 + Math.log((2 * Math.PI * w) / d));
}

/** Elliptic K re-exported for tests. */
export { ellipticK, ellipticRatio };

/**
 * Edge-coupled centred striplines, zero thickness, strips of width w with gap s between
 * grounds b apart (Cohn 1955, IRE Trans. MTT 3:29; from memory, and checked against our
 * converged numerics): k_e = tanh(πw/2b)·tanh(π(w+s)/2b), k_o = tanh(πw/2b)·coth(π(w+s)/2b),
 * even/odd capacitance per line C = 4 ε0 εr K(k)/K(k′) (Z = (30π/√εr) K(k′)/K(k)).
 * In Maxwell terms: C_even = C11 + C12, C_odd = C11 − C12.
 */
export function coupledStriplineCapacitances(w: number, s: number, b: number, epsR = 1): { even: number; odd: number } {
  const t1 = Math.tanh((Math.PI * w) / (2 * b));
  const t2 = Math.tanh((Math.PI * (w + s)) / (2 * b));
  return { even: 4 * EPS0 * epsR * ellipticRatio(t1 * t2), odd: 4 * EPS0 * epsR * ellipticRatio(t1 / t2) };
}
