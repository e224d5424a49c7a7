import { describe, it, expect } from 'vitest';
import { writeCsv, readCsv, readCsvTable, csvField, csvText, csvNumber } from '../../src/io/csv';

// Source of the rules checked here: RFC 4180 (CSV format) and the OWASP "CSV Injection" advice.
describe('csv writing (RFC 4180)', () => {
  it('writes a header record first and CRLF record ends', () => {
    const t = writeCsv(['geo_lat_deg', 'name'], [[1.5, 'a'], [-2, 'b']]);
    expect(t).toBe('geo_lat_deg,name\r\n1.5,a\r\n-2,b\r\n');
  });

  it('quotes fields holding comma, quote, CR or LF and doubles quotes', () => {
    expect(csvField('a,b')).toBe('"a,b"');
    expect(csvField('say "hi"')).toBe('"say ""hi"""');
    expect(csvField('two\nlines')).toBe('"two\nlines"');
    expect(csvField('plain')).toBe('plain');
  });

  it('escapes text cells that a spreadsheet would run as a formula, but not numbers (OWASP)', () => {
    for (const s of ['=1+1', '+1', '-5', '@SUM(A1)', '\tx']) expect(csvField(s).startsWith("'") || csvField(s).startsWith(`"'`), s).toBe(true);
    expect(csvField(-5)).toBe('-5');
    expect(csvField('=a,b')).toBe(`"'=a,b"`);
  });

  it('writes null, undefined and non-finite numbers as empty cells, booleans as words', () => {
    expect(writeCsv(['a', 'b', 'c', 'd'], [[null, undefined, Number.NaN, true]])).toBe('a,b,c,d\r\n,,,true\r\n');
  });

  it('rounds numbers to maxDecimals without trailing zeros or -0', () => {
    expect(csvNumber(1.23456789, 6)).toBe('1.234568');
    expect(csvNumber(2.5, 6)).toBe('2.5');
    expect(csvNumber(-1e-9, 6)).toBe('0');
  });

  it('refuses a row whose width differs from the header', () => {
    expect(() => writeCsv(['a', 'b'], [[1]])).toThrow(/row 1: 1 cells, but the header has 2/);
  });
});

describe('csv reading', () => {
  it('round-trips awkward text and numbers through write → read (invariant)', () => {
    const header = ['name', 'lat_deg', 'note'];
    const rows = [
      ['Quill Harbour', 61.25, 'comma, inside'],
      ['=cmd|x', -12.5, 'quote " and\r\nnewline'],
      ['-leading minus', 0, ''],
    ];
    const t = readCsvTable(writeCsv(header, rows));
    expect(t.header).toEqual(header);
    expect(t.records.map((r) => [r.name, Number(r.lat_deg), r.note])).toEqual(rows);
  });

  it('accepts LF and CR line ends and a byte-order mark, skips blank lines', () => {
    expect(readCsv('\uFEFFa,b\n1,2\n\n3,4')).toEqual([['a', 'b'], ['1', '2'], ['3', '4']]);
    expect(readCsv('a,b\r1,2\r')).toEqual([['a', 'b'], ['1', '2']]);
  });

  it('keeps empty fields, including a final one', () => {
    expect(readCsv('a,,\r\n')).toEqual([['a', '', '']]);
    expect(readCsv('""\r\n')).toEqual([['']]);
  });

  it('names the line of an unterminated quote and of text after a closing quote', () => {
    expect(() => readCsv('a,b\r\n1,"open\r\n')).toThrow(/line 2: a quoted field is never closed/);
    expect(() => readCsv('a\r\n"x"y\r\n')).toThrow(/line 2: text after a closing quote/);
  });

  it('reports records of the wrong width and duplicate columns', () => {
    expect(() => readCsvTable('a,b\r\n1\r\n')).toThrow(/record 2: 1 fields, but the header has 2/);
    expect(() => readCsvTable('a,a\r\n')).toThrow(/column "a" appears twice/);
    expect(() => readCsvTable('')).toThrow(/empty/);
  });

  it("csvText drops only the writer's anti-injection apostrophe", () => {
    expect(csvText("'=x")).toBe('=x');
    expect(csvText("''=x")).toBe("'=x");
    expect(readCsvTable(writeCsv(['t'], [["'=x"], ["''-1"], ["'"], ["'a"]])).records.map((r) => r.t)).toEqual(["'=x", "''-1", "'", "'a"]);
    expect(csvText("'quoted'")).toBe("'quoted'");
    expect(csvText("'")).toBe("'");
  });
});
