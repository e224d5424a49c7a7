/** `trace`: the field line through a site, its footpoints and its conjugate. */
import { makeTracer, traceSite, cgmPair, type Footpoint, type CgmPair } from '../../physics/mapping';
import { describePoint } from '../../physics/trace/footpoint';
import type { PreparedModel } from '../../physics/field/model';
import { writeCsv, type CsvCell } from '../../io/csv';
import { lineFeature, pointFeature, type Feature } from '../../io/geojson';
import { triples } from '../../io/json';
import { CSV_DECIMALS, type CommandDef } from '../command';
import {
  INPUT_RANGES, CONJUGATE_ALT_FLAG, CONDITION_COLUMNS, conditionCells, conjugateAltKmOf, cgmColumns, cgmCells, cgmNote, cgmJson,
} from '../common';

// mlt_h is MLT (MAG), from the centred dipole; cgm_mlt_h is MLT (CGM). ground_cgm_* is the point's CGM at 0 km below it.
const FOOT_HEADER = [...CONDITION_COLUMNS, 'role', 'hemisphere', 'geo_lat_deg', 'geo_lon_deg', 'mag_lat_deg', 'mag_lon_deg', 'mlt_h', 'alt_km',
  ...cgmColumns(''), ...cgmColumns('ground_'), 'cgm_note',
  'line_type', 'length_re', 'equator_r_re', 'equator_b_nt'];
const POINT_HEADER = ['index', 'x_gsm_re', 'y_gsm_re', 'z_gsm_re', 'r_re', 'geo_lat_deg', 'geo_lon_deg', 'alt_km', 'b_nt'];

const byHemisphere = (a: Footpoint, b: Footpoint) => (a.hemisphere === b.hemisphere ? 0 : a.hemisphere === 'north' ? -1 : 1);

export const traceCommand: CommandDef = {
  name: 'trace',
  summary: 'the field line through a site: type, footpoints, conjugate, equatorial crossing',
  usage: 'trace --lat <deg> --lon <deg> [--height-km <km>] [--coords geo|mag] [--points] [common options]',
  notes: [
    'The site is geodetic (WGS84) with --coords geo, or centred-dipole magnetic latitude and',
    'longitude on a sphere with --coords mag. Footpoints lie at --alt-km above the ellipsoid; the',
    'conjugate point lies at the same altitude unless --conjugate-alt-km sets it apart (one rule',
    'for trace and batch). Use --alt-km 0 for ground conjugates. "siteFootpoint" is the footpoint',
    'on the site\'s side, "conjugate" the one in the other hemisphere (null on open or unresolved lines).',
    'Corrected geomagnetic (CGM) coordinates by tracing the main field (references §6) come with',
    'the site, each footpoint and the conjugate: at the point\'s altitude and at the ground below it;',
    'MLT (CGM) beside the centred dipole\'s MLT (MAG). Near the dipole equator CGM is undefined,',
    'and the reason is given instead.',
    'CSV: `#` metadata lines (time, conditions, storm index source, model switches, altitudes,',
    'version), a header, one row per point (site, near footpoint, conjugate) with the time and',
    'condition columns; with --points one row per line point instead.',
    'GeoJSON: the line\'s sub-point track as a LineString ([lon, lat, height m]; cut into a',
    'MultiLineString where it crosses the antimeridian) and Points for the site and footpoints.',
  ].join('\n'),
  flags: [
    { name: 'lat', kind: 'number', meta: '<deg>', unit: 'deg', ...INPUT_RANGES.latDeg, help: 'site latitude', required: true },
    { name: 'lon', kind: 'number', meta: '<deg>', unit: 'deg', ...INPUT_RANGES.lonDeg, help: 'site longitude, east positive', required: true },
    { name: 'height-km', kind: 'number', meta: '<km>', unit: 'km', ...INPUT_RANGES.siteHeightKm, help: 'site height', defaultText: '0' },
    { name: 'coords', kind: 'enum', meta: 'geo|mag', values: ['geo', 'mag'], help: 'coordinates of --lat/--lon', defaultText: 'geo' },
    { name: 'points', kind: 'switch', help: 'include the line\'s points (GSM, RE)' },
    CONJUGATE_ALT_FLAG,
  ],
  formats: ['json', 'csv', 'geojson'],
  examples: ['trace --lat 62.5 --lon 25.1 --alt-km 0 --time 2025-03-20T22:00:00Z', 'trace --lat 64.8 --lon -19.6 --alt-km 110 --conjugate-alt-km 0 --format csv', 'trace --lat 70 --lon 0 --coords mag --points --format geojson'],
  run(ctx) {
    const lat = ctx.flags.lat as number;
    const lon = ctx.flags.lon as number;
    const heightKm = (ctx.flags['height-km'] as number | undefined) ?? 0;
    const coords = ((ctx.flags.coords as string | undefined) ?? 'geo') as 'geo' | 'mag';
    const wantPoints = ctx.flags.points === true;
    const format = ctx.flags.format ?? 'json';
    const model = ctx.model;
    const conjugateAltKm = conjugateAltKmOf(ctx.flags, ctx.altKm);
    const line = traceWithConjugateAlt(model, { lat, lon, heightKm, coords }, ctx.altKm, conjugateAltKm, wantPoints || format === 'geojson');
    if (line.type === 'unresolved') ctx.warn('the line was not resolved within the step and length budget: footpoints may be missing');
    if (line.type === 'open') ctx.warn('the line is open: it has no conjugate point');
    const footpoints = [...line.footpoints].sort(byHemisphere);
    const pts = line.points ? triples(line.points) : null;
    const s = line.siteGsm;
    const sd = describePoint(model.frames, s[0], s[1], s[2]);
    // CGM of the site at its height and at the mapping altitude above it; of each footpoint at its altitude and at the ground.
    const siteLat = coords === 'geo' ? lat : sd.geoLatDeg, siteLon = coords === 'geo' ? lon : sd.geoLonDeg;
    const siteHeight = coords === 'geo' ? heightKm : sd.altKm;
    const siteCgm = cgmPair(model, siteLat, siteLon, siteHeight);
    const siteCgmAtAlt = cgmPair(model, siteLat, siteLon, ctx.altKm).atAlt;
    const fpCgm = new Map<Footpoint, CgmPair>(footpoints.map((fp) => [fp, cgmPair(model, fp.geoLatDeg, fp.geoLonDeg, fp.altKm)]));
    const withCgm = (fp: Footpoint | null) => {
      if (!fp) return null;
      const c = fpCgm.get(fp)!;
      return { ...fp, cgm: cgmJson(c.atAlt), groundCgm: cgmJson(c.ground) };
    };
    const site = {
      latDeg: lat, lonDeg: lon, heightKm, coords, gsmRe: s, geoLatDeg: sd.geoLatDeg, geoLonDeg: sd.geoLonDeg, magLatDeg: sd.magLatDeg, mltHours: sd.mltHours,
      cgm: cgmJson(siteCgm.atAlt), cgmAtMappingAlt: { altKm: ctx.altKm, ...cgmJson(siteCgmAtAlt) },
    };
    const fieldLine: Record<string, unknown> = { type: line.type, lengthRe: line.lengthRe, equator: line.equator, footpoints: footpoints.map(withCgm) };
    if (wantPoints && pts) fieldLine.points = pts;
    const csvSite: CsvSiteRow = { sd, lat: siteLat, lon: siteLon, heightKm: siteHeight, cgm: siteCgm };
    return {
      settings: { conjugateAltKm, mltLabels: { mltHours: 'MLT (MAG)', mltCgmHours: 'MLT (CGM)' } },
      json: { site, fieldLine, siteFootpoint: withCgm(line.near), conjugate: withCgm(line.conjugate), evaluations: line.evals },
      csv: () => (wantPoints && pts ? pointsCsv(model, pts) : footpointsCsv(model, line, footpoints, fpCgm, csvSite)),
      geojson: () => traceFeatures(model, line, footpoints, pts ?? [], { lat, lon, heightKm, coords, sd }),
    };
  },
};

interface SiteInput { lat: number; lon: number; heightKm: number; coords: 'geo' | 'mag' }
type SiteLine = ReturnType<typeof traceSite>;
type PointDescription = ReturnType<typeof describePoint>;
interface CsvSiteRow { sd: PointDescription; lat: number; lon: number; heightKm: number; cgm: CgmPair }

/** The site's line with footpoints at altKm; the conjugate, when one exists, at conjugateAltKm (the same line ended at that altitude in the far hemisphere). */
function traceWithConjugateAlt(model: PreparedModel, site: SiteInput, altKm: number, conjugateAltKm: number, keepPoints: boolean): SiteLine {
  const tracer = makeTracer(model, { altKm, ellipsoid: true });
  const line = traceSite(model, tracer, site.lat, site.lon, site.heightKm, site.coords, keepPoints);
  if (conjugateAltKm !== altKm && line.conjugate) {
    const far = traceSite(model, makeTracer(model, { altKm: conjugateAltKm, ellipsoid: true }), site.lat, site.lon, site.heightKm, site.coords, false);
    const i = line.footpoints.indexOf(line.conjugate);
    line.conjugate = far.conjugate;
    if (far.conjugate && i >= 0) line.footpoints[i] = far.conjugate;
  }
  return line;
}

/** CSV with one row per line point (GSM, geodetic position, |B|). */
function pointsCsv(model: PreparedModel, pts: [number, number, number][]): string {
  const b = new Float64Array(3);
  const rows = pts.map(([x, y, z], i): CsvCell[] => {
    model.evaluate(b, x, y, z);
    const d = describePoint(model.frames, x, y, z);
    return [i, x, y, z, Math.hypot(x, y, z), d.geoLatDeg, d.geoLonDeg, d.altKm, Math.hypot(b[0], b[1], b[2])];
  });
  return writeCsv(POINT_HEADER, rows, { maxDecimals: CSV_DECIMALS });
}

/** CSV with one row for the site and one per footpoint, each with the time and condition columns. */
function footpointsCsv(model: PreparedModel, line: SiteLine, footpoints: Footpoint[], fpCgm: Map<Footpoint, CgmPair>, site: CsvSiteRow): string {
  const cond = conditionCells(model);
  const lineCells: CsvCell[] = [line.type, line.lengthRe, line.equator?.rRe, line.equator?.bNt];
  const { sd, cgm } = site;
  const rows: CsvCell[][] = [[
    ...cond, 'site', sd.magLatDeg >= 0 ? 'north' : 'south', site.lat, site.lon, sd.magLatDeg, sd.magLonDeg, sd.mltHours, site.heightKm,
    ...cgmCells(cgm.atAlt), ...cgmCells(cgm.ground), cgmNote(cgm.atAlt, cgm.ground), ...lineCells,
  ]];
  for (const fp of footpoints) {
    const c = fpCgm.get(fp)!;
    rows.push([...cond, fp === line.conjugate ? 'conjugate' : 'near', fp.hemisphere, fp.geoLatDeg, fp.geoLonDeg, fp.magLatDeg, fp.magLonDeg, fp.mltHours, fp.altKm,
      ...cgmCells(c.atAlt), ...cgmCells(c.ground), cgmNote(c.atAlt, c.ground), ...lineCells]);
  }
  return writeCsv(FOOT_HEADER, rows, { maxDecimals: CSV_DECIMALS });
}

/** GeoJSON: the line's sub-point track, the site and the footpoints. */
function traceFeatures(model: PreparedModel, line: SiteLine, footpoints: Footpoint[], pts: [number, number, number][], site: SiteInput & { sd: PointDescription }): Feature[] {
  const track = pts.map(([x, y, z]) => {
    const d = describePoint(model.frames, x, y, z);
    return [d.geoLonDeg, d.geoLatDeg, d.altKm * 1000];
  });
  const { lat, lon, heightKm, coords, sd } = site;
  const feats: Feature[] = [
    lineFeature(track, { kind: 'fieldLine', type: line.type, lengthRe: line.lengthRe, equatorRRe: line.equator?.rRe ?? null, equatorBNt: line.equator?.bNt ?? null }),
    // A geodetic site is placed exactly as given; a magnetic one at its computed geodetic position.
    coords === 'geo'
      ? pointFeature(lon, lat, { kind: 'site', coords, latDeg: lat, lonDeg: lon, heightKm }, heightKm)
      : pointFeature(sd.geoLonDeg, sd.geoLatDeg, { kind: 'site', coords, latDeg: lat, lonDeg: lon, heightKm }, sd.altKm),
  ];
  for (const fp of footpoints) {
    feats.push(pointFeature(fp.geoLonDeg, fp.geoLatDeg, { kind: 'footpoint', role: fp === line.conjugate ? 'conjugate' : 'near', ...fp }, fp.altKm));
  }
  return feats;
}
