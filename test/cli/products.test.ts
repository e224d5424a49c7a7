import { describe, it, expect, afterAll } from 'vitest';
import { cli, cliJson, csvBody, csvMeta, scratchDir } from './helpers';
import { readCsv } from '../../src/io/csv';
import { prepareModel } from '../../src/physics/field/model';
import { cgmPair, cgmOf } from '../../src/physics/mapping';
import { dstFromCorrected, integrateDstStar } from '../../src/physics/field/storm-index';
import { EXIT_OK, EXIT_USAGE, EXIT_ROWS_FAILED } from '../../src/cli/exit-codes';
import { expectClose } from '../helpers';

// Sources: the CLI contract (references §13: metadata, columns, exit codes, one conjugate-altitude rule);
// CGM by tracing (references §6) and the dipole identity cos²Λ = r/R (references §1, derived).
const T = ['--time', '2025-03-20T22:00:00Z'];
const COND = { time: '2025-03-20T22:00:00Z', pdynNpa: 4, bzNt: -8, byNt: 0, dstNt: -40 };
const FLAGS = [...T, '--pdyn', '4', '--bz', '-8', '--by', '0', '--dst', '-40'];
const scratch = scratchDir('cli-products-');
afterAll(() => scratch.remove());

function table(text: string): Record<string, string>[] {
  const [head, ...rows] = readCsv(csvBody(text));
  return rows.map((r) => Object.fromEntries(head.map((h, i) => [h, r[i]])));
}

describe('corrected geomagnetic coordinates through trace (references §6)', () => {
  it('trace gives the same CGM as the library helper for the site, its footpoint and its conjugate', async () => {
    const j = await cliJson('trace', '--lat', '62.5', '--lon', '-15', ...FLAGS);
    const model = prepareModel({ ...COND, internal: 'igrf' });
    const site = cgmPair(model, 62.5, -15, 0).atAlt;
    if (!site.defined) throw new Error('site CGM undefined');
    expectClose(j.site.cgm.latDeg, site.latDeg, 1e-9, 'site CGM latitude, trace vs cgmPair');
    expectClose(j.site.cgm.lonDeg, site.lonDeg, 1e-9, 'site CGM longitude');
    expectClose(j.site.cgm.mltCgmHours, site.mltH, 1e-9, 'site MLT (CGM)');
    for (const fp of [j.siteFootpoint, j.conjugate]) {
      const p = cgmPair(model, fp.geoLatDeg, fp.geoLonDeg, fp.altKm);
      if (!p.atAlt.defined || !p.ground.defined) throw new Error('footpoint CGM undefined');
      expectClose(fp.cgm.latDeg, p.atAlt.latDeg, 1e-9, `${fp.hemisphere} footpoint CGM latitude at ${fp.altKm} km`);
      expectClose(fp.groundCgm.latDeg, p.ground.latDeg, 1e-9, `${fp.hemisphere} footpoint CGM latitude at the ground`);
    }
    // CGM differs from the centred dipole's latitude with IGRF at this site (by about 4°, measured).
    expect(Math.abs(j.site.cgm.latDeg - j.site.magLatDeg)).toBeGreaterThan(1);
  });

  it('pure centred dipole: CGM latitude, longitude and MLT equal the MAG ones at the footpoints (derived: cos²Λ = r/R)', async () => {
    const j = await cliJson('trace', '--lat', '66', '--lon', '20', ...FLAGS, '--internal', 'dipole');
    for (const fp of [j.siteFootpoint, j.conjugate]) {
      // Tolerance: the CGM trace's measured latitude error (≤ 4e-5°, cgm.ts) plus the footpoint's geodetic round trip.
      expectClose(fp.cgm.latDeg, fp.magLatDeg, 1e-4, `${fp.hemisphere} CGM = MAG latitude`);
      expectClose(fp.cgm.lonDeg, fp.magLonDeg, 1e-4, `${fp.hemisphere} CGM = MAG longitude`);
      expectClose(fp.cgm.mltCgmHours, fp.mltHours, 1e-5, `${fp.hemisphere} MLT (CGM) = MLT (MAG)`);
    }
    expect(j.conditions.mltLabels).toEqual({ mltHours: 'MLT (MAG)', mltCgmHours: 'MLT (CGM)' });
  });

  it('near the dipole equator CGM is undefined with a reason', async () => {
    const model = prepareModel({ ...COND, internal: 'igrf' });
    // Ground points along longitude 100°E across the dipole equator: some line there stays on one side of it.
    let undefinedFound = false;
    for (let la = -15; la <= 15 && !undefinedFound; la += 0.5) {
      const r = cgmOf(model).fromGeodetic(la, 100, 0);
      if (!r.defined) { undefinedFound = true; expect(r.reason).toMatch(/undefined near the dipole equator/); }
    }
    expect(undefinedFound).toBe(true);
  });
});

describe('one conjugate-altitude rule (references §13)', () => {
  it('the conjugate lies at --alt-km unless --conjugate-alt-km sets it apart, and the tables say so', async () => {
    const a = await cliJson('trace', '--lat', '64.8', '--lon', '-19.6', ...FLAGS, '--alt-km', '110');
    expect(a.conjugate.altKm).toBeCloseTo(110, 3);
    expect(a.conditions.conjugateAltKm).toBe(110);
    const b = await cli('trace', '--lat', '64.8', '--lon', '-19.6', ...FLAGS, '--alt-km', '110', '--conjugate-alt-km', '0', '--format', 'csv');
    expect(b.code, b.err).toBe(EXIT_OK);
    const meta = csvMeta(b.out);
    expect(meta.altKm).toBe('110');
    expect(meta.conjugateAltKm).toBe('0');
    expect(meta.internal).toBe('igrf');
    expect(meta.dstSource).toBe('given');
    expect(meta.version).toMatch(/^\d+\.\d+\.\d+/);
    const rows = table(b.out);
    expect(rows.map((r) => r.role)).toEqual(['site', 'near', 'conjugate']);
    expectClose(Number(rows[2].alt_km), 0, 1e-3, 'conjugate at the ground');
    expectClose(Number(rows[1].alt_km), 110, 1e-3, 'near footpoint at 110 km');
    for (const r of rows) expect(r.time_utc).toBe('2025-03-20T22:00:00.000Z');
    // The conjugate at 0 km equals a ground trace's conjugate.
    const g = await cliJson('trace', '--lat', '64.8', '--lon', '-19.6', ...FLAGS, '--alt-km', '0');
    expectClose(Number(rows[2].geo_lat_deg), g.conjugate.geoLatDeg, 1e-6, 'conjugate latitude, set apart vs ground trace');
  });
});

describe('reasons instead of silent empties', () => {
  it('oval --source-re 100: every missing equatorward edge carries the engine search\'s reason', async () => {
    for (const [src, re] of [['100', /^the source distance lies outside the magnetopause$|^the closed region ends before the source distance$/]] as const) {
      const r = await cli('oval', ...FLAGS, '--source-re', src, '--mlt-step', '6', '--format', 'csv', '--hemisphere', 'north');
      expect(r.code, r.err).toBe(EXIT_OK);
      const rows = table(r.out);
      expect(rows.length).toBe(4);
      for (const row of rows) {
        expect(row.equatorward_mag_lat_deg).toBe('');
        expect(row.equatorward_reason, `source ${src} RE, MLT ${row.mlt_h}`).toMatch(re);
      }
      expect(r.err).toMatch(/of 8 boundaries found; 4 missing/);
    }
  });

  it('sweep: one call is bounded (steps × MLT values) with a message naming the flag', async () => {
    const r = await cli('sweep', ...T, '--vary', 'bz', '--from', '0', '--to', '-10', '--steps', '1000', '--mlt', '0,6,12');
    expect(r.code).toBe(EXIT_USAGE);
    expect(r.err).toMatch(/--mlt: --steps 1000 × 3 MLT values = 3000 sweeps steps, more than the 2000/);
  });

  it('sweep CSV rows carry time and condition columns and reason columns', async () => {
    const r = await cli('sweep', ...T, '--vary', 'bz', '--from', '0', '--to', '-4', '--steps', '2', '--dst', '-10', '--format', 'csv', '--source-re', '100');
    expect(r.code, r.err).toBe(EXIT_OK);
    const rows = table(r.out);
    expect(rows.map((x) => x.bz_nt)).toEqual(['0', '0', '-4', '-4']);
    for (const x of rows) {
      expect(x.time_utc).toBe('2025-03-20T22:00:00.000Z');
      expect(x.dst_nt).toBe('-10');
      expect(x.equatorward_reason).toMatch(/^the source distance lies outside the magnetopause$|^the closed region ends before the source distance$/);
    }
  });
});

describe('oval --conditions <series> (references §11, §13)', () => {
  const series = [
    'time,pdyn_npa,bz_nt,by_nt,dst_nt',
    '2025-03-20T20:00:00Z,2.5,-3,1,-20',
    '2025-03-20T21:00:00Z,4.2,-7.5,-2,-45',
    '2025-03-20T22:00:00Z,3.1,1.5,0.5,-38',
  ].join('\n') + '\n';

  it('at MLT 0 and 12 each step equals a separate oval call to 0.01°', async () => {
    const file = scratch.file('storm.csv', series);
    const r = await cli('oval', '--conditions', file, '--mlt', '0,12', '--format', 'csv', '--workers', '2');
    expect(r.code, r.err).toBe(EXIT_OK);
    const rows = table(r.out);
    expect(rows.length).toBe(3 * 2 * 2);
    const lines = series.trim().split('\n').slice(1).map((l) => l.split(','));
    for (const [time, p, bz, by, dst] of lines) {
      const one = await cliJson('oval', '--time', time, '--pdyn', p, '--bz', bz, '--by', by, '--dst', dst, '--mlt-step', '12');
      for (const h of one.hemispheres)
        for (const s of h.sectors) {
          const row = rows.find((x) => Date.parse(x.time_utc) === Date.parse(time) && x.hemisphere === h.hemisphere && Number(x.mlt_h) === s.mltHours)!;
          expect(row.dst_source).toBe('given');
          for (const [k, col] of [['openClosed', 'open_closed'], ['equatorward', 'equatorward']] as const) {
            // Both searches stop at the 0.01° latitude tolerance (boundaries.ts).
            expectClose(Number(row[`${col}_mag_lat_deg`]), s[k].magLatDeg, 0.01, `${time} ${h.hemisphere} MLT ${s.mltHours} ${k}`);
            expectClose(Number(row[`${col}_cgm_lat_deg`]), s[k].cgm.latDeg, 0.02, `${time} ${h.hemisphere} MLT ${s.mltHours} ${k} CGM`);
          }
        }
    }
    expect(r.err).toMatch(/3 steps \(0 skipped, 0 unreadable lines, 0 not computed\)/);
  }, 60_000);

  it('without an index in the file, Dst* is integrated through the series from 0 nT (dst_source "integrated")', async () => {
    const file = scratch.file('nodst.csv', 'time,pdyn_npa,bz_nt,by_nt\n2025-03-20T20:00:00Z,2.5,-3,1\nnot a time,2,2,2\n2025-03-20T21:00:00Z,4.2,-7.5,-2\n');
    const r = await cli('oval', '--conditions', file, '--mlt', '0', '--format', 'csv', '--workers', '1', '--hemisphere', 'north');
    expect(r.code, r.err).toBe(EXIT_OK);
    const rows = table(r.out);
    expect(rows.length).toBe(2);
    expect(rows.every((x) => x.dst_source === 'integrated')).toBe(true);
    expectClose(Number(rows[0].dst_nt), dstFromCorrected(0, 2.5), 1e-6, 'first step: Dst* 0 converted back (O\'Brien–McPherron pressure correction, references §10)');
    // Second step: one hour of the first step's drivers (nominal 400 km/s, Bz −3 nT) from Dst* 0, then the pressure correction at 4.2 nPa.
    const star = integrateDstStar([0, 3.6e6], [400, 400], [-3, -7.5]);
    expectClose(Number(rows[1].dst_nt), dstFromCorrected(star[1], 4.2), 1e-6, 'second step: integrated Dst* converted back');
    expect(star[1]).toBeLessThan(0);
    expect(r.err).toMatch(/series line 3/);
    expect(csvMeta(r.out).program).toBe('fieldline-atlas oval --conditions');
  });

  it('a series with no usable step computes nothing: exit 3 with the reason; flags the file sets are refused', async () => {
    const file = scratch.file('bad.csv', 'time,pdyn_npa,bz_nt,by_nt\n2040-01-01T00:00:00Z,2,1,1\n');
    const r = await cli('oval', '--conditions', file, '--format', 'csv');
    expect(r.code).toBe(EXIT_ROWS_FAILED);
    expect(r.err).toMatch(/nothing computed: the series .* has no usable step/);
    expect(r.err).toMatch(/series line 2: .*IGRF-14 covers/);
    const clash = await cli('oval', '--conditions', file, '--bz', '-5');
    expect(clash.code).toBe(EXIT_USAGE);
    expect(clash.err).toMatch(/--bz: comes from the --conditions file/);
    const missing = await cli('oval', '--conditions', scratch.path('nope.csv'));
    expect(missing.code).toBe(EXIT_USAGE);
    expect(missing.err).toMatch(/--conditions: cannot read .*no such file/);
  });
});
