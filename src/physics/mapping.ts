/**
 * Mapping products over a prepared model: a line's description, conjugate
 * points of sites, the open–closed boundary and the equatorward precipitation
 * edge per MLT and hemisphere, and sweeps over Pdyn or Bz.
 */
import { RE_KM } from './constants';
import { InputError, requireInRange } from './errors';
import { geoFromGeodetic } from './geodesy';
import { applyMat3, applyMat3T } from './frames';
import type { PreparedModel } from './model';
import { Tracer, LINE_CLOSED, LINE_TYPE_NAMES, type TraceOptions, type LineType } from './trace';
import { describePoint, equatorCrossing, gsmAtMagneticLatMlt, type Footpoint, type EquatorCrossing, type Hemisphere } from './footpoint';

export type { Footpoint, EquatorCrossing, Hemisphere };

/**
 * Default equatorial source distance of the equatorward precipitation edge, RE:
 * near the inner edge of the plasma sheet, where the diffuse aurora's electrons
 * come from (common practice; ~6–8 RE in quiet to moderate conditions, from memory).
 * 7 RE (issue 6 calibration, scripts/realism.ts): with the tail sheet on, the edge then
 * moves equatorward with southward Bz in every sector (at 8 RE the compression of the
 * dayside by the Bz-dependent Shue standoff outweighs the stretching at noon).
 */
export const DEFAULT_SOURCE_RE = 7;

export interface LineResult {
  type: LineType;
  lengthRe: number;
  equator: EquatorCrossing | null;
  /** Footpoints reached (0, 1 or 2), south-going (−B) end first. */
  footpoints: Footpoint[];
  /** Points GSM RE xyz (a copy), when asked for. */
  points?: Float64Array;
  evals: number;
}

/** A tracer bound to a model; reuse across calls for speed. */
export function makeTracer(model: PreparedModel, options: Partial<TraceOptions> = {}): Tracer {
  return new Tracer(model, options);
}

/** Describe the line last traced by `t`. */
export function describeLine(model: PreparedModel, t: Tracer, type: number, withPoints = false): LineResult {
  const f = model.frames;
  const p = t.points;
  const feet: Footpoint[] = [];
  for (const i of [t.footMinus, t.footPlus]) {
    if (i >= 0) feet.push(describePoint(f, p[3 * i], p[3 * i + 1], p[3 * i + 2]));
  }
  const closed = type === LINE_CLOSED;
  return {
    type: LINE_TYPE_NAMES[type],
    lengthRe: t.lengthRe,
    equator: closed ? equatorCrossing(p, t.bMag, t.nPoints) : null,
    footpoints: feet,
    points: withPoints ? p.slice(0, 3 * t.nPoints) : undefined,
    evals: t.evals,
  };
}

const tmp = new Float64Array(3);

/** Trace the line through a GSM point. */
export function traceGsm(model: PreparedModel, t: Tracer, x: number, y: number, z: number, withPoints = false): LineResult {
  const type = t.trace(x, y, z);
  return describeLine(model, t, type, withPoints);
}

/** GSM position of a site given in geodetic (coords 'geo') or magnetic (coords 'mag', spherical) lat/lon and height. */
export function siteGsm(out: Float64Array, model: PreparedModel, latDeg: number, lonDeg: number, heightKm = 0, coords: 'geo' | 'mag' = 'geo'): Float64Array {
  requireInRange('lat', latDeg, -90, 90, 'deg');
  requireInRange('lon', lonDeg, -360, 360, 'deg');
  requireInRange('heightKm', heightKm, -1, 100_000, 'km');
  const f = model.frames;
  if (coords === 'geo') {
    geoFromGeodetic(tmp, latDeg, lonDeg, heightKm);
  } else {
    const r = 1 + heightKm / RE_KM;
    const la = (latDeg * Math.PI) / 180, lo = (lonDeg * Math.PI) / 180;
    applyMat3T(tmp, f.magFromGeo, r * Math.cos(la) * Math.cos(lo), r * Math.cos(la) * Math.sin(lo), r * Math.sin(la));
  }
  return applyMat3(out, f.gsmFromGeo, tmp[0], tmp[1], tmp[2]);
}

export interface SiteLine extends LineResult {
  /** The footpoint in the other hemisphere than the site (the conjugate), or null. */
  conjugate: Footpoint | null;
  /** The footpoint on the site's own side, or null. */
  near: Footpoint | null;
  siteGsm: [number, number, number];
}

/**
 * Trace the line through a site; footpoints at the tracer's altitude. The
 * conjugate is the footpoint at the far end from the site.
 */
export function traceSite(model: PreparedModel, t: Tracer, latDeg: number, lonDeg: number, heightKm = 0, coords: 'geo' | 'mag' = 'geo', withPoints = false): SiteLine {
  const s = siteGsm(new Float64Array(3), model, latDeg, lonDeg, heightKm, coords);
  const line = traceGsm(model, t, s[0], s[1], s[2], withPoints);
  applyMat3(tmp, model.frames.smFromGsm, s[0], s[1], s[2]);
  const siteNorth = tmp[2] >= 0;
  let near: Footpoint | null = null;
  let conjugate: Footpoint | null = null;
  for (const fp of line.footpoints) {
    if ((fp.hemisphere === 'north') === siteNorth) near = fp;
    else conjugate = fp;
  }
  return { ...line, near, conjugate, siteGsm: [s[0], s[1], s[2]] };
}

/** Closed / not-closed test of the line from (magLat, MLT) at the footpoint altitude. */
function closedAt(model: PreparedModel, t: Tracer, magLatDeg: number, mltH: number): { closed: boolean; eqR: number } {
  const o = t.options;
  gsmAtMagneticLatMlt(tmp, model.frames, magLatDeg, mltH, o.altKm, o.ellipsoid);
  const type = t.trace(tmp[0], tmp[1], tmp[2]);
  if (type !== LINE_CLOSED) return { closed: false, eqR: NaN };
  const eq = equatorCrossing(t.points, t.bMag, t.nPoints);
  return { closed: true, eqR: eq ? eq.rRe : NaN };
}

export interface BoundaryPoint {
  magLatDeg: number;
  geoLatDeg: number;
  geoLonDeg: number;
}

export interface SectorBoundaries {
  mltHours: number;
  openClosed: BoundaryPoint | null;
  equatorward: BoundaryPoint | null;
}

export interface BoundaryOptions {
  /** Latitude tolerance of the root searches, deg (default 0.01). */
  latTolDeg: number;
  /** Equatorial source distance of the equatorward edge, RE. */
  sourceRe: number;
  /** Lowest |magnetic latitude| searched, deg. */
  minLatDeg: number;
  /** Coarse scan step, deg. */
  scanStepDeg: number;
}

export const DEFAULT_BOUNDARY_OPTIONS: Readonly<BoundaryOptions> = Object.freeze({
  latTolDeg: 0.01,
  sourceRe: DEFAULT_SOURCE_RE,
  minLatDeg: 50,
  scanStepDeg: 2,
});

function boundaryPoint(model: PreparedModel, t: Tracer, signedLat: number, mltH: number): BoundaryPoint {
  const o = t.options;
  gsmAtMagneticLatMlt(tmp, model.frames, signedLat, mltH, o.altKm, o.ellipsoid);
  const d = describePoint(model.frames, tmp[0], tmp[1], tmp[2]);
  return { magLatDeg: signedLat, geoLatDeg: d.geoLatDeg, geoLonDeg: d.geoLonDeg };
}

/**
 * Boundaries at one MLT in one hemisphere. The open–closed boundary is the
 * poleward edge of the closed region met first when scanning from minLatDeg
 * poleward, refined by bisection to latTolDeg. The equatorward edge is the
 * footprint of the closed line whose minimum-|B| point lies at sourceRe
 * (bisection on the equatorial distance, which grows with latitude); null if
 * the closed region ends before reaching it.
 */
export function sectorBoundaries(model: PreparedModel, t: Tracer, hemisphere: Hemisphere, mltH: number, opts: Partial<BoundaryOptions> = {}): SectorBoundaries {
  const o = { ...DEFAULT_BOUNDARY_OPTIONS, ...opts };
  const sgn = hemisphere === 'north' ? 1 : -1;
  // Coarse scan poleward for the first line that is not closed.
  let lo = o.minLatDeg;
  let first = closedAt(model, t, sgn * lo, mltH);
  if (!first.closed) return { mltHours: mltH, openClosed: null, equatorward: null };
  let hi = NaN;
  let loEq = first.eqR;
  const scanned: { lat: number; eqR: number }[] = [{ lat: lo, eqR: loEq }];
  for (let lat = lo + o.scanStepDeg; lat < 90; lat += o.scanStepDeg) {
    const r = closedAt(model, t, sgn * lat, mltH);
    if (!r.closed) { hi = lat; break; }
    lo = lat;
    scanned.push({ lat, eqR: r.eqR });
  }
  if (Number.isNaN(hi)) {
    const r = closedAt(model, t, sgn * 89.99, mltH);
    if (r.closed) return { mltHours: mltH, openClosed: null, equatorward: equatorwardEdge(model, t, sgn, mltH, scanned, NaN, o) };
    hi = 89.99;
  }
  while (hi - lo > o.latTolDeg) {
    const mid = 0.5 * (lo + hi);
    const r = closedAt(model, t, sgn * mid, mltH);
    if (r.closed) { lo = mid; scanned.push({ lat: mid, eqR: r.eqR }); }
    else hi = mid;
  }
  const ocLat = 0.5 * (lo + hi);
  return {
    mltHours: mltH,
    openClosed: boundaryPoint(model, t, sgn * ocLat, mltH),
    equatorward: equatorwardEdge(model, t, sgn, mltH, scanned, ocLat, o),
  };
}

function equatorwardEdge(model: PreparedModel, t: Tracer, sgn: number, mltH: number, scanned: { lat: number; eqR: number }[], ocLat: number, o: BoundaryOptions): BoundaryPoint | null {
  scanned.sort((a, b) => a.lat - b.lat);
  if (!(scanned[0].eqR <= o.sourceRe)) return null; // already beyond the source at the lowest latitude
  let lo = scanned[0].lat;
  let hi = NaN;
  for (const s of scanned) {
    if (s.eqR <= o.sourceRe) lo = s.lat;
    else { hi = s.lat; break; }
  }
  if (Number.isNaN(hi)) {
    if (Number.isNaN(ocLat)) return null;
    hi = ocLat; // source distance beyond the last closed line: search up to the boundary
  }
  while (hi - lo > o.latTolDeg) {
    const mid = 0.5 * (lo + hi);
    const r = closedAt(model, t, sgn * mid, mltH);
    if (r.closed && r.eqR <= o.sourceRe) lo = mid;
    else hi = mid;
  }
  if (!Number.isNaN(ocLat) && hi >= ocLat - o.latTolDeg) return null; // the source lies on open lines here
  return boundaryPoint(model, t, sgn * 0.5 * (lo + hi), mltH);
}

/** MLT grid 0 ≤ h < 24 with the given step (hours). */
export function mltGrid(stepH: number): number[] {
  requireInRange('mltStep', stepH, 0.05, 12, 'h');
  const n = Math.round(24 / stepH);
  if (Math.abs(n * stepH - 24) > 1e-9) throw new InputError('mltStep', `${stepH} h must divide 24 h evenly (e.g. 0.5, 1, 2, 3)`);
  const out: number[] = [];
  for (let i = 0; i < n; i++) out.push(i * stepH);
  return out;
}

export interface HemisphereBoundaries {
  hemisphere: Hemisphere;
  sectors: SectorBoundaries[];
}

/** Boundaries per MLT for the chosen hemispheres. */
export function ovalBoundaries(model: PreparedModel, t: Tracer, hemispheres: Hemisphere[], mlts: number[], opts: Partial<BoundaryOptions> = {}): HemisphereBoundaries[] {
  return hemispheres.map((h) => ({ hemisphere: h, sectors: mlts.map((m) => sectorBoundaries(model, t, h, m, opts)) }));
}

/**
 * Where a footpoint stands against the oval at its MLT: poleward of the
 * open–closed boundary, inside (between the edges), or equatorward.
 */
export function ovalRelation(magLatDeg: number, b: SectorBoundaries): 'poleward' | 'inside' | 'equatorward' | 'unknown' {
  const a = Math.abs(magLatDeg);
  if (b.openClosed && a >= Math.abs(b.openClosed.magLatDeg)) return 'poleward';
  if (b.equatorward && a < Math.abs(b.equatorward.magLatDeg)) return 'equatorward';
  if (b.openClosed && b.equatorward) return 'inside';
  if (b.openClosed && !b.equatorward) return 'inside';
  return 'unknown';
}
