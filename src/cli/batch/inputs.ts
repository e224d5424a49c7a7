/**
 * The batch command's two input tables: header checks (a wrong or missing
 * column is a usage error, exit 2) and row parsing. A row becomes a value, a
 * skip (fill value or empty cell, with the reason) or an error (with the file
 * line and the problem); it never stops the run.
 */
import { csvText } from '../../io/csv';
import { parseNumberText, errorText, inputErrorReason, UsageError } from '../args';
import { INPUT_RANGES } from '../common';
import { parseUtc, decimalYear } from '../../physics/frames/time';
import { igrfCoefficients } from '../../physics/field/mainfield/coefficients';
import { pdynFromPlasmaNominal } from '../../physics/field/magnetopause';
import { InputError } from '../../physics/errors';
import type { SiteInput } from '../../physics/mapping';

const SITE_COLUMNS = { required: ['name', 'lat_deg', 'lon_deg'], optional: ['height_km'] } as const;
const CONDITION_COLUMNS = { required: ['time', 'bz_nt'], pressure: ['pdyn_npa', 'density_cm3', 'speed_kms'], optional: ['by_nt'] } as const;

export const SITES_EXPECTED = 'name, lat_deg, lon_deg, optional height_km';
export const CONDITIONS_EXPECTED = 'time, bz_nt, and pdyn_npa or both density_cm3 and speed_kms; optional by_nt';

/** A parsed row: its value, or why it was skipped, or what is wrong with it. */
export type RowOutcome<T> =
  | { kind: 'ok'; line: number; value: T }
  | { kind: 'skipped'; line: number; reason: string; time?: string }
  | { kind: 'error'; line: number; error: string; time?: string };

/** One condition of a series: the time-varying inputs (the rest come from the flags). */
export interface SeriesCondition {
  time: string;
  pdynNpa: number;
  bzNt: number;
  byNt: number;
  /** Where pdyn came from: the file's pdyn_npa or flow-pressure word, density and speed (with the alpha ratio), or the flags. */
  pdynSource: 'pdyn_npa' | 'flow_pressure' | 'density_speed' | 'density_speed_alpha' | 'flags';
  /** Storm index for the model, nT; null: the model estimates it (steady state). */
  dstNt?: number | null;
  /** Where the index came from (the `dst_source` column); absent: from the model (--dst or its steady-state estimate). */
  dstSource?: 'dst' | 'sym_h' | 'integrated';
  /** Solar-wind speed for the model, km/s; null: the nominal speed. */
  speedKms?: number | null;
  /** A note on this condition for the warnings column (e.g. the storm-index integration restarted). */
  note?: string | null;
}

/** Column index by name, after checking the header against the expected columns. */
export type HeaderIndex = Map<string, number>;

function headerNames(fields: string[]): string[] {
  return fields.map((h) => csvText(h.trim()));
}

function checkHeader(file: string, fields: string[], known: readonly string[], expected: string, missing: (idx: HeaderIndex) => string[]): HeaderIndex {
  const names = headerNames(fields);
  const idx: HeaderIndex = new Map();
  const unknown: string[] = [];
  names.forEach((h, j) => {
    if (idx.has(h)) throw new UsageError(file, `column "${h}" appears twice in the header; expected columns: ${expected}`);
    if (!known.includes(h)) unknown.push(h === '' ? '(empty)' : `"${h}"`);
    idx.set(h, j);
  });
  const miss = missing(idx);
  const problems: string[] = [];
  if (miss.length) problems.push(`missing column${miss.length > 1 ? 's' : ''} ${miss.map((m) => `"${m}"`).join(', ')}`);
  if (unknown.length) problems.push(`unknown column${unknown.length > 1 ? 's' : ''} ${unknown.join(', ')}`);
  if (problems.length) throw new UsageError(file, `${problems.join('; ')} in the header (line 1); expected columns: ${expected}`);
  return idx;
}

export function sitesHeader(fields: string[]): HeaderIndex {
  return checkHeader('--sites', fields, [...SITE_COLUMNS.required, ...SITE_COLUMNS.optional], SITES_EXPECTED,
    (idx) => SITE_COLUMNS.required.filter((c) => !idx.has(c)));
}

export function conditionsHeader(fields: string[]): HeaderIndex {
  return checkHeader('--conditions', fields, [...CONDITION_COLUMNS.required, ...CONDITION_COLUMNS.pressure, ...CONDITION_COLUMNS.optional], CONDITIONS_EXPECTED,
    (idx) => {
      const miss: string[] = CONDITION_COLUMNS.required.filter((c) => !idx.has(c));
      if (!idx.has('pdyn_npa')) {
        if (!idx.has('density_cm3') && !idx.has('speed_kms')) miss.push('pdyn_npa');
        else if (!idx.has('density_cm3')) miss.push('density_cm3');
        else if (!idx.has('speed_kms')) miss.push('speed_kms');
      }
      return miss;
    });
}

/**
 * A fill value: all nines with at least four of them (9999.99, 99999.9, 999.9,
 * 9999999.): the gap markers of solar-wind archives, far outside any real value
 * of these columns. Matched on the text, so 1000 or 9998 are numbers.
 */
const FILL_RE = /^[+-]?(?=(?:\.?9){4,})9*\.?9*$/;

export function isFillText(text: string): boolean {
  return FILL_RE.test(text.trim());
}

class RowProblem extends Error {
  constructor(readonly skip: boolean, message: string) { super(message); }
}

/** The trimmed cell text of a column, or undefined when the column is absent. */
function cell(fields: string[], idx: HeaderIndex, name: string): string | undefined {
  const j = idx.get(name);
  return j === undefined ? undefined : csvText(fields[j].trim());
}

/** A numeric cell: a skip for empty or fill, an error for non-numeric text. */
function num(fields: string[], idx: HeaderIndex, name: string): number {
  const t = cell(fields, idx, name);
  if (t === undefined) throw new RowProblem(false, `${name}: column missing`);
  if (t === '') throw new RowProblem(true, `${name} is empty`);
  if (isFillText(t)) throw new RowProblem(true, `${name} is a fill value (${t})`);
  const v = parseNumberText(t);
  if (v === null || !Number.isFinite(v)) throw new RowProblem(false, `${name}: expected a number, got "${t}"`);
  return v;
}

/** A column value against its input kind's range (INPUT_RANGES, shared with the flags); returns it. */
function inRange(name: string, v: number, range: { min: number; max: number }, unit = ''): number {
  if (v < range.min || v > range.max) {
    const lo = range.min < 0 ? `−${-range.min}` : String(range.min);
    throw new RowProblem(false, `${name}: ${v} is outside ${lo}..${range.max}${unit ? ` ${unit}` : ''}`);
  }
  return v;
}

function outcome<T>(file: string, line: number, width: number, fields: string[], parse: () => T): RowOutcome<T> {
  if (fields.length !== width) {
    const what = fields.length < width ? 'missing value' : 'extra value';
    return { kind: 'error', line, error: `${file} line ${line}: ${what}: ${fields.length} field${fields.length === 1 ? '' : 's'}, the header has ${width}` };
  }
  try {
    return { kind: 'ok', line, value: parse() };
  } catch (e) {
    if (e instanceof RowProblem) {
      return e.skip ? { kind: 'skipped', line, reason: `${file} line ${line}: ${e.message}; row skipped` } : { kind: 'error', line, error: `${file} line ${line}: ${e.message}` };
    }
    return { kind: 'error', line, error: `${file} line ${line}: ${errorText(e)}` };
  }
}

/** One sites record (geodetic latitude, east longitude, height above the ellipsoid). */
export function parseSite(fields: string[], line: number, idx: HeaderIndex): RowOutcome<SiteInput> {
  return outcome('sites', line, idx.size, fields, () => {
    const name = cell(fields, idx, 'name') ?? '';
    const latDeg = inRange('lat_deg', num(fields, idx, 'lat_deg'), INPUT_RANGES.latDeg);
    const lonDeg = inRange('lon_deg', num(fields, idx, 'lon_deg'), INPUT_RANGES.lonDeg);
    let heightKm = 0;
    const h = cell(fields, idx, 'height_km');
    if (h !== undefined && h !== '') {
      heightKm = inRange('height_km', num(fields, idx, 'height_km'), INPUT_RANGES.siteHeightKm);
    }
    return { name, latDeg, lonDeg, heightKm };
  });
}

const FIELD_COLUMN: Record<string, string> = { time: 'time', pdynNpa: 'pdyn_npa', bzNt: 'bz_nt', byNt: 'by_nt', densityCm3: 'density_cm3', speedKms: 'speed_kms' };

/** An engine InputError re-worded for the column it came from. */
function columnError(e: unknown): RowProblem {
  if (e instanceof InputError) {
    return new RowProblem(false, `${FIELD_COLUMN[e.field] ?? e.field}: ${inputErrorReason(e)}`);
  }
  return new RowProblem(false, errorText(e));
}

/** Check a time: ISO 8601 and inside the IGRF-14 span (what prepareModel will need); throws the engine's InputError('time', …). */
export function checkTime(time: string): void {
  igrfCoefficients(decimalYear(parseUtc(time)), 1);
}

/** One conditions record. pdyn_npa wins when it holds a value; else density and speed (2.0e-6·n·v², references §3). */
export function parseCondition(fields: string[], line: number, idx: HeaderIndex): RowOutcome<SeriesCondition> {
  const o = parseConditionValue(fields, line, idx);
  // Keep the time text of a bad row, so the output still lines up with the series.
  const j = idx.get('time');
  if (o.kind !== 'ok' && j !== undefined && j < fields.length) o.time = csvText(fields[j].trim());
  return o;
}

function parseConditionValue(fields: string[], line: number, idx: HeaderIndex): RowOutcome<SeriesCondition> {
  return outcome('conditions', line, idx.size, fields, () => {
    const time = cell(fields, idx, 'time') ?? '';
    if (time === '') throw new RowProblem(true, 'time is empty');
    try { checkTime(time); } catch (e) { throw columnError(e); }
    let pdynNpa: number;
    let pdynSource: SeriesCondition['pdynSource'] = 'pdyn_npa';
    const hasPlasma = idx.has('density_cm3') && idx.has('speed_kms');
    const p = cell(fields, idx, 'pdyn_npa');
    const pdynUsable = p !== undefined && p !== '' && !isFillText(p);
    if (pdynUsable || !hasPlasma) {
      pdynNpa = num(fields, idx, 'pdyn_npa');
      if (!(pdynNpa > 0)) throw new RowProblem(false, `pdyn_npa: expected a pressure > 0 nPa, got ${pdynNpa}`);
    } else {
      const why = p === undefined ? '' : p === '' ? 'pdyn_npa is empty and ' : `pdyn_npa is a fill value (${p}) and `;
      let n: number, v: number;
      try {
        n = num(fields, idx, 'density_cm3');
        v = num(fields, idx, 'speed_kms');
      } catch (e) {
        if (e instanceof RowProblem) throw new RowProblem(e.skip, why + e.message);
        throw e;
      }
      if (!(n > 0)) throw new RowProblem(false, `density_cm3: expected a density > 0 cm⁻³, got ${n}`);
      if (!(v > 0)) throw new RowProblem(false, `speed_kms: expected a speed > 0 km/s, got ${v}`);
      try { pdynNpa = pdynFromPlasmaNominal(n, v); } catch (e) { throw columnError(e); }
      pdynSource = 'density_speed';
    }
    const pdynMax = INPUT_RANGES.pdynNpa.max;
    if (pdynNpa > pdynMax) throw new RowProblem(false, `pdyn_npa: ${pdynNpa} nPa is above the allowed ${pdynMax} nPa`);
    const bzNt = inRange('bz_nt', num(fields, idx, 'bz_nt'), INPUT_RANGES.imfNt, 'nT');
    const byNt = idx.has('by_nt') ? inRange('by_nt', num(fields, idx, 'by_nt'), INPUT_RANGES.imfNt, 'nT') : 0;
    return { time, pdynNpa, bzNt, byNt, pdynSource };
  });
}
