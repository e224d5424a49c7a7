/**
 * Writes the invented demo storm (our own numbers, no real event):
 * examples/demo-storm.csv (our CSV, 72 hourly steps) and
 * examples/demo-storm-hourly.txt (the same storm's main phase, 24 hand-made
 * lines in the community hourly word layout, references §11, one hour with a
 * fill value to show a skipped gap). The storm index is integrated from the
 * invented drivers with the O'Brien–McPherron injection–decay model
 * (references §10), so "given" and "estimated" can be compared in the app.
 * Run: npx tsx examples/gen-demo-storm.ts
 */
import { writeFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { DstStarStepper, dstFromCorrected } from '../src/physics/field/storm-index';

const START_MS = Date.UTC(2027, 9, 14, 0, 0, 0); // invented date, inside the IGRF-14 span
const STEPS = 72;

interface Row { ms: number; pdyn: number; density: number; speed: number; bz: number; by: number; dst: number }

/** Smooth step from 0 to 1 between hours a and b. */
const ramp = (h: number, a: number, b: number) => (h <= a ? 0 : h >= b ? 1 : 0.5 - 0.5 * Math.cos(Math.PI * (h - a) / (b - a)));

function drivers(h: number): Omit<Row, 'ms' | 'dst' | 'pdyn'> {
  // Quiet until hour 13, shock at 14, southward sheath and cloud 15–33, recovery after.
  const shock = ramp(h, 13, 14);
  const cloud = ramp(h, 14.5, 17) * (1 - ramp(h, 31, 36));
  const speed = 390 + 380 * shock - 170 * ramp(h, 36, 71);
  const density = 5.5 + 0.8 * Math.sin(h / 2.9) + 16 * shock * (1 - ramp(h, 14, 22)) + 3 * ramp(h, 14, 22) * (1 - ramp(h, 30, 40)) + 1.2 * Math.sin(h / 1.9) * cloud;
  const bz = 1.8 - 0.6 * Math.sin(h / 2.3) - 28.5 * cloud + 4 * Math.sin(h / 1.7) * cloud + 2.5 * ramp(h, 36, 40) * Math.sin(h / 3.1);
  const by = -2.5 + 9 * Math.sin(h / 5.3) * (0.3 + cloud);
  return { speed, density, bz, by };
}

const rows: Row[] = [];
const stepper = new DstStarStepper(-4);
for (let i = 0; i < STEPS; i++) {
  const d = drivers(i);
  const pdyn = 2.0e-6 * d.density * d.speed * d.speed; // references §3
  if (i > 0) {
    const p = drivers(i - 1);
    stepper.step(1, p.speed, p.bz);
  }
  rows.push({ ms: START_MS + i * 3_600_000, pdyn, ...d, dst: dstFromCorrected(stepper.dstStarNt, pdyn) });
}

const f = (v: number, n: number) => v.toFixed(n);
const iso = (ms: number) => new Date(ms).toISOString().slice(0, 19) + 'Z';
const csv = ['time,pdyn_npa,density_cm3,speed_kms,bz_nt,by_nt,dst_nt']
  .concat(rows.map((r) => [iso(r.ms), f(r.pdyn, 2), f(r.density, 1), f(r.speed, 0), f(r.bz, 1), f(r.by, 1), f(r.dst, 0)].join(',')))
  .join('\n') + '\n';

/** One hourly line: 55 blank-separated right-aligned words; words we do not read hold plausible filler. */
function hourlyLine(r: Row, bzText?: string): string {
  const d = new Date(r.ms);
  const doy = Math.floor((r.ms - Date.UTC(d.getUTCFullYear(), 0, 1)) / 86_400_000) + 1;
  const w: string[] = [];
  for (let i = 1; i <= 55; i++) {
    switch (i) {
      case 1: w.push(String(d.getUTCFullYear())); break;
      case 2: w.push(String(doy)); break;
      case 3: w.push(String(d.getUTCHours())); break;
      case 16: w.push(f(r.by, 1)); break;
      case 17: w.push(bzText ?? f(r.bz, 1)); break;
      case 24: w.push(f(r.density, 1)); break;
      case 25: w.push(`${f(r.speed, 0)}.`); break;
      case 28: w.push('.040'); break;
      case 29: w.push(f(1.67e-6 * r.density * r.speed * r.speed * 1.16, 2)); break;
      case 41: w.push(f(r.dst, 0)); break;
      default: w.push(f(((i * 37) % 200) / 10, 1));
    }
  }
  return w.map((t, i) => t.padStart(i < 3 ? 4 : 7)).join('');
}
const hourly = rows.slice(12, 36).map((r, k) => hourlyLine(r, k === 9 ? '999.9' : undefined)).join('\n') + '\n';

const dir = resolve(import.meta.dirname);
writeFileSync(resolve(dir, 'demo-storm.csv'), csv);
writeFileSync(resolve(dir, 'demo-storm-hourly.txt'), hourly);
const minDst = Math.min(...rows.map((r) => r.dst));
console.log(`demo storm: ${rows.length} steps, min Dst ${minDst.toFixed(0)} nT, max Pdyn ${Math.max(...rows.map((r) => r.pdyn)).toFixed(1)} nPa, min Bz ${Math.min(...rows.map((r) => r.bz)).toFixed(1)} nT`);
