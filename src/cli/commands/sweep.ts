/** `sweep`: boundary latitudes against Pdyn or Bz, other conditions held. */
import { sweepBoundaries, type SweepRows } from '../../physics/mapping';
import type { SectorBoundaries } from '../../physics/mapping';
import { writeCsv, type CsvCell } from '../../io/csv';
import { CSV_DECIMALS, type CommandDef } from '../command';
import { HEMISPHERE_FLAG, SOURCE_RE_FLAG, INPUT_RANGES, CONDITION_COLUMNS, hemispheresOf, sourceReOf } from '../common';
import { boundaryReason } from '../reasons';
import { foundSummary } from './oval-rows';

/** Upper bound on the work of one sweep: values × MLT sectors (each value prepares a model and searches both hemispheres). */
export const MAX_SWEEP_SEARCHES = 2000;
/** Seconds between progress lines on stderr. */
const PROGRESS_SECONDS = 5;
import { UsageError } from '../args';

export const sweepCommand: CommandDef = {
  name: 'sweep',
  summary: 'boundary latitudes against Pdyn or Bz',
  usage: 'sweep --vary pdyn|bz --from <a> --to <b> --steps <n> [--mlt <h>[,<h>…]] [--hemisphere north|south|both] [common options]',
  notes: [
    '--steps is the number of values from --from to --to inclusive: logarithmically spaced for',
    'pdyn (nPa), evenly spaced for bz (nT). The swept value replaces --pdyn or --bz. --mlt takes',
    'one or more comma-separated MLT hours (0 = midnight, the default). One row per value, MLT',
    'and hemisphere; a boundary that does not exist is null (an empty CSV cell) with its reason',
    `(openClosedReason / equatorwardReason). --steps × the number of --mlt values is at most ${MAX_SWEEP_SEARCHES};`,
    'long runs print their progress on stderr. Exit code 3 when no boundary at all was found.',
    'CSV: `#` metadata lines, then the time and condition columns and the boundaries per row.',
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
    if (steps * mlts.length > MAX_SWEEP_SEARCHES) {
      throw new UsageError(ctx.flags.mlt !== undefined ? '--mlt' : '--steps', `--steps ${steps} × ${mlts.length} MLT value${mlts.length > 1 ? 's' : ''} = ${steps * mlts.length} sweeps steps, more than the ${MAX_SWEEP_SEARCHES} one call may run; split the run, or use batch or oval --conditions for long tables`);
    }
    if (vary === 'pdyn' && ctx.flags.pdyn !== undefined) ctx.warn('--pdyn is replaced by the swept values');
    if (vary === 'bz' && ctx.flags.bz !== undefined) ctx.warn('--bz is replaced by the swept values');
    if (vary === 'pdyn' && !c.magnetopause) ctx.warn('with --magnetopause off the pressure changes nothing: every row is the same');
    if (vary === 'bz' && !c.magnetopause && c.imfEfficiency === 0) ctx.warn('with --magnetopause off and --imf-efficiency 0, Bz changes nothing: every row is the same');

    const rows: Record<string, unknown>[] = [];
    const runs: { mlt: number; r: SweepRows }[] = [];
    const t0 = Date.now();
    let last = t0, done = 0;
    const total = steps * mlts.length;
    const progress = async () => {
      const now = Date.now();
      if (now - last >= PROGRESS_SECONDS * 1000) { last = now; ctx.io.stderr(`fieldline-atlas sweep: ${done} of ${total} steps in ${((now - t0) / 1000).toFixed(0)} s…\n`); }
      done++;
    };
    for (const mlt of mlts) {
      const r = await sweepBoundaries(c, { vary, from, to, steps, mltHours: mlt, altKm: ctx.altKm, sourceRe }, progress);
      for (const w of r.warnings) ctx.warn(w);
      runs.push({ mlt, r });
    }
    const values = runs[0].r.values;
    let found = 0, missing = 0;
    const time = new Date(ctx.model.ms).toISOString();
    values.forEach((value, i) => {
      const pdynNpa = vary === 'pdyn' ? value : c.pdynNpa;
      const bzNt = vary === 'bz' ? value : c.bzNt;
      for (const { mlt, r } of runs)
        for (const h of hems) {
          const s: SectorBoundaries = (h === 'north' ? r.north : r.south)[i];
          for (const k of ['openClosed', 'equatorward'] as const) if (s[k]) found++; else missing++;
          rows.push({
            value,
            time, pdynNpa, bzNt, byNt: c.byNt,
            dstNt: c.dstNt ?? null, dstSource: c.dstNt === null || c.dstNt === undefined ? 'estimated' : 'given', internal: c.internal,
            mltHours: mlt,
            hemisphere: h,
            openClosedMagLatDeg: s.openClosed?.magLatDeg ?? null,
            equatorwardMagLatDeg: s.equatorward?.magLatDeg ?? null,
            openClosedGeoLatDeg: s.openClosed?.geoLatDeg ?? null,
            openClosedGeoLonDeg: s.openClosed?.geoLonDeg ?? null,
            equatorwardGeoLatDeg: s.equatorward?.geoLatDeg ?? null,
            equatorwardGeoLonDeg: s.equatorward?.geoLonDeg ?? null,
            sourceRe: r.sourceRe[i],
            openClosedReason: boundaryReason(s, 'openClosed') || null,
            equatorwardReason: boundaryReason(s, 'equatorward') || null,
          });
        }
    });
    return {
      settings: { vary, sourceRe, altKm: ctx.altKm, dstNote: c.dstNt === null || c.dstNt === undefined ? 'estimated per row from its Bz and speed (no --dst given)' : 'given by --dst' },
      summary: foundSummary(found, missing),
      nothingComputed: found === 0 ? 'no boundary was found for any value (see the reasons)' : undefined,
      json: { vary, unit: vary === 'pdyn' ? 'nPa' : 'nT', values, sourceRe, rows },
      csv: () =>
        writeCsv(
          [...CONDITION_COLUMNS, 'mlt_h', 'hemisphere', 'open_closed_mag_lat_deg', 'equatorward_mag_lat_deg',
            'open_closed_geo_lat_deg', 'open_closed_geo_lon_deg', 'equatorward_geo_lat_deg', 'equatorward_geo_lon_deg', 'open_closed_reason', 'equatorward_reason'],
          rows.map((r): CsvCell[] => [r.time, r.pdynNpa, r.bzNt, r.byNt, r.dstNt, r.dstSource, r.internal, r.mltHours, r.hemisphere, r.openClosedMagLatDeg, r.equatorwardMagLatDeg,
            r.openClosedGeoLatDeg, r.openClosedGeoLonDeg, r.equatorwardGeoLatDeg, r.equatorwardGeoLonDeg, r.openClosedReason, r.equatorwardReason] as CsvCell[]),
          { maxDecimals: CSV_DECIMALS },
        ),
    };
  },
};
