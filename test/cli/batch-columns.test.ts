/** Batch columns: CGM (--cgm) and sky darkness. */
import { describe, it, expect, afterAll } from 'vitest';
import * as Astro from 'astronomy-engine';
import { batchCli, scratchDir } from './helpers';
import { expectClose } from '../helpers';

const d = scratchDir('batch-cols-');
afterAll(() => d.remove());

describe('batch columns', () => {
  it('with --internal dipole the footpoint CGM latitude equals its MAG latitude (derived: in a pure dipole CGM = dipole coordinates); Sun elevation vs astronomy-engine to 0.05°', async () => {
    const sites = d.file('s.csv', 'name,lat_deg,lon_deg\nFenmoor,67.1,21.3\nGlasswick,62.4,-95.2\n');
    const r = await batchCli(['--sites', sites, '--time', '2025-03-20T12:00:00Z', '--internal', 'dipole', '--cgm', '--format', 'json', '--workers', '1']);
    expect(r.code, r.err).toBe(0);
    const rows = r.out.trim().split('\n').slice(1).map((l) => JSON.parse(l) as Record<string, any>);
    for (const row of rows) {
      expectClose(row.foot_cgm_lat_deg, row.mag_lat_deg, 1e-3, `${row.site} foot CGM lat vs MAG lat`);
      const obs = new Astro.Observer(row.site_lat_deg, row.site_lon_deg, 0);
      const t = Astro.MakeTime(new Date('2025-03-20T12:00:00Z'));
      const eq = Astro.Equator(Astro.Body.Sun, t, obs, true, true);
      expectClose(row.sun_elevation_deg, Astro.Horizon(t, obs, eq.ra, eq.dec).altitude, 0.05, `${row.site} Sun elevation (astronomy-engine)`);
      if (row.sun_elevation_deg > 0) expect(row.sky_visible === true).toBe(false);
    }
  });
});
