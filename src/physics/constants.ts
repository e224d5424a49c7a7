/** Physical constants and reference values used across the engine. */

/** Main-field reference radius in km (IGRF/WMM convention). Distances in the engine are in units of this. */
export const RE_KM = 6371.2;
/** WGS84 semi-major axis, km (NIMA TR8350.2). */
export const WGS84_A_KM = 6378.137;
/** WGS84 flattening (NIMA TR8350.2). */
export const WGS84_F = 1 / 298.257223563;
/** Vacuum permeability, SI (CODATA, pre-2019 exact value; the difference is < 1e-9 relative). */
export const MU0 = 4 * Math.PI * 1e-7;
/** Proton mass, kg (CODATA 2018). */
export const PROTON_MASS_KG = 1.67262192e-27;
/** Radians per degree (multiply degrees by it). */
export const RAD_PER_DEG = Math.PI / 180;
/** Degrees per radian (multiply radians by it). */
export const DEG_PER_RAD = 180 / Math.PI;
/** Milliseconds per day. */
export const MS_PER_DAY = 86_400_000;
