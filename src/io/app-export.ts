/**
 * The app's export files: sites/conjugates, boundaries and sweeps as CSV
 * (units in headers), GeoJSON (RFC 7946: lon/lat, WGS84) and JSON with a
 * metadata block. Pure builders: data in, text out.
 */
import type { BoundaryCurve, ModelUsed, SiteResult, SweepResult } from '../../workers/protocol';
import type { FieldConditions } from '../physics/field/conditions';
import { writeCsv, type CsvCell as Cell } from './csv';
import { featureCollection, lineFeature, pointFeature, type Feature } from './geojson';

/** The product settings a result was computed with. */
export interface ExportProducts {
  altKm: number;
  /** The conjugate altitude used, km (the footpoint altitude unless set apart). */
  conjugateAltKm: number;
  minElevationDeg: number;
  minLatDeg: number;
}

/** What the metadata of an export is built from: the inputs of the result (never the current inputs) and what the model used. */
export interface ExportSource {
  generator: string;
  version: string;
  createdUtc: string;
  scenario: string;
  conditions: FieldConditions;
  products: ExportProducts;
  /** What the worker's model used (storm state, source distance, tilt); null when the result has none. */
  used: ModelUsed | null;
  warnings: readonly string[];
}

/** Flat metadata, keyed and ordered like the command line's conditions block (references §13), then the app's own keys. */
export type ExportMeta = Record<string, unknown>;

export function exportMetadata(x: ExportSource): ExportMeta {
  const c = x.conditions;
  const u = x.used;
  return {
    time: c.time,
    pdynNpa: c.pdynNpa,
    bzNt: c.bzNt,
    byNt: c.byNt,
    tiltDeg: u ? u.tiltDeg : c.tiltDeg ?? null,
    standoffRe: u ? u.standoffRe : null,
    internal: c.internal,
    magnetopause: c.magnetopause,
    imfEfficiency: c.imfEfficiency,
    altKm: x.products.altKm,
    warnings: [...x.warnings],
    tail: c.tail ?? true,
    tiltSource: c.tiltDeg === null || c.tiltDeg === undefined ? 'time' : 'override',
    igrfEpoch: u ? u.igrfEpoch : null,
    coefficients: 'IGRF-14',
    dstNt: u ? u.dstNt : c.dstNt ?? null,
    dstStarNt: u ? u.dstStarNt : null,
    dstSource: u ? u.dstSource : c.dstNt == null ? 'estimated' : 'given',
    speedKms: u ? u.speedKms : c.speedKms ?? null,
    speedSource: u ? u.speedSource : c.speedKms == null ? 'nominal' : 'given',
    ringCurrentEnergyJ: u ? u.ringCurrentEnergyJ : null,
    sourceRe: u ? u.sourceRe : null,
    sourceReSource: u ? (u.sourceReSet ? 'set' : 'conditions') : null,
    conjugateAltKm: x.products.conjugateAltKm,
    minElevationDeg: x.products.minElevationDeg,
    minLatDeg: x.products.minLatDeg,
    version: x.version,
    generator: x.generator,
    createdUtc: x.createdUtc,
    scenario: x.scenario,
  };
}

/** `# key: value` lines (CRLF) before a CSV table, as the command line's batch writes them. */
export function csvMetadataLines(meta: ExportMeta): string {
  return Object.entries(meta).map(([k, v]) => `# ${k}: ${typeof v === 'string' ? v : JSON.stringify(v)}`.replace(/[\r\n]+/g, ' ')).join('\r\n') + '\r\n';
}

/** A file name stamped with the result's time: fieldline-atlas-<what>-2025-03-20T2200Z.<ext>. */
export function exportFileName(what: string, timeIso: string, ext: string): string {
  const ms = Date.parse(timeIso);
  const stamp = Number.isFinite(ms) ? new Date(ms).toISOString().slice(0, 16).replace(':', '') + 'Z' : 'undated';
  return `fieldline-atlas-${what}-${stamp}.${ext}`;
}

const r = (v: number | null | undefined, d: number): number | null => (v == null || !Number.isFinite(v) ? null : Math.round(v * 10 ** d) / 10 ** d);

const SITE_HEADER = [
  'name', 'lat_deg', 'lon_deg', 'line_type', 'conjugate_lat_deg', 'conjugate_lon_deg', 'conjugate_alt_km',
  'equator_distance_re', 'l_shell', 'mlt_h', 'mag_lat_deg', 'oval_relation',
  'sky_elevation_deg', 'sky_azimuth_deg', 'sky_distance_km', 'sky_visible',
  'open_closed_mag_lat_deg', 'equatorward_mag_lat_deg',
];

export function siteRow(s: SiteResult): Cell[] {
  const c = s.conjugate;
  return [
    s.name, r(s.latDeg, 5), r(s.lonDeg, 5), s.type, r(c?.geoLatDeg, 4), r(c?.geoLonDeg, 4), r(c?.altKm, 1),
    r(s.equatorRe, 3), r(s.lShell, 3), r(s.mltHours, 3), r(s.magLatDeg, 4), s.ovalRelation,
    r(s.sky?.elevationDeg, 2), r(s.sky?.azimuthDeg, 2), r(s.sky?.distanceKm, 1), s.sky ? s.sky.visible : null,
    r(s.boundaries?.openClosedMagLatDeg, 4), r(s.boundaries?.equatorwardMagLatDeg, 4),
  ];
}

/** The sites table; with `meta`, the `#` metadata lines first. */
export function sitesCsv(sites: SiteResult[], meta?: ExportMeta): string {
  return (meta ? csvMetadataLines(meta) : '') + writeCsv(SITE_HEADER, sites.map(siteRow));
}

const BOUNDARY_HEADER = [
  'hemisphere', 'mlt_h', 'open_closed_mag_lat_deg', 'open_closed_geo_lat_deg', 'open_closed_geo_lon_deg',
  'equatorward_mag_lat_deg', 'equatorward_geo_lat_deg', 'equatorward_geo_lon_deg',
  'open_closed_missing_reason', 'equatorward_missing_reason',
];

export function boundariesCsv(curves: BoundaryCurve[], meta?: ExportMeta): string {
  const rows: Cell[][] = [];
  for (const c of curves)
    for (let i = 0; i < c.mltHours.length; i++)
      rows.push([
        c.hemisphere, r(c.mltHours[i], 3), r(c.openClosedMagLatDeg[i], 4), r(c.openClosedGeoLatDeg[i], 4), r(c.openClosedGeoLonDeg[i], 4),
        r(c.equatorwardMagLatDeg[i], 4), r(c.equatorwardGeoLatDeg[i], 4), r(c.equatorwardGeoLonDeg[i], 4),
        c.openClosedReason?.[i] ?? null, c.equatorwardReason?.[i] ?? null,
      ]);
  return (meta ? csvMetadataLines(meta) : '') + writeCsv(BOUNDARY_HEADER, rows);
}

export function sweepCsv(s: SweepResult, meta?: ExportMeta): string {
  const head = [s.vary === 'pdyn' ? 'pdyn_npa' : 'imf_bz_nt', 'mlt_h', 'north_open_closed_mag_lat_deg', 'north_equatorward_mag_lat_deg', 'south_open_closed_mag_lat_deg', 'south_equatorward_mag_lat_deg'];
  const rows: Cell[][] = [];
  for (let i = 0; i < s.values.length; i++)
    rows.push([r(s.values[i], 4), s.mltHours, r(s.northOpenClosedMagLatDeg[i], 4), r(s.northEquatorwardMagLatDeg[i], 4), r(s.southOpenClosedMagLatDeg[i], 4), r(s.southEquatorwardMagLatDeg[i], 4)]);
  return (meta ? csvMetadataLines(meta) : '') + writeCsv(head, rows);
}

/** A closed boundary ring as lon/lat positions (NaN where absent; the shared writer cuts gaps and the antimeridian). */
function ring(lat: ArrayLike<number>, lon: ArrayLike<number>): (number[] | null)[] {
  const out: (number[] | null)[] = [];
  for (let k = 0; k <= lat.length; k++) {
    const i = k % lat.length;
    out.push(Number.isFinite(lat[i]) && Number.isFinite(lon[i]) ? [r(lon[i], 5)!, r(lat[i], 5)!] : null);
  }
  return out;
}

export function boundariesGeoJson(curves: BoundaryCurve[], meta: ExportMeta): object {
  const features: Feature[] = [];
  for (const c of curves)
    for (const edge of ['openClosed', 'equatorward'] as const)
      features.push(lineFeature(ring(c[`${edge}GeoLatDeg`], c[`${edge}GeoLonDeg`]), { hemisphere: c.hemisphere, boundary: edge === 'openClosed' ? 'open-closed' : 'equatorward', alt_km: meta.altKm }));
  return featureCollection(features, { metadata: meta });
}

export function sitesGeoJson(sites: SiteResult[], meta: ExportMeta): object {
  const features: Feature[] = [];
  for (const s of sites) {
    const row = siteRow(s);
    const props: Record<string, unknown> = Object.fromEntries(SITE_HEADER.map((h, i) => [h, row[i] ?? null]));
    features.push(pointFeature(r(s.lonDeg, 5)!, r(s.latDeg, 5)!, { ...props, role: 'site' }));
    if (s.conjugate)
      features.push(pointFeature(r(s.conjugate.geoLonDeg, 5)!, r(s.conjugate.geoLatDeg, 5)!, { name: s.name, role: 'conjugate', hemisphere: s.conjugate.hemisphere, alt_km: s.conjugate.altKm }));
  }
  return featureCollection(features, { metadata: meta });
}

const arr = (a: ArrayLike<number>, d: number) => Array.from(a, (v) => r(v, d));

export function fullJson(meta: ExportMeta, sites: SiteResult[], curves: BoundaryCurve[], sweep: SweepResult | null): object {
  return {
    metadata: meta,
    sites: sites.map((s) => ({ ...s, lineGeo: undefined, error: s.error })),
    boundaries: curves.map((c) => ({
      hemisphere: c.hemisphere,
      mlt_h: arr(c.mltHours, 3),
      open_closed_mag_lat_deg: arr(c.openClosedMagLatDeg, 4),
      open_closed_geo_lat_deg: arr(c.openClosedGeoLatDeg, 4),
      open_closed_geo_lon_deg: arr(c.openClosedGeoLonDeg, 4),
      equatorward_mag_lat_deg: arr(c.equatorwardMagLatDeg, 4),
      equatorward_geo_lat_deg: arr(c.equatorwardGeoLatDeg, 4),
      equatorward_geo_lon_deg: arr(c.equatorwardGeoLonDeg, 4),
      open_closed_missing_reason: c.openClosedReason,
      equatorward_missing_reason: c.equatorwardReason,
    })),
    sweep: sweep && {
      vary: sweep.vary,
      unit: sweep.vary === 'pdyn' ? 'nPa' : 'nT',
      mlt_h: sweep.mltHours,
      values: arr(sweep.values, 4),
      north_open_closed_mag_lat_deg: arr(sweep.northOpenClosedMagLatDeg, 4),
      north_equatorward_mag_lat_deg: arr(sweep.northEquatorwardMagLatDeg, 4),
      south_open_closed_mag_lat_deg: arr(sweep.southOpenClosedMagLatDeg, 4),
      south_equatorward_mag_lat_deg: arr(sweep.southEquatorwardMagLatDeg, 4),
    },
  };
}
