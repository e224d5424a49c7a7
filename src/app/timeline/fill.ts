/**
 * The sites table at once when the cursor lands on a step the site timelines
 * already answered: the timeline worker ran the same siteReport (same model
 * switches, products and sites) for that step, so its cells are the table's
 * numbers (also while the timeline is still running, for the steps it has
 * done: their cells arrive step by step). Field lines and CGM are not in a timeline cell; the sites
 * channel's own answer follows and replaces the filled one (exports wait for it).
 */
import type { AppSiteResult, SiteInput, SitesResult, TimelineCell, TimelineResult, TimelineStepInput } from '../../../workers/protocol';
import type { FieldConditions } from '../../physics/field/conditions';

const EMPTY_LINE = new Float64Array(0);

/** True when conditions `c` are those the cursor sets for `step` (time and solar wind; the model switches are the caller's check). */
export function conditionsAreStep(c: FieldConditions, step: TimelineStepInput): boolean {
  return c.time === step.time && c.pdynNpa === step.pdynNpa && c.bzNt === step.bzNt && c.byNt === step.byNt
    && (c.dstNt ?? null) === step.dstNt && (c.speedKms ?? null) === step.speedKms;
}

/**
 * The sites result for conditions `c` and `sites` from the timeline result `r` at step `k`, or
 * null when it does not answer them (another step's conditions, other sites, no cell, a stale or
 * failed result). The caller has checked that `r` was asked for the current model switches and
 * products with the steps `steps`.
 */
export function sitesFromTimeline(r: TimelineResult, steps: readonly TimelineStepInput[], k: number, c: FieldConditions, sites: readonly SiteInput[]): SitesResult | null {
  if (r.stale || r.error) return null;
  if (r.stepsMs.length !== steps.length) return null;
  return sitesFromStep(r.sites, r.sites.map((ts) => ts.cells[k]), steps, k, c, sites);
}

/**
 * The sites result from one step's cells (one per site, in the order of `asked`, the sites the
 * timeline request was made for), or null when they do not answer conditions `c` and `sites`: the
 * cells a running timeline request sends as each step is done (the steps done so far fill the
 * table before the whole timeline is in). The caller's checks as for sitesFromTimeline.
 */
export function sitesFromStep(asked: readonly { name: string; latDeg: number; lonDeg: number }[], cells: readonly (TimelineCell | undefined)[], steps: readonly TimelineStepInput[], k: number, c: FieldConditions, sites: readonly SiteInput[]): SitesResult | null {
  const step = steps[k];
  if (!step || !conditionsAreStep(c, step)) return null;
  if (asked.length !== sites.length || cells.length !== sites.length) return null;
  const out: AppSiteResult[] = [];
  for (let i = 0; i < asked.length; i++) {
    const ts = asked[i];
    const want = sites[i];
    const cell = cells[i];
    if (!cell || ts.name !== want.name || ts.latDeg !== want.latDeg || ts.lonDeg !== want.lonDeg) return null;
    const row: AppSiteResult = {
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
    if (cell.error) row.error = cell.error;
    out.push(row);
  }
  return { requestId: -1 - k, warnings: [], sites: out, fromTimeline: true };
}
