import { describe, it, expect } from 'vitest';
import { cli } from './helpers';
import { EXIT_OK, EXIT_USAGE } from '../../src/cli/exit-codes';
import { shueMagnetopause } from '../../src/physics/field/magnetopause';

// Source of each expectation: the CLI contract (references §13: every usage error exits 2
// naming the flag at fault) and the fitted data range of Shue et al. (1997), references §3.
const T = ['--time', '2025-03-20T22:00:00Z'];

describe('command-line defects found by the careless-user test', () => {
  it('--pdyn 1e-15 fails at the flag check naming --pdyn, not inside the tail term', async () => {
    const r = await cli('field', '--gsm', '5,0,0', ...T, '--pdyn', '1e-15');
    expect(r.code).toBe(EXIT_USAGE);
    expect(r.err).toMatch(/--pdyn: expected a number in 0\.01\.\.10000 nPa, got 1e-15/);
    expect(r.err).not.toMatch(/innerRe|computation failed/);
    // The smallest allowed pressure computes.
    expect((await cli('field', '--gsm', '5,0,0', ...T, '--pdyn', '0.01')).code).toBe(EXIT_OK);
  });

  it('`trace --time --help` reports the missing value of --time instead of printing help', async () => {
    const r = await cli('trace', '--time', '--help');
    expect(r.code).toBe(EXIT_USAGE);
    expect(r.err).toMatch(/--time: expected a value <ISO 8601 UTC>, got the flag "--help"/);
    expect(r.out).toBe('');
    // Help where a flag may stand still works.
    const h = await cli('trace', '--lat', '5', '--help');
    expect(h.code).toBe(EXIT_OK);
    expect(h.out).toMatch(/^Usage: /);
  });

  it('`sweep --vary bz --from 5000` names --from (and --to likewise)', async () => {
    const r = await cli('sweep', ...T, '--vary', 'bz', '--from', '5000', '--to', '-5', '--steps', '2');
    expect(r.code).toBe(EXIT_USAGE);
    expect(r.err).toMatch(/--from: with --vary bz expected an IMF Bz in -1000\.\.1000 nT, got 5000/);
    const t = await cli('sweep', ...T, '--vary', 'pdyn', '--from', '1', '--to', '0.001', '--steps', '2');
    expect(t.code).toBe(EXIT_USAGE);
    expect(t.err).toMatch(/^fieldline-atlas sweep: --to: /);
  });

  it('`field --geo 60,10,0` gives no "below the reference sphere" warning for a ground point; a point under the ground is warned', async () => {
    // WGS84: at 60° latitude the ellipsoid radius is ~6,364 km, inside the 6,371.2 km reference sphere.
    for (const geo of ['60,10,0', '89,0,0', '-75,140,0.2']) {
      const r = await cli('field', '--geo', geo, ...T, '--dst', '0');
      expect(r.code).toBe(EXIT_OK);
      expect(r.err, geo).not.toMatch(/below/);
    }
    const under = await cli('field', '--geo', '60,10,-5', ...T, '--dst', '0');
    expect(under.err).toMatch(/5\.000 km below the ground/);
  });

  it('no pressure or Bz warning at the edges of the fitted range (0.5, 8.5 nPa; −18, 15 nT); a warning just outside', () => {
    for (const p of [0.5, 8.5]) expect(shueMagnetopause(p, 0).warnings, `Pdyn ${p}`).toEqual([]);
    for (const bz of [-18, 15]) expect(shueMagnetopause(2, bz).warnings, `Bz ${bz}`).toEqual([]);
    expect(shueMagnetopause(0.4999, 0).warnings.join()).toMatch(/0\.5\.\.8\.5 nPa/);
    expect(shueMagnetopause(8.5001, 0).warnings.join()).toMatch(/0\.5\.\.8\.5 nPa/);
  });
});
