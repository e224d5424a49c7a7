/**
 * Shared helpers of the benchmark harness: timing (warm-up, repetitions,
 * median), a seeded random generator, a result sink against dead-code
 * elimination, and the section/figure types the registry in run.ts uses.
 * Benchmarks only: nothing here asserts a timing.
 */
import { performance } from 'node:perf_hooks';

/** A reported figure with its unit, optional target and a note. */
export interface Figure {
  key: string;
  value: number;
  unit: string;
  /** Target as stated in the project issue, if any. */
  target?: { op: '<=' | '>='; value: number; issue: number };
  /** The same figure from CPU time instead of wall time (robust to other load on the machine). */
  cpuValue?: number;
  note?: string;
}

export interface SectionResult {
  figures: Figure[];
  /** Extra machine-readable detail (per-L errors, tolerances…), shown in JSON only. */
  detail?: Record<string, unknown>;
}

export interface BenchSection {
  /** Name used by --only and as the JSON key. */
  name: string;
  title: string;
  /**
   * Optional independent parts. run.ts runs each part in its own fresh process
   * (the JIT's type feedback from one model then cannot slow the measurement of
   * another) and concatenates their figures in this order.
   */
  parts?: readonly string[];
  run(opts: RunOptions): Promise<SectionResult> | SectionResult;
}

export interface RunOptions {
  /** Fewer points / repetitions (for a quick smoke run). */
  quick: boolean;
  /** The part to run (one of BenchSection.parts); undefined = all parts. */
  part?: string;
  /** Progress lines go to stderr, never stdout. */
  log(msg: string): void;
}

export function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  const n = s.length;
  if (n === 0) return NaN;
  return n % 2 ? s[(n - 1) >> 1] : 0.5 * (s[n / 2 - 1] + s[n / 2]);
}

/** Wall times (ms) of `reps` runs of fn after `warmup` untimed runs. */
export function timeRuns(fn: () => void, reps: number, warmup: number): number[] {
  for (let i = 0; i < warmup; i++) fn();
  const out: number[] = [];
  for (let i = 0; i < reps; i++) {
    const t0 = performance.now();
    fn();
    out.push(performance.now() - t0);
  }
  return out;
}

/** CPU time (user + system) of this process so far, ms. */
export function cpuMs(): number {
  const u = process.cpuUsage();
  return (u.user + u.system) / 1000;
}

/**
 * Median wall and CPU time (ms) of fn. On a busy machine the wall time grows by
 * the time the process is descheduled; the CPU time does not, so the two
 * together show whether a figure is inflated by other load.
 */
export function measure(fn: () => void, reps: number, warmup: number): { wallMs: number; cpuMs: number } {
  for (let i = 0; i < warmup; i++) fn();
  const wall: number[] = [];
  const cpu: number[] = [];
  for (let i = 0; i < reps; i++) {
    const c0 = cpuMs();
    const t0 = performance.now();
    fn();
    wall.push(performance.now() - t0);
    cpu.push(cpuMs() - c0);
  }
  return { wallMs: median(wall), cpuMs: median(cpu) };
}

/** Median wall time (ms) of fn. */
export function medianMs(fn: () => void, reps: number, warmup: number): number {
  return median(timeRuns(fn, reps, warmup));
}

export const now = (): number => performance.now();

/** Mulberry32: small seeded generator, so every run benchmarks the same inputs. */
export function seededRandom(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Accumulates results so the optimiser cannot drop the measured work. */
export const sink = { value: 0 };

export function consume(v: number): void {
  sink.value += v;
}

/** Round to `digits` significant digits (for the report only). */
export function sig(v: number, digits = 4): number {
  if (!Number.isFinite(v) || v === 0) return v;
  return Number(v.toPrecision(digits));
}

export function targetMet(f: Figure): boolean | null {
  if (!f.target) return null;
  return f.target.op === '<=' ? f.value <= f.target.value : f.value >= f.target.value;
}
