import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { APP_LIMITS, APP_RANGES, parseDecimal, pressureFromPlasma, readNumber, readTime, readUtcField, siteLimitText, utcFieldText } from '../../src/io/app-inputs';
import { parseSitesCsv } from '../../src/io/app-csv';
import { INPUT_RANGES } from '../../src/cli/common';
import { parseNumberText } from '../../src/cli/args';

describe('the app validation path shares the command line rules', () => {
  it('has the CLI ranges for every input both read (INPUT_RANGES of src/cli/common.ts)', () => {
    const pairs: [keyof typeof INPUT_RANGES, keyof typeof APP_RANGES][] = [
      ['latDeg', 'latDeg'], ['lonDeg', 'lonDeg'], ['pdynNpa', 'pdynNpa'], ['imfNt', 'imfNt'], ['altKm', 'altKm'], ['sourceRe', 'sourceRe'], ['dstNt', 'dstNt'], ['speedKms', 'speedKms'],
    ];
    for (const [cli, app] of pairs) {
      const { unit: _unit, ...bounds } = APP_RANGES[app];
      expect(bounds, cli).toEqual({ ...INPUT_RANGES[cli] });
    }
  });

  it('reads every plain decimal the CLI reads, to the same value (fast-check)', () => {
    fc.assert(fc.property(fc.double({ noNaN: true, noDefaultInfinity: true, min: -1e6, max: 1e6 }), (x) => {
      const t = x.toFixed(6);
      expect(parseDecimal(t)).toBe(parseNumberText(t));
    }), { seed: 11, numRuns: 300 });
  });

  it('refuses hex, exponents, Infinity, NaN and empty text with the CLI wording "expected …, got …"', () => {
    for (const t of ['0x3C', '6e1', 'Infinity', 'NaN', '', ' ', '1,5', '--1', '1.2.3']) expect(parseDecimal(t), t).toBeNull();
    expect(readNumber('lat_deg', '0x3C', APP_RANGES.latDeg)).toEqual({ ok: false, message: 'lat_deg: expected a decimal number in -90..90 deg, got "0x3C"' });
    expect(readNumber('p', '0', APP_RANGES.pdynNpa)).toEqual({ ok: false, message: 'p: expected a decimal number in 0.01..10000 nPa, got "0"' });
    expect(readNumber('p', ' 12.5 ', APP_RANGES.pdynNpa)).toEqual({ ok: true, value: 12.5 });
  });

  it('reads times as the CLI does: no zone = UTC (and said), impossible dates refused', () => {
    expect(readTime('t', '2025-03-20T22:00')).toEqual({ ok: true, value: { iso: '2025-03-20T22:00:00Z', noZone: true } });
    expect(readTime('t', '2025-03-20T22:00:00Z')).toEqual({ ok: true, value: { iso: '2025-03-20T22:00:00Z', noZone: false } });
    expect(readTime('t', '2024-02-30').ok).toBe(false);
    expect(readTime('t', '2023-02-29T00:00Z').ok).toBe(false);
    expect(readTime('t', '2024-02-29T00:00Z').ok).toBe(true);
  });

  it('the time field reads a 24-hour UTC time "YYYY-MM-DD HH:MM UTC" and refuses a 12-hour clock, another zone or an impossible date', () => {
    expect(readUtcField('Time (UTC)', '2025-03-20 22:00 UTC')).toEqual({ ok: true, value: '2025-03-20T22:00:00Z' });
    expect(readUtcField('Time (UTC)', ' 2025-03-20 22:00 ')).toEqual({ ok: true, value: '2025-03-20T22:00:00Z' });
    expect(readUtcField('Time (UTC)', '2025-03-20T23:30')).toEqual({ ok: true, value: '2025-03-20T23:30:00Z' });
    expect(readUtcField('Time (UTC)', '2025-03-20 23:30:15Z')).toEqual({ ok: true, value: '2025-03-20T23:30:15Z' });
    expect(readUtcField('Time (UTC)', '2025-03-20 10:00 PM')).toEqual({ ok: false, message: 'Time (UTC): expected a 24-hour UTC time as YYYY-MM-DD HH:MM, such as 2025-03-20 22:00 UTC, got "2025-03-20 10:00 PM"' });
    expect(readUtcField('Time (UTC)', '2025-03-20 22:00+02:00').ok).toBe(false);
    expect(readUtcField('Time (UTC)', '2025-03-20 24:00')).toEqual({ ok: false, message: 'Time (UTC): expected hours 00–23 and minutes 00–59 (24-hour clock), got "2025-03-20 24:00"' });
    expect(readUtcField('Time (UTC)', '2025-02-30 01:00')).toEqual({ ok: false, message: 'Time (UTC): expected a date that exists, as YYYY-MM-DD HH:MM UTC, got "2025-02-30 01:00"' });
    expect(utcFieldText('2025-03-20T07:05:00Z')).toBe('2025-03-20 07:05 UTC');
    // Round trip: what the field shows reads back to the same instant.
    expect(readUtcField('t', utcFieldText('2031-12-31T23:59:00Z'))).toEqual({ ok: true, value: '2031-12-31T23:59:00Z' });
  });

  it('"Use … nPa" from density and speed gives exactly 2.0e-6·n·v² (references §3), never a clamped value', () => {
    // 500 cm⁻³ at 3000 km/s: 2.0e-6 × 500 × 3000² = 9000 nPa (hand arithmetic), inside the CLI range > 0 … 10000 nPa.
    expect(pressureFromPlasma(500, 3000)).toEqual({ ok: true, value: 9000 });
    expect(pressureFromPlasma(10, 400)).toEqual({ ok: true, value: 3.2 }); // 2.0e-6 × 10 × 400² = 3.2 nPa
    const over = pressureFromPlasma(600, 3000);
    expect(over.ok).toBe(false);
  });
});

describe('site CSV import', () => {
  it('reads name, lat_deg, lon_deg in any order and lists bad lines with the CLI wording', () => {
    const { sites, problems, rows } = parseSitesCsv('lon_deg,name,lat_deg\r\n24.5,"Fell, upper",66.1\n200,East,10\nx,Bad,1\n5,Polar,95\n');
    expect(sites).toEqual([{ name: 'Fell, upper', latDeg: 66.1, lonDeg: 24.5 }, { name: 'East', latDeg: 10, lonDeg: -160 }]);
    expect(rows).toBe(4);
    expect(problems).toEqual(['line 4: lon_deg: expected a decimal number in -360..360 deg, got "x"', 'line 5: lat_deg: expected a decimal number in -90..90 deg, got "95"']);
  });

  it('keeps every good row when one row is short (one short row must not discard the file)', () => {
    const { sites, problems } = parseSitesCsv('name,lat_deg,lon_deg\nA,60,10\nB,61\nC,62,12\n');
    expect(sites.map((s) => s.name)).toEqual(['A', 'C']);
    expect(problems).toEqual(['line 3: 2 fields, but the header has 3']);
  });

  it('refuses hex (0x3C) and exponent (6e1) coordinates, naming the line', () => {
    const { sites, problems } = parseSitesCsv('name,lat_deg,lon_deg\nHex,0x3C,10\nExp,6e1,10\nOk,60,10\n');
    expect(sites.map((s) => s.name)).toEqual(['Ok']);
    expect(problems[0]).toBe('line 2: lat_deg: expected a decimal number in -90..90 deg, got "0x3C"');
    expect(problems[1]).toBe('line 3: lat_deg: expected a decimal number in -90..90 deg, got "6e1"');
  });

  it('goes on after a malformed quote and skips the export metadata lines', () => {
    const { sites, problems } = parseSitesCsv('# time: 2025-03-20T22:00:00Z\r\n# warnings: ["a, \\"b\\""]\r\nname,lat_deg,lon_deg\r\n"Bad"x,60,10\r\nGood,61,11\r\n');
    expect(sites).toEqual([{ name: 'Good', latDeg: 61, lonDeg: 11 }]);
    expect(problems.length).toBe(1);
    expect(problems[0]).toMatch(/line 4/);
  });

  it('refuses names longer than the limit, and a file without coordinate columns', () => {
    const r = parseSitesCsv(`name,lat_deg,lon_deg\n${'n'.repeat(81)},1,2\n`);
    expect(r.sites).toEqual([]);
    expect(r.problems[0]).toMatch(/at most 80 characters/);
    expect(parseSitesCsv('a,b\n1,2\n').problems[0]).toMatch(/lat_deg/);
  });

  it('states the limit: 300 rows → the first 200 imported, 100 not imported', () => {
    expect(siteLimitText(300, APP_LIMITS.maxSites)).toBe('300 sites: the first 200 imported, 100 not imported: the app holds at most 200 sites — use the command line\'s batch for more');
  });
});
