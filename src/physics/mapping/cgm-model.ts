/**
 * Corrected geomagnetic (CGM) coordinates for a prepared model: the converter of
 * cgm.ts (references §6) built once per model from the model's own main field
 * (full IGRF-14 of the date with `internal: 'igrf'`, its centred dipole alone
 * with `internal: 'dipole'`, where CGM equals MAG exactly) and its frames.
 *
 * Callers (CLI, batch, worker) use `cgmOf(model)` and the two point helpers;
 * CGM does not depend on the magnetosphere, only on the main field and the time.
 */
import { igrfCoefficients } from '../field/mainfield/coefficients';
import { prepareMainField, type MainFieldModel } from '../field/mainfield/synthesis';
import type { PreparedModel } from '../field/model';
import { prepareCgm, type CgmConverter, type CgmResult } from './cgm';

export type { CgmResult, CgmConverter } from './cgm';

/** Labels that tell the two MLTs apart wherever both appear. */
export const MLT_LABEL_CGM = 'MLT (CGM)';
export const MLT_LABEL_MAG = 'MLT (MAG)';

const converters = new WeakMap<PreparedModel, CgmConverter>();

/**
 * The main field CGM is defined on for a model, in GEO: the full IGRF-14 synthesis of the date (no
 * truncation: CGM is a ground-level product and its traces go only to the dipole equator), or the
 * centred dipole alone. Shared by the converter and the CGM graticule (cgm-graticule.ts).
 */
export function cgmMainField(model: PreparedModel): MainFieldModel {
  const nmax = model.conditions.internal === 'igrf' ? 13 : 1;
  return prepareMainField(igrfCoefficients(model.decimalYear, nmax));
}

/** The CGM converter of a model's main field, prepared on first use and kept with the model. Not re-entrant. */
export function cgmOf(model: PreparedModel): CgmConverter {
  let c = converters.get(model);
  if (!c) {
    c = prepareCgm(cgmMainField(model), model.frames);
    converters.set(model, c);
  }
  return c;
}

/** CGM of a geodetic point at its own height and at the ground (height 0) below it. */
export interface CgmPair {
  /** At the point's height. */
  atAlt: CgmResult;
  /** At the ground (0 km above the ellipsoid) below the point. */
  ground: CgmResult;
}

/** CGM of a geodetic point (WGS84 latitude, east longitude, height km) at its height and at the ground below it. */
export function cgmPair(model: PreparedModel, latDeg: number, lonDeg: number, heightKm: number): CgmPair {
  const c = cgmOf(model);
  const atAlt = c.fromGeodetic(latDeg, lonDeg, heightKm);
  const ground = heightKm === 0 ? atAlt : c.fromGeodetic(latDeg, lonDeg, 0);
  return { atAlt, ground };
}
