/**
 * `batch`: every site × every condition of a solar-wind series, as a table,
 * on all cores. Inputs are streamed, jobs (one condition × all sites) run on a
 * worker_threads pool with a bounded in-flight window, and rows are written in
 * input order with backpressure, so memory stays flat however long the series.
 * Exit codes: 0 all rows computed (skips allowed), 3 some rows failed,
 * 2 bad arguments or a wrong header, 1 the run itself failed.
 */
import os from 'node:os';
import { basename } from 'node:path';
import { UsageError, errorText, parseFlags, flagHelp, type FlagSpec, type ParsedFlags } from '../args';
import { commonFlags, conditionsFromFlags, programVersion, checkFlag, DEFAULT_ALT_KM, SOURCE_RE_FLAG, CONJUGATE_ALT_FLAG, conjugateAltKmOf } from '../common';
import { DEFAULT_SUN_LIMIT_DEG } from '../../physics/mapping/darkness';
import { CSV_DECIMALS } from '../command';
import { mltGrid, type SiteInput } from '../../physics/mapping';
import { PDYN_NOMINAL_COEFF } from '../../physics/field/magnetopause';
import { decimalYear, parseUtc } from '../../physics/frames/time';
import { sitesHeader, parseSite, checkTime, SITES_EXPECTED, type RowOutcome } from './inputs';
import { batchColumns, BATCH_COLUMNS, SITES_PER_JOB, type BatchFormat, type BatchSettings, type ConditionJob, type JobResult } from './compute';
import { inProcessRunner, threadRunner, type JobRunner } from './pool';
import { runInOrder, Interrupted } from '../pool/ordered-pool';
import { fileSink, stdoutSink, outputPrefix, outputSuffix, chunkSeparator, PARTIAL_SUFFIX, type Sink } from './output';
import { checkOutNotInput } from './guard';
import { csvRecords, requireFile, countLines } from './read';
import { createReadStream } from 'node:fs';
import { readSeries, SERIES_FORMATS, type SeriesFormat, type SeriesRecord } from '../../io/series/series';
import { SERIES_CSV_EXPECTED } from '../../io/series/csv-series';
import { StormIndexTrack } from '../../io/series/storm-track';
import { InputError } from '../../physics/errors';
import { NOMINAL_SPEED_KMS } from '../../physics/field/storm-index';
import type { CsvRecord } from '../../io/batch-csv';
import { Progress } from './progress';
import { EXIT_OK, EXIT_FAILURE, EXIT_USAGE, EXIT_ROWS_FAILED, EXIT_SIGINT, EXIT_SIGTERM } from '../exit-codes';

interface BatchIo {
  stdout(text: string): void;
  stderr(text: string): void;
  now?(): Date;
}

const NAME = 'fieldline-atlas batch';
const FORMATS: BatchFormat[] = ['csv', 'json', 'geojson'];

const BATCH_FLAGS: FlagSpec[] = [
  { name: 'sites', kind: 'string', meta: '<sites.csv>', help: `site table; columns ${SITES_EXPECTED}`, required: true },
  { name: 'conditions', kind: 'string', meta: '<series>', help: `solar-wind series: our CSV (columns ${SERIES_CSV_EXPECTED}), or an hourly or high-resolution (1-/5-min) data file of the merged near-Earth solar-wind data set`, defaultText: 'one condition from --time --pdyn --bz --by' },
  { name: 'series-format', kind: 'string', meta: '<auto|csv|hourly|highres>', help: 'layout of the --conditions file', defaultText: 'auto: told from its first line' },
  { name: 'out', kind: 'string', meta: '<file>', help: 'write the table here', defaultText: 'stdout' },
  { name: 'workers', kind: 'integer', meta: '<N>', min: 1, max: 256, help: 'threads computing rows (1 = this thread); more than the cores is reduced to the cores, with a warning', defaultText: 'the number of cores' },
  { name: 'keep-partial', kind: 'switch', help: `when a run is interrupted or fails, keep the rows written so far as <out>${PARTIAL_SUFFIX} (the --out file itself is never touched unless the run completes)` },
  { name: 'shard', kind: 'string', meta: '<k/n>', help: 'take conditions k, k+n, k+2n, … (1-based) for array jobs; shard outputs concatenate' },
  { name: 'progress', kind: 'switch', help: 'rows/s and ETA on stderr (on by default when stderr is a terminal)' },
  CONJUGATE_ALT_FLAG,
  { name: 'cgm', kind: 'switch', help: 'add corrected geomagnetic (CGM) columns for the site, its footpoint and the conjugate (three extra main-field traces per row)' },
  { name: 'sun-limit-deg', kind: 'number', meta: '<deg>', unit: 'deg', min: -30, max: 0, help: 'sky_visible needs the Sun below this elevation (dark sky)', defaultText: String(DEFAULT_SUN_LIMIT_DEG) },
  { name: 'moon', kind: 'switch', help: 'add the Moon\'s elevation and illuminated fraction (moon_elevation_deg, moon_illuminated_fraction)' },
  SOURCE_RE_FLAG,
  { name: 'boundary-mlt-step', kind: 'number', meta: '<h>', unit: 'h', min: 0.05, max: 12, help: 'approximation for speed: boundaries on this MLT grid per condition, interpolated to each site\'s MLT', defaultText: 'off: the exact search at each site\'s MLT' },
  { name: 'min-elevation-deg', kind: 'number', meta: '<deg>', unit: 'deg', min: -90, max: 90, help: 'lowest elevation at which the oval counts as visible', defaultText: '10' },
];

function batchCommonFlags(): FlagSpec[] {
  return commonFlags(FORMATS).map((s) => (s.name === 'format' ? { ...s, defaultText: 'csv' } : s));
}

export const BATCH_SUMMARY = 'many sites × a solar-wind series: conjugates, footpoints, boundaries, visibility, on all cores';

export function batchHelp(): string {
  return [
    'Usage: npm run --silent cli -- batch --sites <sites.csv> [--conditions <series.csv>] [--out <file>]',
    '         [--format csv|json|geojson] [--workers <N>] [--shard <k/n>] [--progress] [common options]',
    '',
    `batch: ${BATCH_SUMMARY}.`,
    '',
    'Options:',
    flagHelp(BATCH_FLAGS),
    '',
    'Common options (--time --pdyn --bz --by only without --conditions):',
    flagHelp(batchCommonFlags()),
    '',
    'One row per site × condition, in input order (conditions outer, sites inner).',
    'Sites are geodetic (WGS84): lat_deg, lon_deg east, height_km above the ellipsoid (default 0).',
    'Series (--conditions): our CSV, or the hourly / high-resolution (1-, 5-min) text files of the',
    'merged near-Earth solar-wind data set (told from the first line, or --series-format).',
    'CSV columns: time (ISO 8601 UTC); pdyn_npa, or density_cm3 and speed_kms giving',
    `${PDYN_NOMINAL_COEFF}·n·v² nPa (alpha content unknown); bz_nt; optional by_nt (default 0),`,
    'speed_kms, and one storm index, dst_nt or sym_h_nt (nT).',
    'When pdyn_npa is empty or a fill value and density/speed are present, those are used.',
    "Storm index per row (dst_source): the series' own (dst, sym_h) where given; else integrated",
    "through the series in file order by the O'Brien–McPherron injection–decay equation, each",
    "row's speed and Bz held until the next row, the first row from its steady state",
    `(integrated). Speed: the row's, else --speed, else ${NOMINAL_SPEED_KMS} km/s. Without --conditions:`,
    '--dst (flag), else the steady-state estimate (steady_state). Every --shard integrates the',
    'whole series up to its rows, so shards give the rows of one run.',
    '',
    `Columns: ${BATCH_COLUMNS.join(', ')}.`,
    '(cgm_*, foot_cgm_*, conj_cgm_*, cgm_reason only with --cgm; moon_* only with --moon.)',
    'conj_*: the far footpoint at --conjugate-alt-km (default: --alt-km, as trace); foot_* / far_foot_*: the footpoints at',
    "--alt-km on the site's side and the other; mlt_h, mag_lat_deg: of the site-side footpoint;",
    "boundaries (magnetic latitude) at that MLT in the site's hemisphere, for the source distance",
    'source_re (--source-re, else following the conditions); boundary_reason says why a boundary is empty.',
    'oval_above_horizon: the nearest oval point is at least --min-elevation-deg up (daylight or not);',
    'sky_visible: that AND the Sun below --sun-limit-deg (sun_elevation_deg, twilight: day, civil,',
    'nautical, astronomical, night). CGM (references §6) is empty near the dipole equator; cgm_reason says why.',
    'dst_nt: the index used; dst_star_nt: its pressure-corrected value; speed_kms: the speed used.',
    '',
    'Bad rows do not stop the run: a malformed row (missing value, non-numeric, latitude',
    'outside ±90, unparsable time, time outside IGRF-14 1900–2030, pressure ≤ 0) gets the',
    '`error` column naming the file line and the problem; empty cells and fill values',
    '(all nines: 999.9, 9999.99, 99999.9, …) give `skipped` with the reason. A summary goes',
    'to stderr. A wrong or missing header column is exit 2.',
    '',
    'Formats: csv (# metadata lines, header, CRLF; text cells starting with = + - @ get a',
    "leading '), json (JSON Lines: a metadata line, then one object per row), geojson (one",
    'FeatureCollection, a Point per row at the conjugate point; shards give separate collections).',
    'Exit codes: 0 no row failed, 3 some rows failed, 2 bad arguments or header, 1 run failed.',
    '',
    'Examples:',
    '  npm run --silent cli -- batch --sites examples/sites.csv --conditions examples/series.csv --out table.csv',
    '  npm run --silent cli -- batch --sites examples/sites.csv --time 2025-03-20T22:00:00Z --pdyn 3 --bz -5 --format json',
    '  npm run --silent cli -- batch --sites s.csv --conditions year.csv --shard 3/16 --out part-03.csv',
    '',
  ].join('\n');
}

function parseShard(text: string | undefined): { k: number; n: number } {
  if (text === undefined) return { k: 1, n: 1 };
  const m = /^(\d+)\/(\d+)$/.exec(text.trim());
  const k = m ? Number(m[1]) : NaN, n = m ? Number(m[2]) : NaN;
  if (!m || !(n >= 1) || !(k >= 1 && k <= n)) throw new UsageError('--shard', `expected k/n with 1 ≤ k ≤ n (e.g. 2/8), got "${text}"`);
  return { k, n };
}

interface Plan {
  flags: ParsedFlags;
  settings: BatchSettings;
  shard: { k: number; n: number };
  /** --workers as given (null: the number of cores); runBatch caps it at the cores. */
  workersAsked: number | null;
  keepPartial: boolean;
  sitesPath: string;
  conditionsPath: string | null;
  outPath: string | null;
  progress: boolean;
  flagCondition: { time: string; pdynNpa: number; bzNt: number; byNt: number; dstNt: number | null; speedKms: number | null } | null;
  seriesFormat: SeriesFormat | 'auto';
  /** --speed: the speed of series rows without one (null: the nominal speed). */
  fallbackSpeedKms: number | null;
}

function plan(argv: readonly string[], io: BatchIo): Plan {
  const flags = parseFlags(argv, [...BATCH_FLAGS, ...batchCommonFlags()], 'batch');
  const conditionsPath = (flags.conditions as string | undefined) ?? null;
  if (conditionsPath !== null) {
    for (const f of ['time', 'pdyn', 'bz', 'by']) {
      if (flags[f] !== undefined) throw new UsageError(`--${f}`, 'is given by the --conditions file; use it only without --conditions');
    }
    if (flags.dst !== undefined) throw new UsageError('--dst', 'is given by the --conditions file (dst_nt or sym_h_nt, or the index word of a data file) or integrated through it; use it only without --conditions');
  } else if (flags['series-format'] !== undefined) {
    throw new UsageError('--series-format', 'applies to a --conditions file; give --conditions or drop it');
  }
  const seriesFormat = ((flags['series-format'] as string | undefined) ?? 'auto').trim();
  if (seriesFormat !== 'auto' && !(SERIES_FORMATS as readonly string[]).includes(seriesFormat)) {
    throw new UsageError('--series-format', `expected one of auto, ${SERIES_FORMATS.join(', ')}; got "${seriesFormat}"`);
  }
  const c = conditionsFromFlags(flags, io.now ? io.now() : new Date());
  const { time: _t, pdynNpa: _p, bzNt: _bz, byNt: _by, dstNt: _d, speedKms: _v, ...modelSwitches } = c;
  const settings: BatchSettings = {
    model: { ...modelSwitches, tiltDeg: c.tiltDeg ?? null },
    altKm: (flags['alt-km'] as number | undefined) ?? DEFAULT_ALT_KM,
    conjugateAltKm: conjugateAltKmOf(flags, (flags['alt-km'] as number | undefined) ?? DEFAULT_ALT_KM),
    sunLimitDeg: (flags['sun-limit-deg'] as number | undefined) ?? DEFAULT_SUN_LIMIT_DEG,
    moon: flags.moon === true,
    cgm: flags.cgm === true,
    sourceRe: (flags['source-re'] as number | undefined) ?? null,
    minElevationDeg: (flags['min-elevation-deg'] as number | undefined) ?? 10,
    boundaryMltStep: (flags['boundary-mlt-step'] as number | undefined) ?? null,
    format: ((flags.format as string | undefined) ?? 'csv') as BatchFormat,
    csvDecimals: CSV_DECIMALS,
  };
  const step = settings.boundaryMltStep;
  if (step !== null) checkFlag('--boundary-mlt-step', () => mltGrid(step));
  let flagCondition: Plan['flagCondition'] = null;
  if (conditionsPath === null) {
    checkFlag('--time', () => checkTime(c.time));
    flagCondition = { time: c.time, pdynNpa: c.pdynNpa, bzNt: c.bzNt, byNt: c.byNt, dstNt: c.dstNt ?? null, speedKms: c.speedKms ?? null };
  }
  return {
    flags, settings, flagCondition, conditionsPath,
    seriesFormat: seriesFormat as SeriesFormat | 'auto',
    fallbackSpeedKms: c.speedKms ?? null,
    shard: parseShard(flags.shard as string | undefined),
    workersAsked: (flags.workers as number | undefined) ?? null,
    keepPartial: flags['keep-partial'] === true,
    sitesPath: flags.sites as string,
    outPath: (flags.out as string | undefined) ?? null,
    progress: flags.progress === true || process.stderr.isTTY === true,
  };
}

/** The header record's fields; a header with malformed quoting is a usage error (nothing can be read without it). */
function headerFields(rec: CsvRecord, flag: string, path: string): string[] {
  if (rec.error !== undefined) throw new UsageError(flag, `${path}: ${rec.error}`);
  return rec.fields;
}

async function readSites(path: string): Promise<RowOutcome<SiteInput>[]> {
  const out: RowOutcome<SiteInput>[] = [];
  let idx: ReturnType<typeof sitesHeader> | null = null;
  for await (const rec of csvRecords(path)) {
    if (idx === null) { idx = sitesHeader(headerFields(rec, '--sites', path)); continue; }
    out.push(rec.error !== undefined ? { kind: 'error', line: rec.line, error: `sites ${rec.error.replace(/^csv /, '')}; row not read` } : parseSite(rec.fields, rec.line, idx));
  }
  if (idx === null) throw new UsageError('--sites', `${path} is empty; expected a header with columns ${SITES_EXPECTED}`);
  return out;
}

/** A reader's file-level problem (undetectable format, bad header) as a usage error of --conditions. */
function seriesUsage(e: unknown, path: string): unknown {
  if (e instanceof InputError) {
    const msg = e.message.startsWith(`${e.field}: `) ? e.message.slice(e.field.length + 2) : e.message;
    return new UsageError('--conditions', msg.includes(path) ? msg : `${msg} (${path})`);
  }
  return e;
}

/** A series record as a batch condition: its value with the storm index (given or integrated), or its problem. */
function conditionOf(rec: SeriesRecord, track: StormIndexTrack): ConditionJob['cond'] {
  if (rec.kind !== 'ok') return rec.kind === 'error' ? { kind: 'error', line: rec.line, error: rec.error, time: rec.time } : { kind: 'skipped', line: rec.line, reason: rec.reason, time: rec.time };
  const v = rec.value;
  try {
    const storm = track.next(v, rec.line);
    return {
      kind: 'ok', line: rec.line,
      value: { time: v.time, pdynNpa: v.pdynNpa, bzNt: v.bzNt, byNt: v.byNt, pdynSource: v.pdynSource, dstNt: storm.dstNt, dstSource: storm.dstSource, speedKms: storm.speedKms, note: storm.warning },
    };
  } catch (e) {
    return { kind: 'error', line: rec.line, error: `conditions line ${rec.line}: ${errorText(e)}`, time: v.time };
  }
}

/**
 * The jobs of this shard, read as they are needed; the format is detected (or
 * chosen) and the header checked before the first job is asked for. Every
 * record of the file passes through the storm-index track, so a shard's rows
 * carry the same index as one run's.
 */
function* siteChunks(seq0: number, line: number | null, cond: ConditionJob['cond'], siteCount: number, firstCondition: boolean): Generator<ConditionJob> {
  let seq = seq0;
  for (let a = 0; a === 0 || a < siteCount; a += SITES_PER_JOB) {
    yield { seq: seq++, line, cond, siteFrom: a, siteTo: Math.min(siteCount, a + SITES_PER_JOB), firstCondition };
  }
}

async function conditionJobs(p: Plan, siteCount: number): Promise<AsyncIterable<ConditionJob>> {
  if (p.conditionsPath === null) {
    const cond = p.flagCondition!;
    return (async function* () {
      yield* siteChunks(0, null, { kind: 'ok', line: 0, value: { ...cond, pdynSource: 'flags' } }, siteCount, true);
    })();
  }
  const path = p.conditionsPath;
  const records = readSeries(createReadStream(path, { encoding: 'utf8', highWaterMark: 1 << 16 }), { format: p.seriesFormat, label: 'conditions' });
  let first: IteratorResult<SeriesRecord>;
  try { first = await records.next(); } catch (e) { throw seriesUsage(e, path); }
  const { k, n } = p.shard;
  const track = new StormIndexTrack(p.fallbackSpeedKms ?? NOMINAL_SPEED_KMS);
  return (async function* () {
    let i = 0;
    let seq = 0;
    let next = first;
    while (!next.done) {
      const rec = next.value;
      // Every good row feeds the track, whichever shard computes it.
      const cond = conditionOf(rec, track);
      if (i++ % n === k - 1) {
        for (const job of siteChunks(seq, rec.line, cond, siteCount, seq === 0)) { seq = job.seq + 1; yield job; }
      }
      try { next = await records.next(); } catch (e) { throw seriesUsage(e, path); }
    }
  })();
}

function metadata(p: Plan, sites: number): Record<string, unknown> {
  const s = p.settings;
  const fc = p.flagCondition;
  return {
    program: 'fieldline-atlas batch',
    version: programVersion(),
    sites: basename(p.sitesPath),
    siteCount: sites,
    conditions: p.conditionsPath === null ? 'flags' : basename(p.conditionsPath),
    ...(fc ? { time: fc.time, pdynNpa: fc.pdynNpa, bzNt: fc.bzNt, byNt: fc.byNt, dstNt: fc.dstNt ?? 'estimated (steady state)', speedKms: fc.speedKms ?? NOMINAL_SPEED_KMS } : {}),
    ...(fc ? {} : {
      seriesFormat: p.seriesFormat,
      stormIndex: 'per row (dst_source): the series\' dst_nt / sym_h_nt (or index word) where given, else integrated through the series (O\'Brien–McPherron injection–decay, drivers held to the next row, first row from its steady state)',
      speedKms: p.fallbackSpeedKms === null ? `speed_kms of each row, else ${NOMINAL_SPEED_KMS} (nominal)` : `speed_kms of each row, else ${p.fallbackSpeedKms} (--speed)`,
    }),
    shard: `${p.shard.k}/${p.shard.n}`,
    coefficients: 'IGRF-14',
    coefficientEpoch: fc ? decimalYear(parseUtc(fc.time)) : 'the decimal year of each row\'s time',
    ...s.model,
    tiltDeg: s.model.tiltDeg ?? 'from each row\'s time',
    altKm: s.altKm,
    conjugateAltKm: s.conjugateAltKm,
    conjugateAltRule: 'the footpoint altitude (altKm) unless --conjugate-alt-km sets it apart',
    sunLimitDeg: s.sunLimitDeg,
    skyVisible: 'oval_above_horizon and sun_elevation_deg < sunLimitDeg',
    cgm: s.cgm ? 'site at its height, footpoint at altKm, conjugate at conjugateAltKm (traced IGRF main field)' : 'off (--cgm adds it)',
    moon: s.moon,
    sourceRe: s.sourceRe ?? 'per row (source_re): follows the conditions',
    minElevationDeg: s.minElevationDeg,
    boundaries: s.boundaryMltStep === null ? 'exact search at each site\'s MLT (as oval)' : `interpolated from a ${s.boundaryMltStep} h MLT grid (approximation)`,
    pdynFromDensitySpeed: `${PDYN_NOMINAL_COEFF.toExponential()} * density_cm3 * speed_kms^2 nPa`,
    order: 'conditions in file order, sites in file order within each condition',
  };
}

interface Totals { rows: number; ok: number; skipped: number; failed: number; problems: string[] }

function summary(t: Totals, seconds: number, sites: number, conditions: number): string {
  const rate = seconds > 0 ? t.rows / seconds : 0;
  const lines = [
    `${NAME}: ${t.rows} rows (${sites} sites × ${conditions} conditions) in ${seconds.toFixed(2)} s, ${Math.round(rate)} rows/s: ` +
      `${t.ok} computed, ${t.skipped} skipped, ${t.failed} failed`,
  ];
  if (t.problems.length) {
    lines.push(...t.problems.map((m) => `  ${m}`));
    const listed = t.problems.length;
    if (t.skipped + t.failed > listed) lines.push(`  … see the error and skipped columns for all ${t.skipped + t.failed}`);
  }
  return lines.join('\n') + '\n';
}

/** Signals that stop a run cleanly, and their exit codes. */
const STOP_SIGNALS = { SIGINT: EXIT_SIGINT, SIGTERM: EXIT_SIGTERM } as const;
type StopSignal = keyof typeof STOP_SIGNALS;

/**
 * Jobs in flight at most: enough to keep every worker busy (each takes two),
 * and at most 4 per worker. A job holds at most SITES_PER_JOB sites' rows, so
 * the rows held at once stay below window × SITES_PER_JOB whatever the inputs.
 */
function jobWindow(workers: number): number {
  return Math.max(4, 4 * workers);
}

/** The inputs exist and the output is none of them; the worker count (at most the cores, with a warning). */
async function checkRun(p: Plan, io: BatchIo): Promise<number> {
  await requireFile(p.sitesPath, '--sites');
  if (p.conditionsPath !== null) await requireFile(p.conditionsPath, '--conditions');
  if (p.outPath !== null) {
    await checkOutNotInput(p.outPath, [{ flag: '--sites', path: p.sitesPath }, ...(p.conditionsPath !== null ? [{ flag: '--conditions', path: p.conditionsPath }] : [])]);
  }
  const cores = Math.max(1, os.availableParallelism());
  const workers = p.workersAsked ?? cores;
  if (workers > cores) {
    io.stderr(`${NAME}: warning: --workers ${workers} is more than the ${cores} cores of this machine; using ${cores}\n`);
    return cores;
  }
  return workers;
}

/** What a stop by signal left behind: the counts so far and where the rows went. */
function stoppedText(stopBy: StopSignal, totals: Totals, conditions: number, outPath: string | null, partial: string | null): string {
  const where = outPath === null ? 'the rows written so far went to stdout (incomplete)'
    : partial !== null ? `${outPath} left untouched; the rows written so far are in ${partial} (incomplete)`
    : `${outPath} left untouched; nothing kept (--keep-partial keeps the rows written so far)`;
  return `${NAME}: stopped by ${stopBy} after ${totals.rows} rows (${conditions} conditions): ${totals.ok} computed, ${totals.skipped} skipped, ${totals.failed} failed; ${where}\n`;
}

/** The batch command as a function: argv after `batch`; returns the exit code and never throws. */
export async function runBatch(argv: readonly string[], io: BatchIo): Promise<number> {
  if (argv.includes('--help') || argv.includes('-h')) { io.stdout(batchHelp()); return EXIT_OK; }
  let runner: JobRunner | null = null;
  let sink: Sink | null = null;
  let keepPartial = false;
  let stopBy: StopSignal | null = null;
  let stopNow: () => void = () => {};
  const stop = new Promise<void>((res) => { stopNow = res; });
  const onSignal = (sig: NodeJS.Signals) => { if (stopBy === null) { stopBy = sig as StopSignal; stopNow(); } };
  for (const sig of Object.keys(STOP_SIGNALS)) process.on(sig, onSignal);
  const totals: Totals = { rows: 0, ok: 0, skipped: 0, failed: 0, problems: [] };
  let conditions = 0;
  let outPath: string | null = null;
  let suffix = '';
  try {
    const p = plan(argv, io);
    keepPartial = p.keepPartial;
    outPath = p.outPath;
    const workers = await checkRun(p, io);
    const sites = await readSites(p.sitesPath);
    const jobs = await conditionJobs(p, sites.length);
    const expected = p.progress && p.conditionsPath !== null ? Math.ceil(Math.max(0, (await countLines(p.conditionsPath)) - 1) / p.shard.n) : 1;
    sink = p.outPath === null ? stdoutSink((t) => io.stdout(t)) : await fileSink(p.outPath).catch((e: NodeJS.ErrnoException) => {
      throw new UsageError('--out', `cannot write ${p.outPath} (${e.code ?? e.message})`);
    });
    const format = p.settings.format;
    suffix = outputSuffix(format);
    const sinkRef = sink;
    await sinkRef.write(outputPrefix(format, metadata(p, sites.length), p.shard.k === 1, batchColumns(p.settings)));
    runner = workers <= 1 ? inProcessRunner(sites, p.settings) : threadRunner(workers, sites, p.settings);
    const progress = p.progress ? new Progress(io.stderr, expected * sites.length) : null;
    const t0 = performance.now();
    let wroteRows = false;
    const sep = chunkSeparator(format);
    await runInOrder(jobs, runner, jobWindow(workers), async (r: JobResult) => {
      if (r.firstChunk) conditions++;
      totals.rows += r.rows; totals.ok += r.ok; totals.skipped += r.skipped; totals.failed += r.failed;
      for (const m of r.problems) if (totals.problems.length < 20) totals.problems.push(m);
      if (r.text) {
        await sinkRef.write(wroteRows ? sep + r.text : r.text);
        wroteRows = true;
      }
      progress?.update(totals.rows);
    }, stop);
    await sinkRef.write(outputSuffix(format));
    await sinkRef.end();
    sink = null;
    progress?.done();
    io.stderr(summary(totals, (performance.now() - t0) / 1000, sites.length, conditions));
    if (totals.ok === 0) {
      // Documented: exit 0 (nothing failed) but said plainly, so a script's log shows it.
      io.stderr(`${NAME}: warning: no row was computed (${totals.rows === 0 ? 'no rows: the inputs hold no site or no condition' : `all ${totals.rows} rows were ${totals.failed ? 'skipped or failed' : 'skipped'}`})\n`);
    }
    return totals.failed > 0 ? EXIT_ROWS_FAILED : EXIT_OK;
  } catch (e) {
    if (e instanceof Interrupted && stopBy !== null) {
      if (runner) { await runner.close(); runner = null; }
      // A kept partial file is closed as its format requires (GeoJSON's collection), so it parses.
      if (sink && keepPartial) await sink.write(suffix).catch(() => {});
      const partial = sink ? await sink.abort(keepPartial) : null;
      sink = null;
      io.stderr(stoppedText(stopBy, totals, conditions, outPath, partial));
      return STOP_SIGNALS[stopBy];
    }
    if (e instanceof UsageError) {
      io.stderr(`${NAME}: ${e.message}\n(see: batch --help)\n`);
      return EXIT_USAGE;
    }
    io.stderr(`${NAME}: failed: ${errorText(e)}${outPath !== null ? `; ${outPath} left untouched` : ''}\n`);
    return EXIT_FAILURE;
  } finally {
    for (const sig of Object.keys(STOP_SIGNALS)) process.off(sig, onSignal);
    if (runner) await runner.close();
    if (sink) {
      const partial = await sink.abort(keepPartial).catch(() => null);
      if (partial !== null) io.stderr(`${NAME}: the rows written before the failure are in ${partial} (incomplete)\n`);
    }
  }
}
