/** Physical constants, CODATA 2018 (Tiesinga et al., Rev. Mod. Phys. 93:025010, 2021). */
/** Vacuum permittivity ε0, F/m. */
export const EPS0 = 8.8541878128e-12;
/** Vacuum permeability μ0, H/m. */
export const MU0 = 1.25663706212e-6;
/** Speed of light in vacuum c, m/s (exact). */
export const C_LIGHT = 299792458;
