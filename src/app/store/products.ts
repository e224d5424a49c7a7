/** The app's product settings (altitudes, source distance, search floor): a type of their own, so the demo scenario and the store share it without a cycle. */
export type AltPreset = 'ground' | 'green' | 'red' | 'custom';

export interface ProductSettings {
  altPreset: AltPreset;
  /** Footpoint (emission) altitude, km. */
  altKm: number;
  /** Altitude of the conjugate point, km; null = the footpoint altitude (the one rule of app, trace and batch). */
  conjugateAltKm: number | null;
  /** Equatorial source distance of the equatorward edge, RE; null = follows the conditions (the model's storm-following value). */
  sourceRe: number | null;
  minElevationDeg: number;
  /** Lowest magnetic latitude the boundary searches start from, deg. */
  minLatDeg: number;
}

/** The conjugate altitude in use (km): the set value, or the footpoint altitude when none is set. */
export function conjugateAltOf(p: ProductSettings): number {
  return p.conjugateAltKm ?? p.altKm;
}
