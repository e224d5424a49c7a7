import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { cli } from './helpers';
import { EXIT_OK, EXIT_FAILURE, EXIT_USAGE, EXIT_ROWS_FAILED } from '../../src/cli/exit-codes';

// Source: the CLI contract (references §13): whatever the arguments, a command ends with one of the
// documented exit codes, never throws, never prints a stack trace, and a usage error names what was wrong.
// Random argument vectors from each command's flags, plausible and hostile values mixed; bounded, seeded.
// Only cheap runs are let through to the engine (small sweeps, coarse ovals); the rest must fail fast.

const DOCUMENTED = new Set([EXIT_OK, EXIT_FAILURE, EXIT_USAGE, EXIT_ROWS_FAILED]);
const STACK = /\n\s+at .+:\d+:\d+|TypeError|ReferenceError|RangeError|SyntaxError|undefined is not|Cannot read prop/;

const COMMON = ['--time', '--pdyn', '--bz', '--by', '--dst', '--speed', '--tilt-deg', '--internal', '--magnetopause', '--tail', '--imf-efficiency', '--alt-km', '--format', '--help', '--bogus'];
const FLAGS: Record<string, string[]> = {
  field: ['--gsm', '--geo'],
  trace: ['--lat', '--lon', '--height-km', '--coords', '--points', '--conjugate-alt-km'],
  oval: ['--mlt-step', '--hemisphere', '--source-re', '--mlt', '--series-format', '--workers', '--conditions'],
  sweep: ['--vary', '--from', '--to', '--steps', '--mlt', '--hemisphere', '--source-re'],
  timeline: ['--sites', '--conditions', '--from', '--to', '--step-min', '--sun-limit-deg', '--max-zenith-deg', '--series-format', '--conjugate-alt-km'],
};

const value = fc.oneof(
  fc.constantFrom('0', '-5', '2', '60', '1e-15', '1e400', 'NaN', 'Infinity', '0x3C', '', ' ', '--', '-', '=', ',', '1,2', '5,0,0', '60,10,0', '1,2,3,4',
    'igrf', 'dipole', 'on', 'off', 'csv', 'json', 'geojson', 'north', 'both', 'bz', 'pdyn', 'geo', 'mag', '2025-03-20T22:00:00Z', '2031-01-01T00:00:00Z',
    'yesterday', '24', '0.05', '7', '1000', '/nonexistent/file.csv', 'examples/sites.csv', 'examples/series.csv', '2025-03-20T23:00:00Z', '\u0000', 'é', '"'),
  fc.double({ noNaN: false }).map(String),
  fc.string({ maxLength: 8 }),
);

function argv(cmd: string) {
  const flags = [...COMMON, ...FLAGS[cmd]];
  return fc.array(fc.tuple(fc.constantFrom(...flags), fc.option(value, { nil: undefined }), fc.boolean()), { maxLength: 6 })
    .map((parts) => {
      const words: string[] = [cmd];
      for (const [f, v, eq] of parts) {
        if (v === undefined) words.push(f);
        else if (eq) words.push(`${f}=${v}`);
        else words.push(f, v);
      }
      return words;
    })
    // Keep the engine's work small: coarse MLT steps, short sweeps, no real series.
    .filter((w) => !w.some((x, i) => (w[i - 1] === '--steps' && Number(x) > 3) || x.startsWith('--steps=') || (w[i - 1] === '--mlt-step' && Number(x) < 3) || x.startsWith('--mlt-step=') || (w[i - 1] === '--step-min' && Number(x) < 60) || x.startsWith('--step-min=')))
    .map((w) => (w.includes('--mlt-step') || w[0] !== 'oval' ? w : [...w, '--mlt-step', '6']));
}

describe('random argument vectors (fast-check, seeded)', () => {
  for (const cmd of Object.keys(FLAGS)) {
    it(`${cmd}: documented exit codes only, no crash, no stack trace`, async () => {
      await fc.assert(
        fc.asyncProperty(argv(cmd), async (words) => {
          let r;
          try {
            r = await cli(...words);
          } catch (e) {
            throw new Error(`run threw for ${JSON.stringify(words)}: ${String(e)}`);
          }
          expect(DOCUMENTED.has(r.code), `exit ${r.code} for ${JSON.stringify(words)}`).toBe(true);
          expect(STACK.test(r.err), `stack-like text for ${JSON.stringify(words)}: ${r.err}`).toBe(false);
          if (r.code === EXIT_USAGE) expect(r.err, JSON.stringify(words)).toMatch(/^fieldline-atlas( \w+)?: .+\n\(see: /);
          if (r.code === EXIT_OK) expect(r.out.length).toBeGreaterThan(0);
        }),
        { seed: 20261203, numRuns: 60 },
      );
    }, 60_000);
  }
});
