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

import { spawn } from 'node:child_process';
import { readFileSync, existsSync, linkSync, readdirSync } from 'node:fs';
import { dirname } from 'node:path';
import { EXIT_USAGE, EXIT_FAILURE, EXIT_OK, EXIT_SIGINT, EXIT_SIGTERM } from '../../src/cli/exit-codes';
import { SITES_PER_JOB } from '../../src/cli/batch/compute';

const ROOT = new URL('../..', import.meta.url).pathname;

/** The CLI in a child process (node with the tsx loader, no wrapper that could swallow a signal); `kill` is sent once stderr shows progress. */
function spawnBatchAndSignal(args: string[], signal: NodeJS.Signals): Promise<{ code: number | null; err: string }> {
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, ['--import', 'tsx', 'src/cli/main.ts', 'batch', ...args], { cwd: ROOT, stdio: ['ignore', 'ignore', 'pipe'] });
    let err = '';
    let sent = false;
    const timer = setTimeout(() => { child.kill('SIGKILL'); reject(new Error(`no progress within 60 s: ${err}`)); }, 60_000);
    child.stderr.setEncoding('utf8');
    child.stderr.on('data', (t: string) => {
      err += t;
      if (!sent && /rows\/s/.test(err)) { sent = true; child.kill(signal); }
    });
    child.on('exit', (code) => { clearTimeout(timer); resolve({ code, err }); });
  });
}

/** A series long enough that the run is still going when the signal comes (minutes at full speed). */
function longSeries(name: string): string {
  const rows = Array.from({ length: 5000 }, (_, i) => `2025-03-${String(20 + Math.floor(i / 1440)).padStart(2, '0')}T${String(Math.floor(i / 60) % 24).padStart(2, '0')}:${String(i % 60).padStart(2, '0')}:00Z,${2 + (i % 5)},${-(i % 11)},1`);
  return file(name, ['time,pdyn_npa,bz_nt,by_nt', ...rows].join('\n') + '\n');
}

const SITES = 'name,lat_deg,lon_deg\nFenwick Rise,66.2,18.4\nMarrow Point,60.1,-150.3\nOxcombe,-70.5,40.0\n';

describe('batch: the output is never an input (defect 1)', () => {
  it('refuses --out equal to the conditions file (exit 2) and leaves it as it was', async () => {
    const sites = file('s1.csv', SITES);
    const text = 'time,pdyn_npa,bz_nt\n2025-03-20T20:00:00Z,2,-1\n';
    const cond = file('c1.csv', text);
    const r = await batch(['--sites', sites, '--conditions', cond, '--out', cond]);
    expect(r.code).toBe(EXIT_USAGE);
    expect(r.err).toMatch(/--out: .*c1\.csv is the --conditions input file; writing there would destroy it/);
    expect(readFileSync(cond, 'utf8')).toBe(text);
  });

  it('refuses --out that is the sites file under another name (a hard link: same inode)', async () => {
    const sites = file('s2.csv', SITES);
    const other = scratch.path('s2-link.csv');
    linkSync(sites, other);
    const r = await batch(['--sites', sites, '--time', '2025-03-20T22:00:00Z', '--out', other]);
    expect(r.code).toBe(EXIT_USAGE);
    expect(r.err).toMatch(/is the --sites input file/);
    expect(readFileSync(sites, 'utf8')).toBe(SITES);
  });
});

describe('batch: an interrupted run never looks complete (defect 2)', () => {
  it('SIGINT: exit 130, the earlier result at --out untouched, no temporary file left, what was done on stderr', async () => {
    const sites = file('s3.csv', SITES);
    const cond = longSeries('long3.csv');
    const out = file('table3.csv', 'an earlier good result\n');
    const r = await spawnBatchAndSignal(['--sites', sites, '--conditions', cond, '--out', out, '--workers', '1', '--progress', '--internal', 'dipole'], 'SIGINT');
    expect(r.code, r.err).toBe(EXIT_SIGINT);
    expect(readFileSync(out, 'utf8')).toBe('an earlier good result\n');
    expect(r.err).toMatch(/stopped by SIGINT after \d+ rows \(\d+ conditions\).*table3\.csv left untouched; nothing kept/);
    expect(readdirSync(dirname(out)).filter((f) => f.includes('table3.csv.writing'))).toEqual([]);
  }, 90_000);

  it('SIGTERM with --keep-partial: exit 143, the rows so far in <out>.partial (valid GeoJSON), the target not created', async () => {
    const sites = file('s4.csv', SITES);
    const cond = longSeries('long4.csv');
    const out = scratch.path('table4.geojson');
    const r = await spawnBatchAndSignal(['--sites', sites, '--conditions', cond, '--out', out, '--workers', '2', '--progress', '--format', 'geojson', '--keep-partial', '--internal', 'dipole'], 'SIGTERM');
    expect(r.code, r.err).toBe(EXIT_SIGTERM);
    expect(existsSync(out)).toBe(false);
    expect(r.err).toMatch(/stopped by SIGTERM .*the rows written so far are in .*table4\.geojson\.partial \(incomplete\)/);
    const partial = JSON.parse(readFileSync(out + '.partial', 'utf8')) as { type: string; features: unknown[] };
    expect(partial.type).toBe('FeatureCollection');
    expect(partial.features.length % 3).toBe(0);
  }, 90_000);
});

describe('batch: exit codes hold for every failure (defect 4)', () => {
  it('a write error (disk full) exits 1 with the reason, not 13', async () => {
    const sites = file('s5.csv', SITES);
    const r = await batch(['--sites', sites, '--time', '2025-03-20T22:00:00Z', '--out', '/dev/full', '--workers', '1', '--internal', 'dipole']);
    expect(r.code, r.err).toBe(EXIT_FAILURE);
    expect(r.err).toMatch(/failed: .*ENOSPC/);
  });

  it('a run where every row was skipped says so on stderr (exit 0: nothing failed)', async () => {
    const sites = file('s6.csv', SITES);
    const cond = file('c6.csv', 'time,pdyn_npa,bz_nt\n2025-03-20T20:00:00Z,99.99,-1\n2025-03-20T21:00:00Z,,-1\n');
    const r = await batch(['--sites', sites, '--conditions', cond, '--workers', '1']);
    expect(r.code, r.err).toBe(EXIT_OK);
    expect(r.err).toMatch(/warning: no row was computed \(all 6 rows were skipped\)/);
  });
});

describe('batch: bounded work (defect 5)', () => {
  it('--workers above the cores is reduced to the cores, with a warning', async () => {
    const sites = file('s7.csv', SITES);
    const r = await batch(['--sites', sites, '--time', '2025-03-20T22:00:00Z', '--workers', '256', '--internal', 'dipole', '--format', 'json']);
    expect(r.code, r.err).toBe(EXIT_OK);
    expect(r.err).toMatch(/warning: --workers 256 is more than the \d+ cores of this machine; using \d+/);
  });

  it(`splits a condition with more than ${SITES_PER_JOB} sites into jobs (rows in flight bounded) and keeps every row in order`, async () => {
    const n = SITES_PER_JOB + 700;
    // Sites with an empty latitude: skipped rows, cheap, but each still a row of its own.
    const sites = file('s8.csv', ['name,lat_deg,lon_deg', ...Array.from({ length: n }, (_, i) => `p${i},,${i % 360}`)].join('\n') + '\n');
    const cond = file('c8.csv', 'time,pdyn_npa,bz_nt\n2025-03-20T20:00:00Z,2,-1\n2025-03-20T21:00:00Z,3,-2\n');
    const r = await batch(['--sites', sites, '--conditions', cond, '--workers', '2', '--format', 'json']);
    expect(r.code, r.err).toBe(EXIT_OK);
    expect(r.err).toMatch(new RegExp(`${2 * n} rows \\(${n} sites × 2 conditions\\)`));
    const rows = r.out.trim().split('\n').slice(1).map((l) => JSON.parse(l) as { conditions_line: number; sites_line: number });
    expect(rows.map((x) => `${x.conditions_line}:${x.sites_line}`)).toEqual([2, 3].flatMap((c) => Array.from({ length: n }, (_, i) => `${c}:${i + 2}`)));
  });
});
