/**
 * Physical constants shared by the glass model. Units in every name.
 */

/** Standard acceleration of gravity, m/s² (3rd CGPM 1901, exact by definition). */
export const GRAVITY_M_S2 = 9.80665

/** Molar gas constant, J/(mol·K) (CODATA 2018, exact since the 2019 SI). */
export const GAS_CONSTANT_J_MOL_K = 8.314462618

/**
 * Molar gas constant in cal/(mol·K), the value used with the DECHEMA NRTL parameters
 * (ChemSep data set for ethanol + water).
 */
export const GAS_CONSTANT_CAL_MOL_K = 1.9872

/** Molar mass of ethanol, g/mol (IUPAC standard atomic weights; as quoted with OIML R 22 cross-checks). */
export const MOLAR_MASS_ETHANOL_G_MOL = 46.068

/** Molar mass of water, g/mol (IUPAC standard atomic weights). */
export const MOLAR_MASS_WATER_G_MOL = 18.015

/** 0 °C in kelvin (SI definition). */
export const KELVIN_AT_0C = 273.15

/** Standard atmosphere, Pa (exact by definition). */
export const STANDARD_ATMOSPHERE_PA = 101325
