/**
 * Benchmark harness: `npm run bench -- [--only <section>] [--quick]`; for JSON use
 * `npm run --silent bench -- --json` (without --silent npm prints its own banner on stdout).
 *
 * Sections are registered in SECTIONS below, each loaded lazily so that a
 * section whose engine modules are missing reports an error instead of
 * stopping the others. To add a section, write bench/<name>.ts exporting a
 * `BenchSection` (see bench/lib.ts) and add one line to SECTIONS. The `batch`
 * section (site-conditions per second, peak memory) is
 * already registered: it loads bench/batch.ts, exporting `batchSection`, once
 * that file exists. `igrf` (bench/igrf.ts) times IGRF against dipole traces at the same
 * footpoint accuracy; `app` (bench/app.ts) runs the browser bench (bench/browser.ts) and
 * needs the e2e browser. With --json every figure of the speed targets (DEVELOPERS.md) is a top-level key:
 * batchRowsPerSecond100x1000, batchRowsPerSecond10x10000, batchRowsPerSecond1000x100,
 * batchPeakRssMb, overheadRatio(WithTail), overheadRatioIgrf(WithTail), igrfTraceCostRatio
 * (WithTail), sceneMs, sceneMsIgrf, sceneMsIgrfTwoWorkers, appRefinedOvalMs, appLinesDrawnMs; with the ring current
 * (storm terms): evalNsWithRingCurrent, tracesPerSecondWithRingCurrent, sceneMsWithRingCurrent.
 * Without Chromium the app section is skipped with a notice (no figures, no failure).
 *
 * Each section runs in its own Node process, one after the other (one core, no
 * workers); --in-process runs them all in this process instead (e.g. under
 * `node --import tsx --cpu-prof bench/run.ts --in-process --only tracer`).
 *
 * Output: a readable table on stdout; with --json exactly one JSON object on
 * stdout and nothing else (progress goes to stderr).
 */
import { spawnSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import os from 'node:os';
import { fileURLToPath, pathToFileURL } from 'node:url';
import type { BenchSection, Figure, SectionResult } from './lib';
import { sig, targetMet } from './lib';

interface SectionEntry {
  name: string;
  load(): Promise<BenchSection | null>;
}

/** Optional section from bench/<file>.ts exporting `exportName`; null while the file does not exist. */
function optional(name: string, file: string, exportName: string): SectionEntry {
  return {
    name,
    async load() {
      const path = fileURLToPath(new URL(`./${file}`, import.meta.url));
      if (!existsSync(path)) return null;
      const mod = (await import(pathToFileURL(path).href)) as Record<string, unknown>;
      const s = mod[exportName] as BenchSection | undefined;
      if (!s || typeof s.run !== 'function') throw new Error(`bench/${file} does not export a BenchSection named ${exportName}`);
      return s;
    },
  };
}

/** The registry, in run order. */
export const SECTIONS: SectionEntry[] = [
  { name: 'field', load: async () => (await import('./evaluation')).fieldSection },
  { name: 'tracer', load: async () => (await import('./tracer')).tracerSection },
  { name: 'igrf', load: async () => (await import('./igrf')).igrfSection },
  optional('batch', 'batch.ts', 'batchSection'), // batch throughput (references §13)
  { name: 'app', load: async () => (await import('./app')).appSection }, // browser figures (needs the e2e browser)
  { name: 'series', load: async () => (await import('./series')).seriesSection }, // solar-wind series reading
];

interface Args { json: boolean; only: string | null; quick: boolean; inProcess: boolean; child: string | null; part: string | null }

function parseArgs(argv: string[]): Args {
  const a: Args = { json: false, only: null, quick: false, inProcess: false, child: null, part: null };
  for (let i = 0; i < argv.length; i++) {
    const s = argv[i];
    if (s === '--json') a.json = true;
    else if (s === '--quick') a.quick = true;
    else if (s === '--in-process') a.inProcess = true;
    else if (s === '--child') a.child = argv[++i] ?? null; // internal: run one section, print its report as JSON
    else if (s === '--part') a.part = argv[++i] ?? null; // internal: with --child, one part of the section
    else if (s === '--only') a.only = argv[++i] ?? null;
    else if (s.startsWith('--only=')) a.only = s.slice(7);
    else if (s === '--help' || s === '-h') {
      process.stderr.write(`usage: npm run bench -- [--json] [--only <${SECTIONS.map((x) => x.name).join('|')}>] [--quick] [--in-process]\n`);
      process.exit(0);
    } else {
      process.stderr.write(`bench: unknown argument "${s}" (expected --json, --only <section>, --quick, --in-process)\n`);
      process.exit(2);
    }
  }
  if (a.only !== null && !SECTIONS.some((s) => s.name === a.only)) {
    process.stderr.write(`bench: unknown section "${a.only}"; sections: ${SECTIONS.map((s) => s.name).join(', ')}\n`);
    process.exit(2);
  }
  return a;
}

interface SectionReport {
  title?: string;
  status: 'ok' | 'missing' | 'error';
  error?: string;
  seconds?: number;
  /** CPU time / wall time of the section (≈1 on an idle core; GC threads can push it slightly above). */
  cpuShare?: number;
  /** Peak resident set of the process after the section (cumulative over the run), MiB. */
  maxRssMiB?: number;
  /** key → value, the figures for scripts. */
  values?: Record<string, number>;
  figures?: Figure[];
  detail?: Record<string, unknown>;
}

function machine(): Record<string, unknown> {
  const cpus = os.cpus();
  return {
    cpu: cpus[0]?.model ?? 'unknown',
    cores: cpus.length,
    node: process.version,
    v8: process.versions.v8,
    platform: `${os.platform()} ${os.release()} ${os.arch()}`,
    totalMemGiB: Number((os.totalmem() / 2 ** 30).toFixed(1)),
    loadAvg: os.loadavg().map((x) => Number(x.toFixed(2))),
    date: new Date().toISOString(),
    threads: 1,
  };
}

function fmt(v: number): string {
  if (!Number.isFinite(v)) return String(v);
  const a = Math.abs(v);
  if (a !== 0 && (a < 1e-3 || a >= 1e7)) return v.toExponential(3);
  return String(sig(v, 4));
}

function printTable(sections: Record<string, SectionReport>, m: Record<string, unknown>): void {
  const lines: string[] = [];
  lines.push(`Fieldline Atlas benchmarks — ${String(m.cpu)} (${String(m.cores)} cores, 1 used), Node ${String(m.node)}, ${String(m.date)}`);
  for (const [name, r] of Object.entries(sections)) {
    lines.push('');
    const share = r.cpuShare !== undefined ? `, on CPU ${(100 * r.cpuShare).toFixed(0)} % of it` : '';
    lines.push(`[${name}] ${r.title ?? ''}${r.seconds !== undefined ? ` (${r.seconds.toFixed(1)} s${share})` : ''}`);
    if (r.status === 'missing') { lines.push('  not yet implemented (bench file absent)'); continue; }
    if (r.status === 'error') { lines.push(`  ERROR: ${r.error}`); continue; }
    const rows = (r.figures ?? []).map((f) => {
      const met = targetMet(f);
      const target = f.target ? `${f.target.op} ${fmt(f.target.value)} (#${f.target.issue})` : '';
      return [f.key, fmt(f.value), f.cpuValue === undefined ? '' : fmt(f.cpuValue), f.unit, target, met === null ? '' : met ? 'ok' : 'MISSED', f.note ?? ''];
    });
    const head = ['key', 'value', 'cpu-time', 'unit', 'target', '', 'note'];
    const w = head.map((h, i) => Math.max(h.length, ...rows.map((row) => row[i].length)));
    const line = (row: string[]): string => '  ' + row.map((c, i) => (i === 1 || i === 2 ? c.padStart(w[i]) : i === row.length - 1 ? c : c.padEnd(w[i]))).join('  ');
    lines.push(line(head));
    for (const row of rows) lines.push(line(row));
  }
  process.stdout.write(lines.join('\n') + '\n');
}

/** Run one section in this process. */
async function runHere(entry: SectionEntry, quick: boolean, log: (msg: string) => void, part?: string): Promise<SectionReport> {
  try {
    const s = await entry.load();
    if (!s) return { status: 'missing' };
    log(`bench: running ${entry.name}${part ? ` (${part})` : ''}…`);
    const t0 = performance.now();
    const c0 = process.cpuUsage();
    const r: SectionResult = await s.run({ quick, log, part });
    const values: Record<string, number> = {};
    for (const f of r.figures) values[f.key] = f.value;
    const wall = (performance.now() - t0) / 1000;
    const cu = process.cpuUsage(c0);
    // Share of the wall time this process was on a CPU: well below 1 means other load inflated the wall-time figures.
    const cpuShare = (cu.user + cu.system) / 1e6 / wall;
    if (cpuShare < 0.9) log(`bench: ${entry.name}${part ? ` (${part})` : ''}: the process ran only ${(100 * cpuShare).toFixed(0)} % of the wall time (busy machine): prefer the cpu-time figures`);
    const maxRssMiB = process.resourceUsage().maxRSS / 1024;
    return { title: s.title, status: 'ok', seconds: wall, cpuShare, maxRssMiB, values, figures: r.figures, detail: r.detail };
  } catch (e) {
    const err = e instanceof Error ? e.message : String(e);
    log(`bench: section ${entry.name} failed: ${e instanceof Error && e.stack ? e.stack : err}`);
    return { status: 'error', error: err };
  }
}

/** One section report from its parts' reports (each from its own process). */
function mergeParts(reps: SectionReport[], parts: readonly string[]): SectionReport {
  const bad = reps.find((r) => r.status !== 'ok');
  if (bad) return bad;
  const figures = reps.flatMap((r) => r.figures ?? []);
  const values: Record<string, number> = {};
  for (const f of figures) values[f.key] = f.value;
  const detail: Record<string, unknown> = {};
  reps.forEach((r, i) => { detail[parts[i]] = r.detail; });
  const seconds = reps.reduce((a, r) => a + (r.seconds ?? 0), 0);
  const cpuShare = reps.reduce((a, r) => a + (r.cpuShare ?? 0) * (r.seconds ?? 0), 0) / seconds;
  const maxRssMiB = Math.max(...reps.map((r) => r.maxRssMiB ?? 0));
  return { title: reps[0].title, status: 'ok', seconds, cpuShare, maxRssMiB, values, figures, detail };
}

/**
 * Run one section in a fresh Node process (same loader flags), one after the
 * other: the JIT's type feedback from one section (other models through the same
 * call sites) then cannot slow another, figures do not depend on --only, and the
 * peak RSS is the section's own.
 */
function runInChild(entry: SectionEntry, quick: boolean, part?: string): SectionReport {
  const script = fileURLToPath(import.meta.url);
  const r = spawnSync(process.execPath, [...process.execArgv, script, '--child', entry.name, ...(part ? ['--part', part] : []), ...(quick ? ['--quick'] : [])], {
    stdio: ['ignore', 'pipe', 'inherit'],
    encoding: 'utf8',
    maxBuffer: 256 * 2 ** 20,
  });
  if (r.error) return { status: 'error', error: `could not start the section process: ${r.error.message}` };
  try {
    return JSON.parse(r.stdout) as SectionReport;
  } catch {
    return { status: 'error', error: `section process exited with ${r.status ?? r.signal} without a report` };
  }
}

async function main(): Promise<void> {
  const args = parseArgs(process.argv.slice(2));
  const log = (msg: string): void => void process.stderr.write(`${msg}\n`);
  if (args.child !== null) {
    const entry = SECTIONS.find((s) => s.name === args.child);
    const rep: SectionReport = entry ? await runHere(entry, args.quick, log, args.part ?? undefined) : { status: 'error', error: `unknown section ${args.child}` };
    process.stdout.write(JSON.stringify(rep) + '\n');
    return;
  }
  const sections: Record<string, SectionReport> = {};
  for (const entry of SECTIONS) {
    if (args.only !== null && entry.name !== args.only) continue;
    if (args.inProcess) { sections[entry.name] = await runHere(entry, args.quick, log); continue; }
    let parts: readonly string[] | undefined;
    try {
      parts = (await entry.load())?.parts; // loading only reads the declaration; nothing is measured here
    } catch {
      parts = undefined; // the child reports the error
    }
    sections[entry.name] = parts && parts.length ? mergeParts(parts.map((p) => runInChild(entry, args.quick, p)), parts) : runInChild(entry, args.quick);
  }
  const failed = Object.values(sections).some((r) => r.status === 'error');
  const m = machine();
  const missed = Object.entries(sections).flatMap(([name, r]) =>
    (r.figures ?? []).filter((f) => targetMet(f) === false).map((f) => `${name}.${f.key}`));
  if (args.json) {
    // The issues name the figures as top-level keys (tracesPerSecond, sceneMs, …); the sections keep the detail.
    const flat: Record<string, unknown> = {};
    for (const r of Object.values(sections)) Object.assign(flat, r.values ?? {});
    process.stdout.write(JSON.stringify({ ...flat, machine: m, quick: args.quick, sections, targetsMissed: missed }) + '\n');
  } else {
    printTable(sections, m);
    const errs = Object.entries(sections).filter(([, r]) => r.status === 'error').map(([n]) => n);
    if (errs.length) process.stdout.write(`\nSections failed: ${errs.join(', ')}\n`);
    process.stdout.write(missed.length ? `\nTargets missed: ${missed.join(', ')}\n` : errs.length ? '' : '\nAll stated targets met.\n');
  }
  if (failed) process.exitCode = 1;
}

void main();
