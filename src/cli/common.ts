/**
 * The flags every command shares, the conditions they make, and the
 * `conditions` block every result carries.
 */
import { readFileSync } from 'node:fs';
import type { FieldConditions } from '../physics/field/conditions';
import { DEFAULT_CONDITIONS, DEFAULT_IMF_EFFICIENCY, type PreparedModel } from '../physics/field/model';
import { DEG_PER_RAD } from '../physics/constants';
import { InputError } from '../physics/errors';
import { UsageError, inputErrorReason, type FlagSpec, type ParsedFlags } from './args';
import { DEFAULT_SOURCE_RE, type Hemisphere, type CgmResult } from '../physics/mapping';
import type { CsvCell } from '../io/csv';
import { NOMINAL_SPEED_KMS } from '../physics/field/storm-index';
import { INPUT_RANGES } from '../io/input-ranges';

export type OutputFormat = 'json' | 'csv' | 'geojson';

/** Default footpoint altitude, km (common practice for the auroral emission height, references §7). */
export const DEFAULT_ALT_KM = 110;

/** The allowed range of each input kind (shared with the app: src/io/input-ranges.ts). */
export { INPUT_RANGES };

/** --source-re, the same for every command that finds the equatorward edge. */
export const SOURCE_RE_FLAG: FlagSpec = { name: 'source-re', kind: 'number', meta: '<RE>', unit: 'RE', ...INPUT_RANGES.sourceRe, help: 'equatorial source distance of the equatorward edge', defaultText: `follows the storm (${DEFAULT_SOURCE_RE} in quiet times)` };

/** --hemisphere north|south|both. */
export const HEMISPHERE_FLAG = (help: string): FlagSpec => ({ name: 'hemisphere', kind: 'enum', meta: 'north|south|both', values: ['north', 'south', 'both'], help, defaultText: 'both' });

/** The hemispheres chosen by --hemisphere (both when not given). */
export function hemispheresOf(f: ParsedFlags): Hemisphere[] {
  const choice = f.hemisphere as string | undefined;
  return choice === 'north' ? ['north'] : choice === 'south' ? ['south'] : ['north', 'south'];
}

/** --source-re, or undefined when not given (the engine then uses the storm-following distance, model.sourceRe). */
export function sourceReOf(f: ParsedFlags): number | undefined {
  return f['source-re'] as number | undefined;
}

export function commonFlags(formats: readonly OutputFormat[]): FlagSpec[] {
  return [
    { name: 'time', kind: 'string', meta: '<ISO 8601 UTC>', help: 'instant, e.g. 2025-03-20T22:00:00Z', defaultText: 'now' },
    { name: 'pdyn', kind: 'number', meta: '<nPa>', unit: 'nPa', ...INPUT_RANGES.pdynNpa, help: 'solar-wind dynamic pressure (from 0.01: the tail term needs its inner edge within 1000 RE)', defaultText: String(DEFAULT_CONDITIONS.pdynNpa) },
    { name: 'bz', kind: 'number', meta: '<nT>', unit: 'nT', ...INPUT_RANGES.imfNt, help: 'IMF Bz (GSM)', defaultText: String(DEFAULT_CONDITIONS.bzNt) },
    { name: 'by', kind: 'number', meta: '<nT>', unit: 'nT', ...INPUT_RANGES.imfNt, help: 'IMF By (GSM)', defaultText: String(DEFAULT_CONDITIONS.byNt) },
    { name: 'dst', kind: 'number', meta: '<nT>', unit: 'nT', ...INPUT_RANGES.dstNt, help: 'storm index (Dst or SYM-H); sets the ring current', defaultText: 'estimated from --bz and --speed, and said so' },
    { name: 'speed', kind: 'number', meta: '<km/s>', unit: 'km/s', ...INPUT_RANGES.speedKms, help: 'solar-wind speed, for the storm-index estimate', defaultText: `${NOMINAL_SPEED_KMS} (nominal)` },
    { name: 'tilt-deg', kind: 'number', meta: '<deg>', unit: 'deg', min: -90, max: 90, help: 'dipole tilt, overrides the tilt from --time', defaultText: 'from --time' },
    { name: 'internal', kind: 'enum', meta: 'igrf|dipole', values: ['igrf', 'dipole'], help: 'main field: igrf = full IGRF-14 of the date (for site answers, footpoints, conjugates); dipole = its centred dipole alone (for analytic checks, teaching, dipole-based statistics)', defaultText: DEFAULT_CONDITIONS.internal },
    { name: 'magnetopause', kind: 'enum', meta: 'on|off', values: ['on', 'off'], help: 'off removes both the compression term and the boundary', defaultText: 'on' },
    { name: 'tail', kind: 'enum', meta: 'on|off', values: ['on', 'off'], help: 'tail current-sheet term (off for the dipole + magnetopause analytic limits)', defaultText: DEFAULT_CONDITIONS.tail ? 'on' : 'off' },
    { name: 'imf-efficiency', kind: 'number', meta: '<0..1>', min: 0, max: 1, help: 'share of the IMF that penetrates the magnetosphere', defaultText: String(DEFAULT_IMF_EFFICIENCY) },
    { name: 'alt-km', kind: 'number', meta: '<km>', unit: 'km', ...INPUT_RANGES.altKm, help: 'footpoint altitude above the WGS84 ellipsoid', defaultText: String(DEFAULT_ALT_KM) },
    { name: 'format', kind: 'enum', meta: formats.join('|'), values: formats, help: 'output format', defaultText: 'json' },
    { name: 'help', kind: 'switch', help: 'show this help' },
  ];
}

/** Conditions from the common flags; `now` gives the default time. */
export function conditionsFromFlags(f: ParsedFlags, now: Date): FieldConditions {
  return {
    time: (f.time as string | undefined) ?? now.toISOString(),
    pdynNpa: (f.pdyn as number | undefined) ?? DEFAULT_CONDITIONS.pdynNpa,
    bzNt: (f.bz as number | undefined) ?? DEFAULT_CONDITIONS.bzNt,
    byNt: (f.by as number | undefined) ?? DEFAULT_CONDITIONS.byNt,
    tiltDeg: (f['tilt-deg'] as number | undefined) ?? null,
    internal: ((f.internal as string | undefined) ?? DEFAULT_CONDITIONS.internal) as FieldConditions['internal'],
    magnetopause: f.magnetopause === undefined ? DEFAULT_CONDITIONS.magnetopause : f.magnetopause === 'on',
    imfEfficiency: (f['imf-efficiency'] as number | undefined) ?? DEFAULT_IMF_EFFICIENCY,
    tail: f.tail === undefined ? DEFAULT_CONDITIONS.tail : f.tail === 'on',
    dstNt: (f.dst as number | undefined) ?? null,
    speedKms: (f.speed as number | undefined) ?? null,
  };
}

let cachedVersion: string | null = null;

/** This program's version, from package.json. */
export function programVersion(): string {
  if (cachedVersion === null) {
    try {
      const pkg = JSON.parse(readFileSync(new URL('../../package.json', import.meta.url), 'utf8')) as { version?: string };
      cachedVersion = pkg.version ?? 'unknown';
    } catch {
      cachedVersion = 'unknown';
    }
  }
  return cachedVersion;
}

/**
 * The conditions block: the keys fixed by the CLI contract (references §13)
 * first, then extras (the tail switch, the tilt's origin, the Shue flaring exponent, the dipole of the date, the
 * coefficient epoch and the program version).
 */
export function conditionsBlock(model: PreparedModel, altKm: number, warnings: readonly string[], sourceRe?: number): Record<string, unknown> {
  const c = model.conditions;
  const mp = model.magnetopause;
  return {
    time: new Date(model.ms).toISOString(),
    pdynNpa: c.pdynNpa,
    bzNt: c.bzNt,
    byNt: c.byNt,
    tiltDeg: model.frames.tiltRad * DEG_PER_RAD,
    standoffRe: mp ? mp.r0Re : null,
    internal: c.internal,
    magnetopause: c.magnetopause,
    imfEfficiency: c.imfEfficiency,
    altKm,
    warnings: [...warnings],
    tail: c.tail ?? false,
    tiltSource: c.tiltDeg === null || c.tiltDeg === undefined ? 'time' : 'override',
    flaringAlpha: mp ? mp.alpha : null,
    b0Nt: model.dipole.b0Nt,
    poleLatDeg: model.dipole.poleLatDeg,
    poleLonDeg: model.dipole.poleLonDeg,
    igrfEpoch: model.decimalYear,
    coefficients: 'IGRF-14',
    dstNt: model.storm.dstNt,
    dstStarNt: model.storm.dstStarNt,
    dstSource: model.storm.dstSource,
    speedKms: model.storm.speedKms,
    speedSource: model.storm.speedSource,
    ringCurrentEnergyJ: model.ringEnergyJ,
    sourceRe: sourceRe ?? model.sourceRe,
    sourceReSource: sourceRe === undefined ? 'storm-following' : 'given',
    version: programVersion(),
  };
}

/** Engine input names → the flags that set them. */
const FLAG_OF_FIELD: Record<string, string> = {
  time: '--time',
  pdynNpa: '--pdyn',
  bzNt: '--bz',
  byNt: '--by',
  tiltDeg: '--tilt-deg',
  internal: '--internal',
  magnetopause: '--magnetopause',
  imfEfficiency: '--imf-efficiency',
  tail: '--tail',
  altKm: '--alt-km',
  lat: '--lat',
  lon: '--lon',
  heightKm: '--height-km',
  mltStep: '--mlt-step',
  mlt: '--mlt',
  vary: '--vary',
  from: '--from',
  to: '--to',
  steps: '--steps',
  sourceRe: '--source-re',
  dstNt: '--dst',
  speedKms: '--speed',
};

/** An engine InputError re-worded for the flag that set the value, or null when no flag did. */
export function usageFromInputError(e: unknown): UsageError | null {
  if (!(e instanceof InputError)) return null;
  const flag = FLAG_OF_FIELD[e.field];
  return flag ? new UsageError(flag, inputErrorReason(e)) : null;
}

/** Run an engine check of a flag's value; its InputError becomes a UsageError for `flag`. */
export function checkFlag(flag: string, check: () => void): void {
  try {
    check();
  } catch (e) {
    if (e instanceof InputError) throw new UsageError(flag, inputErrorReason(e));
    throw e;
  }
}

/**
 * The one conjugate-altitude rule of every front end (references §13): the
 * conjugate point lies at the footpoint altitude unless --conjugate-alt-km sets
 * it apart. `trace` and `batch` both call this.
 */
export function conjugateAltKmOf(f: ParsedFlags, altKm: number): number {
  return (f['conjugate-alt-km'] as number | undefined) ?? altKm;
}

/** --conjugate-alt-km, the same for every command that gives conjugate points. */
export const CONJUGATE_ALT_FLAG: FlagSpec = {
  name: 'conjugate-alt-km', kind: 'number', meta: '<km>', unit: 'km', ...INPUT_RANGES.altKm,
  help: 'altitude of the conjugate point above the ellipsoid', defaultText: 'the footpoint altitude, --alt-km',
};

/** `# key: value` metadata lines (CRLF) before a CSV table, as batch writes them. */
export function csvMetadata(entries: Record<string, unknown>): string {
  return Object.entries(entries)
    .map(([k, v]) => `# ${k}: ${typeof v === 'string' ? v : JSON.stringify(v)}`.replace(/[\r\n]+/g, ' '))
    .join('\r\n') + '\r\n';
}

/** Time and condition columns every table row carries (the same for trace, oval, sweep and timeline). */
export const CONDITION_COLUMNS = ['time_utc', 'pdyn_npa', 'bz_nt', 'by_nt', 'dst_nt', 'dst_source', 'internal'] as const;

/** The condition cells of one model, in CONDITION_COLUMNS order. */
export function conditionCells(model: PreparedModel): CsvCell[] {
  const c = model.conditions;
  return [new Date(model.ms).toISOString(), c.pdynNpa, c.bzNt, c.byNt, model.storm.dstNt, model.storm.dstSource, c.internal];
}

/** CGM columns of a point at its height (prefix "") or at the ground below it (prefix "ground_"). */
export const cgmColumns = (prefix: string): string[] => [`${prefix}cgm_lat_deg`, `${prefix}cgm_lon_deg`, `${prefix}cgm_mlt_h`];

/** CGM cells (lat, lon, MLT (CGM)); empty where CGM is undefined (the reason goes in a note column). */
export function cgmCells(r: CgmResult | null): CsvCell[] {
  return r && r.defined ? [r.latDeg, r.lonDeg, r.mltH] : [null, null, null];
}

/** The reason(s) CGM is undefined, for a note column ('' when defined). */
export function cgmNote(...rs: (CgmResult | null)[]): string {
  const reasons = rs.filter((r): r is Extract<CgmResult, { defined: false }> => r !== null && !r.defined).map((r) => r.reason);
  return [...new Set(reasons)].join('; ');
}

/** A CGM result for JSON: {latDeg, lonDeg, mltCgmHours, apexRe} or {defined: false, reason}. */
export function cgmJson(r: CgmResult): Record<string, unknown> {
  return r.defined ? { defined: true, latDeg: r.latDeg, lonDeg: r.lonDeg, mltCgmHours: r.mltH, apexRe: r.apexRe } : { defined: false, reason: r.reason };
}
