/**
 * The solar-wind series reader (src/io/series): hand-made lines of each format
 * (references §11 word layouts, invented values) round-trip to the right
 * values; fill values are skipped with a reason naming the word; damaged lines
 * are reported by number and the rest kept; detection and its failures.
 * Times are checked against ECMAScript Date.UTC (an independent calendar).
 */
import { describe, expect, it } from 'vitest';
import { readSeries, readSeriesText, SeriesParser, type SeriesRecord, type SeriesValue } from '../../src/io/series/series';
import { detectSeriesFormat } from '../../src/io/series/detect';
import { parseWord } from '../../src/io/series/words';
import fc from 'fast-check';
import { InputError } from '../../src/physics/errors';
import { expectClose } from '../helpers';
import { highresLine, hourlyLine } from './series-lines';

function ok(r: SeriesRecord): SeriesValue {
  expect(r.kind, JSON.stringify(r)).toBe('ok');
  return (r as Extract<SeriesRecord, { kind: 'ok' }>).value;
}

describe('hourly file (references §11 word layout)', () => {
  it('round-trips a hand-made line: time from year/day/hour, By/Bz GSM, density, speed, flow pressure, Dst', () => {
    const [r] = readSeriesText(hourlyLine({}) + '\n');
    expect(r.line).toBe(1);
    expect(ok(r)).toEqual({
      time: '2027-10-29T14:00:00Z', timeMs: Date.UTC(2027, 9, 29, 14), // day 302 of a common year = 29 October
      pdynNpa: 9.87, pdynSource: 'flow_pressure', densityCm3: 14.2, speedKms: 612,
      bzNt: -12.7, byNt: -3.4, dstNt: -143, dstKind: 'dst',
    });
  });

  it('reads the GSM words (16, 17), not the GSE ones (14, 15)', () => {
    const v = ok(readSeriesText(hourlyLine({ 14: '5.5', 15: '6.6', 16: '-1.1', 17: '2.2' }))[0]);
    expect([v.byNt, v.bzNt]).toEqual([-1.1, 2.2]);
  });

  it('takes the 56-word extended variant', () => {
    expect(ok(readSeriesText(hourlyLine({}, 56))[0]).pdynNpa).toBe(9.87);
  });

  it('day 366 of a leap year is 31 December; day 1 hour 0 is 1 January 00:00 (Date.UTC)', () => {
    expect(ok(readSeriesText(hourlyLine({ 1: '2028', 2: '366', 3: '23' }))[0]).timeMs).toBe(Date.UTC(2028, 11, 31, 23));
    expect(ok(readSeriesText(hourlyLine({ 1: '2028', 2: '1', 3: '0' }))[0]).time).toBe('2028-01-01T00:00:00Z');
  });

  it('pressure word filled: 1.67e-6·n·v²·(1 + 4 Na/Np) with the alpha ratio (references §3, §11 definition)', () => {
    const v = ok(readSeriesText(hourlyLine({ 29: '99.99' }))[0]);
    // By hand: 1.67e-6 × 14.2 × 612² × (1 + 4 × 0.041) = 1.67e-6 × 14.2 × 374544 × 1.164 = 10.33857399 nPa
    expectClose(v.pdynNpa, 10.33857399, 1e-8, 'Pdyn from n, v and alpha ratio');
    expect(v.pdynSource).toBe('density_speed_alpha');
  });

  it('pressure and alpha words filled: 2.0e-6·n·v² (references §3)', () => {
    const v = ok(readSeriesText(hourlyLine({ 29: '99.99', 28: '9.999' }))[0]);
    expectClose(v.pdynNpa, 2.0e-6 * 14.2 * 612 * 612, 1e-12, 'Pdyn 2.0e-6·n·v²'); // = 10.6370… nPa
    expectClose(v.pdynNpa, 10.6370496, 1e-7, 'Pdyn by hand');
    expect(v.pdynSource).toBe('density_speed');
  });

  it('skips a filled Bz GSM with a reason naming the word', () => {
    const [r] = readSeriesText(hourlyLine({ 17: '999.9' }));
    expect(r).toEqual({ kind: 'skipped', line: 1, time: '2027-10-29T14:00:00Z', reason: 'series line 1: word 17 (Bz GSM) is a fill value (999.9); row skipped' });
  });

  it('skips a step with no pressure (pressure and density filled), naming both words', () => {
    const [r] = readSeriesText(hourlyLine({ 29: '99.99', 24: '999.9' }));
    expect(r.kind).toBe('skipped');
    expect((r as { reason: string }).reason).toBe('series line 1: no pressure: word 29 (flow pressure) is a fill value (99.99), word 24 (proton density) is a fill value (999.9); row skipped');
  });

  it('keeps a step whose Dst is filled, without an index', () => {
    const v = ok(readSeriesText(hourlyLine({ 41: '99999' }))[0]);
    expect(v.dstNt).toBeUndefined();
    expect(v.dstKind).toBeUndefined();
  });

  it('a speed of 999. km/s is a number (three 9s, the fill has four)', () => {
    expect(ok(readSeriesText(hourlyLine({ 25: '999.' }))[0]).speedKms).toBe(999);
  });

  it('reports damaged lines by number and keeps the rest', () => {
    const lines = [
      hourlyLine({ 3: '0' }),
      hourlyLine({ 3: '1', 17: '-4.x' }),
      hourlyLine({ 3: '2' }).slice(0, 120),
      '',
      hourlyLine({ 3: '24' }),
      hourlyLine({ 2: '366' }),
      hourlyLine({ 3: '5', 16: '1234.5' }),
      hourlyLine({ 3: '6', 28: '1.5', 29: '99.99' }),
      hourlyLine({ 3: '7' }),
    ];
    const rs = readSeriesText(lines.join('\r\n'));
    expect(rs.map((r) => [r.line, r.kind])).toEqual([[1, 'ok'], [2, 'error'], [3, 'error'], [5, 'error'], [6, 'error'], [7, 'error'], [8, 'error'], [9, 'ok']]);
    const err = (i: number) => (rs[i] as { error: string }).error;
    expect(err(1)).toBe('series line 2: word 17 (Bz GSM): expected a number, got "-4.x"');
    expect(err(2)).toMatch(/^series line 3: \d+ words; a hourly line has 55 or 56$/);
    expect(err(3)).toBe('series line 5: word 3 (hour): expected a whole number in 0..23, got "24"');
    expect(err(4)).toBe('series line 6: word 2 (day of year): expected a whole number in 1..365, got "366"');
    expect(err(5)).toBe('series line 7: word 16 (By GSM): 1234.5 is outside −1000..1000 nT');
    expect(err(6)).toBe('series line 8: word 28 (alpha/proton ratio): expected a ratio in 0..1, got 1.5');
    expect(ok(rs[7]).time).toBe('2027-10-29T07:00:00Z');
  });

  it('the last year of the IGRF-14 span is checked per line: 2030 day 1 00:00 is inside, 01:00 is not', () => {
    const rs = readSeriesText([hourlyLine({ 1: '2029', 2: '365', 3: '23' }), hourlyLine({ 1: '2030', 2: '1', 3: '0' }), hourlyLine({ 1: '2030', 2: '1', 3: '1' })].join('\n'));
    expect(rs.map((r) => r.kind)).toEqual(['ok', 'ok', 'error']);
  });

  it('refuses a year outside the IGRF-14 span with the span in the message', () => {
    const [r] = readSeriesText(hourlyLine({ 1: '1850' }));
    expect(r.kind).toBe('error');
    expect((r as { error: string }).error).toMatch(/^series line 1: time: IGRF-14 covers 1900\.0–2030\.0/);
  });
});

describe('word numbers (the exact fast path of decimal reading)', () => {
  it('equals ECMAScript Number() for random plain decimals up to 15 digits (fast-check)', () => {
    fc.assert(fc.property(fc.constantFrom('', '-', '+'), fc.stringMatching(/^[0-9]{1,9}$/), fc.option(fc.stringMatching(/^[0-9]{0,6}$/)), (sign, int, frac) => {
      const t = `${sign}${int}${frac === null ? '' : `.${frac}`}`;
      expect(Object.is(parseWord(t), Number(t)) || (parseWord(t) === 0 && Number(t) === 0), t).toBe(true);
    }), { numRuns: 2000 });
  });
  it('falls back to the strict parser for exponents and refuses junk', () => {
    expect([parseWord('1.5e3'), parseWord('.5'), parseWord('5.'), parseWord('-.'), parseWord('1.2.3'), parseWord('0x10'), parseWord('')]).toEqual([1500, 0.5, 5, null, null, null, null]);
  });
});

describe('high-resolution file (references §11 word layout)', () => {
  it('round-trips a hand-made 1-minute line: minute word, By/Bz GSM, speed, density, flow pressure, SYM/H', () => {
    const v = ok(readSeriesText(highresLine({}))[0]);
    expect(v).toEqual({
      time: '2027-03-01T23:35:00Z', timeMs: Date.UTC(2027, 2, 1, 23, 35), // day 60 of a common year = 1 March
      pdynNpa: 3.24, pdynSource: 'flow_pressure', densityCm3: 6.81, speedKms: 487.3,
      bzNt: -8.56, byNt: 4.12, dstNt: -57, dstKind: 'sym_h',
    });
  });

  it('takes the 49-word 5-minute variant', () => {
    expect(ok(readSeriesText(highresLine({ 4: '55' }, 49))[0]).time).toBe('2027-03-01T23:55:00Z');
  });

  it('pressure filled: 2.0e-6·n·v² (no alpha word in this file; references §3)', () => {
    const v = ok(readSeriesText(highresLine({ 28: '99.99' }))[0]);
    expectClose(v.pdynNpa, 2.0e-6 * 6.81 * 487.3 * 487.3, 1e-12, 'Pdyn 2.0e-6·n·v²'); // = 3.2342… nPa
    expect(v.pdynSource).toBe('density_speed');
  });

  it('fill values of its own widths: 9999.99 (By), 99999.9 (speed), 999.99 (density), 99999 (SYM/H)', () => {
    expect((readSeriesText(highresLine({ 18: '9999.99' }))[0] as { reason: string }).reason).toBe('series line 1: word 18 (By GSM) is a fill value (9999.99); row skipped');
    const both = readSeriesText(highresLine({ 28: '99.99', 22: '99999.9', 26: '999.99' }))[0] as { reason: string };
    expect(both.reason).toBe('series line 1: no pressure: word 28 (flow pressure) is a fill value (99.99), word 26 (proton density) is a fill value (999.99), word 22 (flow speed) is a fill value (99999.9); row skipped');
    const v = ok(readSeriesText(highresLine({ 42: '99999', 22: '999.9' }))[0]);
    expect(v.dstNt).toBeUndefined();
    expect(v.speedKms).toBe(999.9); // four 9s: a real speed, the fill 99999.9 has six
  });

  it('minute 60 is an error naming the word', () => {
    const [r] = readSeriesText(highresLine({ 4: '60' }));
    expect((r as { error: string }).error).toBe('series line 1: word 4 (minute): expected a whole number in 0..59, got "60"');
  });
});

describe('our CSV (the batch conditions columns plus dst_nt / sym_h_nt)', () => {
  it('round-trips the batch columns, an offset time to UTC, and dst_nt', () => {
    const rs = readSeriesText('time,pdyn_npa,bz_nt,by_nt,dst_nt\n2027-10-29T23:30:00+01:00,4.5,-7.25,2,-88\n');
    expect(ok(rs[0])).toEqual({ time: '2027-10-29T22:30:00Z', timeMs: Date.UTC(2027, 9, 29, 22, 30), pdynNpa: 4.5, pdynSource: 'pdyn_npa', bzNt: -7.25, byNt: 2, dstNt: -88, dstKind: 'dst' });
    expect(rs[0].line).toBe(2);
  });

  it('derives Pdyn from density and speed by the batch rule (2.0e-6·n·v², references §3) and keeps sym_h_nt', () => {
    const v = ok(readSeriesText('time,bz_nt,density_cm3,speed_kms,sym_h_nt\n2027-10-29T22:00Z,-3,5,400,-12\n')[0]);
    expectClose(v.pdynNpa, 1.6, 1e-12, '2.0e-6 × 5 × 400² nPa');
    expect([v.pdynSource, v.densityCm3, v.speedKms, v.byNt, v.dstNt, v.dstKind]).toEqual(['density_speed', 5, 400, 0, -12, 'sym_h']);
  });

  it('keeps speed_kms beside pdyn_npa; an empty or filled index cell leaves the index out', () => {
    const rs = readSeriesText('time,pdyn_npa,bz_nt,speed_kms,dst_nt\n2027-10-29T22:00Z,2,-1,520,\n2027-10-29T23:00Z,2,-1,520,99999\n');
    expect([ok(rs[0]).speedKms, ok(rs[0]).dstNt, ok(rs[1]).dstNt]).toEqual([520, undefined, undefined]);
  });

  it('uses the batch messages for skips and errors (by line), and its own for the index', () => {
    const rs = readSeriesText([
      'time,pdyn_npa,bz_nt,dst_nt',
      '2027-10-29T22:00Z,2,9999.9,-5',
      '2027-10-29T23:00Z,2,abc,-5',
      '2027-10-30T00:00Z,2,-1,-5000',
      '2027-10-30T01:00Z,2,-1',
      '2027-10-30T02:00Z,2,-1,-5',
    ].join('\n'), { label: 'storm.csv' });
    expect(rs.map((r) => r.kind)).toEqual(['skipped', 'error', 'error', 'error', 'ok']);
    expect((rs[0] as { reason: string }).reason).toBe('storm.csv line 2: bz_nt is a fill value (9999.9); row skipped');
    expect((rs[1] as { error: string }).error).toBe('storm.csv line 3: bz_nt: expected a number, got "abc"');
    expect((rs[2] as { error: string }).error).toBe('storm.csv line 4: dst_nt: -5000 is outside −3000..3000 nT');
    expect((rs[3] as { error: string }).error).toBe('storm.csv line 5: missing value: 3 fields, the header has 4');
    expect(rs[0].kind === 'skipped' && rs[0].time).toBe('2027-10-29T22:00Z');
  });

  it('header problems are InputErrors naming the column and the expected columns', () => {
    expect(() => readSeriesText('time,bz_nt,dst_nt,sym_h_nt\n')).toThrow(/columns "dst_nt" and "sym_h_nt" are both present/);
    expect(() => readSeriesText('time,bz_nt,kp\n')).toThrow(InputError);
    expect(() => readSeriesText('time,bz_nt,kp\n')).toThrow('series: missing column "pdyn_npa"; unknown column "kp" in the header (line 1); expected columns: time, bz_nt, and pdyn_npa or both density_cm3 and speed_kms; optional by_nt; optional dst_nt or sym_h_nt');
    expect(() => readSeriesText('\n\ntime,pdyn_npa\n')).toThrow('(line 3)');
  });
});

describe('format detection and choice', () => {
  it('detects each format from the first non-blank line', () => {
    expect(detectSeriesFormat('time,bz_nt,pdyn_npa')).toBe('csv');
    expect(detectSeriesFormat(hourlyLine({}))).toBe('hourly');
    expect(detectSeriesFormat(highresLine({}, 49))).toBe('highres');
    const p = new SeriesParser();
    p.push('\n  \n' + highresLine({}).slice(0, 50));
    expect(p.format).toBeNull(); // the first line is not complete yet
    p.push(highresLine({}).slice(50) + '\n');
    expect(p.format).toBe('highres');
  });

  it('fails with a message listing what is allowed', () => {
    expect(() => readSeriesText('\n2027 302 14 1.0 2.0\n')).toThrow('format: cannot tell the series format from line 2 ("2027 302 14 1.0 2.0": 5 blank-separated words, no comma). Expected a CSV header');
    expect(() => readSeriesText('')).toThrow('series: the input is empty');
    expect(() => readSeriesText('a', { format: 'tsv' as never })).toThrow('format: expected one of auto, csv, hourly, highres; got "tsv"');
  });

  it('an explicit format is used as given (a high-resolution line read as hourly is a word-count error)', () => {
    const [r] = readSeriesText(highresLine({}), { format: 'hourly' });
    expect((r as { error: string }).error).toBe('series line 1: 46 words; a hourly line has 55 or 56');
  });

  it('readSeries takes an async iterable of strings or bytes (Node stream or File.stream())', async () => {
    async function* chunks() {
      const t = new TextEncoder().encode('\ufefftime,pdyn_npa,bz_nt\n2027-10-29T22:00Z,2,-1\n');
      for (let i = 0; i < t.length; i += 5) yield t.slice(i, i + 5);
    }
    const out: SeriesRecord[] = [];
    for await (const r of readSeries(chunks())) out.push(r);
    expect(out.map((r) => r.kind)).toEqual(['ok']);
    expect(ok(out[0]).time).toBe('2027-10-29T22:00:00Z');
  });
});
