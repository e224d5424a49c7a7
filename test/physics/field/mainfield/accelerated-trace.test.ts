import { describe, it, expect } from 'vitest';
import { expectAtMost, pointAngleDeg } from '../../../helpers';
import { prepareModel, type PreparedModel } from '../../../../src/physics/field/model';
import { igrfCoefficients } from '../../../../src/physics/field/mainfield/coefficients';
import { prepareMainField, type MainFieldModel } from '../../../../src/physics/field/mainfield/synthesis';
import { Tracer, type TraceField } from '../../../../src/physics/trace/tracer';
import { geoFromGeodetic } from '../../../../src/physics/frames/geodesy';
import { applyMat3 } from '../../../../src/physics/frames/rotations';

/**
 * The model's field with its internal term swapped: model.evaluate − model.evaluateInternal
 * + the given GEO main field rotated to GSM. Every other term (IMF, tail, compression) is
 * the model's own, so two such fields differ only in the main-field synthesis.
 */
function withMainField(model: PreparedModel, mf: MainFieldModel): TraceField {
  const m = model.frames.gsmFromGeo;
  const w = new Float64Array(3);
  return {
    evaluate(out, x, y, z) {
      model.evaluate(out, x, y, z);
      model.evaluateInternal(w, x, y, z);
      out[0] -= w[0]; out[1] -= w[1]; out[2] -= w[2];
      mf.evaluateGeo(w, m[0] * x + m[3] * y + m[6] * z, m[1] * x + m[4] * y + m[7] * z, m[2] * x + m[5] * y + m[8] * z);
      out[0] += m[0] * w[0] + m[1] * w[1] + m[2] * w[2];
      out[1] += m[3] * w[0] + m[4] * w[1] + m[5] * w[2];
      out[2] += m[6] * w[0] + m[7] * w[1] + m[8] * w[2];
    },
    isInside: model.isInside,
    boundaryMinRe: model.boundaryMinRe,
    geoZRow: model.geoZRow,
  };
}


describe('IGRF truncated by footpoint tolerance (footpointTolDeg) against the full synthesis', () => {
  it('footpoints agree to ≤ 0.001° over random invented sites and dates (derived tolerance, measured)', () => {
    let s = 20240611;
    const rnd = (): number => ((s = (s * 1103515245 + 12345) % 2147483648) / 2147483648);
    const g = new Float64Array(3), p = new Float64Array(3);
    let worst = 0, compared = 0;
    for (let k = 0; k < 24; k++) {
      // Dates 1950–2029 (degree 10 before 2000, 13 after), varied solar wind, tail on and off.
      const ms = Date.UTC(1950, 0, 1) + rnd() * (Date.UTC(2029, 0, 1) - Date.UTC(1950, 0, 1));
      const model = prepareModel({
        time: new Date(Math.floor(ms / 60_000) * 60_000).toISOString(),
        internal: 'igrf', pdynNpa: 0.5 + 6 * rnd(), bzNt: -12 + 16 * rnd(), byNt: -6 + 12 * rnd(), tail: rnd() < 0.6,
      });
      const c = igrfCoefficients(model.decimalYear);
      const full = new Tracer(withMainField(model, prepareMainField(c)));
      const fast = new Tracer(withMainField(model, prepareMainField(c, { footpointTolDeg: 0.001 })));
      for (let j = 0; j < 8; j++) {
        // Invented sites: geodetic latitude ±30–75°, any longitude, from the 110 km footpoint altitude.
        geoFromGeodetic(g, (30 + 45 * rnd()) * (rnd() < 0.5 ? 1 : -1), 360 * rnd() - 180, 110);
        applyMat3(p, model.frames.gsmFromGeo, g[0], g[1], g[2]);
        const typeFull = full.trace(p[0], p[1], p[2]);
        const typeFast = fast.trace(p[0], p[1], p[2]);
        expect(typeFast, `line type at site ${k}/${j}`).toBe(typeFull);
        for (const end of ['footMinus', 'footPlus'] as const) {
          expect(fast[end] >= 0, `${end} present in both at site ${k}/${j}`).toBe(full[end] >= 0);
          if (full[end] < 0) continue;
          worst = Math.max(worst, pointAngleDeg(fast.points, fast[end], full.points, full[end]));
          compared++;
        }
      }
    }
    expect(compared).toBeGreaterThan(300);
    // Measured worst 1.6e-4° over 377 footpoints (κ = 1: FOOTPOINT_REL_PER_RAD in mainfield/truncation.ts).
    expectAtMost(worst, 0.001, 'largest footpoint difference, truncated vs full synthesis (deg)');
  });
});
