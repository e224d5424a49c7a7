/** The timeline export handed to the browser as a download. */
import { version } from '../../../package.json';
import { writeJson } from '../../io/json';
import { conjugateAltOf, store } from '../store';
import { timelineStore } from './state';
import { download } from '../exports';
import { timelineSteps } from './steps';
import { timelineCsv, timelineFileName, timelineJson, type TimelineExportMeta } from './export';

/** Returns false when the site timelines are not computed yet. */
export function exportTimeline(kind: 'csv' | 'json'): boolean {
  const t = timelineStore.get();
  const s = store.get();
  const r = t.result;
  if (!r || r.stepsMs.length === 0) return false;
  const steps = timelineSteps(t, s.conditions);
  if (steps.length !== r.stepsMs.length) return false;
  const c = s.conditions;
  const meta: TimelineExportMeta = {
    generator: 'Fieldline Atlas (browser)',
    version,
    createdUtc: new Date().toISOString(),
    source: t.series ? t.series.name : 'night plan',
    model: { internal: c.internal, magnetopause: c.magnetopause, imfEfficiency: c.imfEfficiency, tail: c.tail, tiltDeg: c.tiltDeg },
    products: { altKm: s.products.altKm, sourceRe: s.products.sourceRe ?? 'follows the conditions (storm-following)', minLatDeg: s.products.minLatDeg, minElevationDeg: s.products.minElevationDeg, conjugateAltKm: conjugateAltOf(s.products) },
    sunLimitDeg: t.sunLimitDeg,
  };
  const sources = t.series?.steps.map((x) => x.dstSource);
  if (kind === 'csv') download(timelineFileName(steps, 'csv'), 'text/csv', timelineCsv(meta, steps, r, sources));
  else download(timelineFileName(steps, 'json'), 'application/json', writeJson(timelineJson(meta, steps, r, sources)));
  return true;
}
