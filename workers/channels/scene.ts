/**
 * The `scene` channel: frames, magnetopause shape and a fan of field lines,
 * GEO points in one typed array (the first thing the app draws).
 */
import { DEG_PER_RAD } from '../../src/physics/constants';
import type { PreparedModel } from '../../src/physics/field/model';
import { applyMat3T } from '../../src/physics/frames/rotations';
import { gsmAtMagneticLatMlt } from '../../src/physics/trace/footpoint';
import type { Tracer } from '../../src/physics/trace/tracer';
import type { EngineApi, FanSpec, FrameInfo, LineBundle, SceneResult } from '../protocol';
import type { EngineContext } from './context';

function frameInfo(m: PreparedModel): FrameInfo {
  const f = m.frames;
  const g = f.gsmFromGeo;
  // GEO ← GSM is the transpose of GSM ← GEO.
  const geoFromGsm = Float64Array.of(g[0], g[3], g[6], g[1], g[4], g[7], g[2], g[5], g[8]);
  return {
    geoFromGsm,
    sunGeo: Float64Array.from(f.sunGeo),
    axisGeo: Float64Array.from(f.axisGeo),
    tiltDeg: f.tiltRad * DEG_PER_RAD,
    poleLatDeg: m.dipole.poleLatDeg,
    poleLonDeg: m.dipole.poleLonDeg,
    b0Nt: m.dipole.b0Nt,
    igrfEpoch: m.decimalYear,
  };
}

/** Trace one line per (MLT, magnetic latitude) seed at the ground; points rotated to GEO. */
function traceFan(m: PreparedModel, t: Tracer, fan: FanSpec): LineBundle {
  const g = m.frames.gsmFromGeo;
  const seeds: [number, number][] = [];
  for (const mlt of fan.mltHours) for (const lat of fan.magLatDeg) seeds.push([lat, mlt]);
  const chunks: Float64Array[] = [];
  const offsets = new Int32Array(seeds.length + 1);
  const types = new Uint8Array(seeds.length);
  const v = new Float64Array(3);
  let total = 0;
  for (let i = 0; i < seeds.length; i++) {
    gsmAtMagneticLatMlt(v, m.frames, seeds[i][0], seeds[i][1], 0, true);
    types[i] = t.trace(v[0], v[1], v[2]);
    const n = t.nPoints;
    const pts = new Float64Array(3 * n);
    const p = t.points;
    for (let k = 0; k < 3 * n; k += 3) {
      applyMat3T(v, g, p[k], p[k + 1], p[k + 2]);
      pts[k] = v[0]; pts[k + 1] = v[1]; pts[k + 2] = v[2];
    }
    chunks.push(pts);
    total += n;
    offsets[i + 1] = total;
  }
  const pointsGeo = new Float64Array(3 * total);
  let o = 0;
  for (const c of chunks) { pointsGeo.set(c, o); o += c.length; }
  return { pointsGeo, offsets, types };
}

const emptyFrames = (): FrameInfo => ({
  geoFromGsm: new Float64Array(9), sunGeo: new Float64Array(3), axisGeo: new Float64Array(3), tiltDeg: NaN, poleLatDeg: NaN, poleLonDeg: NaN, b0Nt: NaN, igrfEpoch: NaN,
});
const emptyLines = (): LineBundle => ({ pointsGeo: new Float64Array(0), offsets: new Int32Array(1), types: new Uint8Array(0) });

export function sceneChannel(ctx: EngineContext): EngineApi['scene'] {
  return (requestId, c, fan) => ctx.run<SceneResult>('scene', requestId,
    () => ({ requestId, warnings: [], frames: emptyFrames(), magnetopause: { enabled: false, r0Re: NaN, alpha: NaN }, lines: emptyLines() }),
    async () => {
      const m = ctx.model(c);
      const lines = traceFan(m, ctx.tracer(m, 0), fan);
      const mp = m.magnetopause;
      return {
        requestId, warnings: [...m.warnings], frames: frameInfo(m),
        magnetopause: { enabled: mp !== null, r0Re: mp ? mp.r0Re : NaN, alpha: mp ? mp.alpha : NaN },
        lines,
      };
    });
}
