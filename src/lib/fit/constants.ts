// Physical constants, SI. Exact values of the 2019 SI redefinition (CODATA 2018, BIPM "The International
// System of Units", 9th ed., 2019): c, h and e are exact by definition.

/** Speed of light in vacuum, m/s (exact). */
export const SPEED_OF_LIGHT = 299_792_458;

/** Planck constant, J·s (exact). */
export const PLANCK = 6.626_070_15e-34;

/** Elementary charge, C (exact). */
export const ELEMENTARY_CHARGE = 1.602_176_634e-19;

/** Reduced Planck constant ħ = h/2π, J·s. */
export const HBAR = PLANCK / (2 * Math.PI);
