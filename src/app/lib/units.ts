/** Small display conversions for the controls (no field physics). */
import { DEG_PER_RAD } from '../../physics/constants';

/** Log-slider position (0..1000) ↔ value in [lo, hi]. */
export function logToSlider(v: number, lo: number, hi: number): number {
  const c = Math.min(hi, Math.max(lo, v));
  return Math.round((1000 * Math.log(c / lo)) / Math.log(hi / lo));
}
export function sliderToLog(pos: number, lo: number, hi: number): number {
  const v = lo * Math.pow(hi / lo, pos / 1000);
  return Number(v.toPrecision(3));
}

/** ISO instant without milliseconds, Z suffix. */
export function isoUtc(ms: number): string {
  return new Date(ms).toISOString().replace(/\.\d{3}Z$/, 'Z');
}

/** Add hours to an ISO instant. */
export function addHours(iso: string, h: number): string {
  return isoUtc(Date.parse(iso) + h * 3_600_000);
}

/** Subsolar (or any direction's) geocentric lat/lon from a unit GEO vector. */
export function directionLatLon(v: ArrayLike<number>): [number, number] {
  return [Math.atan2(v[2], Math.hypot(v[0], v[1])) * DEG_PER_RAD, Math.atan2(v[1], v[0]) * DEG_PER_RAD];
}

/** Format a number for tables: fixed decimals, an en dash for missing. */
export function fmt(v: number | null | undefined, d = 2): string {
  return v == null || !Number.isFinite(v) ? '–' : v.toFixed(d);
}

/** MLT hours as hh:mm. */
export function fmtMlt(h: number | null | undefined): string {
  if (h == null || !Number.isFinite(h)) return '–';
  const m = Math.round((((h % 24) + 24) % 24) * 60) % 1440;
  return `${String(Math.floor(m / 60)).padStart(2, '0')}:${String(m % 60).padStart(2, '0')}`;
}
