import { describe, expect, it } from 'vitest';
import { readCsv } from '../../src/io/csv';
import { geoJsonProblems } from '../../src/io/geojson';
import { boundariesCsv, boundariesGeoJson, exportFileName, exportMetadata, sitesCsv, sitesGeoJson, type ExportMeta } from '../../src/io/app-export';
import type { BoundaryCurve, SiteResult } from '../../workers/protocol';
import { DEMO_SCENARIO } from '../../src/app/scenario';

const meta: ExportMeta = exportMetadata({
  generator: 'test', version: '0', createdUtc: '2025-01-01T00:00:00Z', scenario: 'x',
  conditions: DEMO_SCENARIO.conditions, products: { altKm: 110, conjugateAltKm: 110, minElevationDeg: 10, minLatDeg: 30 }, used: null, warnings: [],
});

function site(name: string, lat: number, lon: number): SiteResult {
  return {
    name, latDeg: lat, lonDeg: lon, type: 'closed',
    conjugate: { hemisphere: 'south', geoLatDeg: -60.5, geoLonDeg: 170.25, magLatDeg: -61, magLonDeg: 10, mltHours: 1, altKm: 0 } as SiteResult['conjugate'],
    footpoints: [], equatorRe: 5.2, lShell: 5.1, mltHours: 23.5, magLatDeg: 64, ovalRelation: 'equatorward',
    sky: { elevationDeg: 12.3, azimuthDeg: 355, distanceKm: 420, visible: true }, boundaries: null, lineGeo: new Float64Array(0),
  };
}

describe('CSV export', () => {
  it('escapes formula-like names (OWASP CSV injection) and keeps negative numbers numeric', () => {
    const csv = sitesCsv([site('=HYPERLINK("x")', -45, -70), site('+1', 1, 1), site('-cmd', 2, 2), site('@SUM(A1)', 3, 3), site('Plain, "quoted"', 4, 4)]);
    const rows = readCsv(csv);
    expect(rows[0]).toContain('lat_deg');
    expect(rows[0].every((h) => /_(deg|km|re|h)$|^(name|line_type|l_shell|oval_relation|sky_visible)$/.test(h))).toBe(true);
    expect(rows.slice(1).map((r) => r[0])).toEqual(["'=HYPERLINK(\"x\")", "'+1", "'-cmd", "'@SUM(A1)", 'Plain, "quoted"']);
    expect(rows[1][1]).toBe('-45');
    expect(rows[1][2]).toBe('-70');
  });

  it('writes one boundary row per MLT sample and hemisphere, with NaN as empty', () => {
    const c: BoundaryCurve = {
      hemisphere: 'north', mltHours: Float64Array.from([0, 12]),
      openClosedMagLatDeg: Float64Array.from([70, NaN]), openClosedGeoLatDeg: Float64Array.from([68, NaN]), openClosedGeoLonDeg: Float64Array.from([10, NaN]),
      equatorwardMagLatDeg: Float64Array.from([65, 72]), equatorwardGeoLatDeg: Float64Array.from([63, 74]), equatorwardGeoLonDeg: Float64Array.from([12, -170]),
      openClosedReason: [null, 'no closed lines at this MLT'], equatorwardReason: [null, null],
    };
    const rows = readCsv(boundariesCsv([c]));
    expect(rows.length).toBe(3);
    expect(rows[2][2]).toBe('');
    expect(rows[2][8], 'an empty boundary carries the engine search\'s reason').toBe('no closed lines at this MLT');
    const gj = boundariesGeoJson([c], meta);
    expect(geoJsonProblems(gj)).toEqual([]);
  });
});

describe('GeoJSON export', () => {
  it('is valid RFC 7946 with lon/lat order and carries the metadata', () => {
    const gj = sitesGeoJson([site('<b>bold</b>', 66.8, 24.1)], meta) as { features: { geometry: { coordinates: number[] }; properties: Record<string, unknown> }[]; metadata: ExportMeta };
    expect(geoJsonProblems(gj)).toEqual([]);
    expect(gj.features[0].geometry.coordinates).toEqual([24.1, 66.8]);
    expect(gj.features[0].properties.name).toBe('<b>bold</b>');
    expect(gj.features[1].geometry.coordinates).toEqual([170.25, -60.5]);
    expect(gj.metadata.pdynNpa).toBe(3);
  });
});

describe('exports that stand alone', () => {
  it('CSV exports start with the same `# key: value` metadata lines as the batch (references §13) and stay readable after them', () => {
    const m = exportMetadata({
      generator: 'test', version: '9.9.9', createdUtc: '2025-01-01T00:00:00Z', scenario: 'Fen "camp"\nline two',
      conditions: { ...DEMO_SCENARIO.conditions, dstNt: -120 },
      products: { altKm: 110, conjugateAltKm: 0, minElevationDeg: 10, minLatDeg: 30 },
      used: { dstNt: -120, dstStarNt: -129.5, dstSource: 'given', speedKms: 400, speedSource: 'nominal', sourceRe: 6.1, sourceReSet: false, ringCurrentEnergyJ: 4e15, tiltDeg: -3.2, standoffRe: 9.8, igrfEpoch: 2025.2 },
      warnings: ['w1'],
    });
    const text = sitesCsv([site('A', 60, 10)], m);
    const lines = text.split('\r\n');
    const metaLines = lines.filter((l) => l.startsWith('# '));
    const keys = metaLines.map((l) => l.slice(2, l.indexOf(':')));
    for (const k of ['time', 'pdynNpa', 'bzNt', 'byNt', 'internal', 'dstNt', 'dstStarNt', 'dstSource', 'speedKms', 'sourceRe', 'conjugateAltKm', 'altKm', 'version']) expect(keys, k).toContain(k);
    expect(metaLines).toContain('# dstSource: given');
    expect(metaLines).toContain('# sourceRe: 6.1');
    expect(metaLines).toContain('# scenario: Fen "camp" line two');
    const table = readCsv(lines.filter((l) => !l.startsWith('# ')).join('\r\n'));
    expect(table[0][0]).toBe('name');
    expect(table[1][0]).toBe('A');
  });

  it('file names carry the result time: fieldline-atlas-sites-2025-03-20T2200Z.csv', () => {
    expect(exportFileName('sites', '2025-03-20T22:00:00Z', 'csv')).toBe('fieldline-atlas-sites-2025-03-20T2200Z.csv');
    expect(exportFileName('boundaries', '2025-03-20T22:07:45.5Z', 'geojson')).toBe('fieldline-atlas-boundaries-2025-03-20T2207Z.geojson');
  });
});
