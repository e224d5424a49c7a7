/**
 * The one plain, serialisable conditions object. The same object drives the
 * worker, the URL, the CLI flags and the metadata block of every export.
 */
import { InputError, expectedGot } from '../errors';

export type InternalFieldKind = 'dipole' | 'igrf';

/** Largest |IMF component| accepted, nT (an order of magnitude above any observed value). */
export const IMF_LIMIT_NT = 1000;

/** Require an IMF component (nT) that is finite and within ±IMF_LIMIT_NT; returns it. */
export function requireImfComponent(field: 'bzNt' | 'byNt', v: number): number {
  if (typeof v !== 'number' || !Number.isFinite(v) || Math.abs(v) > IMF_LIMIT_NT) {
    throw new InputError(field, expectedGot(`a finite IMF component in −${IMF_LIMIT_NT}..${IMF_LIMIT_NT} nT`, v));
  }
  return v;
}

export interface FieldConditions {
  /** ISO 8601 UTC instant. */
  time: string;
  /** Solar-wind dynamic pressure, nPa. */
  pdynNpa: number;
  /** IMF Bz (GSM), nT. */
  bzNt: number;
  /** IMF By (GSM), nT. */
  byNt: number;
  /** Dipole tilt override, degrees; null/undefined = from the time. */
  tiltDeg?: number | null;
  /** Main field: centred dipole of the date, or full IGRF-14. */
  internal: InternalFieldKind;
  /** Magnetopause on: compression term and boundary. Off: neither. */
  magnetopause: boolean;
  /** IMF penetration efficiency ε in [0, 1]. */
  imfEfficiency: number;
  /** Tail current-sheet term on/off (calibrated with it on: references §12). */
  tail?: boolean;
  /**
   * Storm index (Dst or SYM-H), nT, |Dst| ≤ 2000; null/undefined = estimated from the solar wind
   * (O'Brien–McPherron steady state; src/physics/field/storm-index.ts).
   */
  dstNt?: number | null;
  /** Solar-wind speed, km/s, 0 < V ≤ 3000; null/undefined = the nominal 400 km/s (storm-index.ts). */
  speedKms?: number | null;
}

/** Options of the mapping products (not of the field). */
export interface ProductOptions {
  /** Footpoint altitude above the WGS84 ellipsoid, km. */
  altKm: number;
  /** Equatorial source distance for the equatorward precipitation edge, RE. */
  sourceRe: number;
}
