/**
 * Section "tracer": tracing speed and accuracy on one core.
 *  - tracesPerSecond / evalsPerTrace / overheadRatio: closed lines seeded on the
 *    SM equator at L 2–12 (8 MLTs) of the default bench model, default options;
 *  - footpointErrorDeg: pure tilt-0 dipole, sphere at 110 km, against the
 *    analytic footpoint cos²λ = (1 + h/RE)/L (references §1, derived);
 *  - odexSpeedRatio: the same ODE dr/ds = ±B/|B| integrated by odex (Gragg–
 *    Bulirsch–Stoer extrapolation, Hairer & Wanner's ODEX) to the analytic arc
 *    length of each half-line (references §1), tolerances tightened until its
 *    footpoint error ≤ ours; wall time odex / ours;
 *  - sceneMs: one scene recompute on a freshly prepared model: 200 lines
 *    (8 MLTs × 25 latitudes) plus both hemispheres' boundaries at 1 h MLT.
 */
import { createRequire } from 'node:module';
import { prepareModel, type PreparedModel } from '../src/physics/field/model';
import { Tracer } from '../src/physics/trace/tracer';
import { LINE_CLOSED } from '../src/physics/trace/line-type';
import { applyMat3, applyMat3T } from '../src/physics/frames/rotations';
import { gsmAtMagneticLatMlt } from '../src/physics/trace/footpoint';
import { makeTracer, traceGsm, ovalBoundaries, mltGrid } from '../src/physics/mapping';
import { RE_KM, DEG_PER_RAD } from '../src/physics/constants';
import { BENCH_CONDITIONS, BENCH_CONDITIONS_TAIL, BENCH_CONDITIONS_STORM } from './evaluation';
import { type BenchSection, type Figure, type RunOptions, consume, cpuMs, measure, median, now } from './lib';

// tsconfig maps the bare name 'odex' to its local type declaration (test/types/odex.d.ts),
// and tsx follows that mapping at run time, so load the package's entry file by path.
const { Solver } = createRequire(import.meta.url)('odex/src/odex.js') as typeof import('odex');

const ALT_KM = 110;
const MLTS = [0, 3, 6, 9, 12, 15, 18, 21];

/** GSM seeds (xyz interleaved) on the SM equator at r = L for each L and MLT. */
function equatorSeeds(model: PreparedModel, ls: number[], mlts: number[]): Float64Array {
  const out = new Float64Array(3 * ls.length * mlts.length);
  const v = new Float64Array(3);
  let k = 0;
  for (const mlt of mlts) {
    const phi = ((mlt - 12) * 15 * Math.PI) / 180; // MLT = 12 h + φ_SM/15° (common practice)
    for (const L of ls) {
      applyMat3T(v, model.frames.smFromGsm, L * Math.cos(phi), L * Math.sin(phi), 0);
      out[k++] = v[0]; out[k++] = v[1]; out[k++] = v[2];
    }
  }
  return out;
}

function range(a: number, b: number, step: number): number[] {
  const out: number[] = [];
  for (let i = 0; a + i * step <= b + 1e-9; i++) out.push(a + i * step);
  return out;
}

/** Analytic footpoint latitude (rad) of the dipole line L at height h on the sphere: cos²λ = (1 + h/RE)/L (references §1). */
function analyticFootLat(L: number, altKm: number): number {
  return Math.acos(Math.sqrt((1 + altKm / RE_KM) / L));
}

/** Dipole arc length (RE) from the equator to latitude λ: L/(2√3)·[x√(1+x²) + asinh x], x = √3 sin λ (references §1). */
function arcLength(L: number, latRad: number): number {
  const x = Math.sqrt(3) * Math.sin(latRad);
  return (L / (2 * Math.sqrt(3))) * (x * Math.sqrt(1 + x * x) + Math.asinh(x));
}

/** Trace all seeds once; returns the total wall time (ms). */
function traceAll(t: Tracer, seeds: Float64Array): number {
  const n = seeds.length / 3;
  let acc = 0;
  const t0 = now();
  for (let i = 0; i < n; i++) acc += t.trace(seeds[3 * i], seeds[3 * i + 1], seeds[3 * i + 2]) + t.nPoints;
  const dt = now() - t0;
  consume(acc);
  return dt;
}

/** Max |SM latitude of each footpoint − analytic| (deg) over the seeds of a tilt-0 dipole; L from |seed|. */
function dipoleFootError(model: PreparedModel, t: Tracer, seeds: Float64Array): { maxDeg: number; perL: Record<string, number> } {
  const v = new Float64Array(3);
  const n = seeds.length / 3;
  let maxDeg = 0;
  const perL: Record<string, number> = {};
  for (let i = 0; i < n; i++) {
    const x = seeds[3 * i], y = seeds[3 * i + 1], z = seeds[3 * i + 2];
    const L = Math.hypot(x, y, z);
    const type = t.trace(x, y, z);
    const lam = analyticFootLat(L, ALT_KM);
    let err = type === LINE_CLOSED ? 0 : Infinity;
    for (const idx of [t.footMinus, t.footPlus]) {
      if (idx < 0) { err = Infinity; continue; }
      const p = t.points;
      applyMat3(v, model.frames.smFromGsm, p[3 * idx], p[3 * idx + 1], p[3 * idx + 2]);
      const lat = Math.asin(v[2] / Math.hypot(v[0], v[1], v[2]));
      err = Math.max(err, Math.abs(Math.abs(lat) - lam) * DEG_PER_RAD);
    }
    const key = L.toFixed(2);
    perL[key] = Math.max(perL[key] ?? 0, err);
    maxDeg = Math.max(maxDeg, err);
  }
  return { maxDeg, perL };
}

interface OdexRun { maxErrDeg: number; maxRadialErrRe: number; evals: number; ms: number; cpuMs: number }

/**
 * odex on dr/ds = sign·B/|B| of the same model, each half-line integrated from
 * the equatorial seed to its analytic arc length; error = |lat_end| − λ_analytic.
 */
function odexRun(model: PreparedModel, seeds: Float64Array, tol: number): OdexRun {
  const b = new Float64Array(3);
  const derivative = (sign: number) => (_s: number, y: number[]): number[] => {
    model.evaluate(b, y[0], y[1], y[2]);
    const m = sign / Math.sqrt(b[0] * b[0] + b[1] * b[1] + b[2] * b[2]);
    return [b[0] * m, b[1] * m, b[2] * m];
  };
  const fPlus = derivative(1), fMinus = derivative(-1);
  const solver = new Solver(3);
  solver.absoluteTolerance = tol;
  solver.relativeTolerance = tol;
  solver.maxSteps = 100_000;
  const v = new Float64Array(3);
  const rStop = 1 + ALT_KM / RE_KM;
  const n = seeds.length / 3;
  let maxErrDeg = 0, maxRadialErrRe = 0, evals = 0;
  const c0 = cpuMs();
  const t0 = now();
  for (let i = 0; i < n; i++) {
    const y0 = [seeds[3 * i], seeds[3 * i + 1], seeds[3 * i + 2]];
    const L = Math.hypot(y0[0], y0[1], y0[2]);
    const lam = analyticFootLat(L, ALT_KM);
    const sHalf = arcLength(L, lam);
    for (const f of [fMinus, fPlus]) {
      const res = solver.solve(f, 0, y0, sHalf);
      evals += res.nEval;
      const [x, y, z] = res.y;
      applyMat3(v, model.frames.smFromGsm, x, y, z);
      const r = Math.hypot(v[0], v[1], v[2]);
      const lat = Math.asin(v[2] / r);
      maxErrDeg = Math.max(maxErrDeg, Math.abs(Math.abs(lat) - lam) * DEG_PER_RAD);
      maxRadialErrRe = Math.max(maxRadialErrRe, Math.abs(r - rStop));
    }
  }
  const ms = now() - t0;
  return { maxErrDeg, maxRadialErrRe, evals, ms, cpuMs: cpuMs() - c0 };
}

interface Speed {
  nLines: number;
  nSeeds: number;
  tracesPerSecond: number;
  tracesPerCpuSecond: number;
  evalsPerTrace: number;
  evalNsOnPath: number;
  overheadRatio: number;
  overheadRatioCpu: number;
}

/** Closed equatorial lines L 2–12 × 8 MLT of one condition: speed, evaluations and overhead. */
function tracingSpeed(conditions: Parameters<typeof prepareModel>[0], ls: number[], reps: number): Speed {
  const model = prepareModel(conditions);
  const tracer = new Tracer(model);
  const all = equatorSeeds(model, ls, MLTS);
  const kept: number[] = [];
  let pathPts = 0;
  for (let i = 0; i < all.length / 3; i++) {
    if (tracer.trace(all[3 * i], all[3 * i + 1], all[3 * i + 2]) === LINE_CLOSED) {
      kept.push(all[3 * i], all[3 * i + 1], all[3 * i + 2]);
      pathPts += tracer.nPoints;
    }
  }
  const seeds = Float64Array.from(kept);
  const nLines = seeds.length / 3;
  // Points along the traced lines, for the evaluation cost where the tracer actually evaluates.
  const path = new Float64Array(3 * pathPts);
  let evalsTotal = 0;
  let k = 0;
  for (let i = 0; i < nLines; i++) {
    tracer.trace(seeds[3 * i], seeds[3 * i + 1], seeds[3 * i + 2]);
    evalsTotal += tracer.evals;
    path.set(tracer.points.subarray(0, 3 * tracer.nPoints), k);
    k += 3 * tracer.nPoints;
  }
  const evalsPerTrace = evalsTotal / nLines;
  const traceM = measure(() => void traceAll(tracer, seeds), reps, 3);
  const out = new Float64Array(3);
  const pathEval = measure(() => {
    let acc = 0;
    for (let rep = 0; rep < 10; rep++) {
      for (let i = 0; i < pathPts; i++) {
        model.evaluate(out, path[3 * i], path[3 * i + 1], path[3 * i + 2]);
        acc += out[0];
      }
    }
    consume(acc);
  }, reps, 3);
  const evalNsOnPath = (pathEval.wallMs * 1e6) / (10 * pathPts);
  const evalCpuNs = (pathEval.cpuMs * 1e6) / (10 * pathPts);
  return {
    nLines,
    nSeeds: all.length / 3,
    tracesPerSecond: nLines / (traceM.wallMs / 1000),
    tracesPerCpuSecond: nLines / (traceM.cpuMs / 1000),
    evalsPerTrace,
    evalNsOnPath,
    overheadRatio: (traceM.wallMs * 1e6) / nLines / (evalsPerTrace * evalNsOnPath),
    overheadRatioCpu: (traceM.cpuMs * 1e6) / nLines / (evalsPerTrace * evalCpuNs),
  };
}

interface Overhead {
  lines: number;
  evalsPerTrace: number;
  traceUsPerLine: number;
  evalNs: number;
  ratio: number;
  ratioCpu: number;
  /** Spread of the per-round ratios (min, max) over the interleaved rounds. */
  ratioMin: number;
  ratioMax: number;
  /** Fastest trace round ÷ fastest evaluation round (the least-disturbed rounds; robust on a busy machine). */
  ratioFastest: number;
}

/**
 * Tracer overhead in one process: the points the tracer evaluates are recorded once
 * (untimed, through a recording field), then rounds alternate a trace loop over the seeds
 * and an evaluation loop over exactly those recorded points, through the same model.evaluate,
 * so both loops run with the same JIT state and the same evaluations. Ratio = median trace
 * time / median evaluation time (1 = the tracer costs nothing beyond its evaluations).
 */
export function tracerOverhead(model: PreparedModel, seeds: Float64Array, rounds: number, field: import('../src/physics/trace/tracer').TraceField = model): Overhead {
  const n = seeds.length / 3;
  let rec: Float64Array = new Float64Array(3 * 4096);
  let nRec = 0;
  const recording = {
    isInside: field.isInside,
    neutralLineXRe: field.neutralLineXRe,
    boundaryMinRe: field.boundaryMinRe,
    geoZRow: field.geoZRow,
    evaluate(out: Float64Array, x: number, y: number, z: number): void {
      if (3 * nRec + 3 > rec.length) { const g = new Float64Array(2 * rec.length); g.set(rec); rec = g; }
      rec[3 * nRec] = x; rec[3 * nRec + 1] = y; rec[3 * nRec + 2] = z;
      nRec++;
      field.evaluate(out, x, y, z);
    },
  };
  const rt = new Tracer(recording);
  for (let i = 0; i < n; i++) rt.trace(seeds[3 * i], seeds[3 * i + 1], seeds[3 * i + 2]);
  const pts = rec.subarray(0, 3 * nRec);
  const tracer = new Tracer(field);
  const out = new Float64Array(3);
  const evaluate = field.evaluate;
  const evalPass = (): void => {
    let acc = 0;
    for (let i = 0; i < nRec; i++) {
      evaluate(out, pts[3 * i], pts[3 * i + 1], pts[3 * i + 2]);
      acc += out[0];
    }
    consume(acc);
  };
  const tracePass = (): void => void traceAll(tracer, seeds);
  const tw: number[] = [], tc: number[] = [], ew: number[] = [], ec: number[] = [], ratios: number[] = [];
  for (let r = 0; r < rounds + 3; r++) {
    const t = measure(tracePass, 1, 0);
    const e = measure(evalPass, 1, 0);
    if (r < 3) continue; // warm-up rounds
    tw.push(t.wallMs); tc.push(t.cpuMs); ew.push(e.wallMs); ec.push(e.cpuMs);
    ratios.push(t.wallMs / e.wallMs);
  }
  const trace = median(tw), ev = median(ew);
  return {
    lines: n,
    evalsPerTrace: nRec / n,
    traceUsPerLine: (trace * 1000) / n,
    evalNs: (ev * 1e6) / nRec,
    ratio: trace / ev,
    ratioCpu: median(tc) / Math.max(1e-9, median(ec)),
    ratioMin: Math.min(...ratios),
    ratioMax: Math.max(...ratios),
    ratioFastest: Math.min(...tw) / Math.min(...ew),
  };
}

/** Closed equatorial seeds L 2–12 × 8 MLT of a model (the lines tracingSpeed times). */
export function closedEquatorSeeds(model: PreparedModel, ls: number[]): Float64Array {
  const tracer = new Tracer(model);
  const all = equatorSeeds(model, ls, MLTS);
  const kept: number[] = [];
  for (let i = 0; i < all.length / 3; i++) {
    if (tracer.trace(all[3 * i], all[3 * i + 1], all[3 * i + 2]) === LINE_CLOSED) kept.push(all[3 * i], all[3 * i + 1], all[3 * i + 2]);
  }
  return Float64Array.from(kept);
}

interface Scene {
  ms: number; cpuMs: number; prepareMs: number; linesMs: number; boundariesMs: number; lines: number; boundaryTraces: number;
  /** The app's schedule on two cores (two engine workers): each prepares the model, traces half the MLTs' lines and one hemisphere's boundaries; the longer half, ms. */
  twoWorkerMs: number;
}

/**
 * One scene recompute after a condition change: prepare a fresh model, trace
 * 200 lines (8 MLTs × 25 northern magnetic latitudes 55°–85°, from 110 km,
 * points copied out as the scene needs them) and both hemispheres' boundaries
 * at 1 h MLT steps. Median of reps after 2 warm-ups. twoWorkerMs times the two
 * halves one after the other in this thread (prepare + every other MLT's lines +
 * one hemisphere each) and takes the longer: the critical path when the app's two
 * engine workers run them on two free cores.
 */
export function sceneTime(conditions: Parameters<typeof prepareModel>[0], reps: number): Scene {
  const lats = range(0, 24, 1).map((i) => 55 + 1.25 * i);
  const mltHours = mltGrid(1);
  const p = new Float64Array(3);
  const runs: { total: number; cpu: number; prep: number; lines: number; bnd: number; split: number }[] = [];
  let lines = 0;
  const traceLines = (m: PreparedModel, t: Tracer, mlts: readonly number[]): number => {
    let n = 0;
    for (const mlt of mlts) {
      for (const lat of lats) {
        gsmAtMagneticLatMlt(p, m.frames, lat, mlt, ALT_KM, true);
        consume(traceGsm(m, t, p[0], p[1], p[2], true).lengthRe);
        n++;
      }
    }
    return n;
  };
  const half = (h: 0 | 1): number => {
    const t0 = now();
    const m = prepareModel(conditions);
    const t = makeTracer(m);
    traceLines(m, t, MLTS.filter((_, i) => i % 2 === h));
    consume(ovalBoundaries(m, t, [h === 0 ? 'north' : 'south'], mltHours).length);
    return now() - t0;
  };
  for (let rep = 0; rep < reps + 2; rep++) {
    const c0 = cpuMs();
    const t0 = now();
    const m = prepareModel(conditions);
    const t = makeTracer(m);
    const t1 = now();
    lines = traceLines(m, t, MLTS);
    const t2 = now();
    consume(ovalBoundaries(m, t, ['north', 'south'], mltHours).length);
    const t3 = now();
    const cpu = cpuMs() - c0;
    const split = Math.max(half(0), half(1));
    if (rep >= 2) runs.push({ total: t3 - t0, cpu, prep: t1 - t0, lines: t2 - t1, bnd: t3 - t2, split });
  }
  // How many traces the boundary searches take (separate, untimed pass).
  const m = prepareModel(conditions);
  const counting = new (class extends Tracer { count = 0; override trace(x: number, y: number, z: number): number { this.count++; return super.trace(x, y, z); } })(m);
  ovalBoundaries(m, counting, ['north', 'south'], mltHours);
  const med = (k: 'total' | 'cpu' | 'prep' | 'lines' | 'bnd' | 'split'): number => median(runs.map((r) => r[k]));
  return { ms: med('total'), cpuMs: med('cpu'), prepareMs: med('prep'), linesMs: med('lines'), boundariesMs: med('bnd'), lines, boundaryTraces: counting.count, twoWorkerMs: med('split') };
}

export function sceneNote(s: Scene, what: string): string {
  return `${what}: prepare ${s.prepareMs.toFixed(1)} + ${s.lines} lines ${s.linesMs.toFixed(1)} + boundaries (2 hemispheres × 24 MLT, ${s.boundaryTraces} traces) ${s.boundariesMs.toFixed(1)} ms`;
}

export const tracerSection: BenchSection = {
  name: 'tracer',
  title: 'Field-line tracer',
  parts: ['model', 'dipole', 'tail', 'storm', 'overhead'],
  run(o: RunOptions) {
    const reps = o.quick ? 3 : 7;
    const sceneReps = o.quick ? 3 : 7;
    const ls = range(2, 12, 0.25);
    const figures: Figure[] = [];
    const detail: Record<string, unknown> = {};

    // --- Speed through the model without the tail (dipole + compression + IMF) and a scene recompute.
    if (!o.part || o.part === 'model') {
      const sp = tracingSpeed(BENCH_CONDITIONS, ls, reps);
      o.log(`tracer: ${sp.nLines} of ${sp.nSeeds} equatorial seeds are closed (dipole + compression + IMF)`);
      const sc = sceneTime(BENCH_CONDITIONS, sceneReps);
      figures.push(
        { key: 'tracesPerSecond', value: sp.tracesPerSecond, cpuValue: sp.tracesPerCpuSecond, unit: 'lines/s', target: { op: '>=', value: 10_000, issue: 3 }, note: `${sp.nLines} closed lines, L 2–12 × 8 MLT, dipole + compression + IMF, one core` },
        { key: 'evalsPerTrace', value: sp.evalsPerTrace, unit: 'evals/line', note: 'same lines' },
        { key: 'sceneMs', value: sc.ms, cpuValue: sc.cpuMs, unit: 'ms', target: { op: '<=', value: 150, issue: 3 }, note: sceneNote(sc, 'dipole + compression + IMF') },
      );
      Object.assign(detail, { speed: sp, scene: sc });
    }

    // --- Accuracy and odex comparison in the pure tilt-0 dipole.
    if (!o.part || o.part === 'dipole') {
      const dip = prepareModel({ time: BENCH_CONDITIONS.time, internal: 'dipole', magnetopause: false, imfEfficiency: 0, tiltDeg: 0, tail: false });
      const dTracer = new Tracer(dip, { ellipsoid: false, altKm: ALT_KM });
      const dSeeds = equatorSeeds(dip, ls, [0, 6, 12, 18]);
      const acc = dipoleFootError(dip, dTracer, dSeeds);
      let dEvals = 0;
      for (let i = 0; i < dSeeds.length / 3; i++) { dTracer.trace(dSeeds[3 * i], dSeeds[3 * i + 1], dSeeds[3 * i + 2]); dEvals += dTracer.evals; }
      const oursDipole = measure(() => void traceAll(dTracer, dSeeds), reps, 3);
      const oursDipoleMs = oursDipole.wallMs;

      // Loosest tolerance on a 10^(1/4) ladder whose error is ≤ ours.
      const tols = range(0, 28, 1).map((i) => 1e-5 * 10 ** (-i / 4));
      const tried: { tol: number; errDeg: number }[] = [];
      let chosen: number | null = null;
      for (const tol of tols) {
        const r = odexRun(dip, dSeeds, tol);
        tried.push({ tol, errDeg: r.maxErrDeg });
        if (r.maxErrDeg <= acc.maxDeg) { chosen = tol; break; }
      }
      let odexMs = NaN, odexCpuMs = NaN, odexErr = NaN, odexEvalsPerTrace = NaN, odexRadial = NaN;
      if (chosen !== null) {
        odexRun(dip, dSeeds, chosen); // warm-up at the chosen tolerance
        const runs: OdexRun[] = [];
        for (let i = 0; i < (o.quick ? 1 : 5); i++) runs.push(odexRun(dip, dSeeds, chosen));
        odexMs = median(runs.map((r) => r.ms));
        odexCpuMs = median(runs.map((r) => r.cpuMs));
        odexErr = runs[0].maxErrDeg;
        odexRadial = runs[0].maxRadialErrRe;
        odexEvalsPerTrace = runs[0].evals / (dSeeds.length / 3);
      }
      o.log(`tracer: odex tolerance ${chosen?.toExponential(2) ?? 'none'} (tried ${tried.map((t) => `${t.tol.toExponential(1)}:${t.errDeg.toExponential(2)}°`).join(', ')})`);
      figures.push(
        { key: 'footpointErrorDeg', value: acc.maxDeg, unit: 'deg', target: { op: '<=', value: 0.001, issue: 3 }, note: 'tilt-0 dipole, 110 km sphere, max over L 2–12 and both ends' },
        { key: 'odexSpeedRatio', value: odexMs / oursDipoleMs, cpuValue: odexCpuMs / oursDipole.cpuMs, unit: '×', target: { op: '>=', value: 3, issue: 3 }, note: `odex ${odexMs.toFixed(1)} ms (tol ${chosen?.toExponential(2) ?? '—'}, ${odexEvalsPerTrace.toFixed(0)} evals/line) / ours ${oursDipoleMs.toFixed(1)} ms (${(dEvals / (dSeeds.length / 3)).toFixed(0)} evals/line), ${dSeeds.length / 3} lines` },
        { key: 'odexFootpointErrorDeg', value: odexErr, unit: 'deg', note: 'odex at the chosen tolerance (must be ≤ footpointErrorDeg)' },
      );
      detail.dipole = {
        lines: dSeeds.length / 3,
        oursMs: oursDipoleMs,
        oursEvalsPerTrace: dEvals / (dSeeds.length / 3),
        oursErrorDegPerL: acc.perL,
        odexTolerance: chosen,
        odexMs,
        odexEvalsPerTrace,
        odexRadialErrorRe: odexRadial,
        odexTried: tried,
      };
    }

    // --- The app default model (tail sheet on), for context.
    if (!o.part || o.part === 'tail') {
      const spTail = tracingSpeed(BENCH_CONDITIONS_TAIL, ls, reps);
      o.log(`tracer: ${spTail.nLines} of ${spTail.nSeeds} equatorial seeds are closed (with the tail)`);
      const scTail = sceneTime(BENCH_CONDITIONS_TAIL, sceneReps);
      figures.push(
        { key: 'tracesPerSecondWithTail', value: spTail.tracesPerSecond, cpuValue: spTail.tracesPerCpuSecond, unit: 'lines/s', note: `${spTail.nLines} closed lines, app default model (tail on), ${spTail.evalsPerTrace.toFixed(0)} evals/line, ${spTail.evalNsOnPath.toFixed(0)} ns/eval` },
        { key: 'sceneMsWithTail', value: scTail.ms, cpuValue: scTail.cpuMs, unit: 'ms', note: sceneNote(scTail, 'tail on') },
      );
      Object.assign(detail, { speedWithTail: spTail, sceneWithTail: scTail });
    }

    // --- Every term on, with a strong ring current (target: ≥ 10,000 closed traces/s on one core).
    if (!o.part || o.part === 'storm') {
      const sp = tracingSpeed(BENCH_CONDITIONS_STORM, ls, reps);
      o.log(`tracer: ${sp.nLines} of ${sp.nSeeds} equatorial seeds are closed (storm, ring current on)`);
      const sc = sceneTime(BENCH_CONDITIONS_STORM, sceneReps);
      figures.push(
        { key: 'tracesPerSecondWithRingCurrent', value: sp.tracesPerSecond, cpuValue: sp.tracesPerCpuSecond, unit: 'lines/s', target: { op: '>=', value: 10_000, issue: 10 }, note: `${sp.nLines} closed lines, dipole + compression + IMF + tail + ring current (storm index −120 nT), ${sp.evalsPerTrace.toFixed(0)} evals/line, ${sp.evalNsOnPath.toFixed(0)} ns/eval` },
        { key: 'sceneMsWithRingCurrent', value: sc.ms, cpuValue: sc.cpuMs, unit: 'ms', target: { op: '<=', value: 150, issue: 10 }, note: sceneNote(sc, 'storm, ring current on') },
      );
      Object.assign(detail, { speedWithRingCurrent: sp, sceneWithRingCurrent: sc });
    }

    // --- Tracer overhead: trace loop and evaluation loop interleaved in this one process,
    // over exactly the points the tracer evaluates; tail off and on, dipole and IGRF (model.ts as it is).
    if (!o.part || o.part === 'overhead') {
      const rounds = o.quick ? 5 : 15;
      const configs: { key: string; label: string; cond: Parameters<typeof prepareModel>[0]; target?: boolean }[] = [
        { key: 'overheadRatio', label: 'dipole + compression + IMF', cond: BENCH_CONDITIONS, target: true },
        { key: 'overheadRatioWithTail', label: 'dipole, tail on', cond: BENCH_CONDITIONS_TAIL, target: true },
        { key: 'overheadRatioIgrf', label: 'IGRF (footpointTolDeg 0.001), tail off', cond: { ...BENCH_CONDITIONS, internal: 'igrf' } },
        { key: 'overheadRatioIgrfWithTail', label: 'IGRF (footpointTolDeg 0.001), tail on', cond: { ...BENCH_CONDITIONS_TAIL, internal: 'igrf' } },
      ];
      const all: Record<string, Overhead> = {};
      for (const c of configs) {
        const model = prepareModel(c.cond);
        const ov = tracerOverhead(model, closedEquatorSeeds(model, ls), rounds);
        all[c.key] = ov;
        o.log(`tracer: overhead ${c.label}: ${ov.ratio.toFixed(3)} (rounds ${ov.ratioMin.toFixed(3)}–${ov.ratioMax.toFixed(3)}, fastest ${ov.ratioFastest.toFixed(3)}), ${ov.evalsPerTrace.toFixed(0)} evals/line at ${ov.evalNs.toFixed(0)} ns`);
        figures.push({
          key: c.key, value: ov.ratio, cpuValue: ov.ratioCpu, unit: '×',
          target: c.target ? { op: '<=', value: 1.3, issue: 14 } : undefined,
          note: `${c.label}: ${ov.lines} closed lines, ${ov.traceUsPerLine.toFixed(1)} µs/line / (${ov.evalsPerTrace.toFixed(0)} evals × ${ov.evalNs.toFixed(0)} ns), the same points; per-round ${ov.ratioMin.toFixed(2)}–${ov.ratioMax.toFixed(2)}, fastest rounds ${ov.ratioFastest.toFixed(2)}`,
        });
      }
      detail.overhead = all;
    }
    return { figures, detail };
  },
};
