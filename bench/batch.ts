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
 *  - the same with --boundary-mlt-step 1 (interpolated boundaries, an opt-in approximation);
 *  - pipeline*: a million rows that are all skipped (fill values), so the
 *    reader, pool and ordered writer run alone: their speed and RSS growth.
 */
import { mkdtempSync, writeFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { runBatch } from '../src/cli/batch/index';
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

export const batchSection: BenchSection = {
  name: 'batch',
  title: 'batch command: 100 sites × hourly series, 2 worker threads, CSV to a file',
  async run(o: RunOptions) {
    let lastLog = 0;
    const log = (m: string) => { if (m.includes('rows/s') && performance.now() - lastLog > 10_000) { lastLog = performance.now(); o.log(m); } };
    const exact = await runBatchBench({ conditions: o.quick ? 60 : 1000, log });
    if (exact.exitCode !== 0) throw new Error(`batch run exited ${exact.exitCode}`);
    const approx = await runBatchBench({ conditions: o.quick ? 30 : 200, log, extraArgs: ['--boundary-mlt-step', '1'] });
    const pipeline = await runBatchBench({ sites: 5, conditions: o.quick ? 20_000 : 200_000, log, fillOnly: true });
    if (pipeline.exitCode !== 0) throw new Error(`fill-only batch run exited ${pipeline.exitCode}`);
    const target = { op: '>=' as const, value: 5000, issue: 5 };
    const figures: Figure[] = [
      { key: 'siteConditionsPerSecond', value: exact.siteConditionsPerSecond, unit: 'rows/s', target, note: `${exact.sites} sites × ${exact.conditions} conditions, exact boundaries, wall time` },
      { key: 'rowsPerCpuSecond', value: exact.rowsPerCpuSecond, unit: 'rows/cpu-s', note: 'all threads; × cores ≈ wall rate on an idle machine' },
      { key: 'peakRssMb', value: exact.peakRssMb, unit: 'MB', note: 'process peak, all threads' },
      { key: 'rssGrowthMb', value: exact.rssGrowthMb, unit: 'MB', note: 'RSS at the end − at 25 % of the rows' },
      { key: 'approxSiteConditionsPerSecond', value: approx.siteConditionsPerSecond, unit: 'rows/s', target, note: `--boundary-mlt-step 1 (interpolated boundaries), ${approx.conditions} conditions` },
      { key: 'approxRowsPerCpuSecond', value: approx.rowsPerCpuSecond, unit: 'rows/cpu-s' },
      { key: 'pipelineRowsPerSecond', value: pipeline.siteConditionsPerSecond, unit: 'rows/s', note: `${pipeline.rows} skipped rows: reader + pool + writer without physics` },
      { key: 'pipelineRssGrowthMb', value: pipeline.rssGrowthMb, unit: 'MB', note: `RSS at the end − at 25 % of ${pipeline.rows} rows (flat memory)` },
    ];
    return { figures, detail: { exact, approx, pipeline } };
  },
};
