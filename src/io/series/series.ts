/**
 * The one reader of solar-wind series, for the CLI, the batch command and the
 * app alike. Feed it text chunks of any size (a Node stream's strings, a
 * browser File's bytes); it yields one record per data line: a value, a
 * skipped gap with its reason, or an error naming the line — the rest of the
 * file is always kept. Memory stays constant: one partial line is held.
 *
 * Formats (references §11): our CSV (the batch conditions columns plus
 * dst_nt or sym_h_nt), the hourly and the high-resolution (1-/5-min) files of
 * the merged near-Earth solar-wind data set. Detected from the first
 * non-blank line unless chosen. Pure: no Node or DOM APIs beyond TextDecoder.
 */
import { InputError } from '../../physics/errors';
import { CsvSeriesParser } from './csv-series';
import { detectSeriesFormat } from './detect';
import { fixedWordParser } from './layouts';
import { LineSplitter } from './lines';
import { SERIES_FORMATS, type SeriesFormat, type SeriesRecord } from './record';
import type { FixedWordParser } from './words';

export type { SeriesFormat, SeriesRecord, SeriesValue, SeriesPdynSource, StormIndexKind } from './record';
export { SERIES_FORMATS } from './record';

export interface SeriesReadOptions {
  /** The file's layout; `auto` (the default) detects it from the first non-blank line. */
  format?: SeriesFormat | 'auto';
  /** First word of every message, e.g. "conditions" gives "conditions line 12: …". Default "series". */
  label?: string;
}

/** Text held while looking for the first non-blank line, at most. */
const DETECT_LIMIT_CHARS = 1 << 20;

function checkFormat(format: unknown): SeriesFormat | 'auto' {
  if (format === undefined || format === 'auto') return 'auto';
  if (typeof format === 'string' && (SERIES_FORMATS as readonly string[]).includes(format)) return format as SeriesFormat;
  throw new InputError('format', `expected one of auto, ${SERIES_FORMATS.join(', ')}; got ${JSON.stringify(format)}`);
}

/** The first complete non-blank line of `text` (and its 1-based number), or null when none is complete yet. */
function firstLine(text: string, complete: boolean): { line: string; lineNo: number } | null {
  let start = text.charCodeAt(0) === 0xfeff ? 1 : 0;
  let lineNo = 1;
  for (let i = start; i <= text.length; i++) {
    const atEnd = i === text.length;
    const c = atEnd ? -1 : text.charCodeAt(i);
    if (c !== 10 && c !== 13 && !atEnd) continue;
    if (atEnd && !complete) return null;
    // A CR at the very end may still be followed by its LF: wait for more.
    const line = text.slice(start, i);
    if (line.trim() !== '') return { line, lineNo };
    if (atEnd) return null;
    if (c === 13 && i + 1 === text.length && !complete) return null;
    if (c === 13 && text.charCodeAt(i + 1) === 10) i++;
    lineNo++;
    start = i + 1;
  }
  return null;
}

/**
 * Push-style parser: `push(chunk)` returns the records that chunk completed,
 * `end()` the rest. A file-level problem (undetectable format, bad CSV header,
 * broken quoting, no data at all) is thrown as an InputError.
 */
export class SeriesParser {
  private chosen: SeriesFormat | null;
  private readonly label: string;
  private pending = '';
  private csv: CsvSeriesParser | null = null;
  private fixed: FixedWordParser | null = null;
  private lines: LineSplitter | null = null;
  private out: SeriesRecord[] = [];
  private decoder: TextDecoder | null = null;

  constructor(options: SeriesReadOptions = {}) {
    const f = checkFormat(options.format);
    this.chosen = f === 'auto' ? null : f;
    this.label = options.label ?? 'series';
  }

  /** The format in use, once known. */
  get format(): SeriesFormat | null {
    return this.csv ? 'csv' : this.fixed ? this.fixed.layout.format : null;
  }

  push(chunk: string | Uint8Array): SeriesRecord[] {
    const text = typeof chunk === 'string' ? chunk : (this.decoder ??= new TextDecoder('utf-8')).decode(chunk, { stream: true });
    if (this.csv) return this.csv.push(text);
    if (this.lines) return this.feed(text);
    this.pending += text;
    return this.start(false);
  }

  end(): SeriesRecord[] {
    let out: SeriesRecord[] = [];
    if (this.decoder) {
      const rest = this.decoder.decode();
      if (rest) out = this.push(rest);
    }
    if (!this.csv && !this.lines) out = out.concat(this.start(true));
    if (!this.csv && !this.lines) throw new InputError('series', 'the input is empty: no header and no data line');
    if (this.csv) return out.concat(this.csv.end());
    this.lines!.end();
    return out.concat(this.take());
  }

  private start(complete: boolean): SeriesRecord[] {
    const first = firstLine(this.pending, complete);
    if (first === null) {
      if (this.pending.length > DETECT_LIMIT_CHARS) throw new InputError('series', `no complete line in the first ${DETECT_LIMIT_CHARS} characters; this is not a series text file`);
      return [];
    }
    const format = this.chosen ?? detectSeriesFormat(first.line, first.lineNo);
    const text = this.pending;
    this.pending = '';
    if (format === 'csv') {
      this.csv = new CsvSeriesParser(this.label);
      return this.csv.push(text);
    }
    const parser = fixedWordParser(format, this.label);
    this.fixed = parser;
    this.lines = new LineSplitter((line, n, cut) => {
      const r = parser.parseLine(line, n, cut);
      if (r !== null) this.out.push(r);
    });
    return this.feed(text);
  }

  private feed(text: string): SeriesRecord[] {
    this.lines!.push(text);
    return this.take();
  }

  private take(): SeriesRecord[] {
    const out = this.out;
    this.out = [];
    return out;
  }
}

/** Chunks of a browser or Node ReadableStream (bytes or text), without relying on stream async iteration. */
export async function* streamChunks(stream: ReadableStream<Uint8Array | string>): AsyncGenerator<Uint8Array | string> {
  const reader = stream.getReader();
  try {
    for (;;) {
      const { done, value } = await reader.read();
      if (done) return;
      yield value;
    }
  } finally {
    reader.releaseLock();
  }
}

/**
 * The records of a series, chunk by chunk. `chunks` may be a Node stream with
 * an encoding set, `streamChunks(file.stream())` in the browser, or any
 * (async) iterable of strings or UTF-8 bytes.
 */
export async function* readSeries(chunks: AsyncIterable<string | Uint8Array> | Iterable<string | Uint8Array>, options: SeriesReadOptions = {}): AsyncGenerator<SeriesRecord> {
  const parser = new SeriesParser(options);
  for await (const chunk of chunks) yield* parser.push(chunk);
  yield* parser.end();
}

/** All records of a text held in memory (small files, tests). */
export function readSeriesText(text: string, options: SeriesReadOptions = {}): SeriesRecord[] {
  const parser = new SeriesParser(options);
  return parser.push(text).concat(parser.end());
}
