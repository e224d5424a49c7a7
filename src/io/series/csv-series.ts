/**
 * Our CSV series: the batch command's conditions columns (time, bz_nt, pdyn_npa
 * or density_cm3 + speed_kms, optional by_nt) plus an optional storm index
 * column, dst_nt or sym_h_nt. The batch columns are parsed by the batch's own
 * rules (src/cli/batch/inputs.ts); this file adds the index and the density
 * and speed kept beside a pdyn_npa. Pure: no Node or DOM APIs.
 */
import { CsvRecordSplitter, type CsvRecord } from '../batch-csv';
import { csvText } from '../csv';
import { parseNumberText, UsageError } from '../../cli/args';
import { CONDITIONS_EXPECTED, conditionsHeader, isFillText, parseCondition, type HeaderIndex } from '../../cli/batch/inputs';
import { parseUtc } from '../../physics/frames/time';
import { InputError } from '../../physics/errors';
import { isoUtc, LIMITS, type SeriesRecord, type SeriesValue, type StormIndexKind } from './record';

/** Columns this reader adds to the batch's conditions columns. */
export const INDEX_COLUMNS: Record<string, StormIndexKind> = { dst_nt: 'dst', sym_h_nt: 'sym_h' };
export const SERIES_CSV_EXPECTED = `${CONDITIONS_EXPECTED}; optional dst_nt or sym_h_nt`;

/** The batch's messages start "conditions line N"; ours start with the caller's label. */
const BATCH_LABEL = 'conditions';

class CellProblem extends Error {}

/** Already `YYYY-MM-DDTHH:MM:SSZ` (the usual case): kept as written, no re-formatting. */
const CANONICAL_UTC = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}Z$/;

export class CsvSeriesParser {
  private readonly splitter = new CsvRecordSplitter();
  private width = 0;
  /** Positions of the batch columns in a record, in the order of `batchIdx`. */
  private batchCols: number[] = [];
  private batchIdx: HeaderIndex | null = null;
  private indexCol = -1;
  private indexKind: StormIndexKind = 'dst';
  private indexName = '';
  private densityCol = -1;
  private speedCol = -1;

  constructor(private readonly label = 'series') {}

  /** Records completed by this chunk. Throws an InputError for a bad header or broken quoting. */
  push(chunk: string): SeriesRecord[] {
    return this.records(this.guard(() => this.splitter.push(chunk)));
  }

  end(): SeriesRecord[] {
    const out = this.records(this.guard(() => this.splitter.end()));
    if (this.batchIdx === null) throw new InputError('series', `the CSV has no header; expected columns: ${SERIES_CSV_EXPECTED}`);
    return out;
  }

  private guard(f: () => CsvRecord[]): CsvRecord[] {
    try { return f(); } catch (e) {
      if (e instanceof RangeError && !(e instanceof InputError)) throw new InputError('series', e.message);
      throw e;
    }
  }

  private records(recs: CsvRecord[]): SeriesRecord[] {
    const out: SeriesRecord[] = [];
    for (const r of recs) {
      if (this.batchIdx === null) this.header(r);
      else out.push(this.row(r));
    }
    return out;
  }

  private header(r: CsvRecord): void {
    if (r.error !== undefined) throw new InputError('series', `the header ${r.error.replace(/^csv /, '')}; expected columns: ${SERIES_CSV_EXPECTED}`);
    const names = r.fields.map((h) => csvText(h.trim()));
    const base: string[] = [];
    const cols: number[] = [];
    names.forEach((h, j) => {
      const kind = INDEX_COLUMNS[h];
      if (kind === undefined) { base.push(r.fields[j]); cols.push(j); return; }
      if (this.indexCol >= 0) {
        const what = h === this.indexName ? `column "${h}" appears twice` : `columns "${this.indexName}" and "${h}" are both present (keep one storm index)`;
        throw new InputError('series', `${what} in the header (line ${r.line}); expected columns: ${SERIES_CSV_EXPECTED}`);
      }
      this.indexCol = j;
      this.indexKind = kind;
      this.indexName = h;
    });
    try {
      this.batchIdx = conditionsHeader(base);
    } catch (e) {
      if (!(e instanceof UsageError)) throw e;
      const msg = e.message.slice(e.flag.length + 2).replace('(line 1)', `(line ${r.line})`).replace(`expected columns: ${CONDITIONS_EXPECTED}`, `expected columns: ${SERIES_CSV_EXPECTED}`);
      throw new InputError('series', msg);
    }
    this.batchCols = cols;
    this.width = names.length;
    this.densityCol = names.indexOf('density_cm3');
    this.speedCol = names.indexOf('speed_kms');
  }

  private relabel(msg: string): string {
    return this.label !== BATCH_LABEL && msg.startsWith(`${BATCH_LABEL} line `) ? this.label + msg.slice(BATCH_LABEL.length) : msg;
  }

  private row(r: CsvRecord): SeriesRecord {
    const { fields, line } = r;
    const where = `${this.label} line ${line}`;
    // Broken quoting: the splitter's error record ("csv line N: …"), the reading goes on.
    if (r.error !== undefined) return { kind: 'error', line, error: `${this.label} ${r.error.replace(/^csv /, '')}; row not read` };
    if (fields.length !== this.width) {
      const what = fields.length < this.width ? 'missing value' : 'extra value';
      return { kind: 'error', line, error: `${where}: ${what}: ${fields.length} field${fields.length === 1 ? '' : 's'}, the header has ${this.width}` };
    }
    const base = this.batchCols.length === fields.length ? fields : this.batchCols.map((j) => fields[j]);
    const o = parseCondition(base, line, this.batchIdx!);
    if (o.kind === 'skipped') return { kind: 'skipped', line, reason: this.relabel(o.reason), time: o.time };
    if (o.kind === 'error') return { kind: 'error', line, error: this.relabel(o.error), time: o.time };
    const c = o.value;
    try {
      const timeMs = parseUtc(c.time);
      const value: SeriesValue = {
        time: CANONICAL_UTC.test(c.time) ? c.time : isoUtc(timeMs), timeMs, pdynNpa: c.pdynNpa,
        pdynSource: c.pdynSource === 'density_speed' ? 'density_speed' : 'pdyn_npa',
        bzNt: c.bzNt, byNt: c.byNt,
      };
      const n = this.optional(fields, this.densityCol, 'density_cm3');
      const v = this.optional(fields, this.speedCol, 'speed_kms');
      if (n !== undefined) {
        if (!(n > 0)) throw new CellProblem(`density_cm3: expected a density > 0 cm⁻³, got ${n}`);
        value.densityCm3 = n;
      }
      if (v !== undefined) {
        if (!(v > 0)) throw new CellProblem(`speed_kms: expected a speed > 0 km/s, got ${v}`);
        value.speedKms = v;
      }
      const d = this.optional(fields, this.indexCol, this.indexName);
      if (d !== undefined) {
        if (Math.abs(d) > LIMITS.dstMaxNt) throw new CellProblem(`${this.indexName}: ${d} is outside −${LIMITS.dstMaxNt}..${LIMITS.dstMaxNt} nT`);
        value.dstNt = d;
        value.dstKind = this.indexKind;
      }
      return { kind: 'ok', line, value };
    } catch (e) {
      if (!(e instanceof CellProblem)) throw e;
      return { kind: 'error', line, error: `${where}: ${e.message}`, time: c.time };
    }
  }

  /** An optional numeric cell: undefined when the column is absent, empty or a fill value. */
  private optional(fields: string[], col: number, name: string): number | undefined {
    if (col < 0) return undefined;
    const t = csvText(fields[col].trim());
    if (t === '' || isFillText(t)) return undefined;
    const v = parseNumberText(t);
    if (v === null || !Number.isFinite(v)) throw new CellProblem(`${name}: expected a number, got "${t}"`);
    return v;
  }
}
