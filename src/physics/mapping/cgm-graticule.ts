/**
 * A corrected geomagnetic (CGM) graticule for maps: circles of constant CGM
 * latitude and meridians of constant MLT (CGM), as geodetic latitude/longitude
 * polylines at one height above the ellipsoid.
 *
 * Built by inverting the definition the converter uses (cgm.ts; Gustafsson,
 * Papitashvili & Papitashvili 1992, J. Atmos. Terr. Phys. 54, 1609; references
 * §6): a point has CGM latitude Λ and longitude φ when its main-field line
 * crosses the dipole equator at the MAG longitude φ and radius R with
 * cos²Λ = r / R, r its own geocentric radius. So each sample starts at the
 * equatorial point (R, φ) and follows the main field down into one hemisphere
 * to the height surface; R is refined until r / R = cos²Λ there (a fixed point
 * that contracts strongly: r hardly moves with R). The trace may not cross the
 * dipole equator on its way down (the converter would then find that nearer
 * crossing): such samples, and apexes beyond the converter's limit
 * (CGM_MAX_APEX_RE), are undefined, and the polyline breaks there (NaN).
 *
 * MLT (CGM) of a CGM longitude is that of its apex point, i.e. 12 h plus the
 * longitude from the Sun's MAG longitude over 15° per hour (mltHours).
 */
import { DEG_PER_RAD, RAD_PER_DEG } from '../constants';
import { requireInRange, InputError } from '../errors';
import { ellipsoidRadiusRe, geodeticFromGeo, geoFromGeodetic } from '../frames/geodesy';
import { geoFromMag, magFromGeo, type FrameSet } from '../frames/rotations';
import { Tracer, type TraceField } from '../trace/tracer';
import type { MainFieldModel } from '../field/mainfield/synthesis';
import type { PreparedModel } from '../field/model';
import { CGM_MAX_APEX_RE, CGM_STEP_FACTOR, prepareCgm, type CgmConverter } from './cgm';
import { cgmMainField } from './cgm-model';

export interface CgmGraticuleOptions {
  /** Height of the graticule above the WGS84 ellipsoid, km (0–5000). */
  heightKm: number;
  /** CGM latitudes of the circles (deg, > 0; drawn in both hemispheres). Default 40, 50, 60, 70, 80. */
  latitudesDeg?: readonly number[];
  /** CGM longitude step along the circles, deg (default 5). */
  lonStepDeg?: number;
  /** MLT (CGM) of the meridians, h. Default every 3 h. */
  mltHours?: readonly number[];
  /** CGM latitude step along the meridians, deg (default 2; from 30° to the highest defined latitude). */
  meridianStepDeg?: number;
}

export interface GraticuleLine {
  kind: 'latitude' | 'mlt';
  hemisphere: 'north' | 'south';
  /** Signed CGM latitude of a circle (deg), or MLT (CGM) of a meridian (h). */
  value: number;
  /** Geodetic latitude and east longitude (deg) of the samples, in order; NaN where CGM is undefined (the line breaks). */
  latDeg: Float64Array;
  lonDeg: Float64Array;
  /** Signed CGM latitude of each sample (deg): a circle's own latitude, or where each meridian sample sits. */
  cgmLatDeg: Float64Array;
}

export interface CgmGraticule {
  heightKm: number;
  lines: GraticuleLine[];
  /** Highest CGM latitude defined at this height (deg): the apex limit CGM_MAX_APEX_RE. */
  maxLatDeg: number;
  /** Samples where CGM is undefined (NaN in the lines; a break inserted where a segment leaves the line is not counted). */
  undefinedSamples: number;
  /** Main-field traces used (a measure of the cost). */
  traces: number;
}

/** Agreement of each sample's CGM latitude with its target (deg): below the converter's own tracing error (4e-5°). */
const LAT_TOL_DEG = 2e-5;
const MAX_REFINE = 6;
/** Lowest CGM latitude of the meridians (deg): below every map that shows them (they are clipped there). */
const MERIDIAN_FROM_DEG = 30;
/**
 * Below this CGM latitude (deg) each segment's midpoint is converted forward and the segment is
 * dropped when the midpoint is undefined or off the line (more than MID_TOL_DEG): every sample is
 * defined by construction, but the undefined band near the dipole equator can lie between two
 * samples (measured with IGRF-14 at 5° steps: midpoints undefined or off at 1–3°, none from 5° up).
 */
const MID_CHECK_BELOW_DEG = 20;
const MID_TOL_DEG = 0.5;

/** The CGM graticule of a model's main field and time (the same main field as cgmOf). */
export function cgmGraticuleOf(model: PreparedModel, options: CgmGraticuleOptions): CgmGraticule {
  return buildCgmGraticule(cgmMainField(model), model.frames, options);
}

/** Traces CGM samples for one main field, instant and height: the converter's definition inverted. */
class GraticuleSampler {
  traces = 0;
  undefinedSamples = 0;
  /** Result of the last landing: geodetic latitude, longitude (deg) and the radius at the exact height (RE). */
  landLat = NaN;
  landLon = NaN;
  landR = NaN;
  private sideSign = 1;
  private readonly tracer: Tracer;
  private readonly mag = new Float64Array(3);
  private readonly geo = new Float64Array(3);
  private readonly g2 = new Float64Array(3);
  private readonly mid = new Float64Array(3);
  private forward: CgmConverter | null = null;

  constructor(private readonly mainField: MainFieldModel, private readonly frames: FrameSet, readonly heightKm: number) {
    const axis = frames.axisGeo;
    // The trace runs in GEO and may not leave its hemisphere's side of the dipole equator: the
    // "inside" test of the tracer ends a half-line that crosses it (and the other half at once).
    const field: TraceField = {
      evaluate: (out, x, y, z) => mainField.evaluateGeo(out, x, y, z),
      isInside: (x, y, z) => this.sideSign * (axis[0] * x + axis[1] * y + axis[2] * z) > 0,
      boundaryMinRe: 0,
      geoZRow: Float64Array.of(0, 0, 1),
    };
    this.tracer = new Tracer(field, { ellipsoid: true, altKm: heightKm, stepFactor: CGM_STEP_FACTOR, hMaxRe: 1, rMaxRe: CGM_MAX_APEX_RE, maxSteps: 6000 });
  }

  /** Follow the main field from the dipole-equator point (apexRe, MAG longitude lonRad) down to the height surface. */
  private land(apexRe: number, lonRad: number, north: boolean): boolean {
    const { mag, geo, g2, frames, tracer } = this;
    mag[0] = apexRe * Math.cos(lonRad); mag[1] = apexRe * Math.sin(lonRad); mag[2] = 0;
    geoFromMag(geo, mag, frames);
    this.sideSign = north ? 1 : -1;
    tracer.trace(geo[0], geo[1], geo[2]);
    this.traces++;
    const k = tracer.footPlus >= 0 ? tracer.footPlus : tracer.footMinus;
    if (k < 0) return false;
    const p = tracer.points;
    const x = p[3 * k], y = p[3 * k + 1], z = p[3 * k + 2];
    const axis = frames.axisGeo;
    if (this.sideSign * (axis[0] * x + axis[1] * y + axis[2] * z) <= 0) return false;
    const gd = geodeticFromGeo(x, y, z);
    this.landLat = gd.latDeg; this.landLon = gd.lonDeg;
    // The radius of the reported point itself (latitude, longitude at the exact height).
    geoFromGeodetic(g2, gd.latDeg, gd.lonDeg, this.heightKm);
    this.landR = Math.hypot(g2[0], g2[1], g2[2]);
    return true;
  }

  /** The sample at CGM latitude latDeg (> 0) and longitude lonRad in a hemisphere; rGuess: the radius expected there. */
  sample(latDeg: number, lonRad: number, north: boolean, rGuess: number): boolean {
    const cos2 = Math.cos(latDeg * RAD_PER_DEG) ** 2;
    let r = rGuess;
    for (let it = 0; it < MAX_REFINE; it++) {
      const apexRe = r / cos2;
      if (!(apexRe <= CGM_MAX_APEX_RE)) return false;
      if (!this.land(apexRe, lonRad, north)) return false;
      const got = Math.acos(Math.sqrt(Math.min(1, this.landR / apexRe))) * DEG_PER_RAD;
      if (Math.abs(got - latDeg) <= LAT_TOL_DEG) return true;
      r = this.landR;
    }
    return false;
  }

  /** True when the segment between two samples (deg) stays on the line: its midpoint's CGM latitude (and MLT) as expected. */
  private midpointOnLine(lat0: number, lon0: number, lat1: number, lon1: number, cgmLat: number, mltH: number | null): boolean {
    const { geo, g2, mid, heightKm } = this;
    this.forward ??= prepareCgm(this.mainField, this.frames);
    geoFromGeodetic(geo, lat0, lon0, heightKm);
    geoFromGeodetic(g2, lat1, lon1, heightKm);
    const gd = geodeticFromGeo(0.5 * (geo[0] + g2[0]), 0.5 * (geo[1] + g2[1]), 0.5 * (geo[2] + g2[2]));
    geoFromGeodetic(mid, gd.latDeg, gd.lonDeg, heightKm);
    const r = this.forward.fromGeo(mid[0], mid[1], mid[2]);
    this.traces++;
    if (!r.defined || Math.abs(r.latDeg - cgmLat) > MID_TOL_DEG) return false;
    if (mltH === null) return true;
    const d = Math.abs(r.mltH - mltH);
    return Math.min(d, 24 - d) * 15 <= MID_TOL_DEG / Math.cos(cgmLat * RAD_PER_DEG);
  }

  /** A line being built: samples, with NaN pushed between two samples whose segment leaves the line. */
  lineBuilder(mltH: number | null) {
    const la: number[] = [], lo: number[] = [], cl: number[] = [];
    return {
      push: (lat: number, lon: number, cgmLat: number) => {
        const n = la.length;
        if (n > 0 && Number.isFinite(lat) && Number.isFinite(la[n - 1]) && Math.min(Math.abs(cgmLat), Math.abs(cl[n - 1])) < MID_CHECK_BELOW_DEG
          && !this.midpointOnLine(la[n - 1], lo[n - 1], lat, lon, 0.5 * (cgmLat + cl[n - 1]), mltH)) {
          la.push(NaN); lo.push(NaN); cl.push(0.5 * (cgmLat + cl[n - 1]));
        }
        la.push(lat); lo.push(lon); cl.push(cgmLat);
      },
      done: () => ({ latDeg: Float64Array.from(la), lonDeg: Float64Array.from(lo), cgmLatDeg: Float64Array.from(cl) }),
    };
  }

  /**
   * Samples along a line at the given CGM latitudes and MAG longitudes (rad), in order; the radius of
   * each guessed from the last two samples (equal steps). loop: the first sample repeated at the end.
   */
  line(points: readonly { latDeg: number; lonRad: number }[], north: boolean, mltH: number | null, loop: boolean) {
    const sgn = north ? 1 : -1;
    const b = this.lineBuilder(mltH);
    let r1 = NaN, r2 = NaN;
    let first: [number, number] = [NaN, NaN];
    points.forEach(({ latDeg, lonRad }, i) => {
      const guess = Number.isFinite(r2) ? 2 * r1 - r2 : Number.isFinite(r1) ? r1 : ellipsoidRadiusRe(Math.sin(latDeg * RAD_PER_DEG), this.heightKm);
      if (this.sample(latDeg, lonRad, north, guess)) {
        b.push(this.landLat, this.landLon, sgn * latDeg);
        if (i === 0) first = [this.landLat, this.landLon];
        r2 = r1; r1 = this.landR;
      } else {
        b.push(NaN, NaN, sgn * latDeg);
        this.undefinedSamples++;
        r1 = NaN; r2 = NaN;
      }
    });
    // Closed loop: the first sample repeated at the end.
    if (loop) b.push(first[0], first[1], sgn * points[0].latDeg);
    return b.done();
  }
}

/**
 * The CGM graticule for a main field (GEO) and the frames of the instant (their
 * dipole axis defines the dipole equator and MAG; the Sun direction the MLT).
 */
export function buildCgmGraticule(mainField: MainFieldModel, frames: FrameSet, options: CgmGraticuleOptions): CgmGraticule {
  const heightKm = requireInRange('heightKm', options.heightKm, 0, 5000, 'km');
  const lats = options.latitudesDeg ?? [40, 50, 60, 70, 80];
  for (const l of lats) requireInRange('latitudesDeg', l, 1, 89, 'deg');
  const lonStep = requireInRange('lonStepDeg', options.lonStepDeg ?? 5, 0.5, 30, 'deg');
  const mlts = options.mltHours ?? [0, 3, 6, 9, 12, 15, 18, 21];
  for (const m of mlts) requireInRange('mltHours', m, 0, 24, 'h');
  const merStep = requireInRange('meridianStepDeg', options.meridianStepDeg ?? 2, 0.25, 10, 'deg');
  if (!Number.isInteger(360 / lonStep)) throw new InputError('lonStepDeg', `expected a step that divides 360°, got ${lonStep}`);

  const sampler = new GraticuleSampler(mainField, frames, heightKm);
  const lines: GraticuleLine[] = [];
  const nLon = Math.round(360 / lonStep);
  for (const north of [true, false]) {
    for (const lat of lats) {
      const pts = Array.from({ length: nLon }, (_, i) => ({ latDeg: lat, lonRad: i * lonStep * RAD_PER_DEG }));
      lines.push({ kind: 'latitude', hemisphere: north ? 'north' : 'south', value: (north ? 1 : -1) * lat, ...sampler.line(pts, north, null, true) });
    }
  }

  // Highest defined latitude at this height (the smallest radius of the surface, at the poles).
  const maxLatDeg = Math.acos(Math.sqrt(ellipsoidRadiusRe(1, heightKm) / CGM_MAX_APEX_RE)) * DEG_PER_RAD;
  const merLats: number[] = [];
  for (let l = MERIDIAN_FROM_DEG; l < maxLatDeg; l += merStep) merLats.push(l);
  // The Sun's MAG longitude: MLT 12 h (mltHours of the apex point in SM, whose x–z plane holds the Sun).
  const mag = new Float64Array(3);
  magFromGeo(mag, frames.sunGeo, frames);
  const sunLonDeg = Math.atan2(mag[1], mag[0]) * DEG_PER_RAD;
  for (const north of [true, false]) {
    for (const mlt of mlts) {
      const lonRad = (sunLonDeg + (mlt - 12) * 15) * RAD_PER_DEG;
      const pts = merLats.map((latDeg) => ({ latDeg, lonRad }));
      lines.push({ kind: 'mlt', hemisphere: north ? 'north' : 'south', value: mlt, ...sampler.line(pts, north, mlt, false) });
    }
  }
  return { heightKm, lines, maxLatDeg, undefinedSamples: sampler.undefinedSamples, traces: sampler.traces };
}
