/**
 * Sweeps: boundary latitudes at one MLT as Pdyn or Bz varies, other
 * conditions held. Pdyn steps are logarithmic, Bz steps linear.
 */
import type { FieldConditions } from '../field/conditions';
import { InputError, expectedGot, requireInRange } from '../errors';
import { prepareModel } from '../field/model';
import { makeTracer } from './lines';
import { sectorBoundaries, DEFAULT_BOUNDARY_OPTIONS, type SectorBoundaries } from './boundaries';

export interface SweepOptions {
  vary: 'pdyn' | 'bz';
  from: number;
  to: number;
  steps: number;
  mltHours: number;
  altKm: number;
  /** Equatorial source distance, RE; undefined = each step's storm-following one (model.sourceRe). */
  sourceRe?: number;
  latTolDeg?: number;
}

export interface SweepRows {
  values: number[];
  north: SectorBoundaries[];
  south: SectorBoundaries[];
  /** Source distance used at each step, RE. */
  sourceRe: number[];
  /** Warnings of all steps, each once. */
  warnings: string[];
}

/** The parameter values of a sweep (log-spaced for pdyn, linear for bz). */
function sweepValues(o: Pick<SweepOptions, 'vary' | 'from' | 'to' | 'steps'>): number[] {
  if (o.vary !== 'pdyn' && o.vary !== 'bz') throw new InputError('vary', expectedGot('pdyn or bz', o.vary, true));
  const steps = requireInRange('steps', o.steps, 1, 1000);
  if (!Number.isInteger(steps)) throw new InputError('steps', expectedGot('a whole number 1..1000', steps));
  const from = requireInRange('from', o.from, -1000, 1e4);
  const to = requireInRange('to', o.to, -1000, 1e4);
  if (o.vary === 'pdyn' && (from <= 0 || to <= 0)) throw new InputError(from <= 0 ? 'from' : 'to', 'dynamic pressure must be > 0 nPa');
  const out: number[] = [];
  for (let i = 0; i < steps; i++) {
    const f = steps === 1 ? 0 : i / (steps - 1);
    out.push(o.vary === 'pdyn' ? Math.exp(Math.log(from) + f * (Math.log(to) - Math.log(from))) : from + f * (to - from));
  }
  return out;
}

/** Run a sweep; `between` is awaited before each step (lets a worker yield or cancel). */
export async function sweepBoundaries(c: FieldConditions, o: SweepOptions, between?: () => Promise<void>): Promise<SweepRows> {
  const values = sweepValues(o);
  requireInRange('mlt', o.mltHours, 0, 24, 'h');
  const north: SectorBoundaries[] = [];
  const south: SectorBoundaries[] = [];
  const sourceRe: number[] = [];
  const warnings = new Set<string>();
  for (const v of values) {
    if (between) await between();
    const m = prepareModel({ ...c, ...(o.vary === 'pdyn' ? { pdynNpa: v } : { bzNt: v }) });
    for (const w of m.warnings) warnings.add(w);
    const t = makeTracer(m, { altKm: o.altKm, ellipsoid: true });
    const opts = { sourceRe: o.sourceRe ?? m.sourceRe, latTolDeg: o.latTolDeg ?? DEFAULT_BOUNDARY_OPTIONS.latTolDeg };
    sourceRe.push(opts.sourceRe);
    north.push(sectorBoundaries(m, t, 'north', o.mltHours % 24, opts));
    south.push(sectorBoundaries(m, t, 'south', o.mltHours % 24, opts));
  }
  return { values, north, south, sourceRe, warnings: [...warnings] };
}
