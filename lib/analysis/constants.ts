/** Physical constants, CODATA 2018 recommended values (SI). */
export const EPS0 = 8.8541878128e-12; // F/m
export const MU0 = 1.25663706212e-6; // H/m
export const C_LIGHT = 299792458; // m/s, exact
/** Impedance of free space μ0·c, Ω. */
export const ETA0 = MU0 * C_LIGHT;
/** Conductivity of annealed copper at 20 °C, S/m (IEC 60028 standard: 58.0 MS/m). */
export const COPPER_S_PER_M = 5.8e7;
