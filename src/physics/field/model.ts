/**
 * Composition: a plain FieldConditions object becomes a prepared model with
 * evaluate(out, x, y, z) in GSM (RE → nT). B = B_internal + B_compression + B_imf
 * + B_tail. Terms are unconditional inside their module; the boundary is
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
import { prepareImf, DEFAULT_IMF_EFFICIENCY } from './imf';
import { prepareTail, tailParameters, DEFAULT_TAIL_CALIBRATION, type TailCalibration, type TailField } from './tail';
import type { TraceField } from '../trace/tracer';
import type { FieldWriter } from './writer';

export { DEFAULT_IMF_EFFICIENCY };

/** Defaults of every condition (the CLI's and the app's). */
export const DEFAULT_CONDITIONS: Readonly<Omit<FieldConditions, 'time'>> = Object.freeze({
  pdynNpa: 2,
  bzNt: 0,
  byNt: 0,
  tiltDeg: null,
  internal: 'dipole' as InternalFieldKind,
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
  return { time: c.time, pdynNpa, bzNt, byNt, tiltDeg, internal, magnetopause, imfEfficiency, tail };
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
}

/** A term that ADDS its field (GSM nT) at a GSM point (RE) into out; allocation-free. */
interface AddingTerm {
  evaluate(out: Float64Array, x: number, y: number, z: number): void;
}

/** Prepare the model for one condition (a few ms; see `npm run bench`). */
export function prepareModel(input: Partial<FieldConditions> & { time: string }, options: ModelOptions = {}): PreparedModel {
  const c = normalizeConditions(input);
  const ms = parseUtc(c.time);
  const year = decimalYear(ms);
  const coeffs = igrfCoefficients(year, c.internal === 'igrf' ? 13 : 1);
  const dipole = centredDipole(coeffs);
  const frames = prepareFrames(ms, dipole.axisGeo, c.tiltDeg);
  const warnings: string[] = [];

  const internal = prepareInternal(c, coeffs, dipole, frames, warnings);
  const tail = prepareTailTerm(c, frames, options);
  // The external terms the magnetopause currents shield (the closed-field part; the IMF is not
  // shielded). A new term (e.g. a ring current) is prepared like the tail and added to this list.
  const shieldedTerms: AddingTerm[] = tail === null ? [] : [tail];
  const boundary = prepareBoundary(c, shieldedWriter(internal, shieldedTerms), shieldedTerms.length > 0, options, warnings);
  const evaluate = composeTotal(c, dipole, frames, internal, shieldedTerms, boundary.compression);
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
    warnings,
    evaluate,
    evaluateInternal: internal,
    isInside: shape ? (x, y, z) => isInsideMagnetopause(shape, x, y, z) : () => true,
    boundaryMinRe: shape ? shape.r0Re : Infinity,
    geoZRow: new Float64Array([frames.gsmFromGeo[2], frames.gsmFromGeo[5], frames.gsmFromGeo[8]]),
  };
}

/** The main field as a writer (GSM in, GSM out): the tilted centred dipole, or the full IGRF synthesis rotated through GEO. */
function prepareInternal(c: FieldConditions, coeffs: ReturnType<typeof igrfCoefficients>, dipole: CentredDipole, frames: FrameSet, warnings: string[]): FieldWriter {
  if (c.internal === 'igrf') {
    // Degrees whose bounded contribution is < 1e-7 of the dipole at the radius are skipped (mainfield/truncation.ts).
    const mf: MainFieldModel = prepareMainField(coeffs, { truncationRelTol: 1e-7 });
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

/** The tail current sheet for the condition, or null when it is off. */
function prepareTailTerm(c: FieldConditions, frames: FrameSet, options: ModelOptions): TailField | null {
  if (!c.tail) return null;
  const cal = options.tailCalibration ? { ...DEFAULT_TAIL_CALIBRATION, ...options.tailCalibration } : DEFAULT_TAIL_CALIBRATION;
  return prepareTail(tailParameters(c.pdynNpa, c.bzNt, cal), frames.sinTilt, frames.cosTilt);
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
  const compression = prepareCompression(shape, shielded, options.compression);
  // Without the tail the fit is good to < 1 % inside the Shue fitted range; with the tail sheet
  // the measured worst is 1.7 % (tilt ±35°, test/physics/field/tail.test.ts), so the warning starts at 2 %.
  const limit = hasExternalTerms ? 0.02 : 0.01;
  if (compression.rmsResidualRel > limit) {
    warnings.push(`the compression field leaves ${(100 * compression.rmsResidualRel).toFixed(1)} % rms normal field on the magnetopause (fit good to < ${100 * limit} % inside the Shue fitted range)`);
  }
  return { shape, compression };
}

/**
 * The total field: main field + IMF (uniform, folded into the sum; imf.ts holds the
 * formula) + shielded external terms + compression, in that order.
 */
function composeTotal(c: FieldConditions, dipole: CentredDipole, frames: FrameSet, internal: FieldWriter, shieldedTerms: readonly AddingTerm[], compression: CompressionField | null): FieldWriter {
  const imf = prepareImf(c.byNt, c.bzNt, c.imfEfficiency);
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
