/**
 * Incremental CSV reading (src/io/batch-csv.ts) against the whole-text reader
 * readCsv (src/io/csv.ts, RFC 4180): the same records for every chunking of
 * the text, and a round trip through writeCsv. Plus the batch fill-value rule.
 */
import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { CsvRecordSplitter } from '../../src/io/batch-csv';
import { readCsv, writeCsv, csvText } from '../../src/io/csv';
import { isFillText } from '../../src/cli/batch/inputs';

function splitAll(text: string, chunk: number): { fields: string[]; line: number }[] {
  const s = new CsvRecordSplitter();
  const out = [];
  for (let i = 0; i < text.length; i += chunk) out.push(...s.push(text.slice(i, i + chunk)));
  out.push(...s.end());
  return out;
}

describe('CsvRecordSplitter', () => {
  const tricky = '\ufeffname,note\r\n"a, b","say ""hi"""\r\n"multi\nline",x\n\nplain,"q"\rlast,"' + '"' + '"' + '"\n';

  it('gives readCsv\'s records for every chunk size (RFC 4180 dialect of csv.ts)', () => {
    const expected = readCsv(tricky);
    for (let k = 1; k <= tricky.length; k++) {
      expect(splitAll(tricky, k).map((r) => r.fields), `chunk size ${k}`).toEqual(expected);
    }
  });

  it('names the starting line of each record, counting line ends inside quotes', () => {
    expect(splitAll(tricky, 3).map((r) => r.line)).toEqual([1, 2, 3, 6, 7]);
  });

  it('round-trips writeCsv output, including injection-escaped cells, for random tables (property)', () => {
    const cell = fc.oneof(fc.string({ maxLength: 6 }), fc.constantFrom('=1+2', '+x', '-y', '@z', 'a,b', 'q"q', 'l\r\nm', ''));
    fc.assert(fc.property(fc.array(fc.array(cell, { minLength: 2, maxLength: 2 }), { minLength: 1, maxLength: 6 }), fc.integer({ min: 1, max: 9 }), (rows, chunk) => {
      const text = writeCsv(['a', 'b'], rows);
      const got = splitAll(text, chunk).map((r) => r.fields.map(csvText));
      // readCsv drops records that are a single empty field; so does the splitter.
      const want = [['a', 'b'], ...rows.map((r) => r.map(String))];
      expect(got).toEqual(want);
    }), { numRuns: 200 });
  });

  it('refuses an unterminated quote and text after a closing quote, naming the line', () => {
    const s = new CsvRecordSplitter();
    s.push('a,b\n"open');
    expect(() => s.end()).toThrow(/line 2: a quoted field is never closed/);
    expect(() => splitAll('a\n"x"y\n', 2)).toThrow(/line 2: text after a closing quote/);
  });
});

describe('fill values (solar-wind archive gap markers: all nines)', () => {
  it('recognises the common markers and not ordinary numbers', () => {
    for (const t of ['9999.99', '99999.9', '999.9', '9999999.', '-9999.99', ' 999.99 ']) expect(isFillText(t), t).toBe(true);
    for (const t of ['999', '99.9', '9998.99', '1000', '9.99', '-5', '', 'abc', '0.9999']) expect(isFillText(t), t).toBe(false);
  });
});
