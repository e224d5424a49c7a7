/**
 * Scale-out as README's array-job recipe does it: n runs with --shard k/n and
 * --out part-k.csv, merged with `cat`; the merged table, put back in file order
 * by conditions_line, is one run's table byte for byte (storm index integrated
 * through the series included).
 */
import { describe, it, expect, afterAll } from 'vitest';
import { readFileSync } from 'node:fs';
import { batchCli as batch, scratchDir } from './helpers';
import { EXIT_OK } from '../../src/cli/exit-codes';

const scratch = scratchDir('batch-shards-');
afterAll(() => scratch.remove());

/** Records of a batch CSV (no quoted line ends in these tables): `#` lines dropped. */
const records = (text: string) => text.split('\r\n').filter((l) => l !== '' && !l.startsWith('#'));

describe('batch: array-job shards merged with cat equal one run', () => {
  it('3 shards written to files, concatenated, equal one run (header only from shard 1)', async () => {
    const sites = scratch.file('sites.csv', 'name,lat_deg,lon_deg\nQuillan Moor,67.3,25.1\nSedge Hollow,-68.0,77.5\n');
    const rows = Array.from({ length: 8 }, (_, i) => `2025-03-21T${String(i).padStart(2, '0')}:00:00Z,${(2 + 0.5 * i).toFixed(1)},${-2 * i},${i - 3},${430 + 10 * i}`);
    const series = scratch.file('series.csv', ['time,pdyn_npa,bz_nt,by_nt,speed_kms', ...rows].join('\n') + '\n');
    const common = ['--sites', sites, '--conditions', series, '--workers', '1', '--internal', 'dipole'];
    const one = scratch.path('one.csv');
    expect((await batch([...common, '--out', one])).code).toBe(EXIT_OK);
    let merged = '';
    for (let k = 1; k <= 3; k++) {
      const part = scratch.path(`part-${k}.csv`);
      const r = await batch([...common, '--shard', `${k}/3`, '--out', part]);
      expect(r.code, r.err).toBe(EXIT_OK);
      merged += readFileSync(part, 'utf8'); // cat part-1.csv part-2.csv part-3.csv
    }
    const [header, ...body] = records(merged);
    const [oneHeader, ...oneBody] = records(readFileSync(one, 'utf8'));
    expect(header).toBe(oneHeader);
    expect(body.filter((l) => l === header)).toEqual([]); // shards 2 and 3 write no header
    // Back in file order: a stable sort on conditions_line (the first column) keeps the sites' order.
    const byLine = [...body].sort((a, b) => Number(a.split(',')[0]) - Number(b.split(',')[0]));
    expect(byLine).toEqual(oneBody);
  });
});
