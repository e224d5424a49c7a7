/** `oval`: the open–closed boundary and the equatorward precipitation edge per MLT and hemisphere. */
import { makeTracer, ovalBoundaries, mltGrid, type BoundaryPoint } from '../../physics/mapping';
import { writeCsv, type CsvCell } from '../../io/csv';
import { lineFeature, type Feature, type Position } from '../../io/geojson';
import { CSV_DECIMALS, type CommandDef } from '../command';
import { HEMISPHERE_FLAG, SOURCE_RE_FLAG, hemispheresOf, sourceReOf } from '../common';

const OVAL_HEADER = ['hemisphere', 'mlt_h',
  'open_closed_mag_lat_deg', 'open_closed_geo_lat_deg', 'open_closed_geo_lon_deg',
  'equatorward_mag_lat_deg', 'equatorward_geo_lat_deg', 'equatorward_geo_lon_deg',
  'open_closed_missing_reason', 'equatorward_missing_reason'];

const BOUNDARIES = [
  { key: 'openClosed', name: 'open-closed boundary' },
  { key: 'equatorward', name: 'equatorward edge' },
] as const;

export const ovalCommand: CommandDef = {
  name: 'oval',
  summary: 'open–closed boundary and equatorward precipitation edge per MLT sector',
  usage: 'oval [--mlt-step <h>] [--hemisphere north|south|both] [--source-re <RE>] [common options]',
  notes: [
    'For each MLT sector (0 h = midnight) and hemisphere: the open–closed boundary (root search',
    'in magnetic latitude to 0.01°) and the equatorward edge, the footprint of the closed line',
    'whose minimum-|B| point lies at --source-re (default: follows the storm). Each is {magLatDeg, geoLatDeg, geoLonDeg} at',
    '--alt-km, or null where it does not exist, with the reason in openClosedReason /\n' +
    'equatorwardReason (e.g. closed to the pole with --imf-efficiency 0). Searches reach down to 30°.',
    'GeoJSON: one line per boundary per hemisphere, in MLT order and closed around the pole',
    '(a LineString, or a MultiLineString where it is cut at the antimeridian or at missing sectors).',
  ].join('\n'),
  flags: [
    { name: 'mlt-step', kind: 'number', meta: '<h>', unit: 'h', min: 0.05, max: 12, help: 'MLT sector spacing; must divide 24', defaultText: '1' },
    HEMISPHERE_FLAG('hemispheres to compute'),
    SOURCE_RE_FLAG,
  ],
  formats: ['json', 'csv', 'geojson'],
  examples: ['oval --time 2025-03-20T22:00:00Z --bz -5 --format csv', 'oval --mlt-step 0.5 --hemisphere north --format geojson'],
  run(ctx) {
    const step = (ctx.flags['mlt-step'] as number | undefined) ?? 1;
    const sourceRe = sourceReOf(ctx.flags);
    const mlts = mltGrid(step);
    const hems = hemispheresOf(ctx.flags);
    const tracer = makeTracer(ctx.model, { altKm: ctx.altKm, ellipsoid: true });
    const hemispheres = ovalBoundaries(ctx.model, tracer, hems, mlts, { sourceRe });
    const sourceReUsed = sourceRe ?? ctx.model.sourceRe;
    for (const h of hemispheres) {
      const missing = h.sectors.filter((s) => s.openClosed === null).length;
      if (missing === h.sectors.length) ctx.warn(`${h.hemisphere}: no open–closed boundary in any sector (all lines closed, or none closed above 30° magnetic latitude)`);
    }
    return {
      json: { mltStepHours: step, sourceRe: sourceReUsed, hemispheres },
      csv: () => {
        const rows: CsvCell[][] = [];
        for (const h of hemispheres)
          for (const s of h.sectors) {
            const oc = s.openClosed, eq = s.equatorward;
            rows.push([h.hemisphere, s.mltHours, oc?.magLatDeg, oc?.geoLatDeg, oc?.geoLonDeg, eq?.magLatDeg, eq?.geoLatDeg, eq?.geoLonDeg, s.openClosedReason ?? null, s.equatorwardReason ?? null]);
          }
        return writeCsv(OVAL_HEADER, rows, { maxDecimals: CSV_DECIMALS });
      },
      geojson: () => {
        const feats: Feature[] = [];
        for (const h of hemispheres)
          for (const b of BOUNDARIES) {
            const ring: (Position | null)[] = h.sectors.map((s) => {
              const p: BoundaryPoint | null = s[b.key];
              return p ? [p.geoLonDeg, p.geoLatDeg] : null;
            });
            if (ring.length > 1) ring.push(ring[0]); // close the loop around the pole
            feats.push(lineFeature(ring, { kind: 'boundary', boundary: b.key, name: b.name, hemisphere: h.hemisphere, altKm: ctx.altKm, mltStepHours: step, sectorsFound: h.sectors.filter((s) => s[b.key] !== null).length }));
          }
        return feats;
      },
    };
  },
};
