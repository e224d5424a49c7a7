/**
 * Incremental CSV reading for tables too large to hold in memory (the batch
 * command's inputs). Same dialect as readCsv in csv.ts (RFC 4180; CRLF, LF or
 * CR record ends; a leading byte-order mark; empty records skipped), but fed in
 * chunks of any size: a record may span chunks, and quoted fields may span
 * lines. Each record carries the file line it starts on, so errors can name it.
 *
 * Pure: no Node or DOM APIs.
 */

export interface CsvRecord {
  /** Raw field texts (quotes removed; the injection apostrophe kept — see csvText). */
  fields: string[];
  /** 1-based line of the file where the record starts. */
  line: number;
}

/**
 * Push chunks with `push(text)`, then call `end()`; each returns the records
 * completed by that call. Malformed quoting throws a RangeError naming the line.
 */
export class CsvRecordSplitter {
  private record: string[] = [];
  private field = '';
  private inQuotes = false;
  private wasQuoted = false;
  /** A CR ended the previous chunk outside quotes (its LF may open this one). */
  private afterCr = false;
  /** A CR ended the previous chunk inside quotes. */
  private quotedCr = false;
  /** A quote ended the previous chunk inside quotes: closing or the first of a doubled pair. */
  private pendingQuote = false;
  private started = false;
  private line = 1;
  private recordLine = 1;
  private quoteLine = 1;

  push(chunk: string): CsvRecord[] {
    const out: CsvRecord[] = [];
    const n = chunk.length;
    if (n === 0) return out;
    let i = 0;
    if (!this.started) {
      this.started = true;
      if (chunk.charCodeAt(0) === 0xfeff) i = 1;
    }
    if (this.afterCr) {
      this.afterCr = false;
      if (chunk.charCodeAt(i) === 10) i++;
    }
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
        } else if (c === 10) {
          this.line++;
        } else if (c === 13) {
          if (i + 1 === n) this.quotedCr = true;
          else if (chunk.charCodeAt(i + 1) !== 10) this.line++;
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
      } else if (this.wasQuoted) {
        throw new RangeError(`csv line ${this.line}: text after a closing quote`);
      }
    }
    if (runStart < n) this.field += chunk.slice(runStart, n);
    return out;
  }

  end(): CsvRecord[] {
    const out: CsvRecord[] = [];
    if (this.pendingQuote) { this.pendingQuote = false; this.inQuotes = false; }
    if (this.inQuotes) throw new RangeError(`csv line ${this.quoteLine}: a quoted field is never closed`);
    if (this.field !== '' || this.record.length > 0 || this.wasQuoted) this.endRecord(out);
    return out;
  }

  private endRecord(out: CsvRecord[]): void {
    this.record.push(this.field);
    if (this.record.length > 1 || this.record[0] !== '' || this.wasQuoted) out.push({ fields: this.record, line: this.recordLine });
    this.record = [];
    this.field = '';
    this.wasQuoted = false;
  }
}
