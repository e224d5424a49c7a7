/**
 * The batch command end to end, in-process (small files in os.tmpdir()):
 * the bad-row contract (references §13), exit codes, header checks, CSV
 * injection escaping, --workers 1 ≡ --workers 2, shards, and agreement with
 * the `trace` command and the engine's boundary search (same engine, so equal).
 */
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { mkdtempSync, writeFileSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { runBatch } from '../../src/cli/batch/index';
import { run } from '../../src/cli/run';
import { readCsv, csvText } from '../../src/io/csv';
import { prepareModel } from '../../src/physics/field/model';
import { makeTracer, sectorBoundaries } from '../../src/physics/mapping';
import type { FieldConditions } from '../../src/physics/field/conditions';
import { geoJsonProblems } from '../../src/io/geojson';
import { expectClose } from '../helpers';
import { EXIT_OK, EXIT_USAGE, EXIT_ROWS_FAILED } from '../../src/cli/exit-codes';

let dir = '';
const file = (name: string, text: string): string => { const p = join(dir, name); writeFileSync(p, text); return p; };

async function batch(args: string[]): Promise<{ code: number; out: string; err: string }> {
  let out = '', err = '';
  const code = await runBatch(args, { stdout: (t) => { out += t; }, stderr: (t) => { err += t; }, now: () => new Date('2025-03-20T22:00:00Z') });
  return { code, out, err };
}

/** JSON Lines output → [metadata, ...rows]. */
function jsonl(out: string): Record<string, unknown>[] {
  return out.trim().split('\n').map((l) => JSON.parse(l) as Record<string, unknown>);
}

/** CSV output without the # lines → header + records. */
function csvRows(out: string): string[][] {
  return readCsv(out.split('\r\n').filter((l) => !l.startsWith('#')).join('\r\n'));
}

let sites = '', series = '';

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'batch-test-'));
  sites = file('sites.csv', 'name,lat_deg,lon_deg,height_km\nAlder Knoll,66.2,18.4,0.2\nBrisk Cove,-63.0,145.0,\nCinder Ley,55.5,-100.25,0.1\n');
  series = file('series.csv', [
    'time,pdyn_npa,bz_nt,by_nt',
    '2025-03-20T20:00:00Z,2.0,-3.0,1.5',
    '2025-03-20T21:00:00Z,4.5,-8.0,-2.0',
    '2025-03-20T22:00:00Z,1.2,2.5,0.0',
    '2025-03-20T23:00:00Z,3.0,-5.0,4.0',
    '2025-03-21T00:00:00Z,2.6,-1.0,-1.0',
  ].join('\n') + '\n');
});

afterAll(() => { rmSync(dir, { recursive: true, force: true }); });

describe('batch: bad rows (references §13, bad input)', () => {
  it('gives each malformed row an error naming its line and problem, skips fill values and empty cells, and goes on', async () => {
    const bad = file('bad.csv', [
      'time,pdyn_npa,density_cm3,speed_kms,bz_nt,by_nt', // line 1
      '2025-03-20T20:00:00Z,2.0,,,-3.0,1.0', // 2 good
      '2025-03-20T21:00:00Z,2.0,,,-3.0', // 3 missing value
      '2025-03-20T22:00:00Z,2.0,,,abc,1.0', // 4 non-numeric
      'yesterday,2.0,,,-3.0,1.0', // 5 unparsable time
      '2025-02-30T00:00:00Z,2.0,,,-3.0,1.0', // 6 impossible date
      '1899-12-31T00:00:00Z,2.0,,,-3.0,1.0', // 7 before IGRF
      '2031-01-01T00:00:00Z,2.0,,,-3.0,1.0', // 8 after IGRF
      '2025-03-20T23:00:00Z,0,,,-3.0,1.0', // 9 zero pressure
      '2025-03-20T23:00:00Z,-1.5,,,-3.0,1.0', // 10 negative pressure
      '2025-03-21T00:00:00Z,2.0,,,9999.99,1.0', // 11 fill
      '2025-03-21T01:00:00Z,,5.0,99999.9,-3.0,1.0', // 12 fill in speed (pdyn empty)
      '2025-03-21T02:00:00Z,2.0,,,-3.0,', // 13 empty cell
      '2025-03-21T03:00:00Z,,5.0,450,-3.0,1.0', // 14 good, pressure from density and speed
    ].join('\n') + '\n');
    const badSites = file('badsites.csv', 'name,lat_deg,lon_deg\nGood Hill,64,20\nFar Pole,95,10\nNo Lat,,10\n');
    const r = await batch(['--sites', badSites, '--conditions', bad, '--format', 'json', '--workers', '1']);
    expect(r.code, r.err).toBe(EXIT_ROWS_FAILED);
    const [meta, ...rows] = jsonl(r.out);
    expect(meta.metadata).toBeTruthy();
    expect(rows.length).toBe(13 * 3);
    const at = (cl: number, sl: number) => rows.find((x) => x.conditions_line === cl && x.sites_line === sl)!;
    const expectError = (cl: number, re: RegExp) => expect(String(at(cl, 2).error), `line ${cl}`).toMatch(re);
    expectError(3, /^conditions line 3: missing value/);
    expectError(4, /^conditions line 4: bz_nt: expected a number, got "abc"/);
    expectError(5, /^conditions line 5: time: expected an ISO 8601/);
    expectError(6, /^conditions line 6: time: /);
    expectError(7, /^conditions line 7: time: IGRF-14 covers 1900\.0–2030\.0/);
    expectError(8, /^conditions line 8: time: IGRF-14 covers/);
    expectError(9, /^conditions line 9: pdyn_npa: expected a pressure > 0/);
    expectError(10, /^conditions line 10: pdyn_npa: expected a pressure > 0/);
    expect(at(11, 2).skipped).toMatch(/^conditions line 11: bz_nt is a fill value \(9999\.99\); row skipped/);
    expect(at(12, 2).skipped).toMatch(/^conditions line 12: pdyn_npa is empty and speed_kms is a fill value \(99999\.9\)/);
    expect(at(13, 2).skipped).toMatch(/^conditions line 13: by_nt is empty/);
    for (const cl of [2, 14]) {
      expect(at(cl, 2).error, `line ${cl}`).toBeNull();
      expect(at(cl, 2).line_type, `line ${cl}`).toBe('closed');
      expect(at(cl, 3).error).toMatch(/^sites line 3: lat_deg: 95 is outside −90\.\.90/);
      expect(at(cl, 4).skipped).toMatch(/^sites line 4: lat_deg is empty/);
    }
    // density 5 cm⁻³, speed 450 km/s: 2.0e-6·n·v² (references §3) = 2.025 nPa.
    expectClose(at(14, 2).pdyn_npa as number, 2.0e-6 * 5 * 450 * 450, 1e-12, 'pdyn from density and speed');
    // A bad row keeps its time so the table still lines up with the series (normalised when readable).
    expect(at(4, 2).time).toBe('2025-03-20T22:00:00.000Z');
    expect(at(5, 2).time).toBe('yesterday');
    // Summary on stderr: counts, and the problems named.
    expect(r.err).toMatch(/39 rows \(3 sites × 13 conditions\).*: 2 computed, 11 skipped, 26 failed/);
    expect(r.err).toContain('conditions line 3: missing value');
  });

  it('exits 0 when rows are only skipped, never failed', async () => {
    const s = file('skiponly.csv', 'time,pdyn_npa,bz_nt\n2025-03-20T20:00:00Z,2,-1\n2025-03-20T21:00:00Z,99.99,-1\n');
    const r = await batch(['--sites', sites, '--conditions', s, '--workers', '1']);
    expect(r.code, r.err).toBe(EXIT_OK);
    expect(r.err).toMatch(/3 computed, 3 skipped, 0 failed/);
  });

  it('exits 2 on a wrong or missing header column, listing the expected columns, and writes no rows', async () => {
    const noBz = file('nobz.csv', 'time,pdyn_npa,by_nt\n2025-03-20T20:00:00Z,2,1\n');
    let r = await batch(['--sites', sites, '--conditions', noBz]);
    expect(r.code).toBe(EXIT_USAGE);
    expect(r.err).toMatch(/--conditions: missing column "bz_nt".*expected columns: time, bz_nt, and pdyn_npa or both density_cm3 and speed_kms; optional by_nt/);
    expect(r.out).toBe('');
    const typo = file('typo.csv', 'name,lat,lon_deg\nX,1,2\n');
    r = await batch(['--sites', typo, '--conditions', series]);
    expect(r.code).toBe(EXIT_USAGE);
    expect(r.err).toMatch(/--sites: missing column "lat_deg"; unknown column "lat".*expected columns: name, lat_deg, lon_deg, optional height_km/);
    const halfPlasma = file('half.csv', 'time,density_cm3,bz_nt\n2025-03-20T20:00:00Z,5,1\n');
    r = await batch(['--sites', sites, '--conditions', halfPlasma]);
    expect(r.code).toBe(EXIT_USAGE);
    expect(r.err).toMatch(/missing column "speed_kms"/);
    r = await batch(['--sites', join(dir, 'absent.csv')]);
    expect(r.code).toBe(EXIT_USAGE);
    expect(r.err).toMatch(/--sites: cannot read/);
    r = await batch(['--sites', sites, '--conditions', series, '--bz', '-5']);
    expect(r.code).toBe(EXIT_USAGE);
    expect(r.err).toMatch(/--bz: is given by the --conditions file/);
    r = await batch(['--sites', sites, '--shard', '3/2']);
    expect(r.code).toBe(EXIT_USAGE);
    expect(r.err).toMatch(/--shard: expected k\/n with 1 ≤ k ≤ n/);
  });

  it('escapes text cells beginning with = + - @ in CSV output (formula injection) and reads them back', async () => {
    const evil = file('evil.csv', 'name,lat_deg,lon_deg\n=HYPERLINK(1),65,20\n+plus,65,21\n-minus,65,22\n@at,65,23\n');
    const r = await batch(['--sites', evil, '--workers', '1', '--time', '2025-03-20T22:00:00Z']);
    expect(r.code, r.err).toBe(EXIT_OK);
    const [header, ...rows] = csvRows(r.out);
    const j = header.indexOf('site');
    expect(rows.map((x) => x[j])).toEqual(["'=HYPERLINK(1)", "'+plus", "'-minus", "'@at"]);
    expect(rows.map((x) => csvText(x[j]))).toEqual(['=HYPERLINK(1)', '+plus', '-minus', '@at']);
    // Numbers are not text: a negative number stays numeric.
    expect(rows[0][header.indexOf('conj_geo_lat_deg')]).toMatch(/^-\d/);
  });
});

describe('batch: order, workers and shards (references §13, scale)', () => {
  it('writes the same bytes with --workers 1 (this thread) and --workers 2 (thread pool)', async () => {
    const a = await batch(['--sites', sites, '--conditions', series, '--workers', '1']);
    const b = await batch(['--sites', sites, '--conditions', series, '--workers', '2']);
    expect(a.code, a.err).toBe(EXIT_OK);
    expect(b.code, b.err).toBe(EXIT_OK);
    expect(b.out.length).toBeGreaterThan(1000);
    expect(b.out === a.out).toBe(true);
    // Input order: conditions outer, sites inner.
    const [h, ...rows] = csvRows(a.out);
    const ci = h.indexOf('conditions_line'), si = h.indexOf('sites_line');
    expect(rows.map((r) => `${r[ci]}/${r[si]}`)).toEqual([2, 3, 4, 5, 6].flatMap((c) => [2, 3, 4].map((s) => `${c}/${s}`)));
  });

  it('splits the conditions into shards whose rows together are exactly the full run, and whose files concatenate', async () => {
    const full = await batch(['--sites', sites, '--conditions', series, '--workers', '1']);
    const parts: string[] = [];
    for (let k = 1; k <= 3; k++) {
      const r = await batch(['--sites', sites, '--conditions', series, '--workers', '1', '--shard', `${k}/3`]);
      expect(r.code, r.err).toBe(EXIT_OK);
      parts.push(r.out);
    }
    const [header, ...fullRows] = csvRows(full.out);
    const joined = csvRows(parts.join(''));
    expect(joined[0]).toEqual(header); // only shard 1 writes the header
    const ci = header.indexOf('conditions_line');
    expect(csvRows(parts[1]).map((r) => r[ci])).toEqual(['3', '3', '3', '6', '6', '6']); // every 3rd condition from the 2nd
    const key = (r: string[]) => r.join(',');
    expect(joined.slice(1).map(key).sort()).toEqual(fullRows.map(key).sort());
  });
});

describe('batch: agreement with trace and the boundary search (same engine)', () => {
  for (const extra of [[], ['--tail', 'off', '--imf-efficiency', '0.3', '--internal', 'igrf']]) {
    it(`a row equals \`trace\` for the same site and conditions, and the engine boundaries at the row's MLT (${extra.join(' ') || 'default model'})`, async () => {
      const one = file('one-site.csv', 'name,lat_deg,lon_deg,height_km\nAlder Knoll,66.2,18.4,0.2\n');
      const hour = file('one-hour.csv', 'time,pdyn_npa,bz_nt,by_nt\n2025-03-20T21:00:00Z,4.5,-8.0,-2.0\n');
      const r = await batch(['--sites', one, '--conditions', hour, '--workers', '1', '--format', 'json', '--conjugate-alt-km', '0', ...extra]);
      expect(r.code, r.err).toBe(EXIT_OK);
      const row = jsonl(r.out)[1];
      const common = ['--time', '2025-03-20T21:00:00Z', '--pdyn', '4.5', '--bz', '-8', '--by', '-2', '--lat', '66.2', '--lon', '18.4', '--height-km', '0.2', ...extra];
      const traceJson = async (altKm: string) => {
        let out = '';
        const code = await run(['trace', ...common, '--alt-km', altKm], { stdout: (t) => { out += t; }, stderr: () => {}, now: () => new Date() });
        expect(code).toBe(EXIT_OK);
        return JSON.parse(out) as { conditions: FieldConditions; conjugate: Record<string, number>; siteFootpoint: Record<string, number>; fieldLine: { type: string; equator: { rRe: number } } };
      };
      const ground = await traceJson('0');
      const at110 = await traceJson('110');
      expect(row.line_type).toBe(ground.fieldLine.type);
      expectClose(row.conj_geo_lat_deg as number, ground.conjugate.geoLatDeg, 1e-9, 'conjugate latitude vs trace --alt-km 0');
      expectClose(row.conj_geo_lon_deg as number, ground.conjugate.geoLonDeg, 1e-9, 'conjugate longitude vs trace --alt-km 0');
      expectClose(row.conj_mlt_h as number, ground.conjugate.mltHours, 1e-9, 'conjugate MLT vs trace');
      expectClose(row.equator_r_re as number, ground.fieldLine.equator.rRe, 1e-9, 'equatorial distance vs trace');
      expectClose(row.foot_geo_lat_deg as number, at110.siteFootpoint.geoLatDeg, 1e-9, 'site-side footpoint at 110 km vs trace --alt-km 110');
      expectClose(row.foot_geo_lon_deg as number, at110.siteFootpoint.geoLonDeg, 1e-9, 'site-side footpoint longitude vs trace');
      expectClose(row.mlt_h as number, at110.siteFootpoint.mltHours, 1e-9, 'footpoint MLT vs trace');
      // Boundaries: the engine's sector search at the row's MLT in the site's hemisphere, for trace's conditions.
      const c = ground.conditions;
      const m = prepareModel({ time: '2025-03-20T21:00:00Z', pdynNpa: 4.5, bzNt: -8, byNt: -2, internal: c.internal, imfEfficiency: c.imfEfficiency, tail: c.tail, magnetopause: c.magnetopause });
      // One row without an index: the integration starts from the steady state, which is the model's own estimate (references §10).
      expect(row.dst_source).toBe('integrated');
      expectClose(row.dst_star_nt as number, m.storm.dstStarNt, 1e-9, 'Dst* of the first row vs the steady-state estimate');
      expect(row.source_re, 'the source distance follows the conditions').toBe(m.sourceRe);
      const b = sectorBoundaries(m, makeTracer(m, { altKm: 110, ellipsoid: true }), 'north', row.mlt_h as number, { sourceRe: row.source_re as number });
      expect(b.openClosed && b.equatorward, 'both boundaries found').toBeTruthy();
      expectClose(row.open_closed_mag_lat_deg as number, b.openClosed!.magLatDeg, 1e-12, 'open–closed boundary vs sectorBoundaries');
      expectClose(row.equatorward_mag_lat_deg as number, b.equatorward!.magLatDeg, 1e-12, 'equatorward edge vs sectorBoundaries');
    });
  }

  it('writes valid GeoJSON: one Point per row at the conjugate point (RFC 7946), metadata as a foreign member', async () => {
    const r = await batch(['--sites', sites, '--conditions', series, '--workers', '2', '--format', 'geojson', '--shard', '1/2']);
    expect(r.code, r.err).toBe(EXIT_OK);
    const doc = JSON.parse(r.out) as { features: { geometry: { coordinates: number[] } | null; properties: Record<string, unknown> }[]; metadata: Record<string, unknown> };
    expect(geoJsonProblems(doc)).toEqual([]);
    expect(doc.features.length).toBe(9);
    expect(doc.metadata.shard).toBe('1/2');
    const f = doc.features.find((x) => x.geometry)!;
    expect(f.geometry!.coordinates.slice(0, 2)).toEqual([f.properties.conj_geo_lon_deg, f.properties.conj_geo_lat_deg]);
  });

  it('with --out writes the file; without --conditions the flags give one condition', async () => {
    const out = join(dir, 'one.csv');
    const r = await batch(['--sites', sites, '--out', out, '--time', '2025-03-20T22:00:00Z', '--pdyn', '3', '--bz', '-4']);
    expect(r.code, r.err).toBe(EXIT_OK);
    expect(r.out).toBe('');
    const text = readFileSync(out, 'utf8');
    expect(text).toContain('# conditions: flags');
    const [h, ...rows] = csvRows(text);
    expect(rows.length).toBe(3);
    expect(rows[0][h.indexOf('pdyn_npa')]).toBe('3');
    expect(rows[0][h.indexOf('conditions_line')]).toBe('');
  });
});
