/**
 * What the solar-wind series reader hands out: one record per data line — a
 * value, a skip (a gap in the data, with the reason) or an error (the line is
 * unreadable, with its number and the problem). Pure: no Node or DOM APIs.
 */

/** The file layouts the reader understands (references §11). */
export type SeriesFormat = 'csv' | 'hourly' | 'highres';
export const SERIES_FORMATS: readonly SeriesFormat[] = ['csv', 'hourly', 'highres'];

/**
 * Where a record's dynamic pressure came from:
 * - `pdyn_npa`: the CSV column;
 * - `flow_pressure`: the flow-pressure word of an hourly or high-resolution file;
 * - `density_speed`: 2.0e-6·n·v² (alpha content unknown; references §3);
 * - `density_speed_alpha`: 1.67e-6·n·v²·(1 + 4 Na/Np) with the file's alpha ratio (references §3, §11).
 */
export type SeriesPdynSource = 'pdyn_npa' | 'flow_pressure' | 'density_speed' | 'density_speed_alpha';

/** Which storm-time ring-current index a record carries. */
export type StormIndexKind = 'dst' | 'sym_h';

/** One time step of solar-wind conditions. Components are GSM. */
export interface SeriesValue {
  /** ISO 8601 UTC, `YYYY-MM-DDTHH:MM:SSZ` (fractional seconds only when present). */
  time: string;
  /** The same instant as Unix milliseconds. */
  timeMs: number;
  /** Solar-wind dynamic pressure, nPa (always present: a step without it is skipped). */
  pdynNpa: number;
  pdynSource: SeriesPdynSource;
  /** Proton density, cm⁻³, when the file holds it. */
  densityCm3?: number;
  /** Bulk speed, km/s, when the file holds it. */
  speedKms?: number;
  /** IMF Bz, GSM, nT. */
  bzNt: number;
  /** IMF By, GSM, nT (0 when a CSV has no by_nt column). */
  byNt: number;
  /** The storm index (Dst or SYM-H), nT, when the file holds a value. */
  dstNt?: number;
  /** Which index `dstNt` is. */
  dstKind?: StormIndexKind;
}

export type SeriesRecord =
  | { kind: 'ok'; line: number; value: SeriesValue }
  | { kind: 'skipped'; line: number; reason: string; time?: string }
  | { kind: 'error'; line: number; error: string; time?: string };

/** Bounds shared by every format (the batch command's limits). */
export const LIMITS = {
  pdynMaxNpa: 1e4,
  imfMaxNt: 1000,
  /** Storm index bound: well beyond any recorded storm (the largest known Dst is about −1,700 nT). */
  dstMaxNt: 3000,
} as const;

/** ISO 8601 UTC text of a Unix-ms time, without `.000` when the seconds are whole. */
export function isoUtc(ms: number): string {
  const s = new Date(ms).toISOString();
  return s.endsWith('.000Z') ? `${s.slice(0, 19)}Z` : s;
}

/**
 * A fill value of a fixed-word file: only 9s (an optional sign and one decimal
 * point allowed) with at least as many 9s as the word's fill pattern (references
 * §11: gaps are filled with 9s to the field's width). So a high-resolution speed
 * of 999.9 km/s stays a number while 99999.9 is a gap.
 */
export function isNinesFill(text: string, minNines: number): boolean {
  let nines = 0;
  let points = 0;
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (c === 57) nines++;
    else if (c === 46) { if (++points > 1) return false; }
    else if ((c === 43 || c === 45) && i === 0) continue;
    else return false;
  }
  return nines > 0 && nines >= minNines;
}

/** Number of 9s in a fill pattern such as `999.9`. */
export function ninesIn(pattern: string): number {
  let n = 0;
  for (let i = 0; i < pattern.length; i++) if (pattern.charCodeAt(i) === 57) n++;
  return n;
}
