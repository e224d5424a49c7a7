/**
 * The sites table at once when the cursor lands on a step the site timelines
 * already answered: the timeline worker ran the same siteReport (same model
 * switches, products and sites) for that step, so its cells are the table's
 * numbers. Field lines and CGM are not in a timeline cell; the sites
 * channel's own answer follows and replaces the filled one.
 */
import type { AppSiteResult, SitesResult } from '../../../workers/protocol';
import type { AppState } from '../store';
import type { TimelineState } from './state';

const EMPTY_LINE = new Float64Array(0);

/**
 * The sites result for the current conditions from the timeline result, or
 * null when the result does not answer them (no series, another cursor step,
 * conditions not those of the step, a result for other inputs).
 * @param resultAnswersInputs the timeline result was asked for the current sites, products and model switches
 */
export function sitesFromTimeline(t: TimelineState, s: AppState, resultAnswersInputs: boolean): SitesResult | null {
  const r = t.result;
  if (!t.series || !r || !resultAnswersInputs || r.stale || r.error) return null;
  const k = t.cursor;
  const step = t.series.steps[k];
  const c = s.conditions;
  if (!step || r.stepsMs[k] !== step.ms) return null;
  if (c.time !== step.time || c.pdynNpa !== step.pdynNpa || c.bzNt !== step.bzNt || c.byNt !== step.byNt || (c.dstNt ?? null) !== step.dstNt || (c.speedKms ?? null) !== step.speedKms) return null;
  if (r.sites.length !== s.sites.length) return null;
  const sites: AppSiteResult[] = [];
  for (let i = 0; i < r.sites.length; i++) {
    const ts = r.sites[i];
    const want = s.sites[i];
    const cell = ts.cells[k];
    if (!cell || ts.name !== want.name || ts.latDeg !== want.latDeg || ts.lonDeg !== want.lonDeg) return null;
    const out: AppSiteResult = {
      name: ts.name,
      latDeg: ts.latDeg,
      lonDeg: ts.lonDeg,
      type: cell.type,
      conjugate: cell.conjugate,
      footpoints: [],
      equatorRe: cell.equatorRe,
      lShell: cell.lShell,
      mltHours: cell.mltHours,
      magLatDeg: cell.magLatDeg,
      ovalRelation: cell.ovalRelation,
      ovalRelationReason: cell.ovalRelationReason ?? null,
      sky: cell.ovalElevationDeg === null || cell.ovalAzimuthDeg === null || cell.ovalDistanceKm === null ? null
        : { elevationDeg: cell.ovalElevationDeg, azimuthDeg: cell.ovalAzimuthDeg, distanceKm: cell.ovalDistanceKm, visible: cell.ovalVisible },
      boundaries: cell.boundaries,
      lineGeo: EMPTY_LINE,
    };
    if (cell.error) out.error = cell.error;
    sites.push(out);
  }
  return { requestId: -1 - k, warnings: [], sites, fromTimeline: true };
}
