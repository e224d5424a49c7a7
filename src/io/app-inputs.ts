/**
 * The app's one validation path: typed values, imported site files and URL
 * parameters all pass through these functions, with the command line's
 * ranges (the same numbers as INPUT_RANGES in src/cli/common.ts; a test holds
 * them equal) and its wording ("expected …, got …", references §13).
 *
 * Numbers are plain decimals: hexadecimal (0x3C), exponents (6e1), Infinity,
 * NaN and empty text are refused, so a value means what it looks like.
 *
 * Pure: no Node or DOM APIs.
 */
import { expectedGot } from '../physics/errors';
import { parseUtc } from '../physics/frames/time';
import { pdynFromPlasmaNominal } from '../physics/field/magnetopause';
import { INPUT_RANGES } from './input-ranges';

/** An inclusive range (or, with `above`, an exclusive lower bound) and its unit. */
export interface ValueRange {
  min?: number;
  above?: number;
  max: number;
  unit: string;
}

/** The app's limits on what one page holds (share links, site lists, names). */
export const APP_LIMITS = {
  /** Sites the app holds; more belong in the command line's batch. */
  maxSites: 200,
  /** Characters of a site name. */
  maxNameChars: 80,
  /**
   * Characters of a share link. Browsers and servers refuse longer request
   * lines (HTTP 414/431 at 8–16 kB by common defaults); 6000 leaves room.
   */
  maxLinkChars: 6000,
} as const;

/** Allowed values of every number the app reads (the CLI's ranges where the CLI has the input). */
export const APP_RANGES = {
  latDeg: { ...INPUT_RANGES.latDeg, unit: 'deg' },
  lonDeg: { ...INPUT_RANGES.lonDeg, unit: 'deg' },
  pdynNpa: { ...INPUT_RANGES.pdynNpa, unit: 'nPa' },
  imfNt: { ...INPUT_RANGES.imfNt, unit: 'nT' },
  altKm: { ...INPUT_RANGES.altKm, unit: 'km' },
  sourceRe: { ...INPUT_RANGES.sourceRe, unit: 'RE' },
  dstNt: { ...INPUT_RANGES.dstNt, unit: 'nT' },
  speedKms: { ...INPUT_RANGES.speedKms, unit: 'km/s' },
  imfEfficiency: { min: 0, max: 1, unit: '' },
  tiltDeg: { min: -90, max: 90, unit: 'deg' },
  minElevationDeg: { min: -90, max: 90, unit: 'deg' },
  /** Lowest magnetic latitude the boundary searches start from. */
  minLatDeg: { min: 10, max: 60, unit: 'deg' },
  protonDensityCm3: { above: 0, max: 500, unit: 'cm⁻³' },
} as const satisfies Record<string, ValueRange>;

export type RangeName = keyof typeof APP_RANGES;

const DECIMAL_RE = /^[+-]?(?:\d+(?:\.\d*)?|\.\d+)$/;

/** A plain decimal number, or null (hex, exponents, Infinity, NaN, empty or other text). */
export function parseDecimal(text: string): number | null {
  const t = text.trim();
  return DECIMAL_RE.test(t) ? Number(t) : null;
}

/** "a number in −90..90 deg", "a number > 0 and ≤ 10000 nPa" (the CLI's phrasing). */
export function rangeText(r: ValueRange): string {
  const u = r.unit ? ` ${r.unit}` : '';
  if (r.above !== undefined) return `a decimal number > ${r.above} and ≤ ${r.max}${u}`;
  return `a decimal number in ${r.min}..${r.max}${u}`;
}

/** Whether a finite number lies in the range. */
export function inRange(v: number, r: ValueRange): boolean {
  if (!Number.isFinite(v) || v > r.max) return false;
  return r.above !== undefined ? v > r.above : v >= (r.min ?? -Infinity);
}

export type Checked<T> = { ok: true; value: T } | { ok: false; message: string };

/** A typed or read text as a number of the range; the refusal names `what`, what is allowed and the text. */
export function readNumber(what: string, text: string, r: ValueRange): Checked<number> {
  const v = parseDecimal(text);
  if (v === null || !inRange(v, r)) return { ok: false, message: `${what}: ${expectedGot(rangeText(r), text.length > 40 ? `${text.slice(0, 40)}…` : text, true)}` };
  return { ok: true, value: v };
}

/**
 * A time as the CLI reads it (src/physics/frames/time.ts parseUtc): ISO 8601,
 * impossible dates refused (no rolling 30 February over into March), a time
 * without a zone read as UTC (`noZone` says so). The value is normalised to
 * `YYYY-MM-DDTHH:MM:SSZ` (milliseconds kept when present).
 */
export function readTime(what: string, text: string): Checked<{ iso: string; noZone: boolean }> {
  const t = text.trim();
  let ms: number;
  try {
    ms = parseUtc(t);
  } catch {
    return { ok: false, message: `${what}: ${expectedGot('an ISO 8601 time such as 2025-03-20T22:00:00Z', t.length > 40 ? `${t.slice(0, 40)}…` : t, true)}` };
  }
  const d = new Date(ms);
  if (!Number.isFinite(ms) || Number.isNaN(d.getTime())) return { ok: false, message: `${what}: ${expectedGot('a time between the years 0 and 9999', t, true)}` };
  const noZone = !/(?:Z|[+-]\d{2}:\d{2})$/.test(t);
  return { ok: true, value: { iso: d.toISOString().replace('.000Z', 'Z'), noZone } };
}

const UTC_FIELD_RE = /^(\d{4}-\d{2}-\d{2})[ T](\d{2}:\d{2}(?::\d{2})?)(?:\s*(?:UTC|Z))?$/i;

/**
 * The app's time field: a 24-hour UTC time "YYYY-MM-DD HH:MM" (seconds
 * optional, "T" for the space and a trailing "UTC" or "Z" accepted); another
 * zone or a 12-hour clock (am/pm) is refused, and the calendar checks are
 * readTime's. The value is normalised to `YYYY-MM-DDTHH:MM:SSZ`.
 */
export function readUtcField(what: string, text: string): Checked<string> {
  const t = text.trim();
  const m = UTC_FIELD_RE.exec(t);
  const shown = t.length > 40 ? `${t.slice(0, 40)}…` : t;
  if (!m) return { ok: false, message: `${what}: ${expectedGot('a 24-hour UTC time as YYYY-MM-DD HH:MM, such as 2025-03-20 22:00 UTC', shown, true)}` };
  const [hh, mm, ss = 0] = m[2].split(':').map(Number);
  if (hh > 23 || mm > 59 || ss > 59) return { ok: false, message: `${what}: ${expectedGot('hours 00–23 and minutes 00–59 (24-hour clock)', shown, true)}` };
  const r = readTime(what, `${m[1]}T${m[2]}Z`);
  if (!r.ok) return { ok: false, message: `${what}: ${expectedGot('a date that exists, as YYYY-MM-DD HH:MM UTC', shown, true)}` };
  return { ok: true, value: r.value.iso };
}

/** An ISO instant as the time field shows it: "YYYY-MM-DD HH:MM UTC" (24-hour clock). */
export function utcFieldText(iso: string): string {
  const d = new Date(Date.parse(iso));
  return `${d.toISOString().slice(0, 10)} ${d.toISOString().slice(11, 16)} UTC`;
}

/** A site name: trimmed, at most APP_LIMITS.maxNameChars characters (longer is refused, not cut). */
export function readSiteName(what: string, text: string): Checked<string> {
  const t = text.trim();
  if ([...t].length > APP_LIMITS.maxNameChars) return { ok: false, message: `${what}: a site name holds at most ${APP_LIMITS.maxNameChars} characters, got ${[...t].length}` };
  return { ok: true, value: t };
}

/** Longitude −360..360 east-positive, as −180..180 (one shift by 360 at most, so 110.9372 stays exactly 110.9372). */
export function wrapLonDeg(lonDeg: number): number {
  if (lonDeg >= -180 && lonDeg <= 180) return lonDeg;
  return lonDeg > 180 ? lonDeg - 360 : lonDeg + 360;
}

/** The limit message when `total` items arrive but only `room` fit. */
export function siteLimitText(total: number, room: number): string {
  const kept = Math.min(total, room);
  return `${total} sites: the first ${kept} imported, ${total - kept} not imported: the app holds at most ${APP_LIMITS.maxSites} sites — use the command line's batch for more`;
}

/**
 * The dynamic pressure for a density and speed (2.0e-6·n·v², references §3),
 * to 3 significant digits, checked against the pressure range: never clamped
 * to another value in silence.
 */
export function pressureFromPlasma(densityCm3: number, speedKms: number): Checked<number> {
  if (!inRange(densityCm3, APP_RANGES.protonDensityCm3)) return { ok: false, message: `proton density: ${expectedGot(rangeText(APP_RANGES.protonDensityCm3), densityCm3)}` };
  if (!inRange(speedKms, APP_RANGES.speedKms)) return { ok: false, message: `solar-wind speed: ${expectedGot(rangeText(APP_RANGES.speedKms), speedKms)}` };
  const p = Number(pdynFromPlasmaNominal(densityCm3, speedKms).toPrecision(3));
  if (!inRange(p, APP_RANGES.pdynNpa)) return { ok: false, message: `${p} nPa from this density and speed is outside the allowed dynamic pressure, ${rangeText(APP_RANGES.pdynNpa)}` };
  return { ok: true, value: p };
}
