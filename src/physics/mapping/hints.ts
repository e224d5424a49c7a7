/**
 * Starting guesses for boundary searches: a sector's boundaries predicted from
 * its neighbours, and a finder that starts each search from the nearest MLT
 * already answered. A hint changes the cost of a search, never its answer beyond
 * the search tolerance (see `sectorBoundaries`).
 */
import type { PreparedModel } from '../field/model';
import type { Tracer } from '../trace/tracer';
import type { Hemisphere } from '../trace/footpoint';
import { sectorBoundaries, HINT_HALF_WIDTH_DEG, type BoundaryHint, type BoundaryOptions, type BoundaryPoint, type SectorBoundaries } from './boundaries';

/** Linear prediction from the two previous sectors' answers (the first alone when only one). */
export function predictHint(prev: SectorBoundaries | null, prev2: SectorBoundaries | null): BoundaryHint | null {
  if (!prev) return null;
  const lat = (b: BoundaryPoint | null) => (b ? Math.abs(b.magLatDeg) : NaN);
  const oc1 = lat(prev.openClosed), oc2 = prev2 ? lat(prev2.openClosed) : NaN;
  const eq1 = lat(prev.equatorward), eq2 = prev2 ? lat(prev2.equatorward) : NaN;
  const dOc = Number.isFinite(oc2) ? oc1 - oc2 : 0;
  const dEq = Number.isFinite(eq2) ? eq1 - eq2 : 0;
  return {
    openClosedLatDeg: oc1 + dOc,
    equatorwardLatDeg: eq1 + dEq,
    halfWidthDeg: Math.max(HINT_HALF_WIDTH_DEG, 0.5 * Math.max(Math.abs(dOc), Math.abs(dEq))),
  };
}

/**
 * Exact boundaries at arbitrary MLTs for one model, each search started from
 * the nearest MLT already answered (bracket half-width growing with the MLT
 * distance). For many sites of one condition; every answer is a full
 * sectorBoundaries search to latTolDeg, so it agrees with an unhinted one to
 * that tolerance.
 */
export function boundaryFinder(model: PreparedModel, tracer: Tracer, opts: Partial<BoundaryOptions> = {}): (hemisphere: Hemisphere, mltH: number) => SectorBoundaries {
  const done: Record<Hemisphere, SectorBoundaries[]> = { north: [], south: [] };
  return (hemisphere, mltH) => {
    let best: SectorBoundaries | null = null;
    let dBest = Infinity;
    for (const b of done[hemisphere]) {
      const d = Math.abs(((b.mltHours - mltH + 36) % 24) - 12);
      if (d < dBest) { dBest = d; best = b; }
    }
    if (best && dBest === 0) return best;
    const hint: BoundaryHint | null = best && dBest <= 3
      ? {
        openClosedLatDeg: best.openClosed ? Math.abs(best.openClosed.magLatDeg) : undefined,
        equatorwardLatDeg: best.equatorward ? Math.abs(best.equatorward.magLatDeg) : undefined,
        halfWidthDeg: 0.15 + 1.2 * dBest, // boundaries move up to ~1–2° per hour of MLT near noon
      }
      : null;
    const r = sectorBoundaries(model, tracer, hemisphere, mltH, opts, hint);
    done[hemisphere].push(r);
    return r;
  };
}
