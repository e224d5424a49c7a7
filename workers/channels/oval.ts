/**
 * The `oval` channel: the open–closed boundary and the equatorward edge per
 * MLT for both hemispheres, each sector an exact search (sectorBoundaries to
 * latTolDeg), computed in the order that makes the searches cheap:
 *  1. coarse sectors all around the clock first (about 8 per hemisphere), each
 *     started from the previous request's answer at the same MLT moved by the
 *     predicted shift (the other hemisphere's shift there when it is done, plus
 *     the mean residual of the coarse sectors answered; or, without a previous
 *     answer, predicted from the coarse neighbours);
 *  2. then the middles of the gaps, level by level, each started from the previous
 *     answer plus the shift interpolated between its two answered neighbours (or,
 *     without a previous answer, from the interpolation of the neighbours themselves).
 * A hint changes the cost of a search, never its answer beyond the tolerance
 * (sectorBoundaries verifies the bracket and falls back to the full scan). A
 * newer request stops the work between sectors.
 */
import { mltGrid, sectorBoundaries, predictHint, type SectorBoundaries, type Hemisphere, type BoundaryHint } from '../../src/physics/mapping';
import type { BoundaryCurve, EngineApi, OvalOptions, OvalResult } from '../protocol';
import { InputError, expectedGot } from '../../src/physics/errors';
import type { EngineContext } from './context';
import { modelUsed } from './used';

/** How many coarse sectors per hemisphere are searched before the rest. */
const COARSE_SECTORS = 8;
/** Bracket half-width (deg) for a coarse sector when nothing of the new condition is known yet. */
const FIRST_SHIFT_HALF_WIDTH_DEG = 0.4;
/** Bracket half-width (deg) for a coarse sector once other coarse sectors' shifts are known. */
const COARSE_HALF_WIDTH_DEG = 0.15;
/**
 * Bracket half-width (deg) for a sector between two answered ones: FINE_HALF_WIDTH_DEG plus
 * FINE_WIDTH_PER_SPREAD × (difference of the neighbours' shifts) × (their distance in sectors);
 * the interpolated shift's error shrinks as the neighbours close in (measured on pressure steps
 * 1.2–10 nPa of the demo conditions: most predictions within 0.05°).
 */
const FINE_HALF_WIDTH_DEG = 0.05;
const FINE_WIDTH_PER_SPREAD = 0.05;

function emptyCurve(hemisphere: Hemisphere, mlts: number[]): BoundaryCurve {
  const n = mlts.length;
  const nan = () => new Float64Array(n).fill(NaN);
  return {
    hemisphere, mltHours: Float64Array.from(mlts),
    openClosedMagLatDeg: nan(), openClosedGeoLatDeg: nan(), openClosedGeoLonDeg: nan(),
    equatorwardMagLatDeg: nan(), equatorwardGeoLatDeg: nan(), equatorwardGeoLonDeg: nan(),
    openClosedReason: new Array<string | null>(n).fill(null), equatorwardReason: new Array<string | null>(n).fill(null),
  };
}

/** Sector i's answer into the curve's columns (NaN stays where a boundary is absent). */
function fillSector(cur: BoundaryCurve, i: number, b: SectorBoundaries): void {
  if (b.openClosed) {
    cur.openClosedMagLatDeg[i] = b.openClosed.magLatDeg; cur.openClosedGeoLatDeg[i] = b.openClosed.geoLatDeg; cur.openClosedGeoLonDeg[i] = b.openClosed.geoLonDeg;
  }
  if (b.equatorward) {
    cur.equatorwardMagLatDeg[i] = b.equatorward.magLatDeg; cur.equatorwardGeoLatDeg[i] = b.equatorward.geoLatDeg; cur.equatorwardGeoLonDeg[i] = b.equatorward.geoLonDeg;
  }
  cur.openClosedReason[i] = b.openClosedReason ?? null;
  cur.equatorwardReason[i] = b.equatorwardReason ?? null;
}

/**
 * The search order: coarse sectors (every stride-th, about COARSE_SECTORS of them) first, then
 * the middle of every gap between sectors already done, level by level, so each later sector
 * sits between two answered neighbours that close in on it.
 */
export function sectorOrder(n: number): { order: number[]; coarse: boolean[] } {
  const stride = Math.max(1, Math.round(n / COARSE_SECTORS));
  const coarse = Array.from({ length: n }, (_, i) => i % stride === 0);
  const order = [...coarse.keys()].filter((i) => coarse[i]);
  const done = coarse.slice();
  while (order.length < n) {
    const level: number[] = [];
    for (const a of order) {
      // The gap after a (cyclic) up to the next done sector: take its middle.
      let g = 1;
      while (g < n && !done[(a + g) % n]) g++;
      if (g > 1) level.push((a + Math.floor(g / 2)) % n);
    }
    for (const i of level) done[i] = true;
    order.push(...level);
  }
  return { order, coarse };
}

/** |magnetic latitude| of a boundary, NaN when absent. */
const absLat = (p: { magLatDeg: number } | null | undefined): number => (p ? Math.abs(p.magLatDeg) : NaN);

type Which = 'openClosed' | 'equatorward';

/**
 * The searches of one hemisphere in the coarse-first order. `prev` is the previous request's
 * answer on the same grid (or null); `ref` the shifts (new − previous) the other hemisphere
 * already showed per sector (or null): the shift here is predicted as ref + a residual learnt
 * from the sectors answered here (the two hemispheres move alike: on pressure and Bz steps of
 * the demo conditions their open–closed shifts differed by 0.03–0.13° in the median).
 * `pause` runs before every sector. Returns the sectors and their shifts.
 */
async function hemisphereInOrder(
  search: (i: number, hint: BoundaryHint | null) => SectorBoundaries,
  n: number, prev: SectorBoundaries[] | null, ref: Record<Which, Float64Array> | null, pause: () => Promise<void>,
): Promise<{ sectors: SectorBoundaries[]; shift: Record<Which, Float64Array> }> {
  const { order, coarse } = sectorOrder(n);
  const done: (SectorBoundaries | null)[] = new Array<SectorBoundaries | null>(n).fill(null);
  const coarseIdx = order.filter((i) => coarse[i]);
  // Shift new − previous per sector, and its residual against the other hemisphere's (NaN where unknown).
  const shift: Record<Which, Float64Array> = { openClosed: new Float64Array(n).fill(NaN), equatorward: new Float64Array(n).fill(NaN) };
  const refAt = (w: Which, i: number): number => (ref ? ref[w][i] : 0);
  const residual = (w: Which, i: number): number => shift[w][i] - refAt(w, i);
  const meanResidual = (w: Which): number => {
    let s = 0, k = 0;
    for (const i of coarseIdx) { const r = residual(w, i); if (Number.isFinite(r)) { s += r; k++; } }
    return k > 0 ? s / k : NaN;
  };
  /** The nearest done sectors before and after i (cyclic), with their distances in sectors. */
  const neighbours = (i: number): [number, number, number, number] => {
    let a = -1, da = 0, b = -1, db = 0;
    for (let d = 1; d < n && a < 0; d++) { const j = (i - d + n) % n; if (done[j]) { a = j; da = d; } }
    for (let d = 1; d < n && b < 0; d++) { const j = (i + d) % n; if (done[j]) { b = j; db = d; } }
    return [a, da, b, db];
  };
  const hint = (oc: number, eq: number, halfWidthDeg: number): BoundaryHint => ({
    openClosedLatDeg: Number.isFinite(oc) ? oc : undefined, equatorwardLatDeg: Number.isFinite(eq) ? eq : undefined, halfWidthDeg,
  });
  const hintFor = (i: number): BoundaryHint | null => {
    if (coarse[i]) {
      if (prev) {
        // The previous answer moved by the predicted shift; with neither the other hemisphere's
        // shift nor a coarse sector answered here yet, unmoved with a wider bracket.
        const predicted = (w: Which): number => {
          const m = meanResidual(w);
          const r = refAt(w, i) + (Number.isFinite(m) ? m : 0);
          return absLat(prev[i][w]) + (Number.isFinite(r) ? r : 0);
        };
        const known = ref !== null || Number.isFinite(meanResidual('openClosed'));
        return hint(predicted('openClosed'), predicted('equatorward'), known ? COARSE_HALF_WIDTH_DEG : FIRST_SHIFT_HALF_WIDTH_DEG);
      }
      // No previous answer: extrapolate from the two coarse sectors before (predictHint's rule).
      const c = coarseIdx.indexOf(i);
      return predictHint(c >= 1 ? done[coarseIdx[c - 1]] : null, c >= 2 ? done[coarseIdx[c - 2]] : null);
    }
    const [a, da, b, db] = neighbours(i);
    if (a < 0 || b < 0) return null;
    const f = da / (da + db);
    const interp = (va: number, vb: number) => va + f * (vb - va);
    if (prev) {
      const p = (w: Which) => absLat(prev[i][w]) + refAt(w, i) + interp(residual(w, a), residual(w, b));
      const spread = Math.max(Math.abs(residual('openClosed', a) - residual('openClosed', b)) || 0, Math.abs(residual('equatorward', a) - residual('equatorward', b)) || 0);
      return hint(p('openClosed'), p('equatorward'), FINE_HALF_WIDTH_DEG + FINE_WIDTH_PER_SPREAD * spread * (da + db));
    }
    const la = done[a]!, lb = done[b]!;
    const spread = Math.max(Math.abs(absLat(la.openClosed) - absLat(lb.openClosed)) || 0, Math.abs(absLat(la.equatorward) - absLat(lb.equatorward)) || 0);
    return hint(interp(absLat(la.openClosed), absLat(lb.openClosed)), interp(absLat(la.equatorward), absLat(lb.equatorward)), 0.15 + 0.3 * spread);
  };
  for (const i of order) {
    await pause();
    const b = search(i, hintFor(i));
    done[i] = b;
    if (prev) for (const w of ['openClosed', 'equatorward'] as const) shift[w][i] = absLat(b[w]) - absLat(prev[i][w]);
  }
  return { sectors: done as SectorBoundaries[], shift };
}

/** The hemispheres of a request: o.hemispheres (each once, 'north' or 'south'), default both. */
function hemispheresOf(o: OvalOptions): Hemisphere[] {
  const h = o.hemispheres ?? ['north', 'south'];
  const ok = Array.isArray(h) && h.length > 0 && h.every((x) => x === 'north' || x === 'south') && new Set(h).size === h.length;
  if (!ok) throw new InputError('hemispheres', expectedGot("a non-empty list of 'north' and/or 'south', each once", JSON.stringify(h)));
  return [...h];
}

export function ovalChannel(ctx: EngineContext): EngineApi['oval'] {
  // The last complete answer per hemisphere and the grid it was computed on: the hints of the next request.
  const last: Partial<Record<Hemisphere, { key: string; sectors: SectorBoundaries[] }>> = {};
  return (requestId, c, o) => ctx.run<OvalResult>('oval', requestId, () => ({ requestId, warnings: [], curves: [] }), async () => {
    const hemispheres = hemispheresOf(o);
    const m = ctx.model(c);
    const t = ctx.tracer(m, o.altKm);
    const mlts = mltGrid(o.mltStepHours);
    // No source distance in the request: the model's storm-following value (sectorBoundaries).
    const opts = { sourceRe: o.sourceRe, latTolDeg: o.latTolDeg ?? 0.01, ...(o.minLatDeg === undefined ? {} : { minLatDeg: o.minLatDeg }) };
    const key = JSON.stringify([o.mltStepHours, o.altKm, opts.sourceRe ?? null, opts.latTolDeg, o.minLatDeg ?? null]);
    const curves: BoundaryCurve[] = [];
    const found: Partial<Record<Hemisphere, SectorBoundaries[]>> = {};
    // The first hemisphere's shifts predict the second's (when one request asks for both).
    let ref: Record<Which, Float64Array> | null = null;
    for (const hemisphere of hemispheres) {
      const cur = emptyCurve(hemisphere, mlts);
      const prev = last[hemisphere]?.key === key ? last[hemisphere]!.sectors : null;
      const { sectors, shift } = await hemisphereInOrder(
        (i, hint) => sectorBoundaries(m, t, hemisphere, mlts[i], opts, hint),
        mlts.length, prev, ref, () => ctx.pause('oval', requestId),
      );
      ref = prev ? shift : null;
      sectors.forEach((b, i) => fillSector(cur, i, b));
      found[hemisphere] = sectors;
      curves.push(cur);
    }
    for (const h of hemispheres) last[h] = { key, sectors: found[h]! };
    return { requestId, warnings: [...m.warnings], curves, used: modelUsed(m, o.sourceRe) };
  });
}
