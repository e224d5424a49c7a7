/**
 * Field-line tracer: classical RK4 (Runge–Kutta 4th order) along the unit
 * field direction dr/ds = ±B/|B|, s the arc length in RE.
 *
 * Step rule (our own, documented in DEVELOPERS.md): h = clamp(stepFactor · r, hMin, hMax).
 * The field's curvature radius scales with r (exactly ∝ r on a dipole line's
 * equator), so a step proportional to r holds the local truncation error at a
 * fixed fraction of the local scale. The default stepFactor is chosen so that
 * footpoint latitudes agree with the analytic dipole to < 0.001° for L 2–12
 * (test/physics/trace/tracer.test.ts measures it).
 *
 * Stop rules:
 *  - footpoint: the line crosses the stop surface going down; the crossing is
 *    located by secant iteration (kept inside a bracket) on the cubic Hermite
 *    curve of the finished step (its two end points and unit tangents, no field
 *    evaluations), so the footpoint lies on the surface to 1e-10 RE, not at the
 *    last full step; the field is then evaluated once at the landed point. The
 *    Hermite curve's error is O(h⁴) like RK4's global error (the 16× convergence
 *    test and the dipole worked values in test/physics/trace/tracer.test.ts hold);
 *  - a seed on the stop surface (within 1e-10 RE) is its own footpoint;
 *  - open: the line leaves through the magnetopause, passes rMaxRe, or reaches tailward of
 *    the field's distant neutral line (`neutralLineXRe`);
 *  - unresolved: the step or length budget is exhausted (reported, never dropped);
 *  - classification traces only (`trace(x, y, z, returnStopRe)`, the boundary searches): a half
 *    that has been above returnStopRe and comes back below it ends there (END_RETURNED).
 */
import { ellipsoidRadiusRe } from '../frames/geodesy';
import { RE_KM } from '../constants';
import { END_SURFACE, END_MAGNETOPAUSE, END_DISTANCE, END_BUDGET, END_START_BELOW, END_RETURNED, classify } from './line-type';

/** What the tracer needs of a field model. */
export interface TraceField {
  /** Writes the total B (GSM, nT) at (x, y, z) GSM RE into out. */
  evaluate(out: Float64Array, x: number, y: number, z: number): void;
  /** True while (x, y, z) is inside the magnetopause (always true when the boundary is off). */
  isInside(x: number, y: number, z: number): boolean;
  /** Smallest distance of the boundary from Earth (RE); the inside test is skipped below it. */
  readonly boundaryMinRe: number;
  /** Row of the GSM→GEO matrix giving z_GEO, for the ellipsoidal stop surface. */
  readonly geoZRow: Float64Array;
  /**
   * GSM x of the model's distant neutral line, RE (negative; optional). A line that reaches
   * tailward of it is open (it would cross the sheet beyond the neutral line), whatever the
   * trace limit.
   */
  readonly neutralLineXRe?: number;
}

export interface TraceOptions {
  /** Footpoint altitude, km. Above the WGS84 ellipsoid when ellipsoid = true, else above the sphere r = 1 RE. */
  altKm: number;
  ellipsoid: boolean;
  /** Step = stepFactor · r, clamped to [hMinRe, hMaxRe]. */
  stepFactor: number;
  hMinRe: number;
  hMaxRe: number;
  /** Beyond this distance a line counts as open. */
  rMaxRe: number;
  /** Per-direction budgets. */
  maxSteps: number;
  maxLengthRe: number;
}

/** Default stepFactor 0.1: measured footpoint error 2.6e-4° (< 0.001°) for L 2–12 in a dipole, ~200 evaluations a line (test/physics/trace/tracer.test.ts). */
const DEFAULT_TRACE_OPTIONS: Readonly<TraceOptions> = Object.freeze({
  altKm: 110,
  ellipsoid: true,
  stepFactor: 0.1,
  hMinRe: 1e-3,
  hMaxRe: 2.0,
  rMaxRe: 100,
  maxSteps: 4000,
  maxLengthRe: 1000,
});

/**
 * Running totals of this thread's traces and field evaluations (all tracers; never reset here):
 * machine-independent cost figures for benchmarks and profiles (bench/batch.ts reads them).
 */
export const traceTotals = { traces: 0, evals: 0 };

/** A seed this close to the stop surface (RE) is on it: the footpoint precision of the landing. */
const SURFACE_TOL_RE = 1e-10;

/**
 * Preallocated tracer. One instance per thread; not re-entrant. Points of the
 * last trace are in `points` (xyz GSM, RE) from index 0 to 3·nPoints, ordered
 * from the south-going end (−B) to the north-going end (+B).
 */
export class Tracer {
  readonly capacity: number;
  /** Points of the last line, GSM RE. */
  readonly points: Float64Array;
  /** |B| at each point, nT. */
  readonly bMag: Float64Array;
  nPoints = 0;
  /** Point index of the −B (usually southern) and +B (usually northern) footpoints, or −1. */
  footMinus = -1;
  footPlus = -1;
  /** Index of the seed in points. */
  seedIndex = 0;
  evals = 0;
  /** End code of the −B (south-going) and +B (north-going) halves. */
  endMinus = END_BUDGET;
  endPlus = END_BUDGET;
  lengthRe = 0;

  private readonly half: Float64Array; // scratch for one direction
  private readonly halfB: Float64Array;
  private readonly b = new Float64Array(3);
  private opts: TraceOptions;
  private readonly field: TraceField;
  private rStopSphere = 1;
  /** Largest stop radius over the globe (RE), and the radius beyond which the stop surface cannot matter this step. */
  private rStopMax = 1;
  private rStopFar = 1;
  /** Result of the last half-trace (no record allocated per half). */
  private halfN = 0;
  private halfLength = 0;

  constructor(field: TraceField, options: Partial<TraceOptions> = {}) {
    this.field = field;
    this.opts = { ...DEFAULT_TRACE_OPTIONS, ...options };
    this.capacity = this.opts.maxSteps + 2;
    this.points = new Float64Array(this.capacity * 6);
    this.bMag = new Float64Array(this.capacity * 2);
    this.half = new Float64Array(this.capacity * 3);
    this.halfB = new Float64Array(this.capacity);
    this.setOptions(options);
  }

  /** Change options (budgets cannot exceed the capacity fixed at construction). */
  setOptions(options: Partial<TraceOptions>): void {
    const o = { ...this.opts, ...options };
    o.maxSteps = Math.min(o.maxSteps, this.capacity - 2);
    this.opts = o;
    this.rStopSphere = 1 + o.altKm / RE_KM;
    // The ellipsoid's radius is largest on the equator (a > b).
    this.rStopMax = o.ellipsoid ? ellipsoidRadiusRe(0, o.altKm) : this.rStopSphere;
    // Beyond rStopMax + hMax neither a crossing within one step nor the near-surface step cap can happen.
    this.rStopFar = this.rStopMax + o.hMaxRe + 1e-9;
  }

  get options(): Readonly<TraceOptions> {
    return this.opts;
  }

  /** Stop radius (RE) at a GSM point. */
  private stopRadius(x: number, y: number, z: number): number {
    if (!this.opts.ellipsoid) return this.rStopSphere;
    const g = this.field.geoZRow;
    const r = Math.sqrt(x * x + y * y + z * z);
    const sinLat = (g[0] * x + g[1] * y + g[2] * z) / r;
    return ellipsoidRadiusRe(sinLat, this.opts.altKm);
  }

  /**
   * Trace the whole line through (x, y, z) GSM, both directions. Returns the
   * line type code (LINE_CLOSED / LINE_OPEN / LINE_UNRESOLVED).
   *
   * returnStopRe > 0 makes it a classification trace: a half that has been above that radius
   * and comes back inward below it ends there (END_RETURNED, counted as reaching the surface,
   * no footpoint recorded). The caller vouches that every line heading inward below that radius
   * reaches the stop surface (the main field dominates there: `classificationReturnRe`), so the
   * line type and every point up to there are those of the full trace.
   */
  trace(x: number, y: number, z: number, returnStopRe = 0): number {
    this.evals = 0;
    const cap = this.capacity;
    this.returnStopRe = returnStopRe;
    // −B half: stored reversed at the front of points.
    const endM = this.traceHalf(x, y, z, -1);
    this.endMinus = endM;
    const upM = this.upIndex;
    const nm = this.halfN;
    const pts = this.points;
    const bm = this.bMag;
    const half = this.half;
    const hb = this.halfB;
    // Reverse into points[0 .. nm-1]; the seed is half[0].
    for (let i = 0; i < nm; i++) {
      const j = nm - 1 - i;
      pts[3 * i] = half[3 * j];
      pts[3 * i + 1] = half[3 * j + 1];
      pts[3 * i + 2] = half[3 * j + 2];
      bm[i] = hb[j];
    }
    let lengthRe = this.halfLength;
    const endP = this.traceHalf(x, y, z, 1);
    this.endPlus = endP;
    const upP = this.upIndex;
    const np = this.halfN;
    lengthRe += this.halfLength;
    // Append the +B half, skipping its seed when the −B half already holds it.
    const skip = nm > 0 && np > 0 ? 1 : 0;
    let n = nm;
    for (let i = skip; i < np && n < 2 * cap; i++, n++) {
      pts[3 * n] = half[3 * i];
      pts[3 * n + 1] = half[3 * i + 1];
      pts[3 * n + 2] = half[3 * i + 2];
      bm[n] = hb[i];
    }
    this.seedIndex = nm > 0 ? nm - 1 : 0;
    this.nPoints = n;
    // Footpoint indices: the −B end is point 0, the +B end is point n−1; a
    // start below the surface takes the upward crossing of the other half.
    this.footMinus = endM === END_SURFACE ? 0 : endM === END_START_BELOW && upP >= 0 ? nm + upP - skip : -1;
    this.footPlus = endP === END_SURFACE ? n - 1 : endP === END_START_BELOW && upM >= 0 ? nm - 1 - upM : -1;
    this.lengthRe = lengthRe;
    traceTotals.traces++;
    traceTotals.evals += this.evals;
    return classify(endM, endP);
  }

  /**
   * One direction (sign +1 along B, −1 against) into this.half. Returns the
   * end state; the point count and length are left in halfN and halfLength,
   * the index of an upward surface crossing in upIndex. Allocation-free.
   */
  private traceHalf(x0: number, y0: number, z0: number, sign: number): number {
    const o = this.opts;
    const f = this.field;
    const b = this.b;
    const out = this.half;
    const outB = this.halfB;
    const maxSteps = o.maxSteps;
    const stepFactor = o.stepFactor, hMin = o.hMinRe, hMax = o.hMaxRe;
    const rMax = o.rMaxRe, maxLength = o.maxLengthRe;
    const rFar = this.rStopFar, rStopMax = this.rStopMax;
    let x = x0, y = y0, z = z0;
    let evals = 0;
    let length = 0;
    let n = 0;
    this.upIndex = -1;
    this.halfLength = 0;
    // Start state: below the stop surface?
    let r = Math.sqrt(x * x + y * y + z * z);
    let rStop = this.stopRadius(x, y, z);
    f.evaluate(b, x, y, z);
    evals++;
    let bx = b[0], by = b[1], bz = b[2];
    let bmag = Math.sqrt(bx * bx + by * by + bz * bz);
    out[0] = x; out[1] = y; out[2] = z; outB[0] = bmag; n = 1;
    this.halfN = 1;
    if (!(bmag > 0)) {
      this.evals += evals;
      return END_BUDGET;
    }
    // A seed on the surface (to the footpoint precision) is its own footpoint.
    const onSurface = Math.abs(r - rStop) <= SURFACE_TOL_RE;
    let below = r <= rStop + 1e-12 || onSurface;
    // The first step from a seed on the surface going up is not capped by its (zero) height.
    let firstCapped = 0;
    if (below) {
      const drds = (sign * (x * bx + y * by + z * bz)) / (bmag * r);
      if (drds <= 0) {
        this.evals += evals;
        return END_START_BELOW;
      }
      if (onSurface) {
        this.upIndex = 0;
        below = false;
        firstCapped = 1;
      }
    }
    let end = END_BUDGET;
    const bMin = f.boundaryMinRe;
    const xNeutral = f.neutralLineXRe ?? -Infinity;
    // Classification trace: armed once the half has been above the return radius.
    const rReturn = this.returnStopRe;
    let returnArmed = false;
    for (let step = 0; step < maxSteps; step++) {
      let h = stepFactor * r;
      if (h < hMin) h = hMin;
      else if (h > hMax) h = hMax;
      // Keep the step from jumping deep below the surface near the footpoint.
      if (!below && r - rStop < h && r > rStop && step >= firstCapped) {
        const hs = 2 * (r - rStop) + hMin;
        if (hs < h) h = hs;
      }
      // One RK4 step (stage 1 uses the field already at (x, y, z)).
      evals += this.rk4Step(x, y, z, bx, by, bz, bmag, sign, h);
      const nx = this.stepEndX, ny = this.stepEndY, nz = this.stepEndZ;
      const nr = Math.sqrt(nx * nx + ny * ny + nz * nz);
      // Far from the surface its exact radius cannot matter (see rStopFar).
      const nStop = nr < rFar ? this.stopRadius(nx, ny, nz) : rStopMax;
      // The field at the step end: the next step's first stage, and the Hermite curve's end tangent.
      f.evaluate(b, nx, ny, nz);
      evals++;
      const ebx = b[0], eby = b[1], ebz = b[2];
      const ebmag = Math.sqrt(ebx * ebx + eby * eby + ebz * ebz);
      if (below ? nr > nStop : nr <= nStop) {
        // Crossed the surface (down: the footpoint; up: a seed below it): land on the step's Hermite curve.
        evals += this.landOnSurface(x, y, z, bx, by, bz, bmag, nx, ny, nz, ebx, eby, ebz, ebmag, sign, h, r - rStop);
        if (!below) {
          this.storeStepEnd(n++);
          length += this.stepEndH;
          end = END_SURFACE;
          break;
        }
        this.upIndex = n;
        this.storeStepEnd(n++);
        below = false;
      }
      x = nx; y = ny; z = nz; r = nr; rStop = nStop;
      length += h;
      bx = ebx; by = eby; bz = ebz; bmag = ebmag;
      out[3 * n] = x; out[3 * n + 1] = y; out[3 * n + 2] = z; outB[n] = bmag;
      n++;
      if (rReturn > 0) {
        if (returnArmed) {
          if (r < rReturn) { end = END_RETURNED; break; }
        } else if (r > rReturn) returnArmed = true;
      }
      if (r >= bMin && !f.isInside(x, y, z)) { end = END_MAGNETOPAUSE; break; }
      if (r > rMax || x < xNeutral) { end = END_DISTANCE; break; }
      if (length > maxLength) { end = END_BUDGET; break; }
      if (!(bmag > 0)) { end = END_BUDGET; break; }
    }
    this.evals += evals;
    this.halfN = n;
    this.halfLength = length;
    return end;
  }

  /** Index (in the half) of the upward surface crossing of the last half-trace, or −1. */
  private upIndex = -1;
  /** Return radius of the current classification trace, RE (0: a full trace). */
  private returnStopRe = 0;
  // End of the last rk4Step (scratch, not re-entrant); after landOnSurface, the landing
  // point, |B| there (stepEndB) and the arc length from the step's start (stepEndH).
  private stepEndX = 0;
  private stepEndY = 0;
  private stepEndZ = 0;
  private stepEndB = 0;
  private stepEndH = 0;
  private readonly lb = new Float64Array(3);

  /**
   * Landing on the stop surface within a finished step of length h from P0 = (x, y, z)
   * (field bx, by, bz) to P1 = (ex, ey, ez) (field ebx, eby, ebz): the step's cubic Hermite
   * curve p(s), s ∈ [0, 1], matches both points and both unit tangents (times h), so it
   * follows the line to O(h⁴) with s·h its arc length to the same order (Hermite
   * interpolation of an arc-length-parameterised curve). Secant iteration, kept inside the
   * bracket (bisection when a secant step leaves it), on g(s) = |p(s)| − rStop(p(s)); g0 = g(0)
   * and g(1) have opposite signs. No field evaluations but one at the landed point. Leaves the
   * point in stepEnd{X,Y,Z}, |B| there in stepEndB and s·h in stepEndH; returns 1 (evaluations).
   */
  private landOnSurface(
    x: number, y: number, z: number, bx: number, by: number, bz: number, bmag: number,
    ex: number, ey: number, ez: number, ebx: number, eby: number, ebz: number, ebmag: number,
    sign: number, h: number, g0: number,
  ): number {
    // Tangents scaled by the step length (dp/ds); a vanished end field falls back to the start tangent.
    const m0 = (sign * h) / bmag;
    const t0x = bx * m0, t0y = by * m0, t0z = bz * m0;
    let t1x = t0x, t1y = t0y, t1z = t0z;
    if (ebmag > 0) {
      const m1 = (sign * h) / ebmag;
      t1x = ebx * m1; t1y = eby * m1; t1z = ebz * m1;
    }
    const er = Math.sqrt(ex * ex + ey * ey + ez * ez);
    const g1 = er - this.stopRadius(ex, ey, ez);
    let lo = 0, glo = g0, hi = 1, ghi = g1;
    let s = g0 / (g0 - g1);
    if (!(s > 0 && s < 1)) s = 0.5;
    let px = x, py = y, pz = z;
    for (let it = 0; it < 60; it++) {
      const s2 = s * s, s3 = s2 * s;
      const h00 = 2 * s3 - 3 * s2 + 1, h10 = s3 - 2 * s2 + s, h01 = 1 - h00, h11 = s3 - s2;
      px = h00 * x + h10 * t0x + h01 * ex + h11 * t1x;
      py = h00 * y + h10 * t0y + h01 * ey + h11 * t1y;
      pz = h00 * z + h10 * t0z + h01 * ez + h11 * t1z;
      const g = Math.sqrt(px * px + py * py + pz * pz) - this.stopRadius(px, py, pz);
      if (Math.abs(g) < 1e-11 || hi - lo < 1e-15) break;
      if ((g > 0) === (glo > 0)) { lo = s; glo = g; } else { hi = s; ghi = g; }
      // Secant within the bracket (the function is near-linear at this scale).
      let sn = lo + (hi - lo) * (glo / (glo - ghi));
      if (!(sn > lo && sn < hi)) sn = 0.5 * (lo + hi);
      s = sn;
    }
    this.stepEndX = px; this.stepEndY = py; this.stepEndZ = pz;
    this.stepEndH = s * h;
    const lb = this.lb;
    this.field.evaluate(lb, px, py, pz);
    this.stepEndB = Math.sqrt(lb[0] * lb[0] + lb[1] * lb[1] + lb[2] * lb[2]);
    return 1;
  }

  /** Store the landing point (stepEnd{X,Y,Z}, stepEndB) as point n of the half. */
  private storeStepEnd(n: number): void {
    const out = this.half;
    out[3 * n] = this.stepEndX; out[3 * n + 1] = this.stepEndY; out[3 * n + 2] = this.stepEndZ;
    this.halfB[n] = this.stepEndB;
  }

  /** One RK4 step of length t from (x, y, z) (field bx, by, bz there) into stepEnd{X,Y,Z}; 3 evaluations. */
  private rk4Step(x: number, y: number, z: number, bx: number, by: number, bz: number, bmag: number, sign: number, t: number): number {
    const f = this.field;
    const b = this.lb;
    const s = sign / bmag;
    const k1x = bx * s, k1y = by * s, k1z = bz * s;
    const hh = 0.5 * t;
    f.evaluate(b, x + hh * k1x, y + hh * k1y, z + hh * k1z);
    let m = sign / Math.sqrt(b[0] * b[0] + b[1] * b[1] + b[2] * b[2]);
    const k2x = b[0] * m, k2y = b[1] * m, k2z = b[2] * m;
    f.evaluate(b, x + hh * k2x, y + hh * k2y, z + hh * k2z);
    m = sign / Math.sqrt(b[0] * b[0] + b[1] * b[1] + b[2] * b[2]);
    const k3x = b[0] * m, k3y = b[1] * m, k3z = b[2] * m;
    f.evaluate(b, x + t * k3x, y + t * k3y, z + t * k3z);
    m = sign / Math.sqrt(b[0] * b[0] + b[1] * b[1] + b[2] * b[2]);
    const k4x = b[0] * m, k4y = b[1] * m, k4z = b[2] * m;
    const t6 = t / 6;
    this.stepEndX = x + t6 * (k1x + 2 * k2x + 2 * k3x + k4x);
    this.stepEndY = y + t6 * (k1y + 2 * k2y + 2 * k3y + k4y);
    this.stepEndZ = z + t6 * (k1z + 2 * k2z + 2 * k3z + k4z);
    return 3;
  }
}
