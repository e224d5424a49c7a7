/**
 * The batch's boundary columns are exact (references §13): 200 rows of random invented sites ×
 * random conditions through the real batch path (runBatch, one worker, JSON records so numbers are
 * lossless), where each boundary search is started from the nearest MLT the condition already
 * answered (boundaryFinder), against
 *  - the unhinted engine search (sectorBoundaries without a hint) at each row's MLT and magnetic
 *    hemisphere, on the row's model: ≤ 0.01° (the search tolerance) on both boundary columns, the
 *    same boundary_reason;
 *  - a per-row computation: the same batch run for each site alone (one site per condition, so no
 *    search has a neighbour to start from; the same series, so the storm index integrates the
 *    same): every other column identical, and the columns drawn from the boundaries
 *    (oval relation, sky position of the nearest oval point) the same up to what a 0.01° move of a
 *    boundary can change.
 */
import { describe, it, expect } from 'vitest';
import { batchCli, scratchDir } from './helpers';
import { prepareModel } from '../../src/physics/field/model';
import { makeTracer, sectorBoundaries } from '../../src/physics/mapping';
import { RE_KM, RAD_PER_DEG, DEG_PER_RAD } from '../../src/physics/constants';
import { expectAtMost, expectClose } from '../helpers';

const TOL_DEG = 0.01;
const N_SITES = 25;
const N_CONDITIONS = 8;

/** Small deterministic generator (LCG, Numerical Recipes constants) for reproducible random inputs. */
function lcg(seed: number): () => number {
  let s = seed >>> 0;
  return () => { s = (Math.imul(s, 1664525) + 1013904223) >>> 0; return s / 2 ** 32; };
}

type Rec = Record<string, string | number | boolean | null>;

/** The JSON records of a batch run (the metadata line dropped). */
function records(out: string): Rec[] {
  return out.split('\n').filter((l) => l.startsWith('{') && !l.startsWith('{"metadata"')).map((l) => JSON.parse(l) as Rec);
}

const BOUNDARY_COLUMNS = ['open_closed_mag_lat_deg', 'equatorward_mag_lat_deg'];
/** Columns computed from the boundary points (checked with the bound a 0.01° boundary move allows). */
const FROM_BOUNDARIES = ['oval_relation', 'inside_oval', 'sky_elevation_deg', 'sky_azimuth_deg', 'sky_distance_km', 'oval_above_horizon', 'sky_visible'];

describe('batch boundaries: hinted from neighbours, exact to 0.01° (200 random rows; references §13)', () => {
  it('equal the unhinted search at each row\'s MLT; every other column equals a per-site run', async () => {
    const rnd = lcg(20261203);
    const dir = scratchDir('batch-exact-');
    try {
      const sites: string[] = [];
      for (let i = 0; i < N_SITES; i++) {
        const lat = (40 + 45 * rnd()) * (rnd() < 0.6 ? 1 : -1);
        sites.push(`Test Site ${i + 1},${lat.toFixed(4)},${(360 * rnd() - 180).toFixed(4)},${(rnd()).toFixed(3)}`);
      }
      const conds = ['time,pdyn_npa,bz_nt,by_nt'];
      for (let k = 0; k < N_CONDITIONS; k++) {
        const t = new Date(Date.UTC(2026, 4, 3) + k * 3600_000 * (1 + Math.floor(5 * rnd()))).toISOString().replace('.000Z', 'Z');
        conds.push(`${t},${(0.5 + 19.5 * rnd() ** 2).toFixed(2)},${(-20 + 28 * rnd()).toFixed(2)},${(-8 + 16 * rnd()).toFixed(2)}`);
      }
      const condPath = dir.file('conditions.csv', conds.join('\n') + '\n');
      const header = 'name,lat_deg,lon_deg,height_km\n';
      const all = await batchCli(['--sites', dir.file('sites.csv', header + sites.join('\n') + '\n'), '--conditions', condPath, '--format', 'json', '--workers', '1']);
      expect(all.code, all.err).toBe(0);
      const rows = records(all.out);
      expect(rows.length).toBe(N_SITES * N_CONDITIONS);

      // Per-row computation: each site alone over the same series.
      const single = new Map<string, Rec>();
      for (let i = 0; i < N_SITES; i++) {
        const r = await batchCli(['--sites', dir.file(`site${i}.csv`, header + sites[i] + '\n'), '--conditions', condPath, '--format', 'json', '--workers', '1']);
        expect(r.code, r.err).toBe(0);
        for (const rec of records(r.out)) single.set(`${rec.site}|${rec.conditions_line}`, rec);
      }

      let compared = 0, found = 0, worst = 0;
      const models = new Map<number, { m: ReturnType<typeof prepareModel>; t: ReturnType<typeof makeTracer> }>();
      for (const row of rows) {
        const what = `${row.site} × conditions line ${row.conditions_line}`;
        const ref = single.get(`${row.site}|${row.conditions_line}`)!;
        expect(ref, what).toBeTruthy();
        // Every column not drawn from the boundaries is identical (sites_line: the single-site file has one site).
        for (const [k, v] of Object.entries(row)) {
          if (BOUNDARY_COLUMNS.includes(k) || FROM_BOUNDARIES.includes(k) || k === 'sites_line') continue;
          expect(v, `${what}: column ${k}`).toEqual(ref[k]);
        }
        if (typeof row.mlt_h !== 'number') continue;
        // The unhinted engine search at the row's MLT on the row's model (the series' integrated storm index as given).
        let e = models.get(row.conditions_line as number);
        if (!e) {
          const m = prepareModel({ time: row.time as string, pdynNpa: row.pdyn_npa as number, bzNt: row.bz_nt as number, byNt: row.by_nt as number, dstNt: row.dst_nt as number, speedKms: row.speed_kms as number });
          expect(m.storm.dstStarNt, `${what}: the rebuilt model's Dst*`).toBe(row.dst_star_nt);
          e = { m, t: makeTracer(m, { altKm: 110, ellipsoid: true }) };
          models.set(row.conditions_line as number, e);
        }
        const hemi = (row.mag_lat_deg as number) >= 0 ? 'north' : 'south';
        const exact = sectorBoundaries(e.m, e.t, hemi, row.mlt_h, { sourceRe: row.source_re as number });
        const cols: [string, number | null][] = [
          ['open_closed_mag_lat_deg', exact.openClosed ? exact.openClosed.magLatDeg : null],
          ['equatorward_mag_lat_deg', exact.equatorward ? exact.equatorward.magLatDeg : null],
        ];
        for (const [k, want] of cols) {
          const got = row[k] as number | null;
          expect(got === null, `${what}: ${k} found by one search only (batch ${got}, unhinted ${want})`).toBe(want === null);
          // The per-site run has no neighbour to start from: it is the unhinted search itself.
          expect(ref[k], `${what}: ${k} of the per-site run = the unhinted search`).toBe(want);
          if (got !== null && want !== null) {
            expectClose(got, want, TOL_DEG, `${what}: ${k} (batch vs unhinted search)`);
            worst = Math.max(worst, Math.abs(got - want));
            found++;
          }
        }
        // Columns drawn from the boundaries: the same, up to a 0.01° move of a boundary.
        const magLat = row.mag_lat_deg as number;
        const nearEdge = cols.some(([, w]) => w !== null && Math.abs(Math.abs(magLat) - Math.abs(w)) <= 2 * TOL_DEG);
        if (!nearEdge) {
          expect(row.oval_relation, `${what}: oval_relation`).toBe(ref.oval_relation);
          expect(row.inside_oval, `${what}: inside_oval`).toBe(ref.inside_oval);
        }
        if (typeof row.sky_distance_km === 'number' && typeof ref.sky_distance_km === 'number' && row.oval_relation === ref.oval_relation) {
          // 0.01° of latitude at the emission height moves the point by ≤ 0.01°·(RE + 110 km) rad; seen from the
          // distance d it turns by at most that over d (rad). Nearest-edge switches would exceed it (none expected).
          const moveKm = TOL_DEG * RAD_PER_DEG * (RE_KM + 110);
          const d = Math.min(row.sky_distance_km, ref.sky_distance_km as number);
          expectAtMost(Math.abs(row.sky_distance_km - (ref.sky_distance_km as number)), moveKm, `${what}: sky_distance_km`);
          const turnDeg = (moveKm / d) * DEG_PER_RAD;
          expectAtMost(Math.abs((row.sky_elevation_deg as number) - (ref.sky_elevation_deg as number)), turnDeg, `${what}: sky_elevation_deg`);
          const dAz = Math.abs(((((row.sky_azimuth_deg as number) - (ref.sky_azimuth_deg as number)) % 360) + 540) % 360 - 180);
          expectAtMost(dAz * Math.cos((row.sky_elevation_deg as number) * RAD_PER_DEG), turnDeg, `${what}: sky_azimuth_deg`);
          if (Math.abs((row.sky_elevation_deg as number) - 10) > turnDeg) {
            expect(row.oval_above_horizon, `${what}: oval_above_horizon`).toBe(ref.oval_above_horizon);
            expect(row.sky_visible, `${what}: sky_visible`).toBe(ref.sky_visible);
          }
        } else if (!nearEdge) {
          for (const k of ['sky_distance_km', 'oval_above_horizon', 'sky_visible']) expect(row[k], `${what}: ${k}`).toBe(ref[k]);
        }
        compared++;
      }
      // The sample must exercise the searches: most rows have an MLT and found boundaries.
      expect(compared, 'rows with an MLT').toBeGreaterThan(150);
      expect(found, 'boundaries found').toBeGreaterThan(200);
      expectAtMost(worst, TOL_DEG, 'largest |batch − unhinted| (deg)');
    } finally {
      dir.remove();
    }
  }, 300_000);
});
