import { describe, it, expect } from 'vitest';
import { parseFlags, parseNumberText, flagHelp, UsageError, type FlagSpec } from '../../src/cli/args';

// Source: the CLI contract, references §13 (flag names, "message naming the flag and the allowed values").
const specs: FlagSpec[] = [
  { name: 'pdyn', kind: 'number', meta: '<nPa>', unit: 'nPa', above: 0, max: 1e4, help: 'pressure' },
  { name: 'bz', kind: 'number', meta: '<nT>', unit: 'nT', min: -1000, max: 1000, help: 'bz' },
  { name: 'steps', kind: 'integer', meta: '<n>', min: 1, max: 1000, help: 'n', required: false },
  { name: 'internal', kind: 'enum', values: ['dipole', 'igrf'], help: 'main field' },
  { name: 'gsm', kind: 'triple', meta: '<x,y,z>', help: 'point' },
  { name: 'mlt', kind: 'numbers', min: 0, max: 24, help: 'mlt' },
  { name: 'points', kind: 'switch', help: 'points' },
];

function usage(words: string[], s = specs): UsageError {
  try {
    parseFlags(words, s, 'demo');
  } catch (e) {
    expect(e).toBeInstanceOf(UsageError);
    return e as UsageError;
  }
  throw new Error(`no error for ${words.join(' ')}`);
}

describe('flag parsing', () => {
  it('reads --name value and --name=value, negative numbers as values, switches', () => {
    const f = parseFlags(['--bz', '-5', '--pdyn=2.5', '--points', '--gsm', '-6.6,0,1e-1', '--mlt', '0,12.5', '--internal', 'igrf'], specs, 'demo');
    expect(f).toEqual({ bz: -5, pdyn: 2.5, points: true, gsm: [-6.6, 0, 0.1], mlt: [0, 12.5], internal: 'igrf' });
  });

  it('parses numbers strictly', () => {
    for (const ok of ['1', '-1.5', '+2', '.5', '3.', '1e3', '-2E-2']) expect(parseNumberText(ok), ok).not.toBeNull();
    for (const bad of ['', 'abc', '0x10', 'Infinity', 'NaN', '1e', '1,5', '--5']) expect(parseNumberText(bad), bad).toBeNull();
  });

  it('names the flag, the allowed values and what was given', () => {
    expect(usage(['--internal', 'foo']).message).toBe('--internal: expected dipole or igrf, got "foo"');
    expect(usage(['--bz', 'abc']).message).toBe('--bz: expected a number in -1000..1000 nT, got "abc"');
    expect(usage(['--bz', '2000']).message).toBe('--bz: expected a number in -1000..1000 nT, got 2000');
    expect(usage(['--pdyn', '0']).message).toBe('--pdyn: expected a number > 0 and ≤ 10000 nPa, got 0');
    expect(usage(['--steps', '2.5']).message).toBe('--steps: expected a whole number in 1..1000, got "2.5"');
    expect(usage(['--gsm', '1,2']).message).toMatch(/^--gsm: expected three comma-separated numbers <x,y,z>, got "1,2"/);
    expect(usage(['--mlt', '0,25']).message).toMatch(/^--mlt: expected item 2 as a number in 0..24/);
  });

  it('lists the valid flags for an unknown one', () => {
    const e = usage(['--pdyn', '2', '--colour', 'red']);
    expect(e.flag).toBe('--colour');
    expect(e.message).toMatch(/unknown flag for demo; valid flags: --pdyn, --bz, --steps, --internal, --gsm, --mlt, --points/);
  });

  it('refuses a missing value, a repeated flag, a value on a switch and a stray word', () => {
    expect(usage(['--bz']).message).toBe('--bz: expected a value <nT>');
    expect(usage(['--bz', '1', '--bz', '2']).message).toBe('--bz: given more than once');
    expect(usage(['--points=yes']).message).toMatch(/--points: is a switch/);
    expect(usage(['stray']).message).toMatch(/unexpected argument "stray"/);
  });

  it('requires required flags', () => {
    const req: FlagSpec[] = [{ name: 'lat', kind: 'number', meta: '<deg>', help: 'lat', required: true }];
    expect(usage([], req).message).toBe('--lat: is required for demo (<deg>)');
  });

  it('help lists every flag with its default', () => {
    const h = flagHelp([{ name: 'alt-km', kind: 'number', meta: '<km>', help: 'altitude', defaultText: '110' }, ...specs]);
    for (const s of specs) expect(h).toContain(`--${s.name}`);
    expect(h).toMatch(/--alt-km <km>\s+altitude \(default 110\)/);
  });
});
