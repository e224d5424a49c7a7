/**
 * The open–closed boundary and the equatorward precipitation edge at one MLT in
 * one hemisphere, found by root searches over magnetic latitude (each probe is a
 * field-line trace).
 */
import type { PreparedModel } from '../field/model';
import type { Tracer } from '../trace/tracer';
import { LINE_CLOSED } from '../trace/line-type';
import { describePoint, equatorCrossing, gsmAtMagneticLatMlt, type Hemisphere } from '../trace/footpoint';
import { bisectBoundary, illinoisRoot } from '../numeric/roots';

/**
 * Default equatorial source distance of the equatorward precipitation edge, RE:
 * near the inner edge of the plasma sheet, where the diffuse aurora's electrons
 * come from (common practice; ~6–8 RE in quiet to moderate conditions, from memory, references §12).
 * 7 RE (a calibration, references §12, scripts/realism.ts): with the tail sheet on, the edge then
 * moves equatorward with southward Bz in every sector (at 8 RE the compression of the
 * dayside by the Bz-dependent Shue standoff outweighs the stretching at noon).
 */
export const DEFAULT_SOURCE_RE = 7;

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

/** Predicted |magnetic latitudes| (deg) for a sector, e.g. extrapolated from its neighbours. */
export interface BoundaryHint {
  openClosedLatDeg?: number;
  equatorwardLatDeg?: number;
  /** Half-width of the first bracket, deg (default 0.75, at least 0.05). */
  halfWidthDeg?: number;
}

/** Default half-width of the bracket placed around a predicted latitude, deg. */
export const HINT_HALF_WIDTH_DEG = 0.75;

/** Highest |magnetic latitude| probed, deg (the pole itself has no MLT). */
const TOP_LAT_DEG = 89.99;

const tmp = new Float64Array(3);

/** Closed / not-closed test of the line from (magLat, MLT) at the footpoint altitude; eqR is its equatorial distance, RE. */
function closedAt(model: PreparedModel, tracer: Tracer, magLatDeg: number, mltH: number): { closed: boolean; eqR: number } {
  const o = tracer.options;
  gsmAtMagneticLatMlt(tmp, model.frames, magLatDeg, mltH, o.altKm, o.ellipsoid);
  const type = tracer.trace(tmp[0], tmp[1], tmp[2]);
  if (type !== LINE_CLOSED) return { closed: false, eqR: NaN };
  const eq = equatorCrossing(tracer.points, tracer.bMag, tracer.nPoints);
  return { closed: true, eqR: eq ? eq.rRe : NaN };
}

/** The boundary record of the point at signed magnetic latitude and MLT, at the tracer's footpoint altitude. */
export function boundaryPoint(model: PreparedModel, tracer: Tracer, signedMagLatDeg: number, mltH: number): BoundaryPoint {
  const o = tracer.options;
  gsmAtMagneticLatMlt(tmp, model.frames, signedMagLatDeg, mltH, o.altKm, o.ellipsoid);
  const d = describePoint(model.frames, tmp[0], tmp[1], tmp[2]);
  return { magLatDeg: signedMagLatDeg, geoLatDeg: d.geoLatDeg, geoLonDeg: d.geoLonDeg };
}

/** A closed line met during the searches: |magnetic latitude| (deg) and equatorial distance (RE). */
interface Sample { lat: number; eqR: number }

type ClosedProbe = (lat: number) => { closed: boolean; eqR: number };

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
export function sectorBoundaries(model: PreparedModel, tracer: Tracer, hemisphere: Hemisphere, mltH: number, opts: Partial<BoundaryOptions> = {}, hint?: BoundaryHint | null): SectorBoundaries {
  // The source distance follows the conditions (model.sourceRe) unless the caller sets one.
  const o = { ...DEFAULT_BOUNDARY_OPTIONS, ...opts, sourceRe: opts.sourceRe ?? model.sourceRe };
  const sgn = hemisphere === 'north' ? 1 : -1;
  const probe: ClosedProbe = (lat) => closedAt(model, tracer, sgn * lat, mltH);
  const samples: Sample[] = [];
  const none = { mltHours: mltH, openClosed: null, equatorward: null };

  let bracket: [number, number] | null | 'none' = null;
  const h = hint?.openClosedLatDeg ?? NaN;
  if (Number.isFinite(h)) bracket = hintedBracket(probe, h, hintWidth(hint), o, samples);
  if (bracket === 'none') return none;
  let ocFound = true;
  if (!bracket) {
    const scanned = scannedBracket(probe, o, samples);
    if (scanned === 'none') return none;
    if (scanned === 'closed-to-pole') ocFound = false;
    else bracket = scanned;
  }
  let ocLat = NaN;
  if (bracket) {
    ocLat = bisectBoundary(bracket[0], bracket[1], o.latTolDeg, (mid) => {
      const r = probe(mid);
      if (r.closed) samples.push({ lat: mid, eqR: r.eqR });
      return r.closed;
    });
  }
  const eqHint = hint?.equatorwardLatDeg ?? NaN;
  return {
    mltHours: mltH,
    openClosed: ocFound ? boundaryPoint(model, tracer, sgn * ocLat, mltH) : null,
    equatorward: equatorwardEdge(model, tracer, sgn, mltH, samples, ocLat, o, eqHint, hintWidth(hint)),
  };
}

/**
 * Expand a bracket [closed, not closed] outward from the predicted latitude
 * (at most a few steps). Returns null when none was found (the caller scans),
 * 'none' when the lowest latitude is already not closed.
 */
function hintedBracket(probe: ClosedProbe, predictedLat: number, w: number, o: BoundaryOptions, samples: Sample[]): [number, number] | null | 'none' {
  let lo = Math.max(o.minLatDeg, predictedLat - w), hi = Math.min(TOP_LAT_DEG, predictedLat + w);
  let a = probe(lo);
  if (a.closed) {
    samples.push({ lat: lo, eqR: a.eqR });
    for (let k = 0; k < 4; k++) {
      const b = probe(hi);
      if (!b.closed) return [lo, hi];
      samples.push({ lat: hi, eqR: b.eqR });
      if (hi >= TOP_LAT_DEG) break;
      lo = hi; hi = Math.min(TOP_LAT_DEG, hi + 2 * w * (k + 1));
    }
    return null;
  }
  for (let k = 0; k < 4; k++) {
    hi = lo; lo = Math.max(o.minLatDeg, lo - 2 * w * (k + 1));
    a = probe(lo);
    if (a.closed) { samples.push({ lat: lo, eqR: a.eqR }); return [lo, hi]; }
    if (lo <= o.minLatDeg) return 'none';
  }
  return null;
}

/**
 * Coarse scan poleward from minLatDeg for the first line that is not closed.
 * Returns the bracket [last closed, first not closed], 'none' when the lowest
 * latitude is not closed, 'closed-to-pole' when no open line was met.
 */
function scannedBracket(probe: ClosedProbe, o: BoundaryOptions, samples: Sample[]): [number, number] | 'none' | 'closed-to-pole' {
  let lo = o.minLatDeg;
  const first = probe(lo);
  if (!first.closed) return 'none';
  samples.push({ lat: lo, eqR: first.eqR });
  for (let lat = lo + o.scanStepDeg; lat < 90; lat += o.scanStepDeg) {
    const r = probe(lat);
    if (!r.closed) return [lo, lat];
    lo = lat;
    samples.push({ lat, eqR: r.eqR });
  }
  return probe(TOP_LAT_DEG).closed ? 'closed-to-pole' : [lo, TOP_LAT_DEG];
}

/** Half-width of the first bracket around a hint, deg. */
function hintWidth(hint: BoundaryHint | null | undefined): number {
  const w = hint?.halfWidthDeg;
  return w !== undefined && Number.isFinite(w) ? Math.max(0.05, w) : HINT_HALF_WIDTH_DEG;
}

function equatorwardEdge(model: PreparedModel, tracer: Tracer, sgn: number, mltH: number, samples: Sample[], ocLat: number, o: BoundaryOptions, hintLat: number, hintW: number): BoundaryPoint | null {
  const src = o.sourceRe;
  const g = (lat: number): number => {
    const r = closedAt(model, tracer, sgn * lat, mltH);
    return r.closed && Number.isFinite(r.eqR) ? r.eqR - src : NaN; // NaN: not closed
  };
  // Bracket [lo, hi] with g(lo) ≤ 0 < g(hi) (or hi not closed).
  let lo = NaN, glo = NaN, hi = NaN, ghi = NaN;
  if (Number.isFinite(hintLat)) {
    const a = Math.max(o.minLatDeg, hintLat - hintW), b = hintLat + hintW;
    const ga = g(a);
    if (ga <= 0) {
      const gb = g(b);
      if (!(gb <= 0)) { lo = a; glo = ga; hi = b; ghi = gb; }
    }
  }
  if (Number.isNaN(lo)) {
    samples.sort((p, q) => p.lat - q.lat);
    if (samples.length === 0 || (!(samples[0].eqR <= src) && samples[0].lat > o.minLatDeg)) {
      // A hinted search samples only near the boundary: add the lowest latitude.
      const r = closedAt(model, tracer, sgn * o.minLatDeg, mltH);
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
  const lat = illinoisRoot(g, lo, glo, hi, ghi, o.latTolDeg);
  if (!Number.isNaN(ocLat) && lat >= ocLat - o.latTolDeg) return null; // the source lies on open lines here
  return boundaryPoint(model, tracer, sgn * lat, mltH);
}
