/**
 * Incremental CSV reading for tables too large to hold in memory (the batch
 * command's inputs). Same dialect as readCsv in csv.ts (RFC 4180; CRLF, LF or
 * CR record ends; a leading byte-order mark; empty records skipped), but fed in
 * chunks of any size: a record may span chunks, and quoted fields may span
 * lines. Each record carries the file line it starts on, so errors can name it.
 *
 * Malformed quoting never ends the reading: the record becomes an error record
 * (no fields, the line and the problem) and reading goes on from the next line
 * (after text following a closing quote: the line after the offending one; after
 * a quote that is never closed: the line after the record's first line). A
 * quoted field may span at most MAX_QUOTED_LINE_ENDS line ends and a record at
 * most MAX_RECORD_CHARS characters, so memory stays bounded and a stray quote
 * costs a bounded re-read.
 *
 * Pure: no Node or DOM APIs.
 */
import { chunkStart, type ChunkStartState } from './series/lines';

export interface CsvRecord {
  /** Raw field texts (quotes removed; the injection apostrophe kept — see csvText). Empty on an error record. */
  fields: string[];
  /** 1-based line of the file where the record starts. */
  line: number;
  /** Set on a record whose quoting is malformed: what is wrong, naming the line. */
  error?: string;
}

/** A quoted field spanning more line ends than this is taken as a quote that was never closed. */
export const MAX_QUOTED_LINE_ENDS = 64;
/** A record longer than this (characters) is taken as malformed. */
export const MAX_RECORD_CHARS = 1 << 20;

/** End of the line that contains position `from` of `s` (index after its line end), or -1 when the line does not end in `s`. */
function afterLineEnd(s: string, from: number): number {
  for (let i = from; i < s.length; i++) {
    const c = s.charCodeAt(i);
    if (c === 10) return i + 1;
    if (c === 13) return s.charCodeAt(i + 1) === 10 ? i + 2 : i + 1;
  }
  return -1;
}

function countLineEnds(s: string, end: number): number {
  let n = 0;
  for (let i = 0; i < end; i++) {
    const c = s.charCodeAt(i);
    if (c === 10) n++;
    else if (c === 13 && s.charCodeAt(i + 1) !== 10) n++;
  }
  return n;
}

/**
 * Push chunks with `push(text)`, then call `end()`; each returns the records
 * completed by that call, error records included.
 */
export class CsvRecordSplitter implements ChunkStartState {
  private record: string[] = [];
  private field = '';
  private inQuotes = false;
  private wasQuoted = false;
  /** A CR ended the previous chunk outside quotes (its LF may open this one); see chunkStart. */
  afterCr = false;
  /** A CR ended the previous chunk inside quotes. */
  private quotedCr = false;
  /** A quote ended the previous chunk inside quotes: closing or the first of a doubled pair. */
  private pendingQuote = false;
  /** After an error: drop text up to the next line end (it lies in a later chunk). */
  private skipLine = false;
  started = false;
  private line = 1;
  private recordLine = 1;
  private quoteLine = 1;
  /** Raw text of the current record from earlier chunks. */
  private carry = '';

  push(chunk: string): CsvRecord[] {
    const out: CsvRecord[] = [];
    this.pushInto(out, chunk);
    return out;
  }

  end(): CsvRecord[] {
    const out: CsvRecord[] = [];
    this.endInto(out);
    return out;
  }

  private pushInto(out: CsvRecord[], chunk: string): void {
    const n = chunk.length;
    if (n === 0) return;
    let i = chunkStart(this, chunk);
    if (this.skipLine) {
      const k = afterLineEnd(chunk, i);
      if (k < 0) return;
      this.skipLine = false;
      if (k === n && chunk.charCodeAt(n - 1) === 13) this.afterCr = true;
      this.line++;
      this.recordLine = this.line;
      i = k;
    }
    let recStart = i;
    if (this.quotedCr) {
      this.quotedCr = false;
      if (chunk.charCodeAt(i) !== 10) this.line++;
    }
    if (this.pendingQuote) {
      this.pendingQuote = false;
      if (chunk.charCodeAt(i) === 34) { this.field += '"'; i++; }
      else this.inQuotes = false;
    }
    // `field` grows by slices, not characters: plain runs are copied at once.
    let runStart = i;
    for (; i < n; i++) {
      const c = chunk.charCodeAt(i);
      if (this.inQuotes) {
        if (c === 34) {
          this.field += chunk.slice(runStart, i);
          if (i + 1 === n) { this.pendingQuote = true; runStart = n; break; }
          if (chunk.charCodeAt(i + 1) === 34) { this.field += '"'; i++; }
          else this.inQuotes = false;
          runStart = i + 1;
        } else if (c === 10 || c === 13) {
          if (c === 10) this.line++;
          else if (i + 1 === n) this.quotedCr = true;
          else if (chunk.charCodeAt(i + 1) !== 10) this.line++;
          if (this.line - this.quoteLine > MAX_QUOTED_LINE_ENDS) {
            this.fail(out, `csv line ${this.quoteLine}: a quoted field is never closed (it runs over ${MAX_QUOTED_LINE_ENDS} lines)`, this.carry + chunk.slice(recStart), 'start');
            return;
          }
        }
        continue;
      }
      if (c === 34 && this.field === '' && runStart === i && !this.wasQuoted) {
        this.inQuotes = true; this.wasQuoted = true; this.quoteLine = this.line;
        runStart = i + 1;
      } else if (c === 44) {
        this.field += chunk.slice(runStart, i);
        this.record.push(this.field);
        this.field = ''; this.wasQuoted = false;
        runStart = i + 1;
      } else if (c === 13 || c === 10) {
        this.field += chunk.slice(runStart, i);
        if (c === 13) {
          if (i + 1 === n) this.afterCr = true;
          else if (chunk.charCodeAt(i + 1) === 10) i++;
        }
        this.endRecord(out);
        this.line++;
        this.recordLine = this.line;
        runStart = i + 1;
        recStart = i + 1;
      } else if (this.wasQuoted) {
        const raw = this.carry + chunk.slice(recStart);
        // A record that already spans lines most likely began with a stray quote: read again after its first line.
        if (this.line > this.recordLine) this.fail(out, `csv line ${this.recordLine}: a quoted field is not closed properly (text after a closing quote on line ${this.line})`, raw, 'start');
        else this.fail(out, `csv line ${this.line}: text after a closing quote`, raw, this.carry.length + (i - recStart));
        return;
      }
    }
    if (runStart < n) this.field += chunk.slice(runStart, n);
    this.carry = recStart === 0 ? this.carry + chunk : chunk.slice(recStart);
    if (this.carry.length > MAX_RECORD_CHARS) {
      this.fail(out, `csv line ${this.recordLine}: a record longer than ${MAX_RECORD_CHARS} characters`, this.carry, this.inQuotes ? 'start' : this.carry.length);
    }
  }

  private endInto(out: CsvRecord[]): void {
    if (this.pendingQuote) { this.pendingQuote = false; this.inQuotes = false; }
    if (this.skipLine) { this.skipLine = false; return; }
    if (this.inQuotes) {
      this.fail(out, `csv line ${this.quoteLine}: a quoted field is never closed`, this.carry, 'start');
      this.endInto(out);
      return;
    }
    if (this.field !== '' || this.record.length > 0 || this.wasQuoted) this.endRecord(out);
  }

  /**
   * Emit an error record for the current record and go on reading `raw` (the
   * record's text from its start) after the line end that follows position
   * `from` ('start': the record's first line).
   */
  private fail(out: CsvRecord[], error: string, raw: string, from: number | 'start'): void {
    out.push({ fields: [], line: this.recordLine, error });
    const startLine = this.recordLine;
    this.record = []; this.field = ''; this.inQuotes = false; this.wasQuoted = false;
    this.quotedCr = false; this.pendingQuote = false; this.afterCr = false; this.carry = '';
    const cut = afterLineEnd(raw, from === 'start' ? 0 : from);
    if (cut < 0) {
      // The offending line goes on in a later chunk.
      this.line = startLine + countLineEnds(raw, raw.length);
      this.recordLine = this.line;
      this.skipLine = true;
      return;
    }
    this.line = startLine + countLineEnds(raw, cut);
    this.recordLine = this.line;
    if (raw.charCodeAt(cut - 1) === 13 && cut === raw.length) this.afterCr = true;
    this.pushInto(out, raw.slice(cut));
  }

  private endRecord(out: CsvRecord[]): void {
    this.record.push(this.field);
    if (this.record.length > 1 || this.record[0] !== '' || this.wasQuoted) out.push({ fields: this.record, line: this.recordLine });
    this.record = [];
    this.field = '';
    this.wasQuoted = false;
    this.carry = '';
  }
}
