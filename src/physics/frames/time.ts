/**
 * Time scales and the Sun for the frame rotations. Times are Unix milliseconds
 * (UTC, leap seconds ignored, UT1 taken as UTC: the difference is < 0.9 s,
 * i.e. < 0.004° of Earth rotation). Low-precision formulas of Hapgood (1992),
 * Planet. Space Sci. 40, 711 (with the 1997 correction, 45, 1047); they are
 * good to about 0.01° over 1950–2050.
 */
import { InputError } from '../errors';
import { RAD_PER_DEG, MS_PER_DAY } from '../constants';

/** Julian date of the Unix epoch 1970-01-01T00:00Z (standard). */
const JD_UNIX_EPOCH = 2440587.5;
/** Modified Julian date of J2000.0 (2000-01-01T12:00 TT ≈ UT here), Hapgood (1992) §2. */
const MJD_J2000 = 51544.5;

// Days since 1970-01-01 of a proleptic Gregorian date (H. Hinnant's civil-days algorithm).
function daysFromCivil(y: number, m: number, d: number): number {
  const yy = m <= 2 ? y - 1 : y;
  const era = Math.floor(yy / 400);
  const yoe = yy - era * 400;
  const doy = Math.floor((153 * (m + (m > 2 ? -3 : 9)) + 2) / 5) + d - 1;
  const doe = yoe * 365 + Math.floor(yoe / 4) - Math.floor(yoe / 100) + doy;
  return era * 146097 + doe - 719468;
}

function isLeapYear(y: number): boolean {
  return (y % 4 === 0 && y % 100 !== 0) || y % 400 === 0;
}

const DAYS_IN_MONTH = [31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31];

// YYYY-MM-DD, optionally THH:MM[:SS[.fff]] and Z or ±HH:MM.
const ISO_RE = /^(\d{4})-(\d{2})-(\d{2})(?:T(\d{2}):(\d{2})(?::(\d{2})(?:\.(\d{1,9}))?)?(Z|[+-]\d{2}:\d{2})?)?$/;

function bad(iso: string): InputError {
  return new InputError('time', `expected an ISO 8601 UTC time such as 2025-03-20T22:00:00Z, got "${iso}"`);
}

/**
 * Unix ms of an ISO 8601 time. Accepted: `YYYY-MM-DD` (00:00 UTC) and
 * `YYYY-MM-DDTHH:MM[:SS[.fff]]` followed by `Z`, `±HH:MM`, or nothing — a time
 * without a zone is read as UTC (not local time). Impossible calendar dates
 * (month 13, 30 February, hour 24, second 60) are refused with an InputError.
 */
export function parseUtc(iso: string): number {
  if (typeof iso !== 'string') throw bad(String(iso));
  const m = ISO_RE.exec(iso.trim());
  if (!m) throw bad(iso);
  const y = Number(m[1]);
  const mo = Number(m[2]);
  const d = Number(m[3]);
  const h = m[4] === undefined ? 0 : Number(m[4]);
  const mi = m[5] === undefined ? 0 : Number(m[5]);
  const s = m[6] === undefined ? 0 : Number(m[6]);
  const frac = m[7] === undefined ? 0 : Number(`0.${m[7]}`);
  if (mo < 1 || mo > 12) throw bad(iso);
  const dim = mo === 2 && isLeapYear(y) ? 29 : DAYS_IN_MONTH[mo - 1];
  if (d < 1 || d > dim || h > 23 || mi > 59 || s > 59) throw bad(iso);
  let offsetMin = 0;
  const zone = m[8];
  if (zone !== undefined && zone !== 'Z') {
    const oh = Number(zone.slice(1, 3));
    const om = Number(zone.slice(4, 6));
    if (oh > 23 || om > 59) throw bad(iso);
    offsetMin = (zone[0] === '-' ? -1 : 1) * (oh * 60 + om);
  }
  const days = daysFromCivil(y, mo, d);
  return days * MS_PER_DAY + ((h * 60 + mi - offsetMin) * 60 + s + frac) * 1000;
}

/** Julian date (UT) of a Unix-ms time. */
export function julianDate(ms: number): number {
  return ms / MS_PER_DAY + JD_UNIX_EPOCH;
}

// Calendar year containing a Unix-ms time (proleptic Gregorian).
function yearOf(ms: number): number {
  // Start from the mean-year estimate, then correct by at most one.
  let y = 1970 + Math.floor(ms / (365.2425 * MS_PER_DAY));
  while (daysFromCivil(y, 1, 1) * MS_PER_DAY > ms) y--;
  while (daysFromCivil(y + 1, 1, 1) * MS_PER_DAY <= ms) y++;
  return y;
}

/** Year plus the elapsed fraction of that calendar year (365 or 366 days), e.g. 2024-07-02T00:00Z → 2024.5. */
export function decimalYear(ms: number): number {
  const y = yearOf(ms);
  const start = daysFromCivil(y, 1, 1) * MS_PER_DAY;
  const end = daysFromCivil(y + 1, 1, 1) * MS_PER_DAY;
  return y + (ms - start) / (end - start);
}

// Hapgood's time arguments: T0 = Julian centuries from J2000 to 0h UT of the day, H = hours UT.
function hapgoodT0H(ms: number): { t0: number; h: number } {
  const day = Math.floor(ms / MS_PER_DAY);
  const mjd0 = day + 40587; // MJD of 1970-01-01 is 40587 (standard)
  return { t0: (mjd0 - MJD_J2000) / 36525, h: (ms - day * MS_PER_DAY) / 3_600_000 };
}

function wrap2Pi(a: number): number {
  const t = a % (2 * Math.PI);
  return t < 0 ? t + 2 * Math.PI : t;
}

/** Greenwich mean sidereal time (rad, 0..2π): θ = 100.461 + 36000.770 T0 + 15.04107 H deg, Hapgood (1992) §2. */
export function gmstRad(ms: number): number {
  const { t0, h } = hapgoodT0H(ms);
  return wrap2Pi((100.461 + 36000.77 * t0 + 15.04107 * h) * RAD_PER_DEG);
}

/** Mean obliquity of the ecliptic (rad): ε = 23.439 − 0.013 T0 deg, Hapgood (1992) §2. */
export function obliquityRad(ms: number): number {
  const { t0 } = hapgoodT0H(ms);
  return (23.439 - 0.013 * t0) * RAD_PER_DEG;
}

/**
 * The Sun's ecliptic longitude (rad, 0..2π), Hapgood (1992) §2:
 * M = 357.528 + 35999.050 T0 + 0.04107 H, Λ = 280.460 + 36000.772 T0 + 0.04107 H,
 * λ = Λ + (1.915 − 0.0048 T0) sin M + 0.020 sin 2M (deg).
 */
export function sunEclipticLongitudeRad(ms: number): number {
  const { t0, h } = hapgoodT0H(ms);
  const mRad = (357.528 + 35999.05 * t0 + 0.04107 * h) * RAD_PER_DEG;
  const lam = 280.46 + 36000.772 * t0 + 0.04107 * h;
  return wrap2Pi((lam + (1.915 - 0.0048 * t0) * Math.sin(mRad) + 0.02 * Math.sin(2 * mRad)) * RAD_PER_DEG);
}

/** Unit vector to the Sun in GEI (mean equator and equinox of date), Hapgood (1992) §2: S = (cos λ, sin λ cos ε, sin λ sin ε). */
export function sunDirectionGei(out: Float64Array, ms: number): Float64Array {
  const lam = sunEclipticLongitudeRad(ms);
  const eps = obliquityRad(ms);
  const sl = Math.sin(lam);
  out[0] = Math.cos(lam);
  out[1] = sl * Math.cos(eps);
  out[2] = sl * Math.sin(eps);
  return out;
}
