/**
 * The reference for the IGRF footpoint check: a prepared IGRF model's field with its truncated
 * main field (prepareMainField footpointTolDeg, as model.ts uses it) replaced by the full
 * degree-13 synthesis, everything else (IMF, tail, ring current, compression, boundary, neutral
 * line) unchanged: B_ref = B_model + R·(B_full − B_truncated), R the GEO → GSM rotation.
 * Untimed (three syntheses per evaluation); the bench times model.ts itself.
 */
import type { PreparedModel } from '../src/physics/field/model';
import { igrfCoefficients } from '../src/physics/field/mainfield/coefficients';
import { prepareMainField } from '../src/physics/field/mainfield/synthesis';
import type { TraceField } from '../src/physics/trace/tracer';

/** The footpoint tolerance model.ts truncates the IGRF synthesis with, deg. */
export const MODEL_FOOTPOINT_TOL_DEG = 0.001;

export function fullSynthesisField(model: PreparedModel, truncatedTolDeg = MODEL_FOOTPOINT_TOL_DEG): TraceField {
  if (model.conditions.internal !== 'igrf') throw new Error('fullSynthesisField needs a model prepared with internal "igrf"');
  const coeffs = igrfCoefficients(model.decimalYear, 13);
  const full = prepareMainField(coeffs);
  const truncated = prepareMainField(coeffs, { footpointTolDeg: truncatedTolDeg });
  const m = model.frames.gsmFromGeo;
  const a = new Float64Array(3), b = new Float64Array(3);
  const evaluate = (out: Float64Array, x: number, y: number, z: number): void => {
    model.evaluate(out, x, y, z);
    const gx = m[0] * x + m[3] * y + m[6] * z;
    const gy = m[1] * x + m[4] * y + m[7] * z;
    const gz = m[2] * x + m[5] * y + m[8] * z;
    full.evaluateGeo(a, gx, gy, gz);
    truncated.evaluateGeo(b, gx, gy, gz);
    const dx = a[0] - b[0], dy = a[1] - b[1], dz = a[2] - b[2];
    out[0] += m[0] * dx + m[1] * dy + m[2] * dz;
    out[1] += m[3] * dx + m[4] * dy + m[5] * dz;
    out[2] += m[6] * dx + m[7] * dy + m[8] * dz;
  };
  return { evaluate, isInside: model.isInside, boundaryMinRe: model.boundaryMinRe, geoZRow: model.geoZRow, neutralLineXRe: model.neutralLineXRe };
}
