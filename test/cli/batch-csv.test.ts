/**
 * Incremental CSV reading (src/io/batch-csv.ts) against the whole-text reader
 * readCsv (src/io/csv.ts, RFC 4180): the same records for every chunking of
 * the text, and a round trip through writeCsv. Plus the batch fill-value rule.
 */
import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { CsvRecordSplitter, type CsvRecord } from '../../src/io/batch-csv';
import { readCsv, writeCsv, csvText } from '../../src/io/csv';
import { isFillText } from '../../src/cli/batch/inputs';

function splitAll(text: string, chunk: number): CsvRecord[] {
  const s = new CsvRecordSplitter();
  const out: CsvRecord[] = [];
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

  it('turns malformed quoting into an error record naming the line and reads on from the next line (no record lost)', () => {
    // An unterminated quote: the record is an error, the lines after its first line are read again.
    const a = splitAll('a,b\n"open,1\n2,3\n4,5\n', 4);
    expect(a).toEqual([
      { fields: ['a', 'b'], line: 1 },
      { fields: [], line: 2, error: 'csv line 2: a quoted field is never closed' },
      { fields: ['2', '3'], line: 3 },
      { fields: ['4', '5'], line: 4 },
    ]);
    // Text after a closing quote: the record is an error, reading goes on after that line.
    for (let k = 1; k <= 12; k++) {
      expect(splitAll('a\n"x"y,z\nb\r\nc\n', k), `chunk ${k}`).toEqual([
        { fields: ['a'], line: 1 },
        { fields: [], line: 2, error: 'csv line 2: text after a closing quote' },
        { fields: ['b'], line: 3 },
        { fields: ['c'], line: 4 },
      ]);
    }
  });

  it('a stray quote costs a bounded re-read: a quoted field over the line limit is an error and the rest is kept', () => {
    const good = Array.from({ length: 200 }, (_, i) => `r${i},${i}`);
    const text = ['h,v', ...good.slice(0, 50), '"bad,1', ...good.slice(50)].join('\n') + '\n';
    const recs = splitAll(text, 1000);
    const errors = recs.filter((r) => r.error);
    expect(errors.map((r) => r.line)).toEqual([52]);
    expect(recs.filter((r) => !r.error).length).toBe(201);
    expect(recs.find((r) => r.fields[0] === 'r199')?.line).toBe(202);
  });

  it('every chunking gives the same records, errors included, and every good line survives (property, fast-check)', () => {
    // Good lines are plain or properly quoted; bad ones carry a stray quote. Reference: the whole text in one chunk,
    // and independently: every good line that does not follow an unclosed quote within the bound appears with its line number.
    const good = fc.oneof(fc.constantFrom('1,2', 'x,"y, z"', '"q""q",3', 'p,'), fc.stringMatching(/^[a-z0-9]{1,5},[a-z0-9]{0,5}$/));
    const bad = fc.constantFrom('"x"y,1', 'a,"b"c', '"never,closed');
    const line = fc.oneof({ arbitrary: good, weight: 5 }, { arbitrary: bad, weight: 1 });
    fc.assert(fc.property(fc.array(line, { minLength: 1, maxLength: 30 }), fc.constantFrom('\n', '\r\n', '\r'), fc.integer({ min: 1, max: 17 }), (lines, eol, chunk) => {
      const text = lines.join(eol) + eol;
      const whole = splitAll(text, text.length);
      expect(splitAll(text, chunk)).toEqual(whole);
      // No good line before the first bad one is lost, and record count never exceeds the line count.
      const firstBad = lines.findIndex((l) => l.includes('"x"y') || l.includes('"b"c') || l.includes('"never'));
      const upTo = firstBad < 0 ? lines.length : firstBad;
      expect(whole.slice(0, upTo).map((r) => r.line)).toEqual(Array.from({ length: upTo }, (_, i) => i + 1));
      expect(whole.length).toBeLessThanOrEqual(lines.length);
      if (firstBad >= 0) expect(whole[firstBad].error, `line ${firstBad + 1}`).toMatch(new RegExp(`^csv line ${firstBad + 1}: `));
    }), { numRuns: 300 });
  });
});

describe('fill values (solar-wind archive gap markers: all nines)', () => {
  it('recognises the common markers and not ordinary numbers', () => {
    for (const t of ['9999.99', '99999.9', '999.9', '9999999.', '-9999.99', ' 999.99 ']) expect(isFillText(t), t).toBe(true);
    for (const t of ['999', '99.9', '9998.99', '1000', '9.99', '-5', '', 'abc', '0.9999']) expect(isFillText(t), t).toBe(false);
  });
});
