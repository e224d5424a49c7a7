/**
 * Loading a solar-wind series in the browser: the project's one reader
 * (src/io/series) over the file's byte stream, bad lines and gaps kept as
 * notes with their line numbers, the rest kept as steps. Where the file has
 * no storm index the index is integrated through the series (O'Brien–McPherron
 * injection–decay, references §10), restarting from the file's value wherever
 * one is given.
 */
import { SeriesParser, streamChunks, type SeriesRecord, type SeriesValue } from '../../io/series/series';
import { DstStarStepper, dstFromCorrected, pressureCorrectedDst, steadyDstStar, DST_LIMIT_NT, NOMINAL_SPEED_KMS } from '../../physics/field/storm-index';
import type { LineNote, LoadedSeries, SeriesStep } from './state';

const MS_PER_HOUR = 3_600_000;

function median(xs: number[]): number {
  if (xs.length === 0) return 0;
  const s = [...xs].sort((a, b) => a - b);
  const n = s.length;
  return n % 2 ? s[(n - 1) >> 1] : 0.5 * (s[n / 2 - 1] + s[n / 2]);
}

const clampDst = (v: number) => Math.max(-DST_LIMIT_NT, Math.min(DST_LIMIT_NT, v));

/**
 * Turns the reader's records into steps as they arrive (values in time order,
 * the storm index resolved at once; gaps and unreadable lines as notes), so
 * a long file is never held as records.
 */
class StepCollector {
  readonly steps: SeriesStep[] = [];
  readonly skipped: LineNote[] = [];
  readonly errors: LineNote[] = [];
  private stepper: DstStarStepper | null = null;
  private prev: { line: number; v: SeriesValue } | null = null;

  add(r: SeriesRecord): void {
    if (r.kind === 'skipped') { this.skipped.push({ line: r.line, text: r.reason }); return; }
    if (r.kind === 'error') { this.errors.push({ line: r.line, text: r.error }); return; }
    const v = r.value;
    const p = this.prev;
    if (p && !(v.timeMs > p.v.timeMs)) {
      this.errors.push({ line: r.line, text: `line ${r.line}: time ${v.time} is not after the previous step (${p.v.time}, line ${p.line}); row dropped` });
      return;
    }
    const speed = v.speedKms ?? null;
    if (this.stepper === null || p === null) {
      const star = v.dstNt !== undefined ? pressureCorrectedDst(v.dstNt, v.pdynNpa) : steadyDstStar(speed ?? NOMINAL_SPEED_KMS, v.bzNt);
      this.stepper = new DstStarStepper(clampDst(star));
    } else {
      this.stepper.step((v.timeMs - p.v.timeMs) / MS_PER_HOUR, p.v.speedKms ?? NOMINAL_SPEED_KMS, p.v.bzNt);
    }
    let dstNt: number;
    let dstSource: SeriesStep['dstSource'];
    if (v.dstNt !== undefined) {
      dstNt = v.dstNt;
      dstSource = 'given';
      this.stepper.dstStarNt = clampDst(pressureCorrectedDst(v.dstNt, v.pdynNpa));
    } else {
      dstNt = clampDst(dstFromCorrected(this.stepper.dstStarNt, v.pdynNpa));
      dstSource = 'estimated';
    }
    this.steps.push({ time: v.time, ms: v.timeMs, pdynNpa: v.pdynNpa, bzNt: v.bzNt, byNt: v.byNt, dstNt: Math.round(dstNt * 10) / 10, dstSource, speedKms: speed });
    this.prev = { line: r.line, v };
  }

  finish(name: string, format: LoadedSeries['format']): LoadedSeries {
    const st = this.steps;
    const gaps = st.slice(1).map((s, i) => s.ms - st[i].ms);
    return { name, format, steps: st, cadenceMs: median(gaps), skipped: this.skipped, errors: this.errors };
  }
}

/** Records of text chunks through the one reader, and the format it detected. */
async function parseChunks(name: string, chunks: AsyncIterable<string | Uint8Array> | Iterable<string | Uint8Array>): Promise<LoadedSeries> {
  const parser = new SeriesParser();
  const c = new StepCollector();
  for await (const chunk of chunks) for (const r of parser.push(chunk)) c.add(r);
  for (const r of parser.end()) c.add(r);
  return c.finish(name, parser.format ?? 'csv');
}

/** Read a File (or any Blob) chunk by chunk. Whole-file problems throw an InputError. */
export function loadSeriesBlob(file: Blob, name: string): Promise<LoadedSeries> {
  return parseChunks(name, streamChunks(file.stream()));
}

/** Read a text held in memory (the demo files). */
export function loadSeriesText(name: string, text: string): Promise<LoadedSeries> {
  return parseChunks(name, [text]);
}

/** "72 steps (hourly) from demo-storm.csv, 2027-10-14 00:00 – 2027-10-16 23:00 UTC; …" */
export function seriesSummary(s: LoadedSeries): string {
  const n = s.steps.length;
  const when = n ? `${s.steps[0].time.slice(0, 16).replace('T', ' ')} – ${s.steps[n - 1].time.slice(0, 16).replace('T', ' ')} UTC` : 'no usable step';
  const given = s.steps.filter((x) => x.dstSource === 'given').length;
  const index = given === n ? 'storm index from the file' : given === 0 ? 'storm index estimated through the series' : `storm index from the file at ${given} steps, estimated at ${n - given}`;
  const parts = [`${n} step${n === 1 ? '' : 's'} every ${cadenceText(s.cadenceMs)} from ${s.name} (${s.format}), ${when}`, index];
  if (s.skipped.length) parts.push(`${s.skipped.length} line${s.skipped.length === 1 ? '' : 's'} skipped (gaps)`);
  if (s.errors.length) parts.push(`${s.errors.length} line${s.errors.length === 1 ? '' : 's'} unreadable`);
  return parts.join('; ') + '.';
}

/** "1 h", "5 min", "30 s". */
export function cadenceText(ms: number): string {
  if (!(ms > 0)) return '–';
  if (ms % MS_PER_HOUR === 0) return `${ms / MS_PER_HOUR} h`;
  if (ms % 60_000 === 0) return `${ms / 60_000} min`;
  return `${Math.round(ms / 1000)} s`;
}
