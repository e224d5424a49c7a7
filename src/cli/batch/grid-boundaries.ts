/**
 * The batch command's opt-in boundary approximation (--boundary-mlt-step):
 * boundaries from an MLT grid computed once per condition and interpolated to
 * each site's MLT, for speed. Without it the batch uses the engine's own
 * search at the site's exact MLT (boundaryFinder in src/physics/mapping).
 */
import type { PreparedModel } from '../../physics/field/model';
import type { Tracer } from '../../physics/trace/tracer';
import { boundaryFinder, mltGrid, type SectorBoundaries, type BoundaryPoint, type Hemisphere } from '../../physics/mapping';
import { boundaryPoint } from '../../physics/mapping';
import type { BoundaryProvider } from '../../physics/mapping';

/**
 * Boundaries at grid MLTs k·step (computed on first use, kept for the model; each node's search
 * starts from the nearest node already answered, boundaryFinder — the same answer to the search
 * tolerance at a lower cost),
 * linearly interpolated in MLT (periodic) between the two nodes around the
 * asked MLT; null when either node has none. The interpolated point's
 * geographic position is exact for its (magnetic latitude, MLT).
 */
export function gridBoundaries(m: PreparedModel, tAlt: Tracer, sourceRe: number | undefined, stepH: number): BoundaryProvider {
  const n = mltGrid(stepH).length;
  const nodes = new Map<string, SectorBoundaries>();
  const search = boundaryFinder(m, tAlt, { sourceRe });
  const node = (h: Hemisphere, i: number): SectorBoundaries => {
    const key = `${h}${i}`;
    let b = nodes.get(key);
    if (!b) { b = search(h, i * stepH); nodes.set(key, b); }
    return b;
  };
  return (h, mlt) => {
    const x = (((mlt / stepH) % n) + n) % n;
    const i0 = Math.min(n - 1, Math.floor(x));
    const w = x - i0;
    const a = node(h, i0), b = w === 0 ? a : node(h, (i0 + 1) % n);
    const lerp = (p: BoundaryPoint | null, q: BoundaryPoint | null) => (p && q ? boundaryPoint(m, tAlt, p.magLatDeg + w * (q.magLatDeg - p.magLatDeg), mlt) : null);
    return { mltHours: mlt, openClosed: lerp(a.openClosed, b.openClosed), equatorward: lerp(a.equatorward, b.equatorward) };
  };
}
