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
import { prepareFrames, type FrameSet } from '../frames/rotations';
import { igrfCoefficients } from './mainfield/coefficients';
import { centredDipole, type CentredDipole } from './mainfield/centred-dipole';
import { prepareMainField, type MainFieldModel } from './mainfield/synthesis';
import { addTiltedDipoleField } from './dipole';
import { shueMagnetopause, isInsideMagnetopause, type MagnetopauseShape } from './magnetopause';
import { prepareCompression, type CompressionField } from './compression/fit';
import { prepareImf, DEFAULT_IMF_EFFICIENCY } from './imf';
import { prepareTail, tailParameters, DEFAULT_TAIL_CALIBRATION, type TailCalibration, type TailField } from './tail';
import type { TraceField } from '../trace/tracer';

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
  // On by default: the calibrated defaults of issue 6 assume the tail sheet (src/physics/field/tail.ts).
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

/** Prepare the model for one condition (a few ms; see `npm run bench`). */
export function prepareModel(input: Partial<FieldConditions> & { time: string }, options: ModelOptions = {}): PreparedModel {
  const c = normalizeConditions(input);
  const ms = parseUtc(c.time);
  const year = decimalYear(ms);
  const coeffs = igrfCoefficients(year, c.internal === 'igrf' ? 13 : 1);
  const dipole = centredDipole(coeffs);
  const frames = prepareFrames(ms, dipole.axisGeo, c.tiltDeg);
  const warnings: string[] = [];
  const b0 = dipole.b0Nt;
  const sinT = frames.sinTilt;
  const cosT = frames.cosTilt;

  let internal: (out: Float64Array, x: number, y: number, z: number) => void;
  if (c.internal === 'igrf') {
    // Degrees whose bounded contribution is < 1e-7 of the dipole at the radius are skipped (mainfield/truncation.ts).
    const mf: MainFieldModel = prepareMainField(coeffs, { truncationRelTol: 1e-7 });
    const m = frames.gsmFromGeo; // row-major GSM ← GEO
    internal = (out, x, y, z) => {
      // GEO position = transpose(M) · GSM position.
      const gx = m[0] * x + m[3] * y + m[6] * z;
      const gy = m[1] * x + m[4] * y + m[7] * z;
      const gz = m[2] * x + m[5] * y + m[8] * z;
      mf.evaluateGeo(out, gx, gy, gz);
      const bx = out[0], by = out[1], bz = out[2];
      out[0] = m[0] * bx + m[1] * by + m[2] * bz;
      out[1] = m[3] * bx + m[4] * by + m[5] * bz;
      out[2] = m[6] * bx + m[7] * by + m[8] * bz;
    };
    if (c.tiltDeg !== null && c.tiltDeg !== undefined) {
      warnings.push('tiltDeg overrides the tilt while the full IGRF field is on: the geographic mapping follows the overridden Sun line');
    }
  } else {
    internal = (out, x, y, z) => {
      out[0] = 0; out[1] = 0; out[2] = 0;
      addTiltedDipoleField(out, x, y, z, b0, sinT, cosT);
    };
  }

  let tailField: TailField | null = null;
  if (c.tail) {
    const cal = options.tailCalibration ? { ...DEFAULT_TAIL_CALIBRATION, ...options.tailCalibration } : DEFAULT_TAIL_CALIBRATION;
    tailField = prepareTail(tailParameters(c.pdynNpa, c.bzNt, cal), sinT, cosT);
  }
  const tf = tailField;
  // The field the magnetopause currents shield: internal + tail (the closed-field part; the IMF is not shielded).
  const shielded = tf === null ? internal : (out: Float64Array, x: number, y: number, z: number): void => {
    internal(out, x, y, z);
    tf.evaluate(out, x, y, z);
  };

  let mp: MagnetopauseShape | null = null;
  let comp: CompressionField | null = null;
  if (c.magnetopause) {
    mp = shueMagnetopause(c.pdynNpa, c.bzNt, c.byNt);
    warnings.push(...mp.warnings);
    comp = prepareCompression(mp, shielded, options.compression);
    // Without the tail the fit is good to < 1 % inside the Shue fitted range; with the tail sheet
    // the measured worst is 1.7 % (tilt ±35°, test/physics/field/tail.test.ts), so the warning starts at 2 %.
    const limit = tf === null ? 0.01 : 0.02;
    if (comp.rmsResidualRel > limit) {
      warnings.push(`the compression field leaves ${(100 * comp.rmsResidualRel).toFixed(1)} % rms normal field on the magnetopause (fit good to < ${100 * limit} % inside the Shue fitted range)`);
    }
  }
  // The IMF term is uniform: its penetrated components are folded into the sum below (imf.ts holds the formula).
  const imf = prepareImf(c.byNt, c.bzNt, c.imfEfficiency);
  const imfBy = imf.byNt;
  const imfBz = imf.bzNt;

  const geoZRow = new Float64Array([frames.gsmFromGeo[2], frames.gsmFromGeo[5], frames.gsmFromGeo[8]]);
  const shape = mp;
  const compression = comp;
  const dipoleOnly = c.internal === 'dipole';

  const evaluate = (out: Float64Array, x: number, y: number, z: number): void => {
    if (dipoleOnly) {
      out[0] = 0; out[1] = imfBy; out[2] = imfBz;
      addTiltedDipoleField(out, x, y, z, b0, sinT, cosT);
    } else {
      internal(out, x, y, z);
      out[1] += imfBy;
      out[2] += imfBz;
    }
    if (tf !== null) tf.evaluate(out, x, y, z);
    if (compression !== null) compression.evaluate(out, x, y, z);
  };

  return {
    conditions: c,
    ms,
    decimalYear: year,
    frames,
    dipole,
    magnetopause: mp,
    compression: comp,
    tail: tailField,
    warnings,
    evaluate,
    evaluateInternal: internal,
    isInside: shape ? (x, y, z) => isInsideMagnetopause(shape, x, y, z) : () => true,
    boundaryMinRe: shape ? shape.r0Re : Infinity,
    geoZRow,
  };
}
