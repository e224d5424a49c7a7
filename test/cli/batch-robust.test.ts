/**
 * Defects of the batch command found by a hostile-user review, each pinned by
 * a test that failed before the fix: nothing lost, nothing silent.
 */
import { describe, it, expect, afterAll } from 'vitest';
import { batchCli as batch, scratchDir } from './helpers';

const scratch = scratchDir('batch-robust-');
const file = scratch.file;
afterAll(() => scratch.remove());

describe('batch: one bad quote does not end the run or drop rows (defect 3)', () => {
  it('a malformed quoted field past the first 64 KiB read chunk becomes an error row; every other row is written', async () => {
    const sites = file('s.csv', 'name,lat_deg,lon_deg\nFenwick Rise,66.2,18.4\n');
    // 3,000 fill-value rows (skipped cheaply; 150 KB, past the 64 KiB read chunk), then the stray quote, then two computed rows.
    const fill = Array.from({ length: 3000 }, (_, i) => `2025-03-20T${String(i % 24).padStart(2, '0')}:00:00Z,9999.99,-3.000000,1.000000`);
    const lines = ['time,pdyn_npa,bz_nt,by_nt', ...fill, '2025-03-21T00:00:00Z,"2.0"x,-3.0,1.0', '2025-03-21T01:00:00Z,2.0,-3.0,1.0', '2025-03-21T02:00:00Z,3.0,-6.0,"0.0"'];
    const cond = file('c.csv', lines.join('\n') + '\n');
    const r = await batch(['--sites', sites, '--conditions', cond, '--workers', '1', '--format', 'json', '--internal', 'dipole']);
    expect(r.code, r.err).toBe(3); // some rows failed: documented exit code
    const rows = r.out.trim().split('\n').slice(1).map((l) => JSON.parse(l) as Record<string, unknown>);
    expect(rows.length).toBe(3003);
    expect(rows.filter((x) => x.skipped).length).toBe(3000);
    const bad = rows.filter((x) => x.error);
    expect(bad.length).toBe(1);
    expect(String(bad[0].error)).toBe('conditions line 3002: text after a closing quote; row not read');
    expect(rows.filter((x) => !x.error && !x.skipped).map((x) => x.conditions_line)).toEqual([3003, 3004]);
  });
});
