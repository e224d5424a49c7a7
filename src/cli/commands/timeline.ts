/**
 * `timeline`: for each site of a list and each step of a solar-wind series (or
 * of a night at fixed conditions), the line type, where the oval is (with the
 * margin), where its nearest point stands in the sky, and how dark the sky is
 * (Sun, twilight, Moon); then each site's best hours in one sentence.
 */
import { prepareModel, type PreparedModel } from '../../physics/field/model';
import type { FieldConditions } from '../../physics/field/conditions';
import { makeTracer, siteReport, type SiteInput, type SiteResult } from '../../physics/mapping';
import { skyDarkness, DEFAULT_SUN_LIMIT_DEG } from '../../physics/mapping/darkness';
import { bestHours, DEFAULT_MAX_ZENITH_DEG, type TimelineStep } from '../../physics/mapping/best-hours';
import { parseUtc } from '../../physics/frames/time';
import type { SeriesFormat, SeriesRecord } from '../../io/series/series';
import { SERIES_FORMATS } from '../../io/series/series';
import { writeCsv, type CsvCell } from '../../io/csv';
import { UsageError, errorText } from '../args';
import { csvRecords, requireFile } from '../batch/read';
import { sitesHeader, parseSite } from '../batch/inputs';
import { CSV_DECIMALS, type CommandDef, type CommandContext } from '../command';
import { CONDITION_COLUMNS, SOURCE_RE_FLAG, conditionCells, conjugateAltKmOf, CONJUGATE_ALT_FLAG } from '../common';
import { openSeries, seriesSteps, type SeriesStep } from './oval-series';

/** Bounds on one call: sites, steps, and their product (each site × step traces a line and searches a boundary). */
export const TIMELINE_LIMITS = { sites: 200, steps: 5000, siteSteps: 20_000 } as const;

const COLUMNS = [
  ...CONDITION_COLUMNS, 'site', 'lat_deg', 'lon_deg', 'line_type', 'oval_relation', 'oval_margin_deg',
  'oval_elevation_deg', 'oval_azimuth_deg', 'sun_elevation_deg', 'twilight', 'dark', 'moon_elevation_deg', 'moon_illuminated_fraction', 'note',
];

/** Distance to the nearest oval edge, deg of magnetic latitude (null when an edge is missing). */
function ovalMarginDeg(r: SiteResult): number | null {
  const b = r.boundaries;
  if (!b || !Number.isFinite(r.magLatDeg)) return null;
  const lat = Math.abs(r.magLatDeg);
  const oc = b.openClosedMagLatDeg === null ? null : Math.abs(b.openClosedMagLatDeg);
  const eq = b.equatorwardMagLatDeg === null ? null : Math.abs(b.equatorwardMagLatDeg);
  switch (r.ovalRelation) {
    case 'poleward': return oc === null ? null : lat - oc;
    case 'equatorward': return eq === null ? null : eq - lat;
    case 'inside': return oc === null || eq === null ? null : Math.min(oc - lat, lat - eq);
    default: return null;
  }
}

async function readSites(path: string): Promise<{ sites: SiteInput[]; problems: string[] }> {
  await requireFile(path, '--sites');
  const sites: SiteInput[] = [];
  const problems: string[] = [];
  let idx: ReturnType<typeof sitesHeader> | null = null;
  for await (const rec of csvRecords(path)) {
    if (rec.error !== undefined) { problems.push(`sites line ${rec.line}: ${rec.error}`); continue; }
    if (idx === null) { idx = sitesHeader(rec.fields); continue; }
    if (rec.fields.length === 1 && rec.fields[0].trim() === '') continue;
    const o = parseSite(rec.fields, rec.line, idx);
    if (o.kind === 'ok') sites.push(o.value);
    else problems.push(o.kind === 'error' ? o.error : o.reason);
    if (sites.length > TIMELINE_LIMITS.sites) throw new UsageError('--sites', `more than ${TIMELINE_LIMITS.sites} sites; split the list, or use batch for long tables`);
  }
  if (idx === null) throw new UsageError('--sites', `${path} is empty: expected a header with name, lat_deg, lon_deg[, height_km]`);
  return { sites, problems };
}

/** The steps of a night at fixed conditions: --from to --to every --step-min. */
function nightSteps(base: FieldConditions, fromIso: string, toIso: string, stepMin: number): SeriesStep[] {
  const a = parseTime('--from', fromIso), b = parseTime('--to', toIso);
  if (!(b > a)) throw new UsageError('--to', `expected a time after --from (${fromIso}), got ${toIso}`);
  const n = Math.floor((b - a) / (stepMin * 60_000)) + 1;
  if (n > TIMELINE_LIMITS.steps) throw new UsageError('--step-min', `${n} steps from --from to --to, more than the ${TIMELINE_LIMITS.steps} one call may run; choose a longer step or a shorter span`);
  const out: SeriesStep[] = [];
  for (let i = 0; i < n; i++) out.push({ line: 0, conditions: { ...base, time: new Date(a + i * stepMin * 60_000).toISOString() }, dstSource: 'given' });
  return out;
}

function parseTime(flag: string, iso: string): number {
  try {
    return parseUtc(iso);
  } catch (e) {
    throw new UsageError(flag, errorText(e).replace(/^time: /, ''));
  }
}

export const timelineCommand: CommandDef = {
  name: 'timeline',
  summary: 'per site and time step: line type, the oval against the site and in its sky, and how dark the sky is',
  usage: 'timeline --sites <file> (--conditions <series> | --from <ISO> --to <ISO> [--step-min <min>]) [options]',
  notes: [
    'Over a site list (CSV: name, lat_deg, lon_deg[, height_km]; geodetic) and either every step of a',
    'solar-wind series (--conditions, as for oval) or a night at the fixed conditions of the flags',
    '(--from, --to, --step-min): per site and step the line type, where the site stands against the',
    'oval (poleward / inside / equatorward, and the margin to the nearest edge in degrees of magnetic',
    'latitude), the elevation and azimuth (from north, eastward) of the nearest oval point at --alt-km,',
    'the Sun\'s elevation and twilight class (civil −6°, nautical −12°, astronomical −18°), whether it',
    'is dark (Sun below --sun-limit-deg), and the Moon\'s elevation and illuminated fraction.',
    'Each site then gets its best hours (dark, the oval within --max-zenith-deg of the zenith) in one',
    `sentence, on stderr and in the JSON "bestHours". At most ${TIMELINE_LIMITS.sites} sites, ${TIMELINE_LIMITS.steps} steps and`,
    `${TIMELINE_LIMITS.siteSteps} site-steps per call. CSV: \`#\` metadata lines, then one row per step and site.`,
  ].join('\n'),
  flags: [
    { name: 'sites', kind: 'string', meta: '<file>', help: 'site list (name, lat_deg, lon_deg[, height_km])', required: true },
    { name: 'conditions', kind: 'string', meta: '<file>', help: 'solar-wind series: one step per record' },
    { name: 'series-format', kind: 'enum', meta: 'auto|csv|hourly|highres', values: ['auto', ...SERIES_FORMATS], help: 'layout of the --conditions file', defaultText: 'auto (detected)' },
    { name: 'from', kind: 'string', meta: '<ISO 8601 UTC>', help: 'first step of a night at fixed conditions' },
    { name: 'to', kind: 'string', meta: '<ISO 8601 UTC>', help: 'last step (inclusive when on the step grid)' },
    { name: 'step-min', kind: 'number', meta: '<min>', unit: 'min', min: 1, max: 1440, help: 'spacing of the night\'s steps', defaultText: '30' },
    { name: 'sun-limit-deg', kind: 'number', meta: '<deg>', unit: 'deg', min: -30, max: 0, help: 'the sky counts as dark with the Sun below this elevation', defaultText: String(DEFAULT_SUN_LIMIT_DEG) },
    { name: 'max-zenith-deg', kind: 'number', meta: '<deg>', unit: 'deg', min: 0, max: 90, help: 'best hours: the oval at most this far from the zenith', defaultText: String(DEFAULT_MAX_ZENITH_DEG) },
    { name: 'min-elevation-deg', kind: 'number', meta: '<deg>', unit: 'deg', min: 0, max: 90, help: 'the oval point counts as visible above this elevation', defaultText: '10' },
    SOURCE_RE_FLAG,
    CONJUGATE_ALT_FLAG,
  ],
  formats: ['json', 'csv'],
  examples: [
    'timeline --sites examples/sites.csv --from 2025-03-20T18:00:00Z --to 2025-03-21T06:00:00Z --step-min 30 --bz -6 --pdyn 3 --format csv',
    'timeline --sites examples/sites.csv --conditions examples/series.csv',
  ],
  async run(ctx) {
    const f = ctx.flags;
    const series = f.conditions as string | undefined;
    checkTimeSource(f);
    const sunLimitDeg = (f['sun-limit-deg'] as number | undefined) ?? DEFAULT_SUN_LIMIT_DEG;
    const maxZenithDeg = (f['max-zenith-deg'] as number | undefined) ?? DEFAULT_MAX_ZENITH_DEG;
    const minElevationDeg = (f['min-elevation-deg'] as number | undefined) ?? 10;
    const conjugateAltKm = conjugateAltKmOf(f, ctx.altKm);
    const givenSource = f['source-re'] as number | undefined;

    const { sites, problems } = await readSites(f.sites as string);
    for (const p of problems.slice(0, 20)) ctx.warn(p);
    if (sites.length === 0) throw new UsageError('--sites', 'no usable site in the file');

    const base = ctx.conditions;
    const steps = await loadSteps(f, base, sites.length, (p) => ctx.warn(p));

    const rows: CsvCell[][] = [];
    const jsonRows: Record<string, unknown>[] = [];
    const perSite: TimelineStep[][] = sites.map(() => []);
    let failed = 0;
    const warned = new Set<string>();
    for (const step of steps) {
      let model: PreparedModel;
      try {
        model = prepareModel(step.conditions);
      } catch (e) {
        failed++;
        ctx.warn(`step ${step.conditions.time}${step.line ? ` (series line ${step.line})` : ''} not computed: ${errorText(e)}`);
        continue;
      }
      for (const w of model.warnings) if (!w.startsWith('storm index:') && !warned.has(w)) { warned.add(w); }
      const tAlt = makeTracer(model, { altKm: ctx.altKm, ellipsoid: true });
      const tConj = conjugateAltKm === ctx.altKm ? tAlt : makeTracer(model, { altKm: conjugateAltKm, ellipsoid: true });
      const cond = conditionCells(model);
      // A series says where its index came from (the file, or integrated); a night uses the flags' (given or estimated).
      if (series) cond[CONDITION_COLUMNS.indexOf('dst_source')] = step.dstSource;
      sites.forEach((site, i) => {
        const r = siteReport(model, tConj, tAlt, site, { altKm: ctx.altKm, conjugateAltKm, sourceRe: givenSource ?? model.sourceRe, minElevationDeg }, undefined, false);
        const dk = skyDarkness(site.latDeg, site.lonDeg, site.heightKm ?? 0, model.ms, { sunLimitDeg });
        const margin = ovalMarginDeg(r);
        const noteText = r.error ?? (r.sky === null ? 'no oval point found at the site\'s MLT' : '');
        perSite[i].push({ ms: model.ms, lineType: r.type, ovalRelation: r.ovalRelation, ovalMarginDeg: margin, ovalElevationDeg: r.sky?.elevationDeg ?? null, dark: dk.dark });
        const cells: CsvCell[] = [...cond, site.name, site.latDeg, site.lonDeg, r.type, r.ovalRelation, margin, r.sky?.elevationDeg, r.sky?.azimuthDeg,
          dk.sunElevationDeg, dk.twilight, dk.dark, dk.moonElevationDeg, dk.moonIlluminatedFraction, noteText];
        rows.push(cells);
        jsonRows.push(Object.fromEntries(COLUMNS.map((c, k) => [c, cells[k] ?? null])));
      });
    }
    for (const w of warned) ctx.warn(`in some steps: ${w}`);
    const best = sites.map((s, i) => {
      if (perSite[i].length === 0) return { site: s.name, sentence: 'No steps computed.', intervals: [] };
      const b = bestHours(perSite[i], { maxZenithDeg });
      return { site: s.name, sentence: b.sentence, intervals: b.intervals.map((iv) => ({ start: new Date(iv.startMs).toISOString(), end: new Date(iv.endMs).toISOString() })) };
    });
    const computed = steps.length - failed;
    return {
      settings: {
        sites: f.sites, siteCount: sites.length, steps: steps.length,
        timeSource: series ? `series ${series}` : `night ${f.from} to ${f.to} every ${(f['step-min'] as number | undefined) ?? 30} min at the fixed conditions above`,
        conjugateAltKm, sunLimitDeg, maxZenithDeg, minElevationDeg,
        sourceRe: givenSource ?? 'from each step\'s conditions (storm-following)',
        azimuth: 'from north, eastward', ovalMargin: 'deg of magnetic latitude to the nearest oval edge',
      },
      summary: [`${computed} of ${steps.length} steps × ${sites.length} sites computed`, ...best.map((b) => `  ${b.site}: ${b.sentence}`)].join('\n'),
      nothingComputed: computed === 0 ? 'no step could be computed (see the warnings)' : undefined,
      json: { rows: jsonRows, bestHours: best },
      csv: () => writeCsv(COLUMNS, rows, { maxDecimals: CSV_DECIMALS }),
    };
  },
};

/** Either a series or a night (--from and --to), never both; the times come from them alone. */
function checkTimeSource(f: CommandContext['flags']): void {
  const series = f.conditions as string | undefined;
  const night = f.from !== undefined || f.to !== undefined;
  if ((series === undefined) === !night) throw new UsageError(series ? '--from' : '--conditions', 'give either --conditions <series> or --from and --to (a night at fixed conditions)');
  if (night && (f.from === undefined || f.to === undefined)) throw new UsageError(f.from === undefined ? '--from' : '--to', 'a night needs both --from and --to');
  if (f.time !== undefined) throw new UsageError('--time', 'the times come from --conditions or --from/--to');
  if (series) for (const flag of ['pdyn', 'bz', 'by', 'dst', 'speed', 'step-min']) if (f[flag] !== undefined) throw new UsageError(`--${flag}`, 'comes from the --conditions file and cannot be given with it');
}

/** The steps of the series (its unreadable or skipped lines reported through warn, first 20) or of the night, within the limits of one call. */
async function loadSteps(f: CommandContext['flags'], base: FieldConditions, siteCount: number, warn: (text: string) => void): Promise<SeriesStep[]> {
  const series = f.conditions as string | undefined;
  const seriesProblems: string[] = [];
  const note = (r: SeriesRecord) => { if (r.kind === 'skipped') seriesProblems.push(r.reason); else if (r.kind === 'error') seriesProblems.push(r.error); };
  const steps: SeriesStep[] = [];
  if (series) {
    const stream = await openSeries(series, '--conditions');
    for await (const s of seriesSteps(stream, ((f['series-format'] as string | undefined) ?? 'auto') as SeriesFormat | 'auto', base, note)) {
      steps.push(s);
      if (steps.length > TIMELINE_LIMITS.steps) throw new UsageError('--conditions', `more than ${TIMELINE_LIMITS.steps} steps; cut the series, or use oval --conditions for long series`);
    }
  } else {
    steps.push(...nightSteps({ ...base }, f.from as string, f.to as string, (f['step-min'] as number | undefined) ?? 30));
  }
  if (steps.length * siteCount > TIMELINE_LIMITS.siteSteps) {
    throw new UsageError(series ? '--conditions' : '--step-min', `${siteCount} sites × ${steps.length} steps = ${steps.length * siteCount} site-steps, more than the ${TIMELINE_LIMITS.siteSteps} one call may run`);
  }
  for (const p of seriesProblems.slice(0, 20)) warn(p);
  return steps;
}
