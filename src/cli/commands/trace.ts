/** `trace`: the field line through a site, its footpoints and its conjugate. */
import { makeTracer, traceSite, type Footpoint } from '../../physics/mapping';
import { describePoint } from '../../physics/trace/footpoint';
import { writeCsv, type CsvCell } from '../../io/csv';
import { lineFeature, pointFeature, type Feature } from '../../io/geojson';
import { triples } from '../../io/json';
import { CSV_DECIMALS, type CommandDef } from '../command';
import { INPUT_RANGES } from '../common';

const FOOT_HEADER = ['role', 'hemisphere', 'geo_lat_deg', 'geo_lon_deg', 'mag_lat_deg', 'mag_lon_deg', 'mlt_h', 'alt_km',
  'line_type', 'length_re', 'equator_r_re', 'equator_b_nt'];
const POINT_HEADER = ['index', 'x_gsm_re', 'y_gsm_re', 'z_gsm_re', 'r_re', 'geo_lat_deg', 'geo_lon_deg', 'alt_km', 'b_nt'];

const byHemisphere = (a: Footpoint, b: Footpoint) => (a.hemisphere === b.hemisphere ? 0 : a.hemisphere === 'north' ? -1 : 1);

export const traceCommand: CommandDef = {
  name: 'trace',
  summary: 'the field line through a site: type, footpoints, conjugate, equatorial crossing',
  usage: 'trace --lat <deg> --lon <deg> [--height-km <km>] [--coords geo|mag] [--points] [common options]',
  notes: [
    'The site is geodetic (WGS84) with --coords geo, or centred-dipole magnetic latitude and',
    'longitude on a sphere with --coords mag. Footpoints lie at --alt-km above the ellipsoid;',
    'use --alt-km 0 for ground conjugates. "siteFootpoint" is the footpoint on the site\'s side,',
    '"conjugate" the one in the other hemisphere (null on open or unresolved lines).',
    'CSV: one row per footpoint; with --points one row per line point instead.',
    'GeoJSON: the line\'s sub-point track as a LineString ([lon, lat, height m]; cut into a',
    'MultiLineString where it crosses the antimeridian) and Points for the site and footpoints.',
  ].join('\n'),
  flags: [
    { name: 'lat', kind: 'number', meta: '<deg>', unit: 'deg', ...INPUT_RANGES.latDeg, help: 'site latitude', required: true },
    { name: 'lon', kind: 'number', meta: '<deg>', unit: 'deg', ...INPUT_RANGES.lonDeg, help: 'site longitude, east positive', required: true },
    { name: 'height-km', kind: 'number', meta: '<km>', unit: 'km', ...INPUT_RANGES.siteHeightKm, help: 'site height', defaultText: '0' },
    { name: 'coords', kind: 'enum', meta: 'geo|mag', values: ['geo', 'mag'], help: 'coordinates of --lat/--lon', defaultText: 'geo' },
    { name: 'points', kind: 'switch', help: 'include the line\'s points (GSM, RE)' },
  ],
  formats: ['json', 'csv', 'geojson'],
  examples: ['trace --lat 62.5 --lon 25.1 --alt-km 0 --time 2025-03-20T22:00:00Z', 'trace --lat 70 --lon 0 --coords mag --points --format geojson'],
  run(ctx) {
    const lat = ctx.flags.lat as number;
    const lon = ctx.flags.lon as number;
    const heightKm = (ctx.flags['height-km'] as number | undefined) ?? 0;
    const coords = ((ctx.flags.coords as string | undefined) ?? 'geo') as 'geo' | 'mag';
    const wantPoints = ctx.flags.points === true;
    const format = ctx.flags.format ?? 'json';
    const model = ctx.model;
    const tracer = makeTracer(model, { altKm: ctx.altKm, ellipsoid: true });
    const line = traceSite(model, tracer, lat, lon, heightKm, coords, wantPoints || format === 'geojson');
    if (line.type === 'unresolved') ctx.warn('the line was not resolved within the step and length budget: footpoints may be missing');
    if (line.type === 'open') ctx.warn('the line is open: it has no conjugate point');
    const footpoints = [...line.footpoints].sort(byHemisphere);
    const pts = line.points ? triples(line.points) : null;
    const fieldLine: Record<string, unknown> = {
      type: line.type,
      lengthRe: line.lengthRe,
      equator: line.equator,
      footpoints,
    };
    if (wantPoints && pts) fieldLine.points = pts;
    const s = line.siteGsm;
    const sd = describePoint(model.frames, s[0], s[1], s[2]);
    const site = { latDeg: lat, lonDeg: lon, heightKm, coords, gsmRe: s, geoLatDeg: sd.geoLatDeg, geoLonDeg: sd.geoLonDeg, magLatDeg: sd.magLatDeg, mltHours: sd.mltHours };
    return {
      json: { site, fieldLine, siteFootpoint: line.near, conjugate: line.conjugate, evaluations: line.evals },
      csv: () => {
        if (wantPoints && pts) {
          const b = new Float64Array(3);
          const rows = pts.map(([x, y, z], i): CsvCell[] => {
            model.evaluate(b, x, y, z);
            const d = describePoint(model.frames, x, y, z);
            return [i, x, y, z, Math.hypot(x, y, z), d.geoLatDeg, d.geoLonDeg, d.altKm, Math.hypot(b[0], b[1], b[2])];
          });
          return writeCsv(POINT_HEADER, rows, { maxDecimals: CSV_DECIMALS });
        }
        const rows = footpoints.map((fp): CsvCell[] => [
          fp === line.conjugate ? 'conjugate' : 'near', fp.hemisphere, fp.geoLatDeg, fp.geoLonDeg, fp.magLatDeg, fp.magLonDeg, fp.mltHours, fp.altKm,
          line.type, line.lengthRe, line.equator?.rRe, line.equator?.bNt,
        ]);
        return writeCsv(FOOT_HEADER, rows, { maxDecimals: CSV_DECIMALS });
      },
      geojson: () => {
        const track = (pts ?? []).map(([x, y, z]) => {
          const d = describePoint(model.frames, x, y, z);
          return [d.geoLonDeg, d.geoLatDeg, d.altKm * 1000];
        });
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
      },
    };
  },
};
