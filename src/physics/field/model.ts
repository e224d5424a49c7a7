/**
 * Composition: a plain FieldConditions object becomes a prepared model with
 * evaluate(out, x, y, z) in GSM (RE → nT). B = B_internal + B_compression + B_imf
 * + B_tail + B_ring. Terms are unconditional inside their module; the boundary is
 * applied by isInside (the tracer stops there, and `fieldAt` reports whether
 * a point lies inside). Prepared once per condition; evaluation allocates nothing.
 */
import { IMF_LIMIT_NT, type FieldConditions, type InternalFieldKind } from './conditions';
import { InputError, expectedGot, requireInRange } from '../errors';
import { parseUtc, decimalYear } from '../frames/time';
import { prepareFrames, applyMat3, applyMat3T, type FrameSet } from '../frames/rotations';
import { igrfCoefficients } from './mainfield/coefficients';
import { centredDipole, type CentredDipole } from './mainfield/centred-dipole';
import { prepareMainField, type MainFieldModel } from './mainfield/synthesis';
import { addTiltedDipoleField } from './dipole';
import { shueMagnetopause, isInsideMagnetopause, type MagnetopauseShape } from './magnetopause';
import { prepareCompression, type CompressionField } from './compression/fit';
import { prepareImf, DEFAULT_IMF_EFFICIENCY, DEFAULT_IMF_SATURATION_NT } from './imf';
import { prepareTail, tailParameters, DEFAULT_TAIL_CALIBRATION, type TailCalibration, type TailField } from './tail';
import type { TraceField } from '../trace/tracer';
import type { FieldWriter } from './writer';
import { stormState, requireDst, requireSpeed, type StormState } from './storm-index';
import { prepareRingCurrent, ringCurrentParameters, dpsEnergyJ, type RingCurrentField, type RingCurrentParameters } from './ringcurrent';
import { equatorwardSourceRe, type SourceDistance } from './convection';

export { DEFAULT_IMF_EFFICIENCY };

/** Defaults of every condition (the CLI's and the app's). */
export const DEFAULT_CONDITIONS: Readonly<Omit<FieldConditions, 'time'>> = Object.freeze({
  pdynNpa: 2,
  bzNt: 0,
  byNt: 0,
  tiltDeg: null,
  internal: 'igrf' as InternalFieldKind,
  magnetopause: true,
  imfEfficiency: DEFAULT_IMF_EFFICIENCY,
  // On by default: the calibrated defaults (references §12) assume the tail sheet (src/physics/field/tail.ts).
  tail: true,
});

/** Check and complete a conditions object; throws InputError naming the field. */
export function normalizeConditions(c: Partial<FieldConditions> & { time: string }): FieldConditions {
  if (typeof c.time !== 'string') throw new InputError('time', 'expected an ISO 8601 UTC time string');
  parseUtc(c.time);
  const internal = c.internal ?? DEFAULT_CONDITIONS.internal;
  if (internal !== 'dipole' && internal !== 'igrf') {
    throw new InputError('internal', expectedGot('"dipole" or "igrf"', internal, true));
  }
  const magnetopause = c.magnetopause ?? DEFAULT_CONDITIONS.magnetopause;
  if (typeof magnetopause !== 'boolean') throw new InputError('magnetopause', 'expected on (true) or off (false)');
  const pdynNpa = c.pdynNpa ?? DEFAULT_CONDITIONS.pdynNpa;
  const bzNt = c.bzNt ?? DEFAULT_CONDITIONS.bzNt;
  const byNt = c.byNt ?? DEFAULT_CONDITIONS.byNt;
  // Non-physical values are refused here even with the magnetopause off.
  requireInRange('pdynNpa', pdynNpa, Number.MIN_VALUE, 1e4, 'nPa');
  requireInRange('bzNt', bzNt, -IMF_LIMIT_NT, IMF_LIMIT_NT, 'nT');
  requireInRange('byNt', byNt, -IMF_LIMIT_NT, IMF_LIMIT_NT, 'nT');
  const imfEfficiency = requireInRange('imfEfficiency', c.imfEfficiency ?? DEFAULT_CONDITIONS.imfEfficiency, 0, 1);
  const tiltDeg = c.tiltDeg ?? null;
  if (tiltDeg !== null) requireInRange('tiltDeg', tiltDeg, -90, 90, 'deg');
  const tail = c.tail ?? DEFAULT_CONDITIONS.tail;
  if (typeof tail !== 'boolean') throw new InputError('tail', 'expected on (true) or off (false)');
  // Storm inputs: optional; null = estimated from the solar wind / nominal speed (storm-index.ts).
  const dstNt = c.dstNt ?? null;
  if (dstNt !== null) requireDst('dstNt', dstNt);
  const speedKms = c.speedKms ?? null;
  if (speedKms !== null) requireSpeed('speedKms', speedKms);
  return { time: c.time, pdynNpa, bzNt, byNt, tiltDeg, internal, magnetopause, imfEfficiency, tail, dstNt, speedKms };
}

export interface PreparedModel extends TraceField {
  readonly conditions: FieldConditions;
  readonly ms: number;
  readonly decimalYear: number;
  readonly frames: FrameSet;
  readonly dipole: CentredDipole;
  readonly magnetopause: MagnetopauseShape | null;
  readonly compression: CompressionField | null;
  /** The tail current sheet, or null when `tail` is off. */
  readonly tail: TailField | null;
  /** Storm index used (given or estimated; Dst*, speed), for every export's metadata. */
  readonly storm: StormState;
  /** The ring-current term (always present; inactive for Dst* ≥ 0). */
  readonly ringCurrent: RingCurrentField;
  /** Ring-current particle energy by Dessler–Parker–Sckopke, J (references §10). */
  readonly ringEnergyJ: number;
  /** Equatorial source distance of the equatorward edge for these conditions, RE (a user-set distance overrides it). */
  readonly source: SourceDistance;
  /** Equatorial source distance (= source.sourceRe), RE. */
  readonly sourceRe: number;
  readonly warnings: readonly string[];
  /** Total field, GSM nT, at a GSM point in RE (writes out). */
  evaluate(out: Float64Array, x: number, y: number, z: number): void;
  /** Internal field only (writes out). */
  evaluateInternal(out: Float64Array, x: number, y: number, z: number): void;
  isInside(x: number, y: number, z: number): boolean;
}

/** Options of the model that are not conditions (calibration studies: scripts/realism.ts). */
export interface ModelOptions {
  /** Replace parts of the tail calibration (DEFAULT_TAIL_CALIBRATION). */
  tailCalibration?: Partial<TailCalibration>;
  /** Compression fit options (cross-checks). */
  compression?: import('./compression/fit').CompressionOptions;
  /** Ring current on (default true); off reproduces the pre-storm model (calibration studies). */
  ringCurrent?: boolean;
  /** Saturation field of the penetrated IMF, nT (default DEFAULT_IMF_SATURATION_NT with the magnetopause on, none with it off; Infinity: none). */
  imfSaturationNt?: number;
  /** Distance of the distant neutral line down the tail, RE (default DISTANT_NEUTRAL_LINE_RE; Infinity: none). */
  neutralLineRe?: number;
}

/**
 * Distance of the model's distant neutral line down the tail, RE: a line reaching
 * x < −35 RE is open, so no boundary depends on the trace limit (≥ 60 RE). Observed reconnection
 * sites lie at ~20–30 RE (near-Earth, substorms) and ~100 RE (distant), from memory; 35 RE is our
 * calibration between them (references §12; with the far-tail band of the compression fit the quiet
 * midnight boundary moves by < 0.1° for 34–36 RE).
 */
export const DISTANT_NEUTRAL_LINE_RE = 35;
/** Least tailward extent of the compression fit, RE (2 r0 at Pdyn 2 nPa, Bz 0). */
const FIT_MIN_DEPTH_RE = 20.5;
/**
 * Far-tail band of the compression fit (references §12): the Shue surface from the fitted region's edge
 * to x = −60 RE, sampled every 1 r0 and weighted by 0.05, so the compression field beyond the fitted region
 * follows the shielding condition loosely instead of extrapolating the fit. 60 RE lies beyond the distant
 * neutral line and the shortest trace limit; the weight was chosen by a scan (0.03–0.3): at 0.05 a step of
 * the fit depth moves no boundary by more than 0.07° and the shielding rms grows by ≤ 0.05 points.
 */
export const FAR_TAIL_FIT: Readonly<{ depthRe: number; weight: number; spacing: number }> = Object.freeze({ depthRe: 60, weight: 0.05, spacing: 1 });
/** Gap between the equatorward-edge source and the tail sheet's inner edge, RE. */
const TAIL_INNER_GAP_RE = 1;

/** A term that ADDS its field (GSM nT) at a GSM point (RE) into out; allocation-free. */
interface AddingTerm {
  evaluate(out: Float64Array, x: number, y: number, z: number): void;
}

/** Prepare the model for one condition (a few ms; see `npm run bench`). */
export function prepareModel(input: Partial<FieldConditions> & { time: string }, options: ModelOptions = {}): PreparedModel {
  const c = normalizeConditions(input);
  const ms = parseUtc(c.time);
  const year = decimalYear(ms);
  const { dipole, synthesis } = mainFieldOfDate(year, c.internal);
  const frames = prepareFrames(ms, dipole.axisGeo, c.tiltDeg);
  const warnings: string[] = [];

  const internal = prepareInternal(c, synthesis, dipole, frames, warnings);
  const storm = prepareStorm(c, dipole, options, warnings);
  const tail = prepareTailTerm(c, frames, options, storm.source.sourceRe + TAIL_INNER_GAP_RE);
  const ring = prepareRingCurrent(storm.ringParams, frames.sinTilt, frames.cosTilt);
  // The external terms the magnetopause currents shield (the closed-field part; the IMF is not
  // shielded). A new term is prepared like these and added to this list.
  const shieldedTerms: AddingTerm[] = [];
  if (tail !== null) shieldedTerms.push(tail);
  if (storm.ringParams.centreNt !== 0) shieldedTerms.push(ring);
  const boundary = prepareBoundary(c, shieldedWriter(internal, shieldedTerms), shieldedTerms.length > 0, options, warnings);
  const evaluate = composeTotal(c, dipole, frames, internal, shieldedTerms, boundary.compression, options);
  const shape = boundary.shape;

  return {
    conditions: c,
    ms,
    decimalYear: year,
    frames,
    dipole,
    magnetopause: shape,
    compression: boundary.compression,
    tail,
    storm: storm.state,
    ringCurrent: ring,
    ringEnergyJ: dpsEnergyJ(storm.ringParams.centreNt, dipole.b0Nt),
    source: storm.source,
    sourceRe: storm.source.sourceRe,
    warnings,
    evaluate,
    evaluateInternal: internal,
    isInside: shape ? (x, y, z) => isInsideMagnetopause(shape, x, y, z) : () => true,
    boundaryMinRe: shape ? shape.r0Re : Infinity,
    geoZRow: new Float64Array([frames.gsmFromGeo[2], frames.gsmFromGeo[5], frames.gsmFromGeo[8]]),
    // The distant neutral line belongs to the tail sheet (none without it).
    neutralLineXRe: tail === null ? -Infinity : -(options.neutralLineRe ?? DISTANT_NEUTRAL_LINE_RE),
  };
}

/**
 * The storm state of the condition: the index (given, or estimated from the solar wind and
 * said so), the ring current it sets, and the equatorward-edge source distance that follows it.
 */
function prepareStorm(c: FieldConditions, dipole: CentredDipole, options: ModelOptions, warnings: string[]): { state: StormState; ringParams: RingCurrentParameters; source: SourceDistance } {
  const state = stormState(c.pdynNpa, c.bzNt, c.dstNt ?? null, c.speedKms ?? null);
  warnings.push(...state.warnings);
  const ringParams = ringCurrentParameters(options.ringCurrent === false ? 0 : state.dstStarNt);
  const shape = shueMagnetopause(c.pdynNpa, c.bzNt, c.byNt);
  const source = equatorwardSourceRe({
    speedKms: state.speedKms, bzNt: c.bzNt, standoffRe: shape.r0Re, alpha: shape.alpha, b0Nt: dipole.b0Nt, ringPeakRe: ringParams.peakRe,
  });
  return { state, ringParams, source };
}

/** The main field of one instant: its centred dipole and, for IGRF, the truncated synthesis (null for the dipole). */
interface MainFieldOfDate {
  readonly dipole: CentredDipole;
  readonly synthesis: MainFieldModel | null;
}

/**
 * Main fields of the last few instants, by internal-field kind and decimal year (least recently used
 * dropped). The app prepares a new model for every control change at the same time, and the date's
 * coefficients, centred dipole and truncation radii (~0.3 ms) do not depend on the other conditions.
 * The entries are immutable and evaluateGeo writes only into its `out`, so models share them;
 * a model from the cache equals a fresh one to the bit (test/physics/field/model-cache.test.ts).
 */
const mainFieldCache = new Map<string, MainFieldOfDate>();
const MAIN_FIELD_CACHE_SIZE = 8;

function mainFieldOfDate(year: number, internal: InternalFieldKind): MainFieldOfDate {
  const key = `${internal} ${year}`; // String(number) round-trips a double exactly
  const kept = mainFieldCache.get(key);
  if (kept) {
    mainFieldCache.delete(key);
    mainFieldCache.set(key, kept);
    return kept;
  }
  const coeffs = igrfCoefficients(year, internal === 'igrf' ? 13 : 1);
  // Degrees that cannot move a traced footpoint by 0.001° at the radius are skipped (mainfield/truncation.ts;
  // every degree below 1.2 RE, so ground values are the full synthesis).
  const entry: MainFieldOfDate = {
    dipole: centredDipole(coeffs),
    synthesis: internal === 'igrf' ? prepareMainField(coeffs, { footpointTolDeg: 0.001 }) : null,
  };
  mainFieldCache.set(key, entry);
  if (mainFieldCache.size > MAIN_FIELD_CACHE_SIZE) mainFieldCache.delete(mainFieldCache.keys().next().value as string);
  return entry;
}

/** Forget the kept main fields (tests: a fresh preparation against a cached one). */
export function clearMainFieldCache(): void {
  mainFieldCache.clear();
}

/** The main field as a writer (GSM in, GSM out): the tilted centred dipole, or the full IGRF synthesis rotated through GEO. */
function prepareInternal(c: FieldConditions, synthesis: MainFieldModel | null, dipole: CentredDipole, frames: FrameSet, warnings: string[]): FieldWriter {
  if (synthesis !== null) {
    const mf = synthesis;
    const m = frames.gsmFromGeo; // row-major GSM ← GEO
    const geo = new Float64Array(3);
    if (c.tiltDeg !== null && c.tiltDeg !== undefined) {
      warnings.push('tiltDeg overrides the tilt while the full IGRF field is on: the geographic mapping follows the overridden Sun line');
    }
    return (out, x, y, z) => {
      applyMat3T(geo, m, x, y, z); // GEO position = Mᵀ · GSM position
      mf.evaluateGeo(out, geo[0], geo[1], geo[2]);
      applyMat3(out, m, out[0], out[1], out[2]);
    };
  }
  const b0 = dipole.b0Nt, sinT = frames.sinTilt, cosT = frames.cosTilt;
  return (out, x, y, z) => {
    out[0] = 0; out[1] = 0; out[2] = 0;
    addTiltedDipoleField(out, x, y, z, b0, sinT, cosT);
  };
}

/** The tail current sheet for the condition (its inner edge at least at innerMinRe), or null when it is off. */
function prepareTailTerm(c: FieldConditions, frames: FrameSet, options: ModelOptions, innerMinRe: number): TailField | null {
  if (!c.tail) return null;
  const cal = options.tailCalibration ? { ...DEFAULT_TAIL_CALIBRATION, ...options.tailCalibration } : DEFAULT_TAIL_CALIBRATION;
  return prepareTail(tailParameters(c.pdynNpa, c.bzNt, cal, innerMinRe), frames.sinTilt, frames.cosTilt);
}

/** The field the magnetopause currents shield: the main field plus the shielded external terms, in order. */
function shieldedWriter(internal: FieldWriter, terms: readonly AddingTerm[]): FieldWriter {
  if (terms.length === 0) return internal;
  return (out, x, y, z) => {
    internal(out, x, y, z);
    for (let k = 0; k < terms.length; k++) terms[k].evaluate(out, x, y, z);
  };
}

/** The magnetopause (Shue surface) and the compression field fitted on it, or neither when the magnetopause is off. */
function prepareBoundary(c: FieldConditions, shielded: FieldWriter, hasExternalTerms: boolean, options: ModelOptions, warnings: string[]): { shape: MagnetopauseShape | null; compression: CompressionField | null } {
  if (!c.magnetopause) return { shape: null, compression: null };
  const shape = shueMagnetopause(c.pdynNpa, c.bzNt, c.byNt);
  warnings.push(...shape.warnings);
  // Fit at least to x = −20.5 RE (2 r0 at 2 nPa), so that at high pressure the compression
  // field stays small down the tail instead of tending to a large uniform part.
  const fitDepthR0 = options.compression?.fitDepthR0 ?? Math.max(2, FIT_MIN_DEPTH_RE / shape.r0Re);
  // Beyond it, the far-tail band keeps the field small and smooth (FAR_TAIL_FIT); null turns it off (cross-checks).
  const farTail = options.compression?.farTail === undefined ? FAR_TAIL_FIT : options.compression.farTail;
  const compression = prepareCompression(shape, shielded, { ...options.compression, fitDepthR0, farTail });
  // Without external terms the fit is good to < 1 % inside the Shue fitted range; with the tail sheet,
  // the ring current, the deeper fit and the far-tail band the measured worst over Pdyn 0.5–10 nPa,
  // Bz −10..10 nT, tilt ±35° is 2.45 % (test/physics/field/tail.test.ts), so the warning starts at 2.5 %.
  const limit = hasExternalTerms ? 0.025 : 0.01;
  if (compression.rmsResidualRel > limit) {
    warnings.push(`the compression field leaves ${(100 * compression.rmsResidualRel).toFixed(1)} % rms normal field on the magnetopause (fit good to < ${100 * limit} % inside the Shue fitted range)`);
  }
  return { shape, compression };
}

/**
 * The total field: main field + IMF (uniform, folded into the sum; imf.ts holds the
 * formula) + shielded external terms + compression, in that order.
 */
function composeTotal(c: FieldConditions, dipole: CentredDipole, frames: FrameSet, internal: FieldWriter, shieldedTerms: readonly AddingTerm[], compression: CompressionField | null, options: ModelOptions): FieldWriter {
  // The saturation is a property of the bounded magnetosphere (Region-1 currents on the magnetopause,
  // Hill–Siscoe, references §10); with the magnetopause off the term is Dungey's bare vacuum superposition.
  const imf = prepareImf(c.byNt, c.bzNt, c.imfEfficiency, options.imfSaturationNt ?? (c.magnetopause ? DEFAULT_IMF_SATURATION_NT : Infinity));
  const imfBy = imf.byNt;
  const imfBz = imf.bzNt;
  const dipoleOnly = c.internal === 'dipole';
  const b0 = dipole.b0Nt, sinT = frames.sinTilt, cosT = frames.cosTilt;
  const nTerms = shieldedTerms.length;
  return (out, x, y, z) => {
    if (dipoleOnly) {
      out[0] = 0; out[1] = imfBy; out[2] = imfBz;
      addTiltedDipoleField(out, x, y, z, b0, sinT, cosT);
    } else {
      internal(out, x, y, z);
      out[1] += imfBy;
      out[2] += imfBz;
    }
    for (let k = 0; k < nTerms; k++) shieldedTerms[k].evaluate(out, x, y, z);
    if (compression !== null) compression.evaluate(out, x, y, z);
  };
}
