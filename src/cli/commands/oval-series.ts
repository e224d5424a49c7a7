/**
 * `oval --conditions <series>`: the open–closed boundary and the equatorward
 * edge at chosen MLTs for every step of a solar-wind series (src/io/series:
 * our CSV, the hourly and the 1-/5-min community files), streamed in order from
 * a pool of worker threads. Where the file holds no storm index, Dst* is
 * integrated through the series (O'Brien–McPherron, references §10) from a
 * quiet start and said so in the dst_source column.
 */
import { createReadStream } from 'node:fs';
import { readSeries, SERIES_FORMATS, type SeriesRecord, type SeriesFormat } from '../../io/series/series';
import { DstStarStepper, dstFromCorrected, NOMINAL_SPEED_KMS } from '../../physics/field/storm-index';
import type { FieldConditions } from '../../physics/field/conditions';
import { csvField, type CsvCell } from '../../io/csv';
import { writeJson } from '../../io/json';
import { UsageError, errorText, type FlagSpec } from '../args';
import { CSV_DECIMALS, type CommandContext, type CommandResult } from '../command';
import { conditionsBlock, csvMetadata, hemispheresOf } from '../common';
import { coreCount, inThreadPool, runInOrder, threadPool, type JobPool } from '../pool/ordered-pool';
import { OVAL_COLUMNS, foundSummary, type OvalRowSettings } from './oval-rows';
import { computeOvalSeriesStep, type OvalSeriesJob, type OvalSeriesResult } from './oval-series-step';

export const OVAL_SERIES_FLAGS: FlagSpec[] = [
  { name: 'conditions', kind: 'string', meta: '<file>', help: 'solar-wind series: boundaries at --mlt for every step' },
  { name: 'mlt', kind: 'numbers', meta: '<h>[,<h>…]', unit: 'h', min: 0, max: 24, help: 'MLT sectors, with --conditions', defaultText: '0,6,12,18' },
  { name: 'series-format', kind: 'enum', meta: 'auto|csv|hourly|highres', values: ['auto', ...SERIES_FORMATS], help: 'layout of the --conditions file', defaultText: 'auto (detected)' },
  { name: 'workers', kind: 'integer', meta: '<n>', min: 1, max: 64, help: 'worker threads for --conditions (capped at the cores)', defaultText: 'the cores' },
];

export const OVAL_SERIES_NOTES = [
  'With --conditions <file>: one row per step, hemisphere and --mlt sector, in file order, streamed',
  '(csv: metadata lines, header, rows; json: JSON Lines, a {"metadata":…} line then one object per',
  'row). The file is our CSV (time_utc, pdyn_npa or density_cm3 and speed_kms, bz_nt, by_nt,',
  'optional dst_nt or sym_h_nt) or an hourly or 1-/5-min community solar-wind file (detected or',
  '--series-format). Gaps and bad lines are reported on stderr by line number and skipped. Without a',
  'storm index in the file, Dst* is integrated through the series from 0 nT (dst_source "integrated").',
  'The flags --time, --pdyn, --bz, --by, --dst and --speed come from the file and cannot be given.',
].join('\n');

const DEFAULT_MLTS = [0, 6, 12, 18];
/** Steps written before the next progress line may be printed (and at least this many seconds apart). */
const PROGRESS_SECONDS = 5;

/** Conditions of one series step on top of the fixed model switches from the flags. */
function stepConditions(base: FieldConditions, v: { time: string; pdynNpa: number; bzNt: number; byNt: number; speedKms?: number }, dstNt: number): FieldConditions {
  return { ...base, time: v.time, pdynNpa: v.pdynNpa, bzNt: v.bzNt, byNt: v.byNt, dstNt, speedKms: v.speedKms ?? null };
}

/** One step of a series as conditions, with where its storm index came from. */
export interface SeriesStep { line: number; conditions: FieldConditions; dstSource: 'given' | 'integrated' }

/**
 * The steps of a solar-wind series as model conditions over `base` (the fixed switches). Steps
 * without an index get Dst* integrated through the series from 0 nT (row i's drivers act from its
 * time to the next, storm-index.ts integrateDstStar's rule). Skips, unreadable lines and steps out of
 * time order go to `note`.
 */
export async function* seriesSteps(stream: AsyncIterable<string | Uint8Array>, format: SeriesFormat | 'auto', base: FieldConditions, note: (r: SeriesRecord) => void): AsyncGenerator<SeriesStep> {
  const stepper = new DstStarStepper(0);
  let prev: { timeMs: number; speedKms: number; bzNt: number } | null = null;
  for await (const r of readSeries(stream, { format, label: 'series' })) {
    if (r.kind !== 'ok') { note(r); continue; }
    const v = r.value;
    if (prev && !(v.timeMs > prev.timeMs)) { note({ kind: 'error', line: r.line, error: `series line ${r.line}: time ${v.time} is not after the step before; step left out` }); continue; }
    let dstNt: number, dstSource: 'given' | 'integrated';
    if (v.dstNt !== undefined) { dstNt = v.dstNt; dstSource = 'given'; }
    else {
      if (prev) stepper.step((v.timeMs - prev.timeMs) / 3.6e6, prev.speedKms, prev.bzNt);
      dstNt = dstFromCorrected(stepper.dstStarNt, v.pdynNpa);
      dstSource = 'integrated';
    }
    prev = { timeMs: v.timeMs, speedKms: v.speedKms ?? NOMINAL_SPEED_KMS, bzNt: v.bzNt };
    yield { line: r.line, conditions: stepConditions(base, v, dstNt), dstSource };
  }
}

/** Open a series file for reading; a missing or unreadable file is a usage error of `flag`. */
export async function openSeries(path: string, flag: string): Promise<AsyncIterable<string>> {
  const stream = createReadStream(path, { encoding: 'utf8', highWaterMark: 1 << 16 });
  await new Promise<void>((resolve, reject) => {
    stream.once('readable', resolve);
    stream.once('error', (e: NodeJS.ErrnoException) => reject(new UsageError(flag, `cannot read "${path}": ${e.code === 'ENOENT' ? 'no such file' : e.code === 'EISDIR' ? 'a folder, not a file' : e.message}`)));
  });
  return stream as AsyncIterable<string>;
}

/** Flags that a series replaces, or that belong to one instant. */
function rejectInstantFlags(f: CommandContext['flags']): void {
  for (const flag of ['time', 'pdyn', 'bz', 'by', 'dst', 'speed']) {
    if (f[flag] !== undefined) throw new UsageError(`--${flag}`, 'comes from the --conditions file and cannot be given with it');
  }
  if (f['mlt-step'] !== undefined) throw new UsageError('--mlt-step', 'is for one instant; with --conditions choose sectors with --mlt');
  if (f.format === 'geojson') throw new UsageError('--format', 'with --conditions expected csv or json (JSON Lines), got "geojson"');
}

/** The `#` metadata (CSV) or first JSON line: what varies per row, and the fixed settings. */
function seriesMetadata(ctx: CommandContext, path: string, seriesFormat: string, settings: OvalRowSettings): Record<string, unknown> {
  const base = ctx.conditions;
  const meta = {
    program: 'fieldline-atlas oval --conditions',
    ...conditionsBlock(ctx.model, ctx.altKm, []),
    time: 'each row\'s time_utc', pdynNpa: 'each row', bzNt: 'each row', byNt: 'each row', tiltDeg: base.tiltDeg ?? 'from each row\'s time',
    standoffRe: 'from each row', dstNt: 'each row (dst_source: given by the file, or integrated through the series from 0 nT)',
    dstStarNt: undefined, dstSource: undefined, speedKms: undefined, speedSource: undefined, ringCurrentEnergyJ: undefined, warnings: undefined,
    igrfEpoch: 'the decimal year of each row\'s time',
    sourceRe: settings.sourceRe ?? 'from each row\'s conditions (storm-following)',
    series: path, seriesFormat, mlts: settings.mlts.join(' '), hemispheres: settings.hemispheres.join(' '),
    mltLabel: 'mlt_h is MLT (MAG), the centred dipole\'s',
    order: 'series steps in file order; hemispheres, then MLT sectors within each step',
  };
  return Object.fromEntries(Object.entries(meta).filter(([, v]) => v !== undefined));
}

/** One step's rows as CSV lines or JSON Lines. */
function stepText(rows: CsvCell[][], format: string): string {
  return format === 'csv'
    ? rows.map((row) => row.map((c: CsvCell) => csvField(c, CSV_DECIMALS)).join(',')).join('\r\n') + '\r\n'
    : rows.map((row) => JSON.stringify(Object.fromEntries(OVAL_COLUMNS.map((c, i) => [c, row[i] ?? null])))).join('\n') + '\n';
}

export async function runOvalSeries(ctx: CommandContext): Promise<CommandResult> {
  const f = ctx.flags;
  rejectInstantFlags(f);
  const format = (f.format as string | undefined) ?? 'json';
  const path = f.conditions as string;
  const seriesFormat = ((f['series-format'] as string | undefined) ?? 'auto') as SeriesFormat | 'auto';
  const mlts = [...new Set((f.mlt as number[] | undefined) ?? DEFAULT_MLTS)].map((m) => (m === 24 ? 0 : m));
  const settings: OvalRowSettings = { mlts, hemispheres: hemispheresOf(f), altKm: ctx.altKm, sourceRe: (f['source-re'] as number | undefined) ?? null };
  const cores = coreCount();
  const asked = (f.workers as number | undefined) ?? cores;
  if (asked > cores) ctx.warn(`--workers ${asked} is more than the ${cores} cores: using ${cores}`);
  const n = Math.min(asked, cores);

  // Open the file first, so a missing file is a usage error before any output.
  const stream = await openSeries(path, '--conditions');
  const base = ctx.conditions;
  const cleanMeta = seriesMetadata(ctx, path, seriesFormat, settings);
  if (format === 'csv') ctx.io.stdout(csvMetadata(cleanMeta) + OVAL_COLUMNS.map((c) => csvField(c)).join(',') + '\r\n');
  else ctx.io.stdout(writeJson({ metadata: cleanMeta }, 0));

  const problems: string[] = [];
  let skipped = 0, errors = 0;
  const note = (r: SeriesRecord): void => {
    if (r.kind === 'skipped') { skipped++; if (problems.length < 20) problems.push(r.reason.startsWith('series line') ? r.reason : `series line ${r.line}: skipped: ${r.reason}`); }
    else if (r.kind === 'error') { errors++; if (problems.length < 20) problems.push(r.error.startsWith('series') ? r.error : `series line ${r.line}: ${r.error}`); }
  };

  async function* jobs(): AsyncGenerator<OvalSeriesJob> {
    let seq = 0;
    for await (const st of seriesSteps(stream, seriesFormat, base, note)) yield { seq: seq++, ...st, settings };
  }

  const pool: JobPool<OvalSeriesJob, OvalSeriesResult> = n === 1
    ? inThreadPool(computeOvalSeriesStep)
    : threadPool(new URL('./oval-worker-boot.mjs', import.meta.url), n, null);
  const t0 = Date.now();
  let lastProgress = t0;
  let steps = 0, found = 0, missing = 0, failedSteps = 0;
  const warned = new Set<string>();
  try {
    await runInOrder(jobs(), pool, 4 * n, (r) => {
      steps++;
      found += r.found; missing += r.missing;
      if (r.error) { failedSteps++; if (problems.length < 20) problems.push(r.error); }
      for (const w of r.warnings) if (!w.startsWith('storm index:')) warned.add(w.replace(/-?\d+(\.\d+)?(e-?\d+)?/g, '…'));
      ctx.io.stdout(stepText(r.rows, format));
      const now = Date.now();
      if (now - lastProgress >= PROGRESS_SECONDS * 1000) {
        lastProgress = now;
        ctx.io.stderr(`fieldline-atlas oval: ${steps} steps in ${((now - t0) / 1000).toFixed(0)} s…\n`);
      }
    });
  } catch (e) {
    if (e instanceof UsageError) throw e;
    throw new Error(`series "${path}": ${errorText(e)}`);
  } finally {
    await pool.close();
  }
  const seconds = (Date.now() - t0) / 1000;
  for (const w of warned) ctx.warn(`in some steps: ${w}`);
  const lines = [`${steps} steps (${skipped} skipped, ${errors} unreadable lines, ${failedSteps} not computed) in ${seconds.toFixed(1)} s on ${n} thread${n > 1 ? 's' : ''}: ${foundSummary(found, missing)}`, ...problems.map((p) => `  ${p}`)];
  if (skipped + errors + failedSteps > problems.length) lines.push('  … (first 20 listed)');
  return {
    json: {},
    streamed: true,
    ownWarningsOnly: true,
    summary: lines.join('\n'),
    nothingComputed: found === 0 ? (steps === 0 ? `the series "${path}" has no usable step` : 'no boundary was found in any step (see the reasons)') : undefined,
  };
}
