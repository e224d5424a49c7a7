/**
 * CSV writing and reading (RFC 4180): comma separators, CRLF record ends,
 * fields quoted when they hold a comma, a double quote, CR or LF, quotes
 * doubled inside quoted fields. The first record is always the header.
 *
 * Spreadsheet formula injection (OWASP "CSV Injection"): a text cell that
 * begins with = + - @ (or tab / CR) is written with a leading apostrophe so a
 * spreadsheet shows it as text. Numbers are never escaped, so −5 stays numeric.
 * Text already made of apostrophes before such a character gets one more, so
 * `csvText` (which drops exactly one) restores every text exactly.
 *
 * Pure: no Node or DOM APIs; shared by the CLI and the browser app.
 */

export type CsvCell = string | number | boolean | null | undefined;

export interface CsvWriteOptions {
  /** Round numbers to at most this many decimals (trailing zeros dropped). Default: no rounding. */
  maxDecimals?: number;
  /** Record separator; RFC 4180 prescribes CRLF (the default). */
  eol?: '\r\n' | '\n';
}

// Text a spreadsheet could run as a formula, possibly behind apostrophes we must keep.
const ESCAPE_START = /^'*[=+\-@\t\r]/;
// What the writer produced from such text: one more apostrophe in front.
const ESCAPED = /^'+[=+\-@\t\r]/;
const NEEDS_QUOTES = /[",\r\n]/;

/** A number as CSV text; non-finite numbers become an empty cell. */
export function csvNumber(v: number, maxDecimals?: number): string {
  if (!Number.isFinite(v)) return '';
  if (maxDecimals === undefined) return String(v);
  const r = Number(v.toFixed(maxDecimals));
  return String(Object.is(r, -0) ? 0 : r);
}

/** One cell as CSV text (escaped and quoted as needed). */
export function csvField(v: CsvCell, maxDecimals?: number): string {
  if (v === null || v === undefined) return '';
  if (typeof v === 'number') return csvNumber(v, maxDecimals);
  if (typeof v === 'boolean') return v ? 'true' : 'false';
  const s = ESCAPE_START.test(v) ? `'${v}` : v;
  return NEEDS_QUOTES.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

/** A whole table: the header record, then one record per row. Every row must have the header's width. */
export function writeCsv(header: readonly string[], rows: readonly (readonly CsvCell[])[], options: CsvWriteOptions = {}): string {
  const eol = options.eol ?? '\r\n';
  const out: string[] = [header.map((h) => csvField(h)).join(',')];
  rows.forEach((row, i) => {
    if (row.length !== header.length) {
      throw new RangeError(`csv row ${i + 1}: ${row.length} cells, but the header has ${header.length} columns`);
    }
    out.push(row.map((c) => csvField(c, options.maxDecimals)).join(','));
  });
  return out.join(eol) + eol;
}

/**
 * Parse CSV text into records of raw field strings (quotes removed; the
 * injection apostrophe is kept — see csvText). Accepts CRLF, LF or CR record
 * ends and a leading byte-order mark; skips empty records. Throws a RangeError
 * naming the line of an unterminated quote or of text after a closing quote.
 */
export function readCsv(text: string): string[][] {
  const src = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  const records: string[][] = [];
  let record: string[] = [];
  let field = '';
  let inQuotes = false;
  let wasQuoted = false;
  let line = 1;
  let quoteLine = 1;
  const endRecord = () => {
    record.push(field);
    if (record.length > 1 || record[0] !== '' || wasQuoted) records.push(record);
    record = [];
    field = '';
    wasQuoted = false;
  };
  for (let i = 0; i < src.length; i++) {
    const ch = src[i];
    if (inQuotes) {
      if (ch === '"') {
        if (src[i + 1] === '"') { field += '"'; i++; }
        else inQuotes = false;
      } else {
        if (ch === '\n') line++;
        field += ch;
      }
      continue;
    }
    if (ch === '"' && field === '' && !wasQuoted) { inQuotes = true; wasQuoted = true; quoteLine = line; }
    else if (ch === ',') { record.push(field); field = ''; wasQuoted = false; }
    else if (ch === '\r' || ch === '\n') {
      if (ch === '\r' && src[i + 1] === '\n') i++;
      endRecord();
      line++;
    } else if (wasQuoted) {
      throw new RangeError(`csv line ${line}: text after a closing quote`);
    } else field += ch;
  }
  if (inQuotes) throw new RangeError(`csv line ${quoteLine}: a quoted field is never closed`);
  if (field !== '' || record.length > 0 || wasQuoted) endRecord();
  return records;
}

/** The text a writer meant: drops the one anti-injection apostrophe added by csvField. */
export function csvText(raw: string): string {
  return ESCAPED.test(raw) ? raw.slice(1) : raw;
}

export interface CsvTable {
  header: string[];
  /** One object per data record, keyed by header name (text after csvText). */
  records: Record<string, string>[];
}

/** Header-first CSV into keyed records; a record of the wrong width is an error naming its line. */
export function readCsvTable(text: string): CsvTable {
  const rows = readCsv(text);
  if (rows.length === 0) throw new RangeError('csv: the text is empty (a header record is required)');
  const header = rows[0].map((h) => csvText(h.trim()));
  const seen = new Set<string>();
  for (const h of header) {
    if (seen.has(h)) throw new RangeError(`csv header: column "${h}" appears twice`);
    seen.add(h);
  }
  const records = rows.slice(1).map((r, k) => {
    if (r.length !== header.length) {
      throw new RangeError(`csv record ${k + 2}: ${r.length} fields, but the header has ${header.length}`);
    }
    const o: Record<string, string> = {};
    header.forEach((h, j) => { o[h] = csvText(r[j]); });
    return o;
  });
  return { header, records };
}
