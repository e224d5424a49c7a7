/**
 * Plain-word answers for one site (the answer card and the table's "Where the
 * oval is" column): line type, the site against the oval in its own
 * hemisphere's terms, where to look, the conjugate point. Display only: every
 * number comes from the engine's SiteResult.
 */
import type { CgmResult, SiteResult } from '../../../workers/protocol';
import { MLT_LABEL_CGM } from '../../physics/mapping/cgm-model';
import { RAD_PER_DEG, RE_KM } from '../../physics/constants';
import { centralAngleDeg } from '../lib/visibility';

const POINTS = ['N', 'NNE', 'NE', 'ENE', 'E', 'ESE', 'SE', 'SSE', 'S', 'SSW', 'SW', 'WSW', 'W', 'WNW', 'NW', 'NNW'] as const;

/** 16-point compass name of an azimuth (deg from north, eastward); sectors 22.5° wide centred on each point. */
export function compassPoint(azimuthDeg: number): string {
  const a = ((azimuthDeg % 360) + 360) % 360;
  return POINTS[Math.round(a / 22.5) % 16];
}

/** "NNE (22° from north, eastward)". */
export function compassPhrase(azimuthDeg: number): string {
  const a = ((azimuthDeg % 360) + 360) % 360;
  return `${compassPoint(a)} (${Math.round(a) % 360}° from north, eastward)`;
}

/** Why a boundary is missing: the engine's reason when it gives one, else "not found". */
export function missingReason(boundaries: SiteResult['boundaries'], which: 'openClosed' | 'equatorward'): string {
  const b = boundaries as (SiteResult['boundaries'] & { openClosedReason?: string | null; equatorwardReason?: string | null }) | null;
  const r = which === 'openClosed' ? b?.openClosedReason : b?.equatorwardReason;
  return typeof r === 'string' && r.trim() !== '' ? r : 'not found';
}

export interface OvalPlace {
  /** Short label for a table cell. */
  short: string;
  /** One plain sentence. */
  sentence: string;
}

/**
 * The site against the oval at its MLT, in its own hemisphere's terms: in the
 * north, poleward is north; in the south, poleward is south. Inside only when
 * both edges exist and the site lies between them (never inside on one edge).
 */
export function ovalPlace(r: SiteResult): OvalPlace {
  const lat = Math.abs(r.magLatDeg);
  const b = r.boundaries;
  if (!b || !Number.isFinite(lat)) return { short: 'unknown', sentence: 'Where the oval is could not be worked out for this site.' };
  const north = r.magLatDeg >= 0;
  const pole = north ? 'north' : 'south';
  const equator = north ? 'south' : 'north';
  const oc = b.openClosedMagLatDeg == null ? null : Math.abs(b.openClosedMagLatDeg);
  const eq = b.equatorwardMagLatDeg == null ? null : Math.abs(b.equatorwardMagLatDeg);
  const d = (x: number) => `${Math.abs(x).toFixed(1)}°`;
  if (eq != null && lat < eq) {
    return { short: `${equator} of the oval`, sentence: `You are ${equator} of the oval: its equatorward edge is ${d(eq - lat)} of magnetic latitude ${pole} of you.` };
  }
  if (oc != null && lat >= oc) {
    return { short: `${pole} of the oval`, sentence: `You are ${pole} of the oval, in the polar cap: the open–closed boundary is ${d(lat - oc)} of magnetic latitude ${equator} of you.` };
  }
  if (oc != null && eq != null) {
    return { short: 'inside the oval', sentence: `You are inside the oval: ${d(oc - lat)} from its poleward edge (${pole}) and ${d(lat - eq)} from its equatorward edge (${equator}).` };
  }
  if (oc != null) {
    return {
      short: `${equator} of the open–closed boundary`,
      sentence: `The open–closed boundary is ${d(oc - lat)} of magnetic latitude ${pole} of you; the oval's equatorward edge: ${missingReason(b, 'equatorward')}, so whether you are inside the oval cannot be said.`,
    };
  }
  if (eq != null) {
    return { short: `${pole} of the equatorward edge`, sentence: `The oval's equatorward edge is ${d(lat - eq)} of magnetic latitude ${equator} of you; the open–closed boundary: ${missingReason(b, 'openClosed')}.` };
  }
  return { short: 'no boundary', sentence: `No oval boundary at your magnetic local time (open–closed boundary: ${missingReason(b, 'openClosed')}; equatorward edge: ${missingReason(b, 'equatorward')}).` };
}

/** The line type in words. */
export function lineSentence(r: SiteResult): string {
  if (r.error) return `The field line through this site could not be traced: ${r.error}`;
  switch (r.type) {
    case 'closed': return 'Your field line is closed: it returns to Earth in the other hemisphere.';
    case 'open': return 'Your field line is open: it leaves into the solar wind, so there is no conjugate point.';
    default: return 'Your field line could not be classified (it neither closed nor left within the trace limits).';
  }
}

/** Where to look (nearest oval point at the emission height), or why there is nothing to say. */
export function lookSentence(r: SiteResult, minElevationDeg: number): string {
  const s = r.sky;
  if (!s) return 'No oval point to look at from here.';
  const where = `look ${compassPhrase(s.azimuthDeg)}, ${s.elevationDeg.toFixed(0)}° above the horizon; slant distance ${Math.round(s.distanceKm)} km`;
  return s.visible ? `Nearest oval point: ${where}.` : `Nearest oval point: ${where} — below your ${minElevationDeg}° minimum elevation, so probably not seen.`;
}

/** Ground distance (km) between two points on a sphere of radius RE. */
export function groundDistanceKm(lat1Deg: number, lon1Deg: number, lat2Deg: number, lon2Deg: number): number {
  return centralAngleDeg(lat1Deg, lon1Deg, lat2Deg, lon2Deg) * RAD_PER_DEG * RE_KM;
}

/** "59.09° S, 58.09° E". */
export function latLonText(latDeg: number, lonDeg: number): string {
  const lo = ((lonDeg + 540) % 360) - 180;
  return `${Math.abs(latDeg).toFixed(2)}° ${latDeg >= 0 ? 'N' : 'S'}, ${Math.abs(lo).toFixed(2)}° ${lo >= 0 ? 'E' : 'W'}`;
}

/** An ISO instant as "2025-03-20 22:00 UTC" (24-hour clock). */
export function utcText(iso: string): string {
  const ms = Date.parse(iso);
  return Number.isFinite(ms) ? `${new Date(ms).toISOString().slice(0, 16).replace('T', ' ')} UTC` : 'time not set';
}

/** A table cell for a CGM latitude: two decimals, "undefined" near the dipole equator, an en dash when not computed. */
export function cgmLatText(c: CgmResult | undefined): string {
  if (!c) return '–';
  return c.defined ? c.latDeg.toFixed(2) : 'undefined';
}

/** "Corrected geomagnetic latitude 64.3°, MLT (CGM) 23:10." or why it is undefined. */
export function cgmSentence(c: CgmResult | undefined): string {
  if (!c) return '';
  if (!c.defined) return `Corrected geomagnetic latitude: ${c.reason}.`;
  const h = ((c.mltH % 24) + 24) % 24;
  const m = Math.round(h * 60) % 1440;
  const hhmm = `${String(Math.floor(m / 60)).padStart(2, '0')}:${String(m % 60).padStart(2, '0')}`;
  return `Corrected geomagnetic latitude ${c.latDeg.toFixed(1)}°, ${MLT_LABEL_CGM} ${hhmm}.`;
}
