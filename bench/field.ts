/**
 * Timing of the field terms (dipole + compression + IMF): ns per evaluation and
 * preparation ms per condition. Best of several trials (the machine is shared).
 * Run: npx tsx bench/field.ts
 */
import { addTiltedDipoleField } from '../src/physics/dipole';
import { shueMagnetopause } from '../src/physics/magnetopause';
import { prepareCompression, type FieldWriter } from '../src/physics/compression';
import { prepareImf } from '../src/physics/imf';

export interface FieldTiming {
  nsPerEval: number;
  compressionOnlyNs: number;
  prepareMs: number;
  nTerms: number;
}

export function benchFieldTerms(calls = 1_000_000, trials = 5): FieldTiming {
  const b0 = 29733;
  const tilt = 0.35;
  const st = Math.sin(tilt), ct = Math.cos(tilt);
  const shielded: FieldWriter = (o, x, y, z) => {
    o[0] = 0; o[1] = 0; o[2] = 0;
    addTiltedDipoleField(o, x, y, z, b0, st, ct);
  };
  const mp = shueMagnetopause(2, -5, 3);
  let prepareMs = Infinity;
  let comp = prepareCompression(mp, shielded);
  for (let t = 0; t < 20; t++) {
    const t0 = performance.now();
    comp = prepareCompression(mp, shielded);
    prepareMs = Math.min(prepareMs, performance.now() - t0);
  }
  const imf = prepareImf(3, -5, 0.2);
  const out = new Float64Array(3);
  const ev = comp.evaluate, evi = imf.evaluate;
  // Points spread over the dayside and near tail inside the boundary.
  const run = (n: number, full: boolean): number => {
    let acc = 0;
    for (let i = 0; i < n; i++) {
      const x = 8 - (i % 997) * 0.03;
      const y = ((i * 7) % 1009) * 0.016 - 8;
      const z = ((i * 13) % 1013) * 0.016 - 8;
      out[0] = 0; out[1] = 0; out[2] = 0;
      if (full) {
        addTiltedDipoleField(out, x, y, z, b0, st, ct);
        evi(out, x, y, z);
      }
      ev(out, x, y, z);
      acc += out[2];
    }
    return acc;
  };
  // CPU time of this process (user), so other load on a shared machine counts less.
  const cpuMs = (): number => (typeof process !== 'undefined' ? process.cpuUsage().user / 1000 : performance.now());
  let best = Infinity, bestC = Infinity, sink = 0;
  sink += run(200_000, true) + run(200_000, false);
  for (let t = 0; t < trials; t++) {
    let t0 = cpuMs();
    sink += run(calls, true);
    best = Math.min(best, ((cpuMs() - t0) * 1e6) / calls);
    t0 = cpuMs();
    sink += run(calls, false);
    bestC = Math.min(bestC, ((cpuMs() - t0) * 1e6) / calls);
  }
  if (!Number.isFinite(sink)) throw new Error('non-finite field in benchmark');
  return { nsPerEval: best, compressionOnlyNs: bestC, prepareMs, nTerms: comp.nTerms };
}

if (typeof process !== 'undefined' && process.argv[1] && import.meta.url.endsWith(process.argv[1].split('/').pop() ?? '')) {
  console.log(benchFieldTerms());
}
