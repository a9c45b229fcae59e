/**
 * Physical constants. Values follow Bolton (1980) where that paper fixes them, so that the
 * equivalent potential temperature and the saturation vapour pressure agree with its worked values.
 */

/** Standard gravity, m/s² (CGPM 1901). */
export const GRAVITY_MS2 = 9.80665;
/** Gas constant of dry air, J/(kg·K) (Bolton 1980). */
export const DRY_AIR_GAS_CONSTANT_JKGK = 287.04;
/** Specific heat of dry air at constant pressure, J/(kg·K) (Bolton 1980). */
export const DRY_AIR_SPECIFIC_HEAT_JKGK = 1005.7;
/** Gas constant of water vapour, J/(kg·K). */
export const WATER_VAPOUR_GAS_CONSTANT_JKGK = 461.5;
/** Ratio of the gas constants of dry air and water vapour (molar mass ratio), dimensionless. */
export const EPSILON = 0.622;
/** Poisson constant Rd/cp, dimensionless (Bolton 1980 uses 0.2854). */
export const KAPPA = 0.2854;
/** Latent heat of vaporisation at 0 °C, J/kg. */
export const LATENT_HEAT_VAPORISATION_JKG = 2.501e6;
/** Kelvin at 0 °C. */
export const ZERO_CELSIUS_K = 273.15;
/** Reference pressure of potential temperature, hPa. */
export const REFERENCE_PRESSURE_HPA = 1000;
/** Density of liquid water, kg/m³. */
export const WATER_DENSITY_KGM3 = 1000;

/**
 * Dry adiabatic lapse rate g/cp, rounded as the trade quotes it (9.8 °C/km). g/cp with the
 * constants above is 9.751 °C/km; the project's layer classes are defined against 9.8.
 */
export const DRY_ADIABATIC_LAPSE_RATE_C_PER_KM = 9.8;
