/**
 * The CGM graticule for the polar maps (mapping/cgm-graticule.ts), computed in
 * a worker of its own (workers/graticule.worker.ts) so that its ~0.5–1.5 s of
 * tracing never holds up the engine worker's scene, oval and sites. It depends
 * only on the main field, the time (MLT, and the tilt when overridden) and the
 * height: the app keys its cache by `graticuleKey`, so other controls never
 * recompute it.
 */
import { prepareModel } from '../../src/physics/field/model';
import { cgmGraticuleOf, type CgmGraticule } from '../../src/physics/mapping';
import { graticuleKey, type GraticuleRequest } from './graticule-key';

export { graticuleKey, type GraticuleRequest };

export type GraticuleAnswer =
  | { key: string; ok: true; graticule: CgmGraticule; ms: number }
  | { key: string; ok: false; error: string };

/** Compute the graticule of a request; an input the engine refuses comes back as its message. */
export function computeGraticule(r: GraticuleRequest): GraticuleAnswer {
  const key = graticuleKey(r);
  try {
    const t0 = performance.now();
    // Only the main field and the frames matter: the magnetosphere's terms are left off.
    const model = prepareModel({ time: r.time, internal: r.internal, tiltDeg: r.tiltDeg, magnetopause: false, tail: false });
    const graticule = cgmGraticuleOf(model, { heightKm: r.heightKm });
    return { key, ok: true, graticule, ms: performance.now() - t0 };
  } catch (e) {
    return { key, ok: false, error: e instanceof Error ? e.message : String(e) };
  }
}
