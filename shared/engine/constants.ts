/** Boltzmann constant [J/K], exact since the 2019 SI redefinition (BIPM SI Brochure, 9th ed.). */
export const BOLTZMANN = 1.380649e-23;

/** Temperature used when a design gives none [K]. */
export const DEFAULT_TEMPERATURE = 300;

export const TWO_PI = 2 * Math.PI;

/** Lowest frequency a density is evaluated at [Hz]: keeps 1/f terms finite where folding lands on a harmonic. */
export const FREQUENCY_FLOOR = 1e-9;
