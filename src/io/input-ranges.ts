/**
 * The allowed range of each input kind, one table for the command line (flags
 * and batch columns) and the app (typed values, imported files, links):
 * inclusive min/max; `above` an exclusive lower bound. Pure (no Node or DOM APIs).
 */
import { DST_LIMIT_NT, SPEED_LIMIT_KMS } from '../physics/field/storm-index';

export const INPUT_RANGES = {
  latDeg: { min: -90, max: 90 },
  lonDeg: { min: -360, max: 360 },
  siteHeightKm: { min: -1, max: 100_000 },
  /** Below 0.01 nPa the tail term's inner edge moves beyond its allowed 1000 RE (and no solar wind is that thin). */
  pdynNpa: { min: 0.01, max: 1e4 },
  imfNt: { min: -1000, max: 1000 },
  altKm: { min: 0, max: 5000 },
  sourceRe: { min: 1.5, max: 100 },
  dstNt: { min: -DST_LIMIT_NT, max: DST_LIMIT_NT },
  speedKms: { above: 0, max: SPEED_LIMIT_KMS },
} as const;
