import { describe, it, expect, afterAll } from 'vitest';
import * as Astro from 'astronomy-engine';
import { cli, cliJson, csvBody, csvMeta, scratchDir } from './helpers';
import { readCsv } from '../../src/io/csv';
import { prepareModel } from '../../src/physics/field/model';
import { makeTracer, siteReport } from '../../src/physics/mapping';
import { EXIT_OK, EXIT_USAGE } from '../../src/cli/exit-codes';
import { expectClose } from '../helpers';

// Sources: the CLI contract (references §13); the Sun's elevation against astronomy-engine
// (a general-purpose ephemeris library, geometric elevation without refraction) to 0.05°;
// twilight limits −6/−12/−18° (common practice); the per-site numbers are siteReport's (as batch).
const scratch = scratchDir('cli-timeline-');
afterAll(() => scratch.remove());
const SITES = 'name,lat_deg,lon_deg,height_km\nBrannock Tor,65.2,-18.1,0.1\nLissel Cove,-68.4,77.9,0\n';
const NIGHT = ['--from', '2025-03-20T20:00:00Z', '--to', '2025-03-21T02:00:00Z', '--step-min', '120', '--pdyn', '3', '--bz', '-6', '--dst', '-30'];

function table(text: string): Record<string, string>[] {
  const [head, ...rows] = readCsv(csvBody(text));
  return rows.map((r) => Object.fromEntries(head.map((h, i) => [h, r[i]])));
}

describe('timeline (references §13)', () => {
  it('a night at fixed conditions: one row per step and site with the site report, the Sun and the Moon; best hours per site', async () => {
    const sites = scratch.file('sites.csv', SITES);
    const r = await cli('timeline', '--sites', sites, ...NIGHT, '--format', 'csv', '--sun-limit-deg', '-12');
    expect(r.code, r.err).toBe(EXIT_OK);
    const rows = table(r.out);
    expect(rows.length).toBe(4 * 2);
    const meta = csvMeta(r.out);
    expect(meta.program).toBe('fieldline-atlas timeline');
    expect(meta.sunLimitDeg).toBe('-12');
    expect(meta.conjugateAltKm).toBe('110');
    expect(r.err).toMatch(/Brannock Tor: (Dark sky|No dark hours)/);
    expect(r.err).toMatch(/Lissel Cove: (Dark sky|No dark hours)/);
    for (const row of rows) {
      const ms = Date.parse(row.time_utc);
      const lat = Number(row.lat_deg), lon = Number(row.lon_deg);
      const model = prepareModel({ time: row.time_utc, pdynNpa: 3, bzNt: -6, byNt: 0, dstNt: -30 });
      const t = makeTracer(model, { altKm: 110, ellipsoid: true });
      const want = siteReport(model, t, t, { name: row.site, latDeg: lat, lonDeg: lon, heightKm: row.site === 'Brannock Tor' ? 0.1 : 0 }, { altKm: 110, conjugateAltKm: 110, sourceRe: model.sourceRe, minElevationDeg: 10 }, undefined, false);
      expect(row.line_type).toBe(want.type);
      expect(row.oval_relation).toBe(want.ovalRelation);
      if (want.sky) {
        expectClose(Number(row.oval_elevation_deg), want.sky.elevationDeg, 1e-6, `${row.site} ${row.time_utc} oval elevation vs siteReport`);
        expectClose(Number(row.oval_azimuth_deg), want.sky.azimuthDeg, 1e-6, `${row.site} ${row.time_utc} oval azimuth vs siteReport`);
      }
      const obs = new Astro.Observer(lat, lon, row.site === 'Brannock Tor' ? 100 : 0);
      const eq = Astro.Equator(Astro.Body.Sun, new Date(ms), obs, true, true);
      const sunEl = Astro.Horizon(new Date(ms), obs, eq.ra, eq.dec).altitude;
      expectClose(Number(row.sun_elevation_deg), sunEl, 0.05, `${row.site} ${row.time_utc} Sun elevation vs astronomy-engine`);
      const cls = sunEl >= -0.833 ? 'day' : sunEl >= -6 ? 'civil' : sunEl >= -12 ? 'nautical' : sunEl >= -18 ? 'astronomical' : 'night';
      if (Math.abs(sunEl - Math.round(sunEl / 6) * 6) > 0.1) expect(row.twilight).toBe(cls);
      expect(row.dark).toBe(String(sunEl < -12));
      const f = Number(row.moon_illuminated_fraction);
      expect(f >= 0 && f <= 1).toBe(true);
    }
  }, 60_000);

  it('JSON carries the rows and each site\'s best hours; a series drives the steps with its own conditions', async () => {
    const sites = scratch.file('sites2.csv', SITES);
    const series = scratch.file('series.csv', 'time,pdyn_npa,bz_nt,by_nt\n2025-03-20T22:00:00Z,2.2,-4,1\n2025-03-20T23:00:00Z,5.5,-11,-3\n');
    const j = await cliJson('timeline', '--sites', sites, '--conditions', series);
    expect(j.rows.length).toBe(4);
    expect(j.rows.map((x: any) => x.bz_nt)).toEqual([-4, -4, -11, -11]);
    expect(j.rows.every((x: any) => x.dst_source === 'integrated')).toBe(true);
    expect(j.bestHours.map((b: any) => b.site)).toEqual(['Brannock Tor', 'Lissel Cove']);
    for (const b of j.bestHours) expect(b.sentence).toMatch(/UTC/);
  }, 60_000);

  it('bad use names the flag: both or neither time source, too many site-steps, a missing file', async () => {
    const sites = scratch.file('sites3.csv', SITES);
    const both = await cli('timeline', '--sites', sites, '--conditions', sites, '--from', '2025-03-20T20:00:00Z');
    expect(both.code).toBe(EXIT_USAGE);
    expect(both.err).toMatch(/--from: give either --conditions <series> or --from and --to/);
    const long = await cli('timeline', '--sites', sites, '--from', '2025-01-01T00:00:00Z', '--to', '2025-12-31T00:00:00Z', '--step-min', '1');
    expect(long.code).toBe(EXIT_USAGE);
    expect(long.err).toMatch(/--step-min: .* more than the 5000 one call may run/);
    const none = await cli('timeline', '--sites', scratch.path('none.csv'), ...NIGHT);
    expect(none.code).toBe(EXIT_USAGE);
    expect(none.err).toMatch(/--sites: cannot read/);
  });
});
