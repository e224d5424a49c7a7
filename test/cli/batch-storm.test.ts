/**
 * batch and the storm index: conditions through the one series reader (our CSV,
 * the hourly and high-resolution data files), the index per row given or
 * integrated through the series (O'Brien & McPherron 2000, references §10), and
 * the new columns (dst_nt, dst_source, dst_star_nt, speed_kms, source_re, boundary_reason).
 */
import { describe, it, expect, afterAll } from 'vitest';
import { batchCli as batch, scratchDir } from './helpers';
import { expectClose } from '../helpers';
import { EXIT_OK, EXIT_USAGE } from '../../src/cli/exit-codes';

const scratch = scratchDir('batch-storm-');
const file = scratch.file;
afterAll(() => scratch.remove());

const SITES = 'name,lat_deg,lon_deg\nHollin Tarn,64.5,-20.5\n';
const FAST = ['--workers', '1', '--format', 'json', '--internal', 'dipole'];

function jsonRows(out: string): Record<string, any>[] {
  return out.trim().split('\n').slice(1).map((l) => JSON.parse(l) as Record<string, any>);
}

// O'Brien & McPherron (2000), J. Geophys. Res. 105, 7707 (references §10), written out here from the paper:
// Q = −4.4 (VBs − 0.49) nT/h for VBs > 0.49 mV/m; τ = 2.40 exp(9.74 / (4.69 + VBs)) h; Dst* = Dst − 7.26 √Pdyn + 11.
const qOM = (vbs: number) => (vbs > 0.49 ? -4.4 * (vbs - 0.49) : 0);
const tauOM = (vbs: number) => 2.4 * Math.exp(9.74 / (4.69 + vbs));
const star = (dst: number, p: number) => dst - 7.26 * Math.sqrt(p) + 11;

describe('batch: storm index per row (references §10)', () => {
  it('uses a given dst_nt or sym_h_nt as the index, and says so per row', async () => {
    const sites = file('s.csv', SITES);
    const dst = file('dst.csv', 'time,pdyn_npa,bz_nt,by_nt,dst_nt,speed_kms\n2025-03-20T21:00:00Z,4,-12,2,-180,620\n2025-03-20T22:00:00Z,4,-12,2,,620\n');
    const r = await batch(['--sites', sites, '--conditions', dst, ...FAST]);
    expect(r.code, r.err).toBe(EXIT_OK);
    const [a, b] = jsonRows(r.out);
    expect(a.dst_source).toBe('dst');
    expect(a.dst_nt).toBe(-180);
    expectClose(a.dst_star_nt, star(-180, 4), 1e-9, 'Dst* = Dst − b√Pdyn + c (O\'Brien–McPherron 2000)');
    expect(a.speed_kms).toBe(620);
    // The empty index of the next row: integrated from the given one over the hour (exact solution of the ODE).
    expect(b.dst_source).toBe('integrated');
    const vbs = 620 * 12 * 1e-3;
    const qt = qOM(vbs) * tauOM(vbs);
    expectClose(b.dst_star_nt, qt + (star(-180, 4) - qt) * Math.exp(-1 / tauOM(vbs)), 1e-9, 'one hour of injection–decay from the given index');
    const sym = file('sym.csv', 'time,pdyn_npa,bz_nt,by_nt,sym_h_nt\n2025-03-20T21:00:00Z,4,-12,2,-95\n');
    const s = jsonRows((await batch(['--sites', sites, '--conditions', sym, ...FAST])).out)[0];
    expect([s.dst_source, s.dst_nt]).toEqual(['sym_h', -95]);
  });

  it('integrates the injection–decay equation through the series in time order: a storm builds up and recovers', async () => {
    const sites = file('s.csv', SITES);
    // 6 quiet hours (Bz +2), 6 hours of Bz −15 at 600 km/s, 6 hours of recovery (Bz +2): every row at Pdyn 3 nPa.
    const bz = [...Array(6).fill(2), ...Array(6).fill(-15), ...Array(6).fill(2)];
    const rows = bz.map((b, i) => `2025-03-21T${String(i).padStart(2, '0')}:00:00Z,3,${b},0,600`);
    const cond = file('storm.csv', ['time,pdyn_npa,bz_nt,by_nt,speed_kms', ...rows].join('\n') + '\n');
    const r = await batch(['--sites', sites, '--conditions', cond, ...FAST]);
    expect(r.code, r.err).toBe(EXIT_OK);
    const got = jsonRows(r.out).map((x) => x.dst_star_nt as number);
    // Reference: the closed-form step of d(Dst*)/dt = Q − Dst*/τ with the previous row's drivers held over the hour.
    let d = qOM(0) * tauOM(0); // first row: steady state of its drivers (Bz +2: VBs 0, Q 0)
    const want = [d];
    for (let i = 1; i < bz.length; i++) {
      const v = 600 * Math.max(0, -bz[i - 1]) * 1e-3;
      const qt = qOM(v) * tauOM(v);
      d = qt + (d - qt) * Math.exp(-1 / tauOM(v));
      want.push(d);
    }
    got.forEach((g, i) => expectClose(g, want[i], 1e-9, `Dst* at hour ${i}`));
    expect(Math.min(...got)).toBeLessThan(-60); // the storm builds up over the driven hours …
    expect(got[17]).toBeGreaterThan(got[11]); // … and recovers afterwards
    expect(jsonRows(r.out).every((x) => x.dst_source === 'integrated')).toBe(true);
  });

  it('gives every shard the same index as one run (each shard integrates the whole series up to its rows)', async () => {
    const sites = file('s.csv', SITES);
    const rows = Array.from({ length: 9 }, (_, i) => `2025-03-21T${String(i).padStart(2, '0')}:00:00Z,${2 + i % 3},${-4 * i},1`);
    const cond = file('sh.csv', ['time,pdyn_npa,bz_nt,by_nt', ...rows].join('\n') + '\n');
    const one = jsonRows((await batch(['--sites', sites, '--conditions', cond, ...FAST])).out);
    const parts = [];
    for (let k = 1; k <= 3; k++) parts.push(...jsonRows((await batch(['--sites', sites, '--conditions', cond, '--shard', `${k}/3`, ...FAST])).out));
    parts.sort((a, b) => a.conditions_line - b.conditions_line);
    expect(parts.map((x) => [x.conditions_line, x.dst_star_nt, x.open_closed_mag_lat_deg])).toEqual(one.map((x) => [x.conditions_line, x.dst_star_nt, x.open_closed_mag_lat_deg]));
  });

  it('a row with an impossible speed is an error of its own; the rows after it go on from the last good row', async () => {
    const sites = file('s.csv', SITES);
    const cond = file('fast.csv', 'time,pdyn_npa,bz_nt,by_nt,speed_kms,dst_nt\n2025-03-21T00:00:00Z,3,-10,0,500,-150\n2025-03-21T01:00:00Z,3,-10,0,5000,\n2025-03-21T02:00:00Z,3,-10,0,500,\n');
    const r = await batch(['--sites', sites, '--conditions', cond, ...FAST]);
    const [, b, c] = jsonRows(r.out);
    expect(b.error).toMatch(/^conditions line 3: speed_kms: 5000 km\/s is outside the allowed range: above 0 and at most 3000 km\/s/);
    expect(c.error).toBeNull();
    // Line 4 integrates two hours from line 2 with line 2's drivers (the bad line is not a driver).
    const v = 500 * 10e-3, qt = qOM(v) * tauOM(v);
    expectClose(c.dst_star_nt, qt + (star(-150, 3) - qt) * Math.exp(-2 / tauOM(v)), 1e-9, 'held over the bad line');
  });

  it('refuses --dst with a --conditions file, and an unknown --series-format (exit 2)', async () => {
    const sites = file('s.csv', SITES);
    const cond = file('c.csv', 'time,pdyn_npa,bz_nt\n2025-03-21T00:00:00Z,2,-3\n');
    const a = await batch(['--sites', sites, '--conditions', cond, '--dst', '-50']);
    expect(a.code).toBe(EXIT_USAGE);
    expect(a.err).toMatch(/--dst: is given by the --conditions file/);
    const b = await batch(['--sites', sites, '--conditions', cond, '--series-format', 'weekly']);
    expect(b.code).toBe(EXIT_USAGE);
    expect(b.err).toMatch(/--series-format: expected one of auto, csv, hourly, highres; got "weekly"/);
  });
});

/** An hourly data line (references §11 word layout): 55 blank-separated words, the ones we read set, the rest 0. */
function hourlyLine(hour: number, v: { by: number; bz: number; n: number; speed: number; alpha: number; p: string; dst: string }): string {
  const w = Array.from({ length: 55 }, () => '0');
  w[0] = '2025'; w[1] = '79'; w[2] = String(hour);
  w[15] = v.by.toFixed(1); w[16] = v.bz.toFixed(1); w[23] = v.n.toFixed(1); w[24] = v.speed.toFixed(0) + '.';
  w[27] = v.alpha.toFixed(3); w[28] = v.p; w[40] = v.dst;
  return w.join(' ');
}

describe('batch: the community data files through the series reader (references §11)', () => {
  it('reads an hourly file: flow-pressure word, GSM By/Bz, the Dst word as the index; a fill is skipped with the reason', async () => {
    const sites = file('s.csv', SITES);
    const text = [
      hourlyLine(20, { by: 3.2, bz: -7.5, n: 8, speed: 480, alpha: 0.04, p: '3.10', dst: '-64' }),
      hourlyLine(21, { by: 999.9, bz: -7.5, n: 8, speed: 480, alpha: 0.04, p: '3.10', dst: '-70' }),
      hourlyLine(22, { by: 1.0, bz: -9.0, n: 8, speed: 500, alpha: 0.04, p: '99.99', dst: '99999' }),
    ].join('\n') + '\n';
    const cond = file('year.dat', text);
    for (const fmt of ['auto', 'hourly']) {
      const r = await batch(['--sites', sites, '--conditions', cond, '--series-format', fmt, ...FAST]);
      expect(r.code, r.err).toBe(EXIT_OK);
      const [a, b, c] = jsonRows(r.out);
      // Day 79 of 2025 is 20 March.
      expect([a.time, a.pdyn_npa, a.by_nt, a.bz_nt, a.dst_nt, a.dst_source, a.speed_kms]).toEqual(['2025-03-20T20:00:00.000Z', 3.1, 3.2, -7.5, -64, 'dst', 480]);
      expect(b.skipped).toMatch(/^conditions line 2: word 16 \(By GSM\) is a fill value \(999\.9\); row skipped/);
      // Pressure from density, speed and alpha ratio (1.67e-6 n v² (1 + 4 α), references §3, §11); index integrated from line 1 over two hours.
      expectClose(c.pdyn_npa, 1.67e-6 * 8 * 500 * 500 * (1 + 4 * 0.04), 1e-12, 'flow pressure from n, v, alpha');
      expect(c.dst_source).toBe('integrated');
      const v = 480 * 7.5e-3;
      const qt = qOM(v) * tauOM(v);
      expectClose(c.dst_star_nt, qt + (star(-64, 3.1) - qt) * Math.exp(-2 / tauOM(v)), 1e-9, 'two hours held over the skipped line');
    }
  });

  it('a file whose layout cannot be told is exit 2 naming the line and the choices', async () => {
    const sites = file('s.csv', SITES);
    const cond = file('odd.dat', '2025 79 20 1 2 3\n');
    const r = await batch(['--sites', sites, '--conditions', cond]);
    expect(r.code).toBe(EXIT_USAGE);
    expect(r.err).toMatch(/--conditions: cannot tell the series format from line 1 .*6 blank-separated words.*csv, hourly or highres/);
  });
});

describe('batch: every empty boundary carries a reason', () => {
  it('a source distance beyond the magnetopause leaves the equatorward edge empty and says why (the engine\'s reason)', async () => {
    const sites = file('s.csv', SITES);
    const r = await batch(['--sites', sites, '--time', '2025-03-20T22:00:00Z', '--pdyn', '2', '--bz', '-3', '--source-re', '60', ...FAST]);
    expect(r.code, r.err).toBe(EXIT_OK);
    const [row] = jsonRows(r.out);
    expect(row.source_re).toBe(60);
    expect(row.equatorward_mag_lat_deg).toBeNull();
    expect(row.open_closed_mag_lat_deg).not.toBeNull();
    expect(row.boundary_reason).toMatch(/^equatorward: the (source distance lies outside the magnetopause|closed region ends before the source distance)$/);
    expect(row.dst_source).toBe('steady_state');
  });
});
