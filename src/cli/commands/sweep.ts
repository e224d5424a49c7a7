/** `sweep`: boundary latitudes against Pdyn or Bz, other conditions held. */
import { sweepBoundaries, type SweepRows } from '../../physics/mapping';
import type { SectorBoundaries } from '../../physics/mapping';
import { writeCsv, type CsvCell } from '../../io/csv';
import { CSV_DECIMALS, type CommandDef } from '../command';
import { HEMISPHERE_FLAG, SOURCE_RE_FLAG, INPUT_RANGES, hemispheresOf, sourceReOf } from '../common';
import { UsageError } from '../args';

export const sweepCommand: CommandDef = {
  name: 'sweep',
  summary: 'boundary latitudes against Pdyn or Bz',
  usage: 'sweep --vary pdyn|bz --from <a> --to <b> --steps <n> [--mlt <h>[,<h>…]] [--hemisphere north|south|both] [common options]',
  notes: [
    '--steps is the number of values from --from to --to inclusive: logarithmically spaced for',
    'pdyn (nPa), evenly spaced for bz (nT). The swept value replaces --pdyn or --bz. --mlt takes',
    'one or more comma-separated MLT hours (0 = midnight, the default). One row per value, MLT',
    'and hemisphere; a boundary that does not exist is null (an empty CSV cell).',
  ].join('\n'),
  flags: [
    { name: 'vary', kind: 'enum', meta: 'pdyn|bz', values: ['pdyn', 'bz'], help: 'the parameter to sweep', required: true },
    { name: 'from', kind: 'number', meta: '<a>', min: -1000, max: 1e4, help: 'first value (nPa or nT)', required: true },
    { name: 'to', kind: 'number', meta: '<b>', min: -1000, max: 1e4, help: 'last value (nPa or nT)', required: true },
    { name: 'steps', kind: 'integer', meta: '<n>', min: 1, max: 1000, help: 'number of values', required: true },
    { name: 'mlt', kind: 'numbers', meta: '<h>[,<h>…]', unit: 'h', min: 0, max: 24, help: 'MLT sectors', defaultText: '0' },
    HEMISPHERE_FLAG('hemispheres to report'),
    SOURCE_RE_FLAG,
  ],
  formats: ['json', 'csv'],
  examples: ['sweep --vary bz --from 5 --to -15 --steps 5 --mlt 0,12', 'sweep --vary pdyn --from 1 --to 10 --steps 6 --format csv'],
  async run(ctx) {
    const vary = ctx.flags.vary as 'pdyn' | 'bz';
    const from = ctx.flags.from as number;
    const to = ctx.flags.to as number;
    const steps = ctx.flags.steps as number;
    const mlts = (ctx.flags.mlt as number[] | undefined) ?? [0];
    const sourceRe = sourceReOf(ctx.flags);
    const hems = hemispheresOf(ctx.flags);
    const c = ctx.conditions;
    // --from/--to against the swept quantity's own range (the flag spec covers both quantities).
    const range = vary === 'pdyn' ? { ...INPUT_RANGES.pdynNpa, unit: 'nPa', what: 'a dynamic pressure' } : { ...INPUT_RANGES.imfNt, unit: 'nT', what: 'an IMF Bz' };
    for (const [flag, v] of [['--from', from], ['--to', to]] as const) {
      if (v < range.min || v > range.max) throw new UsageError(flag, `with --vary ${vary} expected ${range.what} in ${range.min}..${range.max} ${range.unit}, got ${v}`);
    }
    if (vary === 'pdyn' && ctx.flags.pdyn !== undefined) ctx.warn('--pdyn is replaced by the swept values');
    if (vary === 'bz' && ctx.flags.bz !== undefined) ctx.warn('--bz is replaced by the swept values');
    if (vary === 'pdyn' && !c.magnetopause) ctx.warn('with --magnetopause off the pressure changes nothing: every row is the same');
    if (vary === 'bz' && !c.magnetopause && c.imfEfficiency === 0) ctx.warn('with --magnetopause off and --imf-efficiency 0, Bz changes nothing: every row is the same');

    const rows: Record<string, unknown>[] = [];
    const runs: { mlt: number; r: SweepRows }[] = [];
    for (const mlt of mlts) {
      const r = await sweepBoundaries(c, { vary, from, to, steps, mltHours: mlt, altKm: ctx.altKm, sourceRe });
      for (const w of r.warnings) ctx.warn(w);
      runs.push({ mlt, r });
    }
    const values = runs[0].r.values;
    values.forEach((value, i) => {
      for (const { mlt, r } of runs)
        for (const h of hems) {
          const s: SectorBoundaries = (h === 'north' ? r.north : r.south)[i];
          rows.push({
            value,
            mltHours: mlt,
            hemisphere: h,
            openClosedMagLatDeg: s.openClosed?.magLatDeg ?? null,
            equatorwardMagLatDeg: s.equatorward?.magLatDeg ?? null,
            openClosedGeoLatDeg: s.openClosed?.geoLatDeg ?? null,
            openClosedGeoLonDeg: s.openClosed?.geoLonDeg ?? null,
            equatorwardGeoLatDeg: s.equatorward?.geoLatDeg ?? null,
            equatorwardGeoLonDeg: s.equatorward?.geoLonDeg ?? null,
          });
        }
    });
    const valueColumn = vary === 'pdyn' ? 'pdyn_npa' : 'bz_nt';
    return {
      json: { vary, unit: vary === 'pdyn' ? 'nPa' : 'nT', values, sourceRe, rows },
      csv: () =>
        writeCsv(
          [valueColumn, 'mlt_h', 'hemisphere', 'open_closed_mag_lat_deg', 'equatorward_mag_lat_deg',
            'open_closed_geo_lat_deg', 'open_closed_geo_lon_deg', 'equatorward_geo_lat_deg', 'equatorward_geo_lon_deg'],
          rows.map((r): CsvCell[] => [r.value, r.mltHours, r.hemisphere, r.openClosedMagLatDeg, r.equatorwardMagLatDeg,
            r.openClosedGeoLatDeg, r.openClosedGeoLonDeg, r.equatorwardGeoLatDeg, r.equatorwardGeoLonDeg] as CsvCell[]),
          { maxDecimals: CSV_DECIMALS },
        ),
    };
  },
};
