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
 *    located by secant iteration (kept inside a bracket) on the length of a
 *    partial RK4 step, so the footpoint lies on the surface to 1e-10 RE, not at
 *    the last full step;
 *  - open: the line leaves through the magnetopause, passes rMaxRe, or reaches tailward of
 *    the field's distant neutral line (`neutralLineXRe`);
 *  - unresolved: the step or length budget is exhausted (reported, never dropped).
 */
import { ellipsoidRadiusRe } from '../frames/geodesy';
import { RE_KM } from '../constants';
import { END_SURFACE, END_MAGNETOPAUSE, END_DISTANCE, END_BUDGET, END_START_BELOW, classify } from './line-type';

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

/** Result of one half-trace (one direction from the seed). */
interface HalfTrace {
  end: number;
  nPoints: number;
  lengthRe: number;
  evals: number;
}

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
   */
  trace(x: number, y: number, z: number): number {
    this.evals = 0;
    const cap = this.capacity;
    // −B half: stored reversed at the front of points.
    const m = this.traceHalf(x, y, z, -1);
    this.endMinus = m.end;
    const upM = this.upIndex;
    const nm = m.nPoints;
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
    let lengthRe = m.lengthRe;
    const p = this.traceHalf(x, y, z, 1);
    this.endPlus = p.end;
    const upP = this.upIndex;
    lengthRe += p.lengthRe;
    // Append the +B half, skipping its seed when the −B half already holds it.
    const skip = nm > 0 && p.nPoints > 0 ? 1 : 0;
    let n = nm;
    for (let i = skip; i < p.nPoints && n < 2 * cap; i++, n++) {
      pts[3 * n] = half[3 * i];
      pts[3 * n + 1] = half[3 * i + 1];
      pts[3 * n + 2] = half[3 * i + 2];
      bm[n] = hb[i];
    }
    this.seedIndex = nm > 0 ? nm - 1 : 0;
    this.nPoints = n;
    // Footpoint indices: the −B end is point 0, the +B end is point n−1; a
    // start below the surface takes the upward crossing of the other half.
    this.footMinus = m.end === END_SURFACE ? 0 : m.end === END_START_BELOW && upP >= 0 ? nm + upP - skip : -1;
    this.footPlus = p.end === END_SURFACE ? n - 1 : p.end === END_START_BELOW && upM >= 0 ? nm - 1 - upM : -1;
    this.lengthRe = lengthRe;
    return classify(m.end, p.end);
  }

  /**
   * One direction (sign +1 along B, −1 against) into this.half. Returns the
   * end state. Allocation-free apart from the returned record.
   */
  private traceHalf(x0: number, y0: number, z0: number, sign: number): HalfTrace {
    const o = this.opts;
    const f = this.field;
    const b = this.b;
    const out = this.half;
    const outB = this.halfB;
    const maxSteps = o.maxSteps;
    let x = x0, y = y0, z = z0;
    let evals = 0;
    let length = 0;
    let n = 0;
    // Start state: below the stop surface?
    let r = Math.sqrt(x * x + y * y + z * z);
    let rStop = this.stopRadius(x, y, z);
    f.evaluate(b, x, y, z);
    evals++;
    let bx = b[0], by = b[1], bz = b[2];
    let bmag = Math.sqrt(bx * bx + by * by + bz * bz);
    out[0] = x; out[1] = y; out[2] = z; outB[0] = bmag; n = 1;
    if (!(bmag > 0)) {
      this.evals += evals;
      return { end: END_BUDGET, nPoints: n, lengthRe: 0, evals };
    }
    // dr/ds along the chosen direction.
    let below = r <= rStop + 1e-12;
    if (below) {
      const drds = (sign * (x * bx + y * by + z * bz)) / (bmag * r);
      if (drds <= 0) {
        this.evals += evals;
        return { end: END_START_BELOW, nPoints: 1, lengthRe: 0, evals };
      }
    }
    let end = END_BUDGET;
    this.upIndex = -1;
    const bMin = f.boundaryMinRe;
    const xNeutral = f.neutralLineXRe ?? -Infinity;
    for (let step = 0; step < maxSteps; step++) {
      let h = o.stepFactor * r;
      if (h < o.hMinRe) h = o.hMinRe;
      else if (h > o.hMaxRe) h = o.hMaxRe;
      // Keep the step from jumping deep below the surface near the footpoint.
      if (!below && r - rStop < h && r > rStop) {
        const hs = 2 * (r - rStop) + o.hMinRe;
        if (hs < h) h = hs;
      }
      // One RK4 step (stage 1 uses the field already at (x, y, z)).
      evals += this.rk4Step(x, y, z, bx, by, bz, bmag, sign, h);
      const nx = this.stepEndX, ny = this.stepEndY, nz = this.stepEndZ;
      const nr = Math.sqrt(nx * nx + ny * ny + nz * nz);
      const nStop = this.stopRadius(nx, ny, nz);
      if (nr <= nStop && !below) {
        // Crossed the surface going down: find the partial step that lands on it.
        evals += this.landOnSurface(x, y, z, bx, by, bz, bmag, sign, h, r - rStop, nr - nStop);
        this.storeStepEnd(n++);
        length += this.stepEndH;
        end = END_SURFACE;
        break;
      }
      if (below && nr > nStop) {
        // Crossed the surface going up (start below it): record the exact near footpoint.
        evals += this.landOnSurface(x, y, z, bx, by, bz, bmag, sign, h, r - rStop, nr - nStop);
        this.upIndex = n;
        this.storeStepEnd(n++);
        below = false;
      }
      x = nx; y = ny; z = nz; r = nr; rStop = nStop;
      length += h;
      f.evaluate(b, x, y, z);
      evals++;
      bx = b[0]; by = b[1]; bz = b[2];
      bmag = Math.sqrt(bx * bx + by * by + bz * bz);
      out[3 * n] = x; out[3 * n + 1] = y; out[3 * n + 2] = z; outB[n] = bmag;
      n++;
      if (r >= bMin && !f.isInside(x, y, z)) { end = END_MAGNETOPAUSE; break; }
      if (r > o.rMaxRe || x < xNeutral) { end = END_DISTANCE; break; }
      if (length > o.maxLengthRe) { end = END_BUDGET; break; }
      if (!(bmag > 0)) { end = END_BUDGET; break; }
    }
    this.evals += evals;
    return { end, nPoints: n, lengthRe: length, evals };
  }

  /** Index (in the half) of the upward surface crossing of the last half-trace, or −1. */
  private upIndex = -1;
  // End of the last rk4Step (scratch, not re-entrant); after landOnSurface, the landing
  // point, |B| there (stepEndB) and the partial step length (stepEndH).
  private stepEndX = 0;
  private stepEndY = 0;
  private stepEndZ = 0;
  private stepEndB = 0;
  private stepEndH = 0;
  private readonly lb = new Float64Array(3);

  /**
   * Secant iteration, kept inside the bracket (bisection when a secant step leaves it),
   * on the partial step length t ∈ (0, h] so that one RK4 step of length t from
   * (x, y, z) ends on the stop surface. g(t) = r(t) − rStop(t); g0 = g(0) and
   * gh = g(h) have opposite signs. Leaves the landing point in stepEnd{X,Y,Z},
   * |B| there in stepEndB and t in stepEndH. Returns the evaluations used.
   */
  private landOnSurface(x: number, y: number, z: number, bx: number, by: number, bz: number, bmag: number, sign: number, h: number, g0: number, gh: number): number {
    let evals = 0;
    let lo = 0, glo = g0, hi = h, ghi = gh;
    let t = h * (g0 / (g0 - gh));
    for (let it = 0; it < 30; it++) {
      evals += this.rk4Step(x, y, z, bx, by, bz, bmag, sign, t);
      const r = Math.sqrt(this.stepEndX * this.stepEndX + this.stepEndY * this.stepEndY + this.stepEndZ * this.stepEndZ);
      const g = r - this.stopRadius(this.stepEndX, this.stepEndY, this.stepEndZ);
      if (Math.abs(g) < 1e-11 || hi - lo < 1e-13) break;
      if ((g > 0) === (glo > 0)) { lo = t; glo = g; } else { hi = t; ghi = g; }
      // Secant within the bracket (the function is near-linear at this scale).
      let tn = lo + (hi - lo) * (glo / (glo - ghi));
      if (!(tn > lo && tn < hi)) tn = 0.5 * (lo + hi);
      t = tn;
    }
    this.stepEndH = t;
    const lb = this.lb;
    this.field.evaluate(lb, this.stepEndX, this.stepEndY, this.stepEndZ);
    evals++;
    this.stepEndB = Math.sqrt(lb[0] * lb[0] + lb[1] * lb[1] + lb[2] * lb[2]);
    return evals;
  }

  /** Store the landing point (stepEnd{X,Y,Z}, stepEndB) as point n of the half. */
  private storeStepEnd(n: number): void {
    const out = this.half;
    out[3 * n] = this.stepEndX; out[3 * n + 1] = this.stepEndY; out[3 * n + 2] = this.stepEndZ;
    this.halfB[n] = this.stepEndB;
  }

  /** One RK4 step of length t from (x, y, z) (field bx, by, bz there) into stepEnd{X,Y,Z}; 3 evaluations. Used for every step and for the partial landing steps. */
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
