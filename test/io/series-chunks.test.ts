/**
 * Chunk boundaries never drop, split or renumber a record (fast-check over
 * random chunkings): for each format, reading a file in random string or byte
 * chunks gives exactly the records of reading it whole, and one record per
 * non-blank line (counted here by a regular-expression split, independently
 * of the reader's line splitter).
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { readSeries, readSeriesText, SeriesParser, type SeriesRecord } from '../../src/io/series/series';
import { LineSplitter, MAX_LINE_CHARS } from '../../src/io/series/lines';
import { highresLine, hourlyLine } from './series-lines';

const EOLS = ['\n', '\r\n', '\r'];

function join(lines: string[], seed: number): string {
  // Mixed line ends (LF, CRLF, CR), a byte-order mark and a final line with or without an end.
  let s = '\ufeff';
  lines.forEach((l, i) => { s += l + (i === lines.length - 1 && seed % 2 ? '' : EOLS[(i + seed) % 3]); });
  return s;
}

const FILES: Record<string, string[]> = {
  hourly: [
    hourlyLine({ 3: '0' }), '', hourlyLine({ 3: '1', 17: '999.9' }), hourlyLine({ 3: '2', 17: '−4.2' }),
    hourlyLine({ 3: '3', 29: '99.99' }), '   ', hourlyLine({ 3: '4' }).slice(0, 100), hourlyLine({ 3: '5' }, 56),
  ],
  highres: [
    highresLine({ 4: '0' }), highresLine({ 4: '1', 28: '99.99' }), '', highresLine({ 4: '2', 19: '9999.99' }),
    highresLine({ 4: '3', 42: 'x' }), highresLine({ 4: '4' }, 49), highresLine({ 4: '5' }),
  ],
  csv: [
    'time,pdyn_npa,bz_nt,by_nt,sym_h_nt', '2027-10-29T22:00Z,2,-1,0.5,-20', '', '2027-10-29T22:05Z,"2.5",-1.5,0.5,-22',
    '2027-10-29T22:10Z,9999.99,-2,0.5,-25', '2027-10-29T22:15Z,2,−4,0.5,-25', '2027-10-29T22:20Z,3,-2,0.5',
    '2027-10-29T22:25Z,3,-2,0.5,99999',
  ],
};

function splitAt(text: string, cuts: number[]): string[] {
  const at = [...new Set(cuts.map((c) => c % (text.length + 1)))].sort((a, b) => a - b);
  const out: string[] = [];
  let prev = 0;
  for (const c of at) { out.push(text.slice(prev, c)); prev = c; }
  out.push(text.slice(prev));
  return out;
}

function readChunks(chunks: (string | Uint8Array)[]): SeriesRecord[] {
  const p = new SeriesParser();
  const out: SeriesRecord[] = [];
  for (const c of chunks) out.push(...p.push(c));
  out.push(...p.end());
  return out;
}

describe('series reader over random chunkings (fast-check)', () => {
  for (const [format, lines] of Object.entries(FILES)) {
    it(`${format}: string chunks and byte chunks give the records of the whole text`, () => {
      fc.assert(fc.property(fc.integer({ min: 0, max: 5 }), fc.array(fc.nat(), { maxLength: 40 }), (seed, cuts) => {
        const text = join(lines, seed);
        const whole = readSeriesText(text);
        const dataLines = text.replace(/^\ufeff/, '').split(/\r\n|\r|\n/).filter((l) => l.trim() !== '');
        expect(whole.length).toBe(format === 'csv' ? dataLines.length - 1 : dataLines.length);
        expect(whole.some((r) => r.kind === 'ok') && whole.some((r) => r.kind === 'error') && whole.some((r) => r.kind === 'skipped')).toBe(true);
        expect(readChunks(splitAt(text, cuts))).toEqual(whole);
        const bytes = new TextEncoder().encode(text);
        const byteChunks: Uint8Array[] = [];
        let prev = 0;
        for (const c of [...new Set(cuts.map((c) => c % (bytes.length + 1)))].sort((a, b) => a - b)) { byteChunks.push(bytes.slice(prev, c)); prev = c; }
        byteChunks.push(bytes.slice(prev));
        expect(readChunks(byteChunks)).toEqual(whole);
      }), { numRuns: 150 });
    });
  }

  it('one character per chunk (every boundary at once), through the async reader', async () => {
    const text = join(FILES.highres, 1);
    const out: SeriesRecord[] = [];
    for await (const r of readSeries(text.split(''))) out.push(r);
    expect(out).toEqual(readSeriesText(text));
  });
});

describe('LineSplitter memory', () => {
  it('holds at most one partial line, and cuts a line longer than the cap (reported, not kept)', () => {
    const seen: [string, number, boolean][] = [];
    const s = new LineSplitter((t, n, cut) => seen.push([t.slice(0, 3), n, cut]));
    let maxPending = 0;
    for (let i = 0; i < 1000; i++) { s.push(`row ${i} `.padEnd(90, 'x')); maxPending = Math.max(maxPending, s.pending); s.push('\n'); }
    expect(maxPending).toBe(90);
    const big = 'y'.repeat(4096);
    for (let i = 0; i < 40; i++) { s.push(big); maxPending = Math.max(maxPending, s.pending); }
    s.push('\nlast');
    s.end();
    expect(maxPending).toBeLessThanOrEqual(MAX_LINE_CHARS);
    expect(seen.length).toBe(1002);
    expect(seen[1000]).toEqual(['yyy', 1001, true]);
    expect(seen[1001]).toEqual(['las', 1002, false]);
  });
});
