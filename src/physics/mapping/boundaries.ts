/**
 * The open–closed boundary and the equatorward precipitation edge at one MLT in
 * one hemisphere, found by root searches over magnetic latitude (each probe is a
 * field-line trace).
 */
import type { PreparedModel } from '../field/model';
import type { Tracer } from '../trace/tracer';
import { LINE_CLOSED, LINE_UNRESOLVED } from '../trace/line-type';
import { shueRadius } from '../field/magnetopause';
import { DEG_PER_RAD, RAD_PER_DEG } from '../constants';
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

/**
 * Why a boundary is missing at one MLT (plain words every output can show as they are).
 *  - 'no closed lines at this MLT': the line at the lowest latitude searched is already open.
 *  - 'closed to the pole': no open line up to the pole (no open–closed boundary).
 *  - 'unresolved lines': the lowest line's trace ran out of its budget, so the region is unknown.
 *  - 'the source distance lies outside the magnetopause': no closed line can reach it here.
 *  - 'the closed region ends before the source distance': the last closed line crosses the
 *    equator inside the source distance.
 *  - 'the source distance maps below the lowest latitude searched': the line at the lowest
 *    latitude already crosses the equator beyond the source distance.
 */
export type MissingBoundaryReason =
  | 'no closed lines at this MLT'
  | 'closed to the pole'
  | 'unresolved lines'
  | 'the source distance lies outside the magnetopause'
  | 'the closed region ends before the source distance'
  | 'the source distance maps below the lowest latitude searched';

export interface SectorBoundaries {
  mltHours: number;
  openClosed: BoundaryPoint | null;
  equatorward: BoundaryPoint | null;
  /** Why openClosed is null (null when it was found). Set by sectorBoundaries; records assembled elsewhere (e.g. interpolated) may leave it out. */
  openClosedReason?: MissingBoundaryReason | null;
  /** Why equatorward is null (null when it was found); as openClosedReason. */
  equatorwardReason?: MissingBoundaryReason | null;
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
  minLatDeg: 30,
  scanStepDeg: 2,
});

/**
 * Highest latitude an unhinted scan starts from, deg: the search floor before storm-time
 * boundaries (quiet answers stay those of a 50° floor). The scan starts lower when the source
 * distance is small (scanStartLatDeg) and walks down to minLatDeg when its first line is open.
 */
export const SCAN_START_MAX_LAT_DEG = 50;
/** The scan starts at the dipole footprint of this fraction of the source distance (lines stretched by the tail or ring current reach it lower still; compression moves it up by less than this margin). */
const SCAN_START_SOURCE_FRACTION = 0.6;

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

interface Probe { closed: boolean; unresolved: boolean; eqR: number }

/**
 * Return radius of the searches' classification traces, RE (Tracer.trace's returnStopRe; 0: full
 * traces). A probe needs only the line type and the equatorial distance, so the return leg of a
 * line may stop where it comes back inward below this radius, provided every line heading inward
 * there reaches the ground: the main field must dominate. The only external term that grows
 * large inside a few RE is the storm-time ring current (its own field at Earth's centre is
 * Dst*); with |Dst*| ≤ 300 nT the external field stays under ~10 % of the main field inside
 * 2.5 RE (main field ≥ ~1,900 nT there), with |Dst*| ≤ 800 nT inside 2 RE (≥ ~3,700 nT); beyond,
 * full traces. test/physics/mapping/classification-trace.test.ts checks the line type and
 * equatorial distance against full traces over random conditions up to those limits.
 * Saves the last ~7–10 % of a probe's field evaluations (measured in the batch).
 */
export function classificationReturnRe(model: PreparedModel): number {
  const ring = Math.abs(model.ringCurrent.params.centreNt);
  if (ring <= 300) return 2.5;
  if (ring <= 800) return 2;
  return 0;
}

/** Closed / not-closed test of the line from (magLat, MLT) at the footpoint altitude; eqR is its equatorial distance, RE. */
function closedAt(model: PreparedModel, tracer: Tracer, magLatDeg: number, mltH: number): Probe {
  const o = tracer.options;
  gsmAtMagneticLatMlt(tmp, model.frames, magLatDeg, mltH, o.altKm, o.ellipsoid);
  const type = tracer.trace(tmp[0], tmp[1], tmp[2], classificationReturnRe(model));
  if (type !== LINE_CLOSED) return { closed: false, unresolved: type === LINE_UNRESOLVED, eqR: NaN };
  const eq = equatorCrossing(tracer.points, tracer.bMag, tracer.nPoints);
  return { closed: true, unresolved: false, eqR: eq ? eq.rRe : NaN };
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

type ClosedProbe = (lat: number) => Probe;

/** What a bracket search found: a bracket, or why there is none. */
type BracketResult = [number, number] | 'none' | 'unresolved' | 'closed-to-pole';

/**
 * Boundaries at one MLT in one hemisphere. The open–closed boundary is the
 * poleward edge of the lowest closed region above minLatDeg: the scan starts at
 * scanStartLatDeg (near the expected edge, never above 50°), climbs poleward over a fixed
 * latitude grid (openClosedCell; or walks down to minLatDeg when its first line is not
 * closed) and refines by bisection to latTolDeg. The equatorward edge is the
 * footprint of the closed line whose minimum-|B| point lies at sourceRe
 * (the equatorial distance grows with latitude: a safeguarded regula falsi,
 * Illinois variant, on ln(r_eq / sourceRe)). A missing boundary comes with its reason
 * (openClosedReason, equatorwardReason).
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
  // Lines already traced in this search are not traced again (a hinted search may be redone unhinted).
  const traced = new Map<number, Probe>();
  const probe: ClosedProbe = (lat) => {
    let p = traced.get(lat);
    if (!p) { p = closedAt(model, tracer, sgn * lat, mltH); traced.set(lat, p); }
    return p;
  };
  const samples: Sample[] = [];
  const missing = (reason: MissingBoundaryReason): SectorBoundaries =>
    ({ mltHours: mltH, openClosed: null, equatorward: null, openClosedReason: reason, equatorwardReason: reason });

  let bracket = openClosedCell(probe, o, hint?.openClosedLatDeg ?? NaN, samples);
  // A hint that lands on closed lines near the pole (e.g. a lone closed line at the top node) can
  // climb to the pole from a region the unhinted scan never reaches: confirm by the unhinted search.
  if (bracket === 'closed-to-pole' && hint?.openClosedLatDeg !== undefined && Number.isFinite(hint.openClosedLatDeg)) {
    bracket = openClosedCell(probe, o, NaN, samples);
  }
  if (bracket === 'none') return missing('no closed lines at this MLT');
  if (bracket === 'unresolved') return missing('unresolved lines');
  let ocLat = NaN;
  if (bracket !== 'closed-to-pole') {
    ocLat = bisectBoundary(bracket[0], bracket[1], o.latTolDeg, (mid) => {
      const r = probe(mid);
      if (r.closed) samples.push({ lat: mid, eqR: r.eqR });
      return r.closed;
    });
  }
  const eqHint = hint?.equatorwardLatDeg ?? NaN;
  const eq = equatorwardEdge(model, tracer, sgn, mltH, samples, ocLat, o, eqHint, hintWidth(hint));
  return {
    mltHours: mltH,
    openClosed: Number.isNaN(ocLat) ? null : boundaryPoint(model, tracer, sgn * ocLat, mltH),
    equatorward: typeof eq === 'string' ? null : eq,
    openClosedReason: Number.isNaN(ocLat) ? 'closed to the pole' : null,
    equatorwardReason: typeof eq === 'string' ? eq : null,
  };
}

/** Dipole footprint latitude (deg) of the line through L·0.6·sourceRe, clamped to [minLatDeg, 50°]: where an unhinted scan starts. */
export function scanStartLatDeg(o: Pick<BoundaryOptions, 'minLatDeg' | 'sourceRe'>): number {
  const l = SCAN_START_SOURCE_FRACTION * o.sourceRe;
  const dipoleLat = l > 1 ? Math.acos(Math.sqrt(1 / l)) * DEG_PER_RAD : 0;
  return Math.max(o.minLatDeg, Math.min(SCAN_START_MAX_LAT_DEG, dipoleLat));
}

/** Spacing of the latitude grid on which the open–closed searches probe lines, deg (references §12). */
export const OC_GRID_STEP_DEG = 0.5;
/**
 * How far poleward of a closed grid line the searches look for more closed lines, deg: every
 * grid line up to OC_CLIMB_DEG above it, and the whole-degree grid lines up to
 * OC_FAR_CLIMB_DEG above it (references §12). The boundary is the poleward edge of the closed
 * grid lines reached by such steps. Measured: in 2,400 random meridians (Pdyn 0.5–20 nPa,
 * Bz −30..+10 nT, By ±10 nT) 54 had closed islands poleward of the first closed→open
 * transition, the farthest starting 2.55° above it; at Pdyn 2 nPa, Bz +5 nT near noon (south)
 * one starts 2.95° above it.
 */
export const OC_CLIMB_DEG = 2;
/** See OC_CLIMB_DEG. */
export const OC_FAR_CLIMB_DEG = 6;

/**
 * The open–closed grid of one search: node 0 is minLatDeg, the last node the highest latitude
 * probed, the others the multiples of OC_GRID_STEP_DEG in between. The nodes do not depend on
 * the hint, so every search probes the same lines and refines the same cell.
 */
class LatGrid {
  readonly n: number;
  private readonly j0: number;
  constructor(readonly minLat: number, readonly step: number) {
    this.j0 = Math.floor(minLat / step) + 1;
    const jLast = Math.ceil(TOP_LAT_DEG / step) - 1;
    this.n = Math.max(0, jLast - this.j0 + 1) + 2;
  }
  lat(i: number): number {
    if (i <= 0) return this.minLat;
    if (i >= this.n - 1) return TOP_LAT_DEG;
    return (this.j0 + i - 1) * this.step;
  }
  /** Index of the highest node at or below lat (0 below the first inner node). */
  below(lat: number): number {
    if (!(lat >= this.lat(1))) return 0;
    if (lat >= TOP_LAT_DEG) return this.n - 1;
    return Math.min(this.n - 2, Math.max(1, Math.floor(lat / this.step + 1e-9) - this.j0 + 1));
  }
}

/**
 * The open–closed boundary's grid cell. From a closed grid node (found near the hint, or by
 * the coarse scan from scanStartLatDeg), climb: look at every node up to OC_CLIMB_DEG poleward
 * of the highest closed node known and at the whole-degree nodes up to OC_FAR_CLIMB_DEG
 * (farthest first), and move up to the highest closed one there, until none is closed. The result, the cell [highest closed node, next node], depends
 * on the model alone (the climb from any closed node of one region ends at the same node), so
 * a hint changes the cost of the search, not its answer. Returns 'none' / 'unresolved' when
 * nothing down to minLatDeg is closed, 'closed-to-pole' when the climb reaches the pole.
 */
function openClosedCell(probe: ClosedProbe, o: BoundaryOptions, hintLat: number, samples: Sample[]): BracketResult {
  const grid = new LatGrid(o.minLatDeg, OC_GRID_STEP_DEG);
  const known = new Map<number, Probe>();
  const at = (i: number): Probe => {
    let p = known.get(i);
    if (!p) {
      p = probe(grid.lat(i));
      known.set(i, p);
      if (p.closed) samples.push({ lat: grid.lat(i), eqR: p.eqR });
    }
    return p;
  };
  const last = grid.n - 1;
  let top = -1;
  if (Number.isFinite(hintLat)) {
    const s = grid.below(hintLat);
    if (at(s).closed) top = s;
    else {
      // Walk down in growing steps (0.5°, 1°, 1.5°, 2° below the previous probe).
      for (let k = 1, i = s; k <= 4 && i > 0 && top < 0; k++) {
        i = Math.max(0, i - k);
        if (at(i).closed) top = i;
      }
    }
  }
  if (top < 0) {
    const stepNodes = Math.max(1, Math.round(o.scanStepDeg / OC_GRID_STEP_DEG));
    const s = grid.below(scanStartLatDeg(o));
    // A closed start goes straight to the climb (its farthest-first probes cover up to 6° a probe).
    if (at(s).closed) top = s;
    else {
      for (let i = s; i > 0 && top < 0;) {
        i = Math.max(0, i - stepNodes);
        if (at(i).closed) top = i;
      }
      if (top < 0) return notClosedAtFloor(at(0));
    }
  }
  // Start from the highest closed node met so far.
  for (const [i, p] of known) if (p.closed && i > top) top = i;
  const climbNodes = Math.max(1, Math.round(OC_CLIMB_DEG / OC_GRID_STEP_DEG));
  const farNodes = Math.max(climbNodes, Math.round(OC_FAR_CLIMB_DEG / OC_GRID_STEP_DEG));
  const wholeDegree = (i: number): boolean => { const l = grid.lat(i); return Math.abs(l - Math.round(l)) < 1e-9; };
  for (;;) {
    if (top >= last) return 'closed-to-pole';
    let next = -1;
    for (let i = Math.min(last, top + farNodes); i > top; i--) {
      if (i - top > climbNodes && !wholeDegree(i) && i !== last) continue;
      if (at(i).closed) { next = i; break; }
    }
    if (next < 0) return [grid.lat(top), grid.lat(top + 1)];
    top = next;
  }
}

/** Why a search at the lowest latitude found nothing closed. */
const notClosedAtFloor = (p: Probe): 'none' | 'unresolved' => (p.unresolved ? 'unresolved' : 'none');

/** Half-width of the first bracket around a hint, deg. */
function hintWidth(hint: BoundaryHint | null | undefined): number {
  const w = hint?.halfWidthDeg;
  return w !== undefined && Number.isFinite(w) ? Math.max(0.05, w) : HINT_HALF_WIDTH_DEG;
}

/** Why no closed line reaches the source distance at this MLT: the magnetopause lies inside it, or the closed region ends first. */
function sourceBeyondReason(model: PreparedModel, mltH: number, sourceRe: number): MissingBoundaryReason {
  const mp = model.magnetopause;
  if (mp) {
    // Angle from +x_GSM of the equatorial direction at this MLT (noon = 0, midnight = π).
    const thetaRad = Math.abs(((((mltH - 12) % 24) + 36) % 24) - 12) * 15 * RAD_PER_DEG;
    if (sourceRe >= shueRadius(mp, thetaRad)) return 'the source distance lies outside the magnetopause';
  }
  return 'the closed region ends before the source distance';
}

/**
 * A bracket of the equatorward edge's root near a predicted latitude: a probe there, a Newton
 * step with the dipole slope of ln r_eq (d ln r_eq/dλ = 2 tan λ, from r_eq = r / cos²λ for the line
 * through a footpoint at radius r and latitude λ, references §1),
 * then secant steps through the two newest closed probes (10 % past the predicted root, so the
 * next probe tends to cross it), at most 4 probes and never more than 4 half-widths from the
 * prediction. g is ln(r_eq/source) (NaN: not closed, the high side). Null when no bracket was found.
 */
function bracketNear(g: (lat: number) => number, hintLat: number, hintW: number, minLat: number, maxLat: number, tol: number): [number, number, number, number] | null {
  const clampLat = (x: number) => Math.min(maxLat, Math.max(minLat, x));
  let lo = NaN, glo = NaN, hi = NaN, ghi = NaN;
  let xa = NaN, ga = NaN; // the newest closed probe before the current one
  let x = clampLat(hintLat);
  for (let k = 0; k < 4; k++) {
    const gx = g(x);
    if (gx <= 0) { if (!(x <= lo)) { lo = x; glo = gx; } } else if (!(x >= hi)) { hi = x; ghi = gx; }
    if (lo < hi) return [lo, glo, hi, ghi];
    let next: number;
    if (!Number.isFinite(gx)) next = x - hintW; // above the closed region: step down
    else {
      let slope = 2 * Math.tan(x * RAD_PER_DEG) * RAD_PER_DEG; // per degree, dipole
      if (Number.isFinite(ga) && x !== xa && (gx - ga) / (x - xa) > 0) slope = (gx - ga) / (x - xa);
      const dx = -gx / slope;
      next = x + 1.1 * dx + (dx > 0 ? 0.5 : -0.5) * tol;
      xa = x; ga = gx;
    }
    next = Math.min(hintLat + 4 * hintW, Math.max(hintLat - 4 * hintW, next));
    next = clampLat(next);
    if (next === x) return null;
    x = next;
  }
  return null;
}

function equatorwardEdge(model: PreparedModel, tracer: Tracer, sgn: number, mltH: number, samples: Sample[], ocLat: number, o: BoundaryOptions, hintLat: number, hintW: number): BoundaryPoint | MissingBoundaryReason {
  const src = o.sourceRe;
  const lnSrc = Math.log(src);
  // ln(r_eq/source): the sign of r_eq − source, and nearly linear in latitude (dipole: d ln r_eq/dλ = 2 tan λ),
  // so the regula falsi needs few traces.
  const g = (lat: number): number => {
    const r = closedAt(model, tracer, sgn * lat, mltH);
    return r.closed && r.eqR > 0 ? Math.log(r.eqR) - lnSrc : NaN; // NaN: not closed
  };
  // Bracket [lo, hi] with g(lo) ≤ 0 < g(hi) (or hi not closed).
  let lo = NaN, glo = NaN, hi = NaN, ghi = NaN;
  if (Number.isFinite(hintLat)) {
    const top = Number.isNaN(ocLat) ? TOP_LAT_DEG : ocLat;
    const b = bracketNear(g, hintLat, hintW, o.minLatDeg, top, o.latTolDeg);
    if (b) [lo, glo, hi, ghi] = b;
  }
  if (Number.isNaN(lo)) {
    samples.sort((p, q) => p.lat - q.lat);
    if (samples.length === 0 || (!(samples[0].eqR <= src) && samples[0].lat > o.minLatDeg)) {
      // A hinted or source-started search samples only near the boundary: add the lowest latitude.
      const r = closedAt(model, tracer, sgn * o.minLatDeg, mltH);
      if (r.closed) samples.unshift({ lat: o.minLatDeg, eqR: r.eqR });
    }
    if (samples.length === 0) return 'no closed lines at this MLT';
    if (!(samples[0].eqR <= src)) return 'the source distance maps below the lowest latitude searched';
    for (const s of samples) {
      if (s.eqR <= src) { lo = s.lat; glo = Math.log(s.eqR) - lnSrc; }
      else { hi = s.lat; ghi = Math.log(s.eqR) - lnSrc; break; }
    }
    if (Number.isNaN(hi)) {
      if (Number.isNaN(ocLat)) return sourceBeyondReason(model, mltH, src); // closed to the pole, source never reached
      hi = ocLat; // the source lies beyond the last closed line sampled: search up to the boundary
      ghi = NaN;
    }
  }
  // Illinois regula falsi, falling back to bisection where the far end is not closed.
  const lat = illinoisRoot(g, lo, glo, hi, ghi, o.latTolDeg);
  if (!Number.isNaN(ocLat) && lat >= ocLat - o.latTolDeg) return sourceBeyondReason(model, mltH, src); // the source lies on open lines here
  return boundaryPoint(model, tracer, sgn * lat, mltH);
}
