import { describe, it, expect } from 'vitest';
import { cli, cliJson, spawnCli, csvBody } from './helpers';
import { spawnSync } from 'node:child_process';
import { run } from '../../src/cli/run';
import { readCsv } from '../../src/io/csv';
import { geoJsonProblems } from '../../src/io/geojson';
import { expectClose } from '../helpers';
import { EXIT_OK, EXIT_FAILURE, EXIT_USAGE } from '../../src/cli/exit-codes';

// Source of every expectation here: the CLI contract, references §13 (flag names, JSON keys,
// exit codes 0/2/1, stdout = result only) and RFC 4180 / RFC 7946 for the file formats.
const T = ['--time', '2025-03-20T22:00:00Z'];
const CONDITION_KEYS = ['time', 'pdynNpa', 'bzNt', 'byNt', 'tiltDeg', 'standoffRe', 'internal', 'magnetopause', 'imfEfficiency', 'altKm', 'warnings'];
const FOOT_KEYS = ['hemisphere', 'geoLatDeg', 'geoLonDeg', 'magLatDeg', 'magLonDeg', 'mltHours', 'altKm'];

function expectKeys(o: Record<string, unknown>, keys: string[], what: string) {
  for (const k of keys) expect(o, `${what} lacks "${k}"`).toHaveProperty(k);
}

describe('JSON results carry the fixed keys', () => {
  it('conditions block echoes the flags', async () => {
    const j = await cliJson('field', '--gsm', '5,0,0', ...T, '--internal', 'dipole', '--pdyn', '3', '--bz', '-4', '--by', '1.5', '--tilt-deg', '10', '--alt-km', '200', '--imf-efficiency', '0.2');
    expectKeys(j.conditions, CONDITION_KEYS, 'conditions');
    expect(j.conditions).toMatchObject({ time: '2025-03-20T22:00:00.000Z', pdynNpa: 3, bzNt: -4, byNt: 1.5, internal: 'dipole', magnetopause: true, imfEfficiency: 0.2, altKm: 200 });
    expectClose(j.conditions.tiltDeg, 10, 1e-9, 'tiltDeg echoes --tilt-deg');
    expect(j.conditions.standoffRe).toBeGreaterThan(5);
    expect(Array.isArray(j.conditions.warnings)).toBe(true);
  });

  it('defaults: --time now, pdyn 2, bz 0, by 0, IGRF-14 main field, magnetopause on, alt 110 km', async () => {
    const j = await cliJson('field', '--gsm', '5,0,0');
    expect(j.conditions).toMatchObject({ time: '2025-03-20T12:00:00.000Z', pdynNpa: 2, bzNt: 0, byNt: 0, internal: 'igrf', magnetopause: true, altKm: 110 });
    // Shue et al. (1998) worked value for Dp = 2 nPa, Bz = 0 (references §3): r0 = 10.2519 RE.
    expectClose(j.conditions.standoffRe, 10.2519, 1e-4, 'standoff at the default conditions');
  });

  it('--magnetopause off gives a null standoff', async () => {
    const j = await cliJson('field', '--gsm', '5,0,0', '--magnetopause', 'off');
    expect(j.conditions.magnetopause).toBe(false);
    expect(j.conditions.standoffRe).toBeNull();
  });

  it('field: bGsmNt, bNt, bGeoNt, inside', async () => {
    const j = await cliJson('field', '--geo', '62.5,25.1,110', ...T);
    expectKeys(j, ['bGsmNt', 'bNt', 'bGeoNt', 'inside', 'position'], 'field');
    expect(j.bGsmNt).toHaveLength(3);
    expectClose(Math.hypot(...(j.bGeoNt as number[])), j.bNt, 1e-9 * j.bNt, '|bGeoNt| = bNt (a rotation keeps length)');
    expectClose(j.position.geoLatDeg, 62.5, 1e-9, 'geodetic latitude round trip');
    expectClose(j.position.altKm, 110, 1e-6, 'height round trip');
    expect(j.inside).toBe(true);
  });

  it('field outside the magnetopause warns on stderr and in the block', async () => {
    const r = await cli('field', '--gsm', '30,0,0', ...T);
    expect(r.code).toBe(EXIT_OK);
    const j = JSON.parse(r.out);
    expect(j.inside).toBe(false);
    expect(j.conditions.warnings.join(' ')).toMatch(/outside the magnetopause/);
    expect(r.err).toMatch(/warning: .*outside the magnetopause/);
  });

  it('trace: fieldLine with type, lengthRe, equator, footpoints; points only with --points', async () => {
    const j = await cliJson('trace', '--lat', '62.5', '--lon', '25.1', ...T);
    expectKeys(j.fieldLine, ['type', 'lengthRe', 'equator', 'footpoints'], 'fieldLine');
    expect(j.fieldLine).not.toHaveProperty('points');
    expect(j.fieldLine.type).toBe('closed');
    expectKeys(j.fieldLine.equator, ['rRe', 'bNt', 'gsmRe'], 'equator');
    expect(j.fieldLine.footpoints.map((f: { hemisphere: string }) => f.hemisphere)).toEqual(['north', 'south']);
    // The tracer's stop surface approximates the height above the ellipsoid to < 10 m (src/physics/frames/geodesy.ts).
    for (const f of j.fieldLine.footpoints) { expectKeys(f, FOOT_KEYS, 'footpoint'); expectClose(f.altKm, 110, 0.01, 'footpoint at --alt-km'); }
    const p = await cliJson('trace', '--lat', '62.5', '--lon', '25.1', ...T, '--points');
    expect(p.fieldLine.points.length).toBeGreaterThan(10);
    expect(p.fieldLine.points[0]).toHaveLength(3);
  });

  it('oval: hemispheres → sectors with openClosed / equatorward', async () => {
    const j = await cliJson('oval', ...T, '--mlt-step', '6', '--bz', '-5');
    expect(j.hemispheres.map((h: { hemisphere: string }) => h.hemisphere)).toEqual(['north', 'south']);
    for (const h of j.hemispheres) {
      expect(h.sectors.map((s: { mltHours: number }) => s.mltHours)).toEqual([0, 6, 12, 18]);
      for (const s of h.sectors) {
        expectKeys(s, ['mltHours', 'openClosed', 'equatorward'], 'sector');
        expect(s.openClosed, `openClosed at ${s.mltHours} h`).not.toBeNull();
        expectKeys(s.openClosed, ['magLatDeg', 'geoLatDeg', 'geoLonDeg'], 'openClosed');
      }
    }
  });

  it('sweep: rows with value, mltHours, hemisphere and both latitudes', async () => {
    const j = await cliJson('sweep', '--vary', 'pdyn', '--from', '1', '--to', '4', '--steps', '3', ...T, '--bz', '-5');
    expect(j.rows).toHaveLength(6);
    for (const r of j.rows) expectKeys(r, ['value', 'mltHours', 'hemisphere', 'openClosedMagLatDeg', 'equatorwardMagLatDeg'], 'row');
    expect(j.rows.map((r: { value: number }) => r.value).filter((_: number, i: number) => i % 2 === 0).map((v: number) => +v.toFixed(9))).toEqual([1, 2, 4]);
  });
});

describe('CSV output (RFC 4180, units in the header)', () => {
  const cases: [string, string[], string[]][] = [
    ['field', ['field', '--gsm', '5,1,0'], ['x_gsm_re', 'geo_lat_deg', 'alt_km', 'bz_gsm_nt', 'b_nt', 'inside']],
    ['trace', ['trace', '--lat', '62.5', '--lon', '25.1'], ['role', 'hemisphere', 'geo_lat_deg', 'mag_lat_deg', 'mlt_h', 'alt_km', 'length_re', 'equator_r_re']],
    ['trace --points', ['trace', '--lat', '62.5', '--lon', '25.1', '--points'], ['index', 'x_gsm_re', 'r_re', 'geo_lat_deg', 'alt_km', 'b_nt']],
    ['oval', ['oval', '--mlt-step', '12'], ['hemisphere', 'mlt_h', 'open_closed_mag_lat_deg', 'equatorward_geo_lon_deg']],
    ['sweep', ['sweep', '--vary', 'bz', '--from', '0', '--to', '-4', '--steps', '2'], ['bz_nt', 'mlt_h', 'hemisphere', 'open_closed_mag_lat_deg', 'equatorward_mag_lat_deg']],
  ];
  for (const [what, argv, cols] of cases) {
    it(`${what}: header first, equal widths, CRLF`, async () => {
      const r = await cli(...argv, ...T, '--format', 'csv');
      expect(r.code, r.err).toBe(EXIT_OK);
      expect(r.out.endsWith('\r\n')).toBe(true);
      expect(r.out.startsWith('# program: fieldline-atlas '), 'metadata lines first (references §13)').toBe(true);
      const rows = readCsv(csvBody(r.out));
      for (const c of cols) expect(rows[0]).toContain(c);
      expect(rows.length).toBeGreaterThan(1);
      for (const row of rows) expect(row.length).toBe(rows[0].length);
      for (const h of rows[0]) expect(h).toMatch(/^[a-z_]+$/);
    });
  }
});

describe('GeoJSON output (RFC 7946)', () => {
  it('trace: a line of the sub-point track plus Points, [lon, lat] order', async () => {
    const r = await cli('trace', '--lat', '62.5', '--lon', '25.1', ...T, '--format', 'geojson');
    expect(r.code, r.err).toBe(EXIT_OK);
    const fc = JSON.parse(r.out);
    expect(fc.type).toBe('FeatureCollection');
    expect(geoJsonProblems(fc)).toEqual([]);
    expect(fc.conditions).toBeDefined();
    const kinds = fc.features.map((f: { properties: { kind: string } }) => f.properties.kind);
    expect(kinds).toEqual(['fieldLine', 'site', 'footpoint', 'footpoint']);
    expect(['LineString', 'MultiLineString']).toContain(fc.features[0].geometry.type);
    const site = fc.features[1].geometry.coordinates;
    expectClose(site[0], 25.1, 1e-9, 'site longitude first');
    expectClose(site[1], 62.5, 1e-9, 'site latitude second');
  });

  it('oval: one line per boundary per hemisphere, closed around the pole', async () => {
    const r = await cli('oval', ...T, '--mlt-step', '3', '--bz', '-5', '--format', 'geojson');
    expect(r.code, r.err).toBe(EXIT_OK);
    const fc = JSON.parse(r.out);
    expect(geoJsonProblems(fc)).toEqual([]);
    const keys = fc.features.map((f: { properties: { hemisphere: string; boundary: string } }) => `${f.properties.hemisphere}/${f.properties.boundary}`);
    expect(keys).toEqual(['north/openClosed', 'north/equatorward', 'south/openClosed', 'south/equatorward']);
    for (const f of fc.features) {
      const lines: number[][][] = f.geometry.type === 'LineString' ? [f.geometry.coordinates] : f.geometry.coordinates;
      expect(f.properties.sectorsFound, `${f.properties.hemisphere} ${f.properties.boundary}: all 8 sectors`).toBe(8);
      const flat = lines.flat();
      expect(flat[flat.length - 1], 'ring closed: last position = first').toEqual(flat[0]);
      // Parts meet only at the antimeridian cut (RFC 7946 §3.1.9).
      for (let i = 1; i < lines.length; i++) {
        const end = lines[i - 1][lines[i - 1].length - 1], start = lines[i][0];
        expect(Math.abs(end[0]), 'cut at ±180').toBe(180);
        expect(start[0]).toBe(-end[0]);
        expect(start[1]).toBe(end[1]);
      }
      const north = f.properties.hemisphere === 'north';
      for (const p of flat) expect(north ? p[1] > 40 : p[1] < -40, `latitude ${p[1]} in the ${f.properties.hemisphere}`).toBe(true);
    }
  });

  it('field: one Point', async () => {
    const fc = JSON.parse((await cli('field', '--geo', '-45,170,0', ...T, '--format', 'geojson')).out);
    expect(geoJsonProblems(fc)).toEqual([]);
    expect(fc.features[0].geometry.coordinates.slice(0, 2).map((v: number) => +v.toFixed(9))).toEqual([170, -45]);
  });
});

describe('bad arguments exit 2 with a message naming the flag', () => {
  const cases: [string, string[], RegExp][] = [
    ['unknown flag', ['field', '--gsm', '5,0,0', '--colour', 'red'], /--colour: unknown flag for field; valid flags: --gsm, --geo, --time/],
    ['bad number', ['field', '--gsm', '5,0,0', '--pdyn', 'lots'], /--pdyn: expected a number in 0.01..10000 nPa, got "lots"/],
    ['out of range', ['field', '--gsm', '5,0,0', '--imf-efficiency', '1.5'], /--imf-efficiency: expected a number in 0..1, got 1.5/],
    ['wrong enum', ['field', '--gsm', '5,0,0', '--internal', 'foo'], /--internal: expected igrf or dipole, got "foo"/],
    ['wrong on/off', ['oval', '--magnetopause', 'yes'], /--magnetopause: expected on or off, got "yes"/],
    ['missing required', ['trace', '--lat', '60'], /--lon: is required for trace/],
    ['missing --vary', ['sweep', '--from', '1', '--to', '2', '--steps', '2'], /--vary: is required for sweep/],
    ['field needs one point', ['field'], /give exactly one of --gsm <x,y,z> or --geo <lat,lon,altKm>/],
    ['bad time', ['field', '--gsm', '5,0,0', '--time', 'yesterday'], /--time: expected an ISO 8601 UTC time/],
    ['time outside IGRF-14', ['field', '--gsm', '5,0,0', '--time', '1850-01-01T00:00:00Z'], /--time: IGRF-14 covers 1900.0/],
    ['MLT step must divide 24', ['oval', '--mlt-step', '5'], /--mlt-step: 5 h must divide 24 h evenly/],
    ['format not offered', ['sweep', '--vary', 'bz', '--from', '0', '--to', '1', '--steps', '2', '--format', 'geojson'], /--format: expected json or csv, got "geojson"/],
    ['pdyn sweep below zero', ['sweep', '--vary', 'pdyn', '--from', '-1', '--to', '2', '--steps', '2'], /--from: with --vary pdyn expected a dynamic pressure in 0.01..10000 nPa, got -1/],
    ['integer steps', ['sweep', '--vary', 'bz', '--from', '0', '--to', '1', '--steps', '2.5'], /--steps: expected a whole number in 1..1000/],
    ['unknown command', ['orbit'], /unknown command "orbit"; commands: field, trace, oval, sweep, timeline, batch/],
    ['no command', [], /a command is required/],
  ];
  for (const [what, argv, re] of cases) {
    it(what, async () => {
      const r = await cli(...argv);
      expect(r.code, r.err).toBe(EXIT_USAGE);
      expect(r.err).toMatch(re);
      expect(r.out).toBe('');
    });
  }

  it('a point too close to the centre is refused as an argument', async () => {
    const r = await cli('field', '--gsm', '0.001,0,0');
    expect(r.code).toBe(EXIT_USAGE);
    expect(r.err).toMatch(/--gsm: expected a point at least 0.01 RE/);
  });
});

describe('a failure that is not an argument error exits 1', () => {
  it('an engine failure (here: an unusable clock for the default --time) gives exit 1 and "computation failed"', async () => {
    let out = '';
    let err = '';
    const code = await run(['field', '--gsm', '5,0,0'], { stdout: (t) => { out += t; }, stderr: (t) => { err += t; }, now: () => new Date(Number.NaN) });
    expect(code).toBe(EXIT_FAILURE);
    expect(err).toMatch(/computation failed/);
    expect(out).toBe('');
  });
});

describe('--help', () => {
  for (const argv of [['--help'], ['help'], ['help', 'oval'], ['help', 'batch'], ['field', '--help'], ['trace', '--help'], ['oval', '--help'], ['sweep', '--help'], ['trace', '--lat', 'x', '-h']]) {
    it(argv.join(' '), async () => {
      const r = await cli(...argv);
      expect(r.code).toBe(EXIT_OK);
      expect(r.out).toMatch(/Usage: npm run --silent cli -- /);
      expect(r.err).toBe('');
    });
  }
  it('command help lists its own and the common flags', async () => {
    const h = (await cli('sweep', '--help')).out;
    for (const f of ['--vary', '--from', '--to', '--steps', '--mlt', '--time', '--pdyn', '--bz', '--by', '--tilt-deg', '--internal', '--magnetopause', '--imf-efficiency', '--alt-km', '--format']) expect(h).toContain(f);
  });
});

describe('as a child process (npx tsx src/cli/main.ts)', () => {
  it('stdout carries only the JSON result, exit 0', () => {
    const r = spawnCli('field', '--gsm', '6.6,0,0', ...T);
    expect(r.code, r.err).toBe(EXIT_OK);
    const j = JSON.parse(r.out);
    expect(j.bNt).toBeGreaterThan(0);
  });
  it('bad flag: exit 2, message on stderr, nothing on stdout', () => {
    const r = spawnCli('oval', '--hemisphere', 'east');
    expect(r.code).toBe(EXIT_USAGE);
    expect(r.err).toMatch(/--hemisphere: expected north, south or both, got "east"/);
    expect(r.out).toBe('');
  });
  it('through the package script: npm run --silent cli -- --version', () => {
    const p = spawnSync('npm', ['run', '--silent', 'cli', '--', '--version'], { encoding: 'utf8', cwd: new URL('../..', import.meta.url).pathname });
    expect(p.status, p.stderr).toBe(EXIT_OK);
    expect(p.stdout.trim()).toMatch(/^\d+\.\d+\.\d+$/);
  });
  it('--help exits 0', () => {
    const r = spawnCli('--help');
    expect(r.code).toBe(EXIT_OK);
    expect(r.out).toMatch(/Commands:/);
  });
});
