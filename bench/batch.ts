/**
 * Section "batch" (throughput and memory of the batch contract, references §13): the batch command end to end — invented
 * sites × an invented hourly series, written to a temporary CSV file — on a
 * pool of worker threads (2 by default: the issue's 2-core machine).
 *  - siteConditionsPerSecond: rows / wall time of the run (exact boundaries);
 *  - rowsPerCpuSecond: rows / process CPU time (all threads): what an idle
 *    core does, since the wall figure suffers when other jobs share the machine;
 *  - peakRssMb: the process's peak resident set (all threads), and
 *    rssGrowthMb: resident set at the end minus at a quarter of the run
 *    (flat memory: about 0 however many rows);
 *  - batchTracesPerRow / batchEvalsPerRow / batchCpuMsPerRow: the main run's first conditions again
 *    in one thread, counting traces and field evaluations (machine-independent) and CPU time;
 *  - the same with --boundary-mlt-step 1 (interpolated boundaries, an opt-in approximation);
 *  - pipeline*: a million rows that are all skipped (fill values), so the
 *    reader, pool and ordered writer run alone: their speed and RSS growth.
 */
import { mkdtempSync, writeFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { runBatch } from '../src/cli/batch/index';
import { traceTotals } from '../src/physics/trace/tracer';
import { seededRandom, type BenchSection, type Figure, type RunOptions } from './lib';

export interface BatchBenchResult {
  sites: number;
  conditions: number;
  workers: number;
  rows: number;
  seconds: number;
  siteConditionsPerSecond: number;
  rowsPerCpuSecond: number;
  peakRssMb: number;
  rssGrowthMb: number;
  exitCode: number;
}

/** Invented inputs: sites spread over both hemispheres (|lat| 40–80°), an hourly series of moderate activity. */
function writeInputs(dir: string, sites: number, conditions: number, fill: boolean): { sitesPath: string; seriesPath: string } {
  const rnd = seededRandom(5);
  const s = ['name,lat_deg,lon_deg,height_km'];
  for (let i = 0; i < sites; i++) {
    const lat = (40 + 40 * rnd()) * (rnd() < 0.7 ? 1 : -1);
    s.push(`Bench Site ${i + 1},${lat.toFixed(3)},${(360 * rnd() - 180).toFixed(3)},${(rnd() * 0.5).toFixed(2)}`);
  }
  const c = ['time,pdyn_npa,bz_nt,by_nt'];
  const t0 = Date.UTC(2025, 0, 1);
  for (let i = 0; i < conditions; i++) {
    // Hourly; a minute apart for the fill-only run, so a million rows stay inside IGRF-14's span.
    const t = new Date(t0 + i * (fill ? 60_000 : 3600_000)).toISOString().replace('.000Z', 'Z');
    c.push(`${t},${fill ? '9999.99' : (0.8 + 5 * rnd()).toFixed(2)},${(-10 + 14 * rnd()).toFixed(2)},${(-6 + 12 * rnd()).toFixed(2)}`);
  }
  const sitesPath = join(dir, 'sites.csv');
  const seriesPath = join(dir, 'series.csv');
  writeFileSync(sitesPath, s.join('\n') + '\n');
  writeFileSync(seriesPath, c.join('\n') + '\n');
  return { sitesPath, seriesPath };
}

/**
 * One batch run with figures. `fillOnly` makes every condition a fill value, so
 * rows are skipped without physics: a run of the streaming pipeline alone
 * (reader, pool, ordered writer), for the memory check at a million rows.
 */
export async function runBatchBench(opts: { sites?: number; conditions?: number; workers?: number; extraArgs?: string[]; fillOnly?: boolean; log?: (m: string) => void } = {}): Promise<BatchBenchResult> {
  const sites = opts.sites ?? 100, conditions = opts.conditions ?? 1000, workers = opts.workers ?? 2;
  const dir = mkdtempSync(join(tmpdir(), 'batch-bench-'));
  try {
    const { sitesPath, seriesPath } = writeInputs(dir, sites, conditions, opts.fillOnly === true);
    const rows = sites * conditions;
    let rssAtQuarter = NaN;
    // Progress lines ("batch: <done>/<total> rows …") tell how far the run is.
    const watch = (t: string) => {
      const m = /batch: (\d+)\//.exec(t);
      if (m && Number.isNaN(rssAtQuarter) && Number(m[1]) >= rows / 4) rssAtQuarter = process.memoryUsage().rss;
    };
    const cpu0 = process.cpuUsage();
    const t0 = performance.now();
    const code = await runBatch(['--sites', sitesPath, '--conditions', seriesPath, '--out', join(dir, 'out.csv'), '--workers', String(workers), '--progress', ...(opts.extraArgs ?? [])], {
      stdout: () => {},
      stderr: (t) => { watch(t); opts.log?.(t.trimEnd()); },
    });
    const seconds = (performance.now() - t0) / 1000;
    const cpu = process.cpuUsage(cpu0);
    const rssEnd = process.memoryUsage().rss;
    return {
      sites, conditions, workers, rows, seconds,
      siteConditionsPerSecond: rows / seconds,
      rowsPerCpuSecond: rows / ((cpu.user + cpu.system) / 1e6),
      peakRssMb: process.resourceUsage().maxRSS / 1024,
      rssGrowthMb: Number.isNaN(rssAtQuarter) ? NaN : (rssEnd - rssAtQuarter) / 2 ** 20,
      exitCode: code,
    };
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

/**
 * Machine-independent cost of a row: the same inputs as the main run (its first `conditions`
 * conditions) in this thread (--workers 1), counting the traces and field evaluations of every
 * tracer (traceTotals), and this thread's CPU time per row.
 */
export async function batchCostPerRow(opts: { sites?: number; conditions?: number; extraArgs?: string[] } = {}): Promise<{ rows: number; tracesPerRow: number; evalsPerRow: number; cpuMsPerRow: number }> {
  const t0 = traceTotals.traces, e0 = traceTotals.evals;
  const cpu0 = process.cpuUsage();
  const r = await runBatchBench({ sites: opts.sites ?? 100, conditions: opts.conditions ?? 20, workers: 1, extraArgs: opts.extraArgs });
  if (r.exitCode !== 0) throw new Error(`batch cost run exited ${r.exitCode}`);
  const cpu = process.cpuUsage(cpu0);
  return {
    rows: r.rows,
    tracesPerRow: (traceTotals.traces - t0) / r.rows,
    evalsPerRow: (traceTotals.evals - e0) / r.rows,
    cpuMsPerRow: (cpu.user + cpu.system) / 1000 / r.rows,
  };
}

/**
 * Parts (each in its own process, so each peak RSS is its own): the speed-target table's
 * shapes — 100 sites × 1,000 conditions, 10 × 10,000, 1,000 × 100 (exact boundaries,
 * 2 workers, today's code path), the same 100-site run with IGRF on (fewer conditions),
 * and the extras (interpolated boundaries, pipeline alone).
 */
export const batchSection: BenchSection = {
  name: 'batch',
  title: 'batch command: sites × hourly series, 2 worker threads, CSV to a file',
  parts: ['main', 'shapes', 'igrf', 'extras'],
  async run(o: RunOptions) {
    let lastLog = 0;
    const log = (m: string) => { if (m.includes('rows/s') && performance.now() - lastLog > 10_000) { lastLog = performance.now(); o.log(m); } };
    const target = { op: '>=' as const, value: 5000, issue: 14 };
    const figures: Figure[] = [];
    const detail: Record<string, unknown> = {};
    const check = (r: BatchBenchResult, what: string): BatchBenchResult => {
      if (r.exitCode !== 0) throw new Error(`batch run ${what} exited ${r.exitCode}`);
      return r;
    };
    if (!o.part || o.part === 'main') {
      const exact = check(await runBatchBench({ conditions: o.quick ? 60 : 1000, log }), '100 sites');
      figures.push(
        { key: 'siteConditionsPerSecond', value: exact.siteConditionsPerSecond, unit: 'rows/s', target, note: `${exact.sites} sites × ${exact.conditions} conditions, exact boundaries, wall time` },
        { key: 'batchRowsPerSecond100x1000', value: exact.siteConditionsPerSecond, unit: 'rows/s', target, note: `the speed-target table's shape (same run${o.quick ? ', --quick: fewer conditions' : ''})` },
        { key: 'rowsPerCpuSecond', value: exact.rowsPerCpuSecond, unit: 'rows/cpu-s', note: 'all threads; × cores ≈ wall rate on an idle machine' },
        { key: 'peakRssMb', value: exact.peakRssMb, unit: 'MB', note: 'process peak, all threads' },
        { key: 'batchPeakRssMb', value: exact.peakRssMb, unit: 'MB', note: 'the 100 × 1,000 run (speed-target table)' },
        { key: 'rssGrowthMb', value: exact.rssGrowthMb, unit: 'MB', note: 'RSS at the end − at 25 % of the rows' },
      );
      detail.exact = exact;
      const cost = await batchCostPerRow({ conditions: o.quick ? 5 : 20 });
      figures.push(
        { key: 'batchTracesPerRow', value: cost.tracesPerRow, unit: 'traces/row', note: `${cost.rows} rows of the same inputs in one thread: the site's line and the boundary searches' probes` },
        { key: 'batchEvalsPerRow', value: cost.evalsPerRow, unit: 'evals/row', note: 'field evaluations per row (same rows)' },
        { key: 'batchCpuMsPerRow', value: cost.cpuMsPerRow, unit: 'ms/row', note: 'CPU time per row in one thread (same rows, includes the per-condition model preparation)' },
      );
      detail.cost = cost;
    }
    if (!o.part || o.part === 'shapes') {
      // 10 × 10,000 is timed over its first 3,000 conditions (the rate is per row; 100,000 rows would take the bench ~10 min today).
      const few = check(await runBatchBench({ sites: 10, conditions: o.quick ? 100 : 3000, log }), '10 sites');
      const many = check(await runBatchBench({ sites: 1000, conditions: o.quick ? 10 : 100, log }), '1000 sites');
      figures.push(
        { key: 'batchRowsPerSecond10x10000', value: few.siteConditionsPerSecond, unit: 'rows/s', target, note: `10 × 10,000 shape timed over ${few.sites} sites × ${few.conditions} conditions, exact boundaries, peak RSS ${few.peakRssMb.toFixed(0)} MB` },
        { key: 'batchRowsPerSecond1000x100', value: many.siteConditionsPerSecond, unit: 'rows/s', target, note: `${many.sites} sites × ${many.conditions} conditions, exact boundaries, peak RSS ${many.peakRssMb.toFixed(0)} MB` },
        { key: 'batchPeakRssMbShapes', value: Math.max(few.peakRssMb, many.peakRssMb), unit: 'MB', note: 'process peak over the two runs above' },
      );
      Object.assign(detail, { few, many });
    }
    if (!o.part || o.part === 'igrf') {
      const igrf = check(await runBatchBench({ conditions: o.quick ? 20 : 200, log, extraArgs: ['--internal', 'igrf'] }), 'IGRF');
      figures.push(
        { key: 'batchRowsPerSecondIgrf', value: igrf.siteConditionsPerSecond, unit: 'rows/s', target, note: `--internal igrf (model.ts truncation as it is), ${igrf.sites} sites × ${igrf.conditions} conditions, exact boundaries` },
        { key: 'batchRowsPerCpuSecondIgrf', value: igrf.rowsPerCpuSecond, unit: 'rows/cpu-s' },
      );
      detail.igrf = igrf;
    }
    if (!o.part || o.part === 'extras') {
      const approx = check(await runBatchBench({ conditions: o.quick ? 30 : 200, log, extraArgs: ['--boundary-mlt-step', '1'] }), 'interpolated');
      const pipeline = check(await runBatchBench({ sites: 5, conditions: o.quick ? 20_000 : 200_000, log, fillOnly: true }), 'fill-only');
      figures.push(
        { key: 'approxSiteConditionsPerSecond', value: approx.siteConditionsPerSecond, unit: 'rows/s', target, note: `--boundary-mlt-step 1 (interpolated boundaries), ${approx.conditions} conditions` },
        { key: 'approxRowsPerCpuSecond', value: approx.rowsPerCpuSecond, unit: 'rows/cpu-s' },
        { key: 'pipelineRowsPerSecond', value: pipeline.siteConditionsPerSecond, unit: 'rows/s', note: `${pipeline.rows} skipped rows: reader + pool + writer without physics` },
        { key: 'pipelineRssGrowthMb', value: pipeline.rssGrowthMb, unit: 'MB', note: `RSS at the end − at 25 % of ${pipeline.rows} rows (flat memory)` },
      );
      Object.assign(detail, { approx, pipeline });
    }
    return { figures, detail };
  },
};
