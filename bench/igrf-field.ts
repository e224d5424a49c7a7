/**
 * The prepared model's field with its IGRF main field replaced by a truncated one
 * (prepareMainField's footpointTolDeg rule), composed term by term the way
 * src/physics/field/model.ts composes it: IMF + internal (GEO synthesis rotated to GSM)
 * + tail + compression. The compression keeps the fit made against the full field.
 * Used by the bench to time an accelerated IGRF trace before model.ts adopts the option.
 */
import type { PreparedModel } from '../src/physics/field/model';
import { prepareImf } from '../src/physics/field/imf';
import { igrfCoefficients } from '../src/physics/field/mainfield/coefficients';
import { prepareMainField, type MainFieldModel } from '../src/physics/field/mainfield/synthesis';
import type { TraceField } from '../src/physics/trace/tracer';

export interface AcceleratedIgrf extends TraceField {
  readonly mainField: MainFieldModel;
}

export function acceleratedIgrfField(model: PreparedModel, footpointTolDeg: number): AcceleratedIgrf {
  if (model.conditions.internal !== 'igrf') throw new Error('acceleratedIgrfField needs a model prepared with internal "igrf"');
  const mf = prepareMainField(igrfCoefficients(model.decimalYear, 13), { footpointTolDeg });
  const c = model.conditions;
  const imf = prepareImf(c.byNt, c.bzNt, c.imfEfficiency);
  const imfBy = imf.byNt, imfBz = imf.bzNt;
  const m = model.frames.gsmFromGeo;
  const tail = model.tail;
  const comp = model.compression;
  const evaluate = (out: Float64Array, x: number, y: number, z: number): void => {
    const gx = m[0] * x + m[3] * y + m[6] * z;
    const gy = m[1] * x + m[4] * y + m[7] * z;
    const gz = m[2] * x + m[5] * y + m[8] * z;
    mf.evaluateGeo(out, gx, gy, gz);
    const bx = out[0], by = out[1], bz = out[2];
    out[0] = m[0] * bx + m[1] * by + m[2] * bz;
    out[1] = m[3] * bx + m[4] * by + m[5] * bz + imfBy;
    out[2] = m[6] * bx + m[7] * by + m[8] * bz + imfBz;
    if (tail !== null) tail.evaluate(out, x, y, z);
    if (comp !== null) comp.evaluate(out, x, y, z);
  };
  return { evaluate, isInside: model.isInside, boundaryMinRe: model.boundaryMinRe, geoZRow: model.geoZRow, mainField: mf };
}
