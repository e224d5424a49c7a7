/**
 * Export actions: build the files from the store and hand them to the browser
 * as downloads. An export refuses (with the reason) while its result does not
 * match the current inputs (store/freshness.ts), and its metadata describes
 * the inputs the result was computed for, never the current ones.
 */
import { version } from '../../package.json';
import {
  boundariesCsv, boundariesGeoJson, exportFileName, exportMetadata, fullJson, sitesCsv, sitesGeoJson, sweepCsv, type ExportMeta,
} from '../io/app-export';
import type { ModelUsed } from '../../workers/protocol';
import { conjugateAltOf, store, type AnsweredFor, type AppState } from './store';
import { staleReason, type ResultKind } from './store/freshness';
import { writeJson } from '../io/json';
import { snapshotPng } from './scene/snapshot';
import { mapsSvgDocument } from './panels/mapSvg';
import { graticuleView } from './lib/cgmGraticule';
import { ui } from './panels/selection';

function metaFor(s: AppState, a: AnsweredFor, used: ModelUsed | null, warnings: readonly string[]): ExportMeta {
  return exportMetadata({
    generator: 'Fieldline Atlas (browser)',
    version,
    createdUtc: new Date().toISOString(),
    scenario: s.scenarioName,
    conditions: a.conditions,
    products: { altKm: a.products.altKm, conjugateAltKm: conjugateAltOf(a.products), minElevationDeg: a.products.minElevationDeg, minLatDeg: a.products.minLatDeg },
    used,
    warnings,
  });
}

/** Hand text or a blob to the browser as a file download. */
export function download(name: string, type: string, data: string | Blob): void {
  const blob = typeof data === 'string' ? new Blob([data], { type }) : data;
  const url = URL.createObjectURL(blob);
  const a = document.createElement('a');
  a.href = url;
  a.download = name;
  document.body.appendChild(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(url), 5000);
}

const json = (o: object) => writeJson(o);

export type ExportKind = 'sites-csv' | 'sites-geojson' | 'boundaries-csv' | 'boundaries-geojson' | 'sweep-csv' | 'all-json' | 'png' | 'svg';

/** The results each export is made of. */
const NEEDS: Record<ExportKind, ResultKind[]> = {
  'sites-csv': ['sites'],
  'sites-geojson': ['sites'],
  'boundaries-csv': ['oval'],
  'boundaries-geojson': ['oval'],
  'sweep-csv': ['sweep'],
  'all-json': ['sites', 'oval'],
  png: ['scene'],
  svg: ['oval', 'sites'],
};

/** Null when `kind` can be exported now; otherwise the reason it cannot. */
export function exportRefusal(s: AppState, kind: ExportKind): string | null {
  for (const k of NEEDS[kind]) {
    const why = staleReason(s, k);
    if (why) return why;
  }
  if ((kind === 'sites-csv' || kind === 'sites-geojson') && (s.siteResults?.sites.length ?? 0) === 0) return 'there are no sites: add one first';
  if ((kind === 'sites-csv' || kind === 'sites-geojson' || kind === 'all-json') && s.siteResults?.fromTimeline) return 'the sites table is still being completed (field lines and CGM): try again in a moment';
  return null;
}

/** '' when the file was handed to the browser; otherwise the reason it was not. */
export function runExport(kind: ExportKind): string {
  const s = store.get();
  const refusal = exportRefusal(s, kind);
  if (refusal) return refusal;
  const sr = s.siteResults;
  const ov = s.oval;
  const time = s.answeredFor[NEEDS[kind][0]]!.conditions.time;
  const sitesMeta = () => metaFor(s, s.answeredFor.sites!, sr?.used ?? null, sr?.warnings ?? []);
  const ovalMeta = () => metaFor(s, s.answeredFor.oval!, ov?.used ?? null, ov?.warnings ?? []);
  switch (kind) {
    case 'sites-csv':
      download(exportFileName('sites', time, 'csv'), 'text/csv', sitesCsv(sr!.sites, sitesMeta()));
      return '';
    case 'sites-geojson':
      download(exportFileName('sites', time, 'geojson'), 'application/geo+json', json(sitesGeoJson(sr!.sites, sitesMeta())));
      return '';
    case 'boundaries-csv':
      download(exportFileName('boundaries', time, 'csv'), 'text/csv', boundariesCsv(ov!.curves, ovalMeta()));
      return '';
    case 'boundaries-geojson':
      download(exportFileName('boundaries', time, 'geojson'), 'application/geo+json', json(boundariesGeoJson(ov!.curves, ovalMeta())));
      return '';
    case 'sweep-csv': {
      const sw = s.sweep!;
      // The sweep varies one input: its metadata is that of the sweep's base inputs.
      download(exportFileName(`sweep-${sw.vary}`, time, 'csv'), 'text/csv', sweepCsv(sw, metaFor(s, s.answeredFor.sweep!, null, sw.warnings)));
      return '';
    }
    case 'all-json':
      download(exportFileName('all', time, 'json'), 'application/json', json(fullJson(sitesMeta(), sr!.sites, ov!.curves, staleReason(s, 'sweep') ? null : s.sweep)));
      return '';
    case 'png': {
      const url = snapshotPng();
      if (!url) return 'the 3D view is not drawn yet';
      const bin = atob(url.split(',')[1]);
      const bytes = new Uint8Array(bin.length);
      for (let i = 0; i < bin.length; i++) bytes[i] = bin.charCodeAt(i);
      download(exportFileName('view', time, 'png'), 'image/png', new Blob([bytes], { type: 'image/png' }));
      return '';
    }
    case 'svg': {
      const maps = document.querySelectorAll<SVGSVGElement>('#polar-maps svg[data-map]');
      if (maps.length === 0) return 'the maps are not drawn yet';
      // The CGM grid goes into the export only when it is drawn for the current inputs.
      const grat = s.view.cgmGraticule ? graticuleView() : null;
      if (grat && (!grat.graticule || grat.busy)) return grat.error ? `the CGM grid could not be computed: ${grat.error}` : 'the CGM grid is still being computed: try again in a moment';
      // XMLSerializer escapes text content, so site names stay text; the document adds title, time, conditions and legend.
      const ser = new XMLSerializer();
      const doc = mapsSvgDocument({ maps: [...maps].map((m) => ({ markup: ser.serializeToString(m), width: m.width.baseVal.value, height: m.height.baseVal.value })), conditions: s.conditions, products: s.products, basemap: ui.get().basemap, cgm: grat?.graticule ? { heightKm: grat.graticule.heightKm, maxLatDeg: grat.graticule.maxLatDeg } : undefined });
      download(exportFileName('maps', time, 'svg'), 'image/svg+xml', doc);
      return '';
    }
  }
}
