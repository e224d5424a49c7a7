/** `oval`: the open–closed boundary and the equatorward precipitation edge per MLT and hemisphere. */
import { mltGrid, type BoundaryPoint } from '../../physics/mapping';
import { writeCsv } from '../../io/csv';
import { lineFeature, type Feature, type Position } from '../../io/geojson';
import { CSV_DECIMALS, type CommandDef } from '../command';
import { UsageError } from '../args';
import { HEMISPHERE_FLAG, SOURCE_RE_FLAG, hemispheresOf } from '../common';
import { OVAL_COLUMNS, ovalStep, ovalStepJson, foundSummary } from './oval-rows';
import { OVAL_SERIES_FLAGS, OVAL_SERIES_NOTES, runOvalSeries } from './oval-series';

const BOUNDARIES = [
  { key: 'openClosed', name: 'open-closed boundary' },
  { key: 'equatorward', name: 'equatorward edge' },
] as const;

export const ovalCommand: CommandDef = {
  name: 'oval',
  summary: 'open–closed boundary and equatorward precipitation edge per MLT sector',
  usage: 'oval [--mlt-step <h>] [--hemisphere north|south|both] [--source-re <RE>] [common options]\n' +
    '       oval --conditions <series file> [--mlt <h>[,<h>…]] [--series-format auto|csv|hourly|highres] [--workers <n>] [options]',
  notes: [
    'For each MLT sector (0 h = midnight) and hemisphere: the open–closed boundary (root search',
    'in magnetic latitude to 0.01°) and the equatorward edge, the footprint of the closed line',
    'whose minimum-|B| point lies at --source-re (default: follows the storm). Each is {magLatDeg, geoLatDeg, geoLonDeg} at',
    '--alt-km with its corrected geomagnetic (CGM) latitude at that altitude and at the ground,',
    'or null where it does not exist, with the reason (openClosedReason / equatorwardReason;',
    'CSV: *_reason columns). Exit code 3 when no boundary at all was found.',
    'CSV: `#` metadata lines (time, conditions, storm index source, model switches, altitude,',
    'version), then one row per hemisphere and MLT with the time and condition columns.',
    'GeoJSON: one line per boundary per hemisphere, in MLT order and closed around the pole',
    '(a LineString, or a MultiLineString where it is cut at the antimeridian or at missing sectors).',
    '',
    OVAL_SERIES_NOTES,
  ].join('\n'),
  flags: [
    { name: 'mlt-step', kind: 'number', meta: '<h>', unit: 'h', min: 0.05, max: 12, help: 'MLT sector spacing; must divide 24', defaultText: '1' },
    HEMISPHERE_FLAG('hemispheres to compute'),
    { ...SOURCE_RE_FLAG, defaultText: 'from the conditions (storm-following; 7 RE in quiet times)' },
    ...OVAL_SERIES_FLAGS,
  ],
  formats: ['json', 'csv', 'geojson'],
  examples: ['oval --time 2025-03-20T22:00:00Z --bz -5 --format csv', 'oval --mlt-step 0.5 --hemisphere north --format geojson', 'oval --conditions examples/series.csv --mlt 0,6,12,18 --format csv'],
  run(ctx) {
    if (ctx.flags.conditions !== undefined) return runOvalSeries(ctx);
    const step = (ctx.flags['mlt-step'] as number | undefined) ?? 1;
    for (const flag of ['mlt', 'workers', 'series-format']) {
      if (ctx.flags[flag] !== undefined) throw new UsageError(`--${flag}`, `is for --conditions (boundaries at chosen MLTs through a series)${flag === 'mlt' ? '; for one instant use --mlt-step' : ''}`);
    }
    const given = ctx.flags['source-re'] as number | undefined;
    const mlts = mltGrid(step);
    const hems = hemispheresOf(ctx.flags);
    const st = ovalStep(ctx.model, { mlts, hemispheres: hems, altKm: ctx.altKm, sourceRe: given ?? null });
    const hemispheres = st.hemispheres;
    for (const h of hemispheres) {
      const missing = h.sectors.filter((s) => s.openClosed === null).length;
      if (missing === h.sectors.length) ctx.warn(`${h.hemisphere}: no open–closed boundary in any sector (all lines closed, or none closed above the lowest searched latitude)`);
      const eqMissing = h.sectors.filter((s) => s.equatorward === null).length;
      if (eqMissing === h.sectors.length) ctx.warn(`${h.hemisphere}: no equatorward edge in any sector: ${st.details.get(h.sectors[0])!.equatorward.reason}`);
    }
    return {
      settings: { sourceRe: st.sourceRe, sourceReOrigin: given === undefined ? 'conditions' : 'flag', mltStepHours: step, mltLabel: 'mlt_h is MLT (MAG), the centred dipole\'s; boundaries sit at these MLT sectors' },
      summary: foundSummary(st.found, st.missing),
      nothingComputed: st.found === 0 ? 'no boundary was found in any sector (see the reasons)' : undefined,
      json: { mltStepHours: step, sourceRe: st.sourceRe, hemispheres: ovalStepJson(st) },
      csv: () => writeCsv(OVAL_COLUMNS, st.rows, { maxDecimals: CSV_DECIMALS }),
      geojson: () => {
        const feats: Feature[] = [];
        for (const h of hemispheres)
          for (const b of BOUNDARIES) {
            const ring: (Position | null)[] = h.sectors.map((s) => {
              const p: BoundaryPoint | null = s[b.key];
              return p ? [p.geoLonDeg, p.geoLatDeg] : null;
            });
            if (ring.length > 1) ring.push(ring[0]); // close the loop around the pole
            const missing = h.sectors.filter((s) => s[b.key] === null).map((s) => ({ mltHours: s.mltHours, reason: st.details.get(s)![b.key].reason }));
            feats.push(lineFeature(ring, { kind: 'boundary', boundary: b.key, name: b.name, hemisphere: h.hemisphere, altKm: ctx.altKm, mltStepHours: step, sectorsFound: h.sectors.length - missing.length, missing }));
          }
        return feats;
      },
    };
  },
};
