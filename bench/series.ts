/**
 * Section "series": the solar-wind series reader
 * (src/io/series) streaming a generated file from disk in 64 KiB chunks —
 * a year of 1-minute high-resolution lines (525,600), twenty years of hourly
 * lines, a year of 1-minute CSV rows — with invented values.
 *  - <format>LinesPerSecond: records / wall time (cpuValue: / CPU time);
 *  - <format>HeapGrowthMb: heap after a forced GC at the end minus at the
 *    start (flat memory: about 0 however long the file), when run with
 *    --expose-gc (else not reported).
 * Not registered in run.ts yet: `npx tsx bench/series.ts` runs it alone.
 */
import { createReadStream, createWriteStream, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { readSeries } from '../src/io/series/series';
import { cpuMs, seededRandom, type BenchSection, type Figure, type RunOptions } from './lib';

const MIN_PER_DAY = 1440;

function words(n: number, rnd: () => number): string[] {
  const w: string[] = [];
  for (let i = 0; i < n; i++) w.push((rnd() * 30).toFixed(1));
  return w;
}

/** One high-resolution line (46 words, references §11 layout), invented values. */
function highres(i: number, rnd: () => number): string {
  const w = words(46, rnd);
  w[0] = '2027'; w[1] = String(Math.floor(i / MIN_PER_DAY) % 365 + 1); w[2] = String(Math.floor(i / 60) % 24); w[3] = String(i % 60);
  w[17] = (rnd() * 20 - 10).toFixed(2); w[18] = (rnd() * 20 - 10).toFixed(2); w[21] = (350 + rnd() * 400).toFixed(1);
  w[25] = (1 + rnd() * 20).toFixed(2); w[27] = i % 97 === 0 ? '99.99' : (0.5 + rnd() * 8).toFixed(2); w[41] = String(Math.round(-rnd() * 150));
  return w.map((t, k) => t.padStart(k < 4 ? 4 : 8)).join(' ');
}

/** One hourly line (55 words). */
function hourly(i: number, rnd: () => number): string {
  const w = words(55, rnd);
  w[0] = String(2000 + Math.floor(i / 8760)); w[1] = String(Math.floor(i / 24) % 365 + 1); w[2] = String(i % 24);
  w[15] = (rnd() * 20 - 10).toFixed(1); w[16] = (rnd() * 20 - 10).toFixed(1); w[23] = (1 + rnd() * 20).toFixed(1);
  w[24] = (350 + rnd() * 400).toFixed(0) + '.'; w[27] = (rnd() * 0.08).toFixed(3); w[28] = i % 89 === 0 ? '99.99' : (0.5 + rnd() * 8).toFixed(2);
  w[40] = String(Math.round(-rnd() * 150));
  return w.map((t, k) => t.padStart(k < 3 ? 4 : 6)).join(' ');
}

function csv(i: number, rnd: () => number): string {
  const head = i === 0 ? 'time,pdyn_npa,bz_nt,by_nt,sym_h_nt\n' : '';
  return `${head}${new Date(Date.UTC(2027, 0, 1) + i * 60_000).toISOString().slice(0, 19)}Z,${(0.5 + rnd() * 8).toFixed(2)},${(rnd() * 20 - 10).toFixed(2)},${(rnd() * 20 - 10).toFixed(2)},${Math.round(-rnd() * 150)}`;
}

async function writeFile(path: string, n: number, line: (i: number, rnd: () => number) => string): Promise<void> {
  const rnd = seededRandom(13);
  const out = createWriteStream(path);
  let buf = '';
  for (let i = 0; i < n; i++) {
    buf += line(i, rnd) + '\n';
    if (buf.length > 1 << 20) { if (!out.write(buf)) await new Promise<void>((r) => out.once('drain', () => r())); buf = ''; }
  }
  out.write(buf);
  await new Promise<void>((r) => out.end(() => r()));
}

function heapMb(): number | null {
  const gc = (globalThis as { gc?: () => void }).gc;
  if (!gc) return null;
  gc();
  return process.memoryUsage().heapUsed / 1e6;
}

async function readFile(path: string): Promise<{ records: number; wallS: number; cpuS: number; heapGrowthMb: number | null }> {
  const h0 = heapMb();
  const c0 = cpuMs();
  const t0 = performance.now();
  let records = 0;
  for await (const r of readSeries(createReadStream(path, { encoding: 'utf8', highWaterMark: 1 << 16 }))) { if (r.kind) records++; }
  const wallS = (performance.now() - t0) / 1000;
  const cpuS = (cpuMs() - c0) / 1000;
  const h1 = heapMb();
  return { records, wallS, cpuS, heapGrowthMb: h0 === null || h1 === null ? null : h1 - h0 };
}

const FORMATS = {
  highres: { lines: 525_600, make: highres, what: '1 year of 1-min high-resolution lines' },
  hourly: { lines: 175_200, make: hourly, what: '20 years of hourly lines' },
  csv: { lines: 525_600, make: csv, what: '1 year of 1-min CSV rows' },
} as const;

export const seriesSection: BenchSection = {
  name: 'series',
  title: 'Solar-wind series reader (streaming from disk)',
  parts: ['highres', 'hourly', 'csv'],
  async run(opts: RunOptions) {
    const figures: Figure[] = [];
    const dir = mkdtempSync(join(tmpdir(), 'fieldline-series-'));
    try {
      for (const part of (opts.part ? [opts.part] : this.parts!) as (keyof typeof FORMATS)[]) {
        const f = FORMATS[part];
        const n = opts.quick ? 20_000 : f.lines;
        const path = join(dir, `${part}.txt`);
        opts.log(`series: writing ${n} lines (${f.what})`);
        await writeFile(path, n, f.make);
        const r = await readFile(path);
        figures.push({ key: `${part}LinesPerSecond`, value: r.records / r.wallS, cpuValue: r.records / r.cpuS, unit: 'lines/s', target: { op: '>=', value: 200_000, issue: 13 }, note: `${r.records} records, ${f.what}` });
        if (r.heapGrowthMb !== null) figures.push({ key: `${part}HeapGrowthMb`, value: r.heapGrowthMb, unit: 'MB', note: 'heap after GC, end minus start' });
        rmSync(path);
      }
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
    return { figures };
  },
};

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) {
  const res = await seriesSection.run({ quick: process.argv.includes('--quick'), log: (m) => process.stderr.write(`${m}\n`) });
  for (const f of res.figures) console.log(`${f.key}: ${Math.round(f.value * 100) / 100} ${f.unit}${f.cpuValue ? ` (CPU: ${Math.round(f.cpuValue)})` : ''}${f.note ? ` — ${f.note}` : ''}`);
}
