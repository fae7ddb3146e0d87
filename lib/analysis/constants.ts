/** Physical constants (CODATA 2018, defined once in lib/engine/constants.ts) and material defaults. */
import { C_LIGHT, MU0 } from '../engine/constants';

export { C_LIGHT, EPS0, MU0 } from '../engine/constants';
/** Impedance of free space μ0·c, Ω. */
export const ETA0 = MU0 * C_LIGHT;
/** Conductivity of annealed copper at 20 °C, S/m (IEC 60028 standard: 58.0 MS/m). */
export const COPPER_S_PER_M = 5.8e7;
