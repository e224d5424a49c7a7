/**
 * Mapping products over a prepared model: a line's description, conjugate
 * points of sites, the open–closed boundary and the equatorward precipitation
 * edge per MLT and hemisphere, and sweeps over Pdyn or Bz.
 */
import { RE_KM } from '../constants';
import { InputError, requireInRange } from '../errors';
import { geoFromGeodetic } from '../frames/geodesy';
import { applyMat3, applyMat3T } from '../frames/rotations';
import type { PreparedModel } from '../field/model';
import { Tracer, LINE_CLOSED, LINE_TYPE_NAMES, type TraceOptions, type LineType } from '../trace/tracer';
import { describePoint, equatorCrossing, gsmAtMagneticLatMlt, type Footpoint, type EquatorCrossing, type Hemisphere } from '../trace/footpoint';

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
 * (the equatorial distance grows with latitude: a safeguarded regula falsi,
 * Illinois variant, on r_eq − sourceRe); null if the closed region ends first.
 *
 * `hint` (the neighbouring sector's answer) lets the search start from a
 * narrow bracket around it; the bracket is verified by tracing both ends and
 * the full scan runs when it does not hold, so a hint changes the cost, not
 * the answer beyond latTolDeg.
 */
export function sectorBoundaries(model: PreparedModel, t: Tracer, hemisphere: Hemisphere, mltH: number, opts: Partial<BoundaryOptions> = {}, hint?: BoundaryHint | null): SectorBoundaries {
  // The source distance follows the conditions (model.sourceRe, issue 10) unless the caller sets one.
  const o = { ...DEFAULT_BOUNDARY_OPTIONS, ...opts, sourceRe: opts.sourceRe ?? model.sourceRe ?? DEFAULT_SOURCE_RE };
  const sgn = hemisphere === 'north' ? 1 : -1;
  const probe = (lat: number) => closedAt(model, t, sgn * lat, mltH);
  const samples: Sample[] = [];
  let bracket: [number, number] | null = null;
  let ocFound = true;

  const h = hint?.openClosedLatDeg ?? NaN;
  if (Number.isFinite(h)) {
    // Expand a bracket outward from the predicted latitude (at most a few steps).
    const w = hintWidth(hint);
    let lo = Math.max(o.minLatDeg, h - w), hi = Math.min(89.99, h + w);
    let a = probe(lo);
    if (a.closed) {
      samples.push({ lat: lo, eqR: a.eqR });
      for (let k = 0; k < 4 && !bracket; k++) {
        const b = probe(hi);
        if (!b.closed) bracket = [lo, hi];
        else {
          samples.push({ lat: hi, eqR: b.eqR });
          if (hi >= 89.99) break;
          lo = hi; hi = Math.min(89.99, hi + 2 * w * (k + 1));
        }
      }
    } else {
      for (let k = 0; k < 4 && !bracket; k++) {
        hi = lo; lo = Math.max(o.minLatDeg, lo - 2 * w * (k + 1));
        a = probe(lo);
        if (a.closed) { samples.push({ lat: lo, eqR: a.eqR }); bracket = [lo, hi]; }
        else if (lo <= o.minLatDeg) return { mltHours: mltH, openClosed: null, equatorward: null };
      }
    }
  }
  if (!bracket) {
    // Coarse scan poleward for the first line that is not closed.
    let lo = o.minLatDeg;
    const first = probe(lo);
    if (!first.closed) return { mltHours: mltH, openClosed: null, equatorward: null };
    samples.push({ lat: lo, eqR: first.eqR });
    let hi = NaN;
    for (let lat = lo + o.scanStepDeg; lat < 90; lat += o.scanStepDeg) {
      const r = probe(lat);
      if (!r.closed) { hi = lat; break; }
      lo = lat;
      samples.push({ lat, eqR: r.eqR });
    }
    if (Number.isNaN(hi)) {
      const r = probe(89.99);
      if (r.closed) ocFound = false;
      else hi = 89.99;
    }
    if (ocFound) bracket = [lo, hi];
  }
  let ocLat = NaN;
  if (bracket) {
    let [lo, hi] = bracket;
    while (hi - lo > o.latTolDeg) {
      const mid = 0.5 * (lo + hi);
      const r = probe(mid);
      if (r.closed) { lo = mid; samples.push({ lat: mid, eqR: r.eqR }); }
      else hi = mid;
    }
    ocLat = 0.5 * (lo + hi);
  }
  const eqHint = hint?.equatorwardLatDeg ?? NaN;
  return {
    mltHours: mltH,
    openClosed: ocFound ? boundaryPoint(model, t, sgn * ocLat, mltH) : null,
    equatorward: equatorwardEdge(model, t, sgn, mltH, samples, ocLat, o, eqHint, hintWidth(hint)),
  };
}

interface Sample { lat: number; eqR: number }

/** Predicted |magnetic latitudes| (deg) for a sector, e.g. extrapolated from its neighbours. */
export interface BoundaryHint {
  openClosedLatDeg?: number;
  equatorwardLatDeg?: number;
  /** Half-width of the first bracket, deg (default 0.75, at least 0.05). */
  halfWidthDeg?: number;
}

/** Linear prediction from the two previous sectors' answers (the first alone when only one). */
export function predictHint(prev: SectorBoundaries | null, prev2: SectorBoundaries | null): BoundaryHint | null {
  if (!prev) return null;
  const lat = (b: BoundaryPoint | null) => (b ? Math.abs(b.magLatDeg) : NaN);
  const oc1 = lat(prev.openClosed), oc2 = prev2 ? lat(prev2.openClosed) : NaN;
  const eq1 = lat(prev.equatorward), eq2 = prev2 ? lat(prev2.equatorward) : NaN;
  const dOc = Number.isFinite(oc2) ? oc1 - oc2 : 0;
  const dEq = Number.isFinite(eq2) ? eq1 - eq2 : 0;
  return {
    openClosedLatDeg: oc1 + dOc,
    equatorwardLatDeg: eq1 + dEq,
    halfWidthDeg: Math.max(HINT_HALF_WIDTH_DEG, 0.5 * Math.max(Math.abs(dOc), Math.abs(dEq))),
  };
}

/** Default half-width of the bracket placed around a predicted latitude, deg. */
const HINT_HALF_WIDTH_DEG = 0.75;

function hintWidth(hint: BoundaryHint | null | undefined): number {
  const w = hint?.halfWidthDeg;
  return w !== undefined && Number.isFinite(w) ? Math.max(0.05, w) : HINT_HALF_WIDTH_DEG;
}

function equatorwardEdge(model: PreparedModel, t: Tracer, sgn: number, mltH: number, samples: Sample[], ocLat: number, o: BoundaryOptions, hintLat: number, hintW: number): BoundaryPoint | null {
  const src = o.sourceRe;
  const probe = (lat: number): number => {
    const r = closedAt(model, t, sgn * lat, mltH);
    return r.closed && Number.isFinite(r.eqR) ? r.eqR - src : NaN; // NaN: not closed
  };
  // Bracket [lo, hi] with g(lo) ≤ 0 < g(hi) (or hi not closed).
  let lo = NaN, glo = NaN, hi = NaN, ghi = NaN;
  if (Number.isFinite(hintLat)) {
    const a = Math.max(o.minLatDeg, hintLat - hintW), b = hintLat + hintW;
    const ga = probe(a);
    if (ga <= 0) {
      const gb = probe(b);
      if (!(gb <= 0)) { lo = a; glo = ga; hi = b; ghi = gb; }
    }
  }
  if (Number.isNaN(lo)) {
    samples.sort((p, q) => p.lat - q.lat);
    if (samples.length === 0 || (!(samples[0].eqR <= src) && samples[0].lat > o.minLatDeg)) {
      // A hinted search samples only near the boundary: add the lowest latitude.
      const r = closedAt(model, t, sgn * o.minLatDeg, mltH);
      if (r.closed) samples.unshift({ lat: o.minLatDeg, eqR: r.eqR });
    }
    if (samples.length === 0 || !(samples[0].eqR <= src)) return null; // beyond the source already at the lowest latitude
    for (const s of samples) {
      if (s.eqR <= src) { lo = s.lat; glo = s.eqR - src; }
      else { hi = s.lat; ghi = s.eqR - src; break; }
    }
    if (Number.isNaN(hi)) {
      if (Number.isNaN(ocLat)) return null;
      hi = ocLat; // the source lies beyond the last closed line sampled: search up to the boundary
      ghi = NaN;
    }
  }
  // Illinois regula falsi, falling back to bisection where the far end is not closed.
  let side = 0;
  let root = NaN;
  for (let it = 0; it < 60 && hi - lo > o.latTolDeg; it++) {
    let x = Number.isFinite(ghi) && ghi !== glo ? lo + (hi - lo) * (glo / (glo - ghi)) : 0.5 * (lo + hi);
    const guard = 0.05 * (hi - lo);
    if (!(x > lo + guard && x < hi - guard)) x = 0.5 * (lo + hi);
    const g = probe(x);
    if (g <= 0) {
      lo = x; glo = g;
      if (side === -1 && Number.isFinite(ghi)) ghi *= 0.5;
      side = -1;
    } else {
      hi = x; ghi = g; // NaN when not closed
      if (side === 1) glo *= 0.5;
      side = 1;
    }
    // Converged: the secant step from the newest point is below a quarter of the tolerance.
    if (Number.isFinite(g) && Number.isFinite(ghi) && Number.isFinite(glo) && ghi !== glo) {
      const slope = (ghi - glo) / (hi - lo);
      if (slope > 0 && Math.abs(g / slope) < 0.25 * o.latTolDeg) { root = x - g / slope; break; }
    }
  }
  const lat = Number.isFinite(root) ? root : 0.5 * (lo + hi);
  if (!Number.isNaN(ocLat) && lat >= ocLat - o.latTolDeg) return null; // the source lies on open lines here
  return boundaryPoint(model, t, sgn * lat, mltH);
}

/**
 * Exact boundaries at arbitrary MLTs for one model, each search started from
 * the nearest MLT already answered (bracket half-width growing with the MLT
 * distance). For many sites of one condition; every answer is a full
 * sectorBoundaries search to latTolDeg, so it agrees with an unhinted one to
 * that tolerance.
 */
export function boundaryFinder(model: PreparedModel, t: Tracer, opts: Partial<BoundaryOptions> = {}): (hemisphere: Hemisphere, mltH: number) => SectorBoundaries {
  const done: Record<Hemisphere, SectorBoundaries[]> = { north: [], south: [] };
  return (hemisphere, mltH) => {
    let best: SectorBoundaries | null = null;
    let dBest = Infinity;
    for (const b of done[hemisphere]) {
      const d = Math.abs(((b.mltHours - mltH + 36) % 24) - 12);
      if (d < dBest) { dBest = d; best = b; }
    }
    if (best && dBest === 0) return best;
    const hint: BoundaryHint | null = best && dBest <= 3
      ? {
        openClosedLatDeg: best.openClosed ? Math.abs(best.openClosed.magLatDeg) : undefined,
        equatorwardLatDeg: best.equatorward ? Math.abs(best.equatorward.magLatDeg) : undefined,
        halfWidthDeg: 0.15 + 1.2 * dBest, // boundaries move up to ~1–2° per hour of MLT near noon
      }
      : null;
    const r = sectorBoundaries(model, t, hemisphere, mltH, opts, hint);
    done[hemisphere].push(r);
    return r;
  };
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
  return hemispheres.map((h) => {
    const sectors: SectorBoundaries[] = [];
    let prev: SectorBoundaries | null = null, prev2: SectorBoundaries | null = null;
    for (const m of mlts) {
      const b = sectorBoundaries(model, t, h, m, opts, predictHint(prev, prev2));
      sectors.push(b);
      prev2 = prev;
      prev = b;
    }
    return { hemisphere: h, sectors };
  });
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
