/** Export actions: build the files from the store and hand them to the browser as downloads. */
import { version } from '../../package.json';
import { boundariesCsv, boundariesGeoJson, fullJson, sitesCsv, sitesGeoJson, sweepCsv, type ExportMeta } from '../io/app-export';
import { store } from './store';
import { writeJson } from '../io/json';
import { snapshotPng } from './scene/snapshot';
import { mapsSvgDocument } from './panels/mapSvg';
import { ui } from './panels/selection';

function exportMeta(): ExportMeta {
  const s = store.get();
  return {
    generator: 'Fieldline Atlas (browser)',
    version,
    createdUtc: new Date().toISOString(),
    scenario: s.scenarioName,
    conditions: s.conditions,
    products: { altKm: s.products.altKm, sourceRe: s.products.sourceRe, minElevationDeg: s.products.minElevationDeg },
    igrfEpoch: s.scene?.frames.igrfEpoch ?? null,
  };
}

function download(name: string, type: string, data: string | Blob): void {
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

/** Returns false when there is nothing to export yet. */
export function runExport(kind: ExportKind): boolean {
  const s = store.get();
  const sites = s.siteResults?.sites ?? [];
  const curves = s.oval?.curves ?? [];
  switch (kind) {
    case 'sites-csv': return sites.length > 0 && (download('fieldline-atlas-sites.csv', 'text/csv', sitesCsv(sites)), true);
    case 'sites-geojson': return sites.length > 0 && (download('fieldline-atlas-sites.geojson', 'application/geo+json', json(sitesGeoJson(sites, exportMeta()))), true);
    case 'boundaries-csv': return curves.length > 0 && (download('fieldline-atlas-boundaries.csv', 'text/csv', boundariesCsv(curves)), true);
    case 'boundaries-geojson': return curves.length > 0 && (download('fieldline-atlas-boundaries.geojson', 'application/geo+json', json(boundariesGeoJson(curves, exportMeta()))), true);
    case 'sweep-csv': return !!s.sweep && (download(`fieldline-atlas-sweep-${s.sweep.vary}.csv`, 'text/csv', sweepCsv(s.sweep)), true);
    case 'all-json': return download('fieldline-atlas.json', 'application/json', json(fullJson(exportMeta(), sites, curves, s.sweep))), true;
    case 'png': {
      const url = snapshotPng();
      if (!url) return false;
      const bin = atob(url.split(',')[1]);
      const bytes = new Uint8Array(bin.length);
      for (let i = 0; i < bin.length; i++) bytes[i] = bin.charCodeAt(i);
      download('fieldline-atlas-view.png', 'image/png', new Blob([bytes], { type: 'image/png' }));
      return true;
    }
    case 'svg': {
      const maps = document.querySelectorAll<SVGSVGElement>('#polar-maps svg[data-map]');
      if (maps.length === 0) return false;
      // XMLSerializer escapes text content, so site names stay text; the document adds title, time, conditions and legend.
      const ser = new XMLSerializer();
      const doc = mapsSvgDocument({ maps: [...maps].map((m) => ({ markup: ser.serializeToString(m), width: m.width.baseVal.value, height: m.height.baseVal.value })), conditions: s.conditions, products: s.products, basemap: ui.get().basemap });
      download('fieldline-atlas-maps.svg', 'image/svg+xml', doc);
      return true;
    }
  }
}
