/**
 * The `timeline` channel: every site at every step of a timeline (a loaded
 * solar-wind series, or a night at a chosen step), in one call per series.
 * Per step: one model for the step's conditions, the per-site report
 * (siteReport, the same as the sites channel, so the table at a step equals
 * this row), the margin to the nearest oval edge, and the sky darkness; per
 * site: the best hours. A newer timeline request stops the work between steps.
 * Models are prepared here, not through the shared cache, so a long timeline
 * does not evict the model the other channels are using.
 */
import { prepareModel } from '../../src/physics/field/model';
import { makeTracer, sectorBoundaries, siteReport, type SiteResult } from '../../src/physics/mapping';
import { skyDarkness } from '../../src/physics/mapping/darkness';
import { bestHours, type TimelineStep } from '../../src/physics/mapping/best-hours';
import { InputError, requireInRange } from '../../src/physics/errors';
import { parseUtc } from '../../src/physics/frames/time';
import type { EngineApi, TimelineCell, TimelineResult, TimelineSite } from '../protocol';
import type { EngineContext } from './context';
import { MAX_TIMELINE_STEPS } from './timeline-limits';

/** Lowest elevation (deg) at which the oval counts as visible when the request gives none (as the sites channel). */
const DEFAULT_MIN_ELEVATION_DEG = 10;


/**
 * Distance (deg of magnetic latitude, ≥ 0) from |magLat| to the nearest oval
 * edge at the site's MLT: to the open–closed boundary when poleward, to the
 * equatorward edge when equatorward, to the nearer of the two inside.
 */
export function ovalMarginDeg(r: Pick<SiteResult, 'ovalRelation' | 'magLatDeg' | 'boundaries'>): number | null {
  const a = Math.abs(r.magLatDeg);
  const oc = r.boundaries?.openClosedMagLatDeg;
  const eq = r.boundaries?.equatorwardMagLatDeg;
  const toOc = oc === null || oc === undefined ? null : Math.abs(a - Math.abs(oc));
  const toEq = eq === null || eq === undefined ? null : Math.abs(a - Math.abs(eq));
  switch (r.ovalRelation) {
    case 'poleward': return toOc;
    case 'equatorward': return toEq;
    case 'inside': return toOc === null ? toEq : toEq === null ? toOc : Math.min(toOc, toEq);
    default: return null;
  }
}

/** Per engine: the step each running timeline request should compute next (set by timelineFocus). */
const focusOf = new WeakMap<EngineContext, Map<number, number>>();
function focusMap(ctx: EngineContext): Map<number, number> {
  let f = focusOf.get(ctx);
  if (!f) focusOf.set(ctx, (f = new Map()));
  return f;
}

/** The `timelineFocus` call: step `step` of the running request `requestId` next (ignored when it is not running). */
export function timelineFocusChannel(ctx: EngineContext): EngineApi['timelineFocus'] {
  return async (requestId, step) => {
    const f = focusMap(ctx);
    if (f.has(requestId) && Number.isInteger(step)) f.set(requestId, step);
  };
}

export function timelineChannel(ctx: EngineContext): EngineApi['timeline'] {
  return (requestId, base, steps, o, sites, progress) => ctx.run<TimelineResult>('timeline', requestId, () => ({ requestId, warnings: [], stepsMs: [], dstNt: [], dstSource: [], sites: [] }), async () => {
    if (!Array.isArray(steps) || steps.length === 0) throw new InputError('timeline', 'expected at least one time step');
    if (steps.length > MAX_TIMELINE_STEPS) throw new InputError('timeline', `expected at most ${MAX_TIMELINE_STEPS} steps, got ${steps.length}`);
    const sunLimitDeg = requireInRange('sunLimitDeg', o.sunLimitDeg, -30, 0, 'deg');
    const conjugateAltKm = o.conjugateAltKm ?? 0;
    const stepsMs = steps.map((s, i) => {
      const ms = parseUtc(s.time);
      if (i > 0 && !(ms > parseUtc(steps[i - 1].time))) throw new InputError('timeline', `step ${i + 1}: times must increase (${s.time} is not after ${steps[i - 1].time})`);
      return ms;
    });
    const out: TimelineSite[] = sites.map((s) => ({ name: s.name, latDeg: s.latDeg, lonDeg: s.lonDeg, cells: [], bestHours: '', bestIntervals: [] }));
    const n = steps.length;
    // Steps in order, except a focused step (timelineFocus) goes next; every answer goes to its step's slot.
    const stepWarnings: (readonly string[])[] = new Array(n);
    const dstNt: number[] = new Array(n);
    const dstSource: ('given' | 'estimated')[] = new Array(n);
    for (const s of out) s.cells = new Array<TimelineCell>(n);
    const done = new Uint8Array(n);
    let nextInOrder = 0;
    const focus = focusMap(ctx);
    focus.set(requestId, -1);
    try {
      for (let count = 0; count < n; count++) {
        await ctx.pause('timeline', requestId);
        let i = focus.get(requestId) ?? -1;
        if (!(i >= 0 && i < n) || done[i]) {
          while (done[nextInOrder]) nextInOrder++;
          i = nextInOrder;
        }
        done[i] = 1;
        const st = steps[i];
        const m = prepareModel({ ...base, time: st.time, pdynNpa: st.pdynNpa, bzNt: st.bzNt, byNt: st.byNt, dstNt: st.dstNt, speedKms: st.speedKms });
        stepWarnings[i] = m.warnings;
        dstNt[i] = m.storm.dstNt;
        dstSource[i] = m.storm.dstSource;
        const stepCells: TimelineCell[] = [];
        const tConj = makeTracer(m, { altKm: conjugateAltKm, ellipsoid: true });
        const tAlt = conjugateAltKm === o.altKm ? tConj : makeTracer(m, { altKm: o.altKm, ellipsoid: true });
        // As the sites channel: no source distance in the request means the model's storm-following one.
        const sourceRe = o.sourceRe ?? m.sourceRe;
        const options = { conjugateAltKm, altKm: o.altKm, sourceRe, minElevationDeg: o.minElevationDeg ?? DEFAULT_MIN_ELEVATION_DEG };
        const boundaryAt = o.minLatDeg === undefined ? undefined
          : (h: 'north' | 'south', mlt: number) => sectorBoundaries(m, tAlt, h, mlt, { sourceRe, minLatDeg: o.minLatDeg });
        sites.forEach((site, k) => {
          const r = siteReport(m, tConj, tAlt, site, options, boundaryAt, false);
          const d = skyDarkness(site.latDeg, site.lonDeg, site.heightKm ?? 0, stepsMs[i], { sunLimitDeg });
          const cell: TimelineCell = {
            type: r.type,
            ovalRelation: r.ovalRelation,
            ovalMarginDeg: ovalMarginDeg(r),
            mltHours: r.mltHours,
            magLatDeg: r.magLatDeg,
            lShell: r.lShell,
            conjugateLatDeg: r.conjugate ? r.conjugate.geoLatDeg : null,
            conjugateLonDeg: r.conjugate ? r.conjugate.geoLonDeg : null,
            openClosedMagLatDeg: r.boundaries?.openClosedMagLatDeg ?? null,
            equatorwardMagLatDeg: r.boundaries?.equatorwardMagLatDeg ?? null,
            ovalElevationDeg: r.sky ? r.sky.elevationDeg : null,
            ovalAzimuthDeg: r.sky ? r.sky.azimuthDeg : null,
            ovalVisible: r.sky ? r.sky.visible : false,
            sunElevationDeg: d.sunElevationDeg,
            twilight: d.twilight,
            dark: d.dark,
            moonElevationDeg: d.moonElevationDeg,
            moonIlluminatedFraction: d.moonIlluminatedFraction,
            equatorRe: r.equatorRe,
            conjugate: r.conjugate,
            ovalDistanceKm: r.sky ? r.sky.distanceKm : null,
            ovalRelationReason: r.ovalRelationReason ?? null,
            boundaries: r.boundaries,
          };
          if (r.error) cell.error = r.error;
          out[k].cells[i] = cell;
          stepCells.push(cell);
        });
        progress?.(count + 1, n, i, stepCells);
      }
    } finally {
      focus.delete(requestId);
    }
    // The warnings in step order (the same list whatever the order the steps were computed in).
    const warnings = new Set(stepWarnings.flat());
    for (const s of out) {
      const tl: TimelineStep[] = s.cells.map((c, i) => ({ ms: stepsMs[i], lineType: c.type, ovalRelation: c.ovalRelation, ovalMarginDeg: c.ovalMarginDeg, ovalElevationDeg: c.ovalElevationDeg, dark: c.dark }));
      const b = bestHours(tl, o.maxZenithDeg === undefined ? {} : { maxZenithDeg: o.maxZenithDeg });
      s.bestHours = b.sentence;
      s.bestIntervals = b.intervals;
    }
    return { requestId, warnings: [...warnings], stepsMs, dstNt, dstSource, sites: out };
  });
}
