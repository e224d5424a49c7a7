/** The auroral oval: boundaries around the clock in each hemisphere, and where a footpoint stands against them. */
import { InputError, requireInRange } from '../errors';
import type { PreparedModel } from '../field/model';
import type { Tracer } from '../trace/tracer';
import type { Hemisphere } from '../trace/footpoint';
import { sectorBoundaries, type BoundaryOptions, type SectorBoundaries } from './boundaries';
import { predictHint } from './hints';

/** MLT grid 0 ≤ h < 24 with the given step (hours). */
export function mltGrid(stepH: number): number[] {
  requireInRange('mltStep', stepH, 0.05, 12, 'h');
  const n = Math.round(24 / stepH);
  if (Math.abs(n * stepH - 24) > 1e-9) throw new InputError('mltStep', `${stepH} h must divide 24 h evenly (e.g. 0.5, 1, 2, 3)`);
  const out: number[] = [];
  for (let i = 0; i < n; i++) out.push(i * stepH);
  return out;
}

export interface HemisphereBoundaries {
  hemisphere: Hemisphere;
  sectors: SectorBoundaries[];
}

/**
 * The oval loop of one hemisphere: one sector per MLT, each search started from
 * the two previous sectors' answers. A generator, so a caller can pause or stop
 * between sectors (the worker checks for stale requests there).
 */
export function* ovalSectors(model: PreparedModel, tracer: Tracer, hemisphere: Hemisphere, mlts: readonly number[], opts: Partial<BoundaryOptions> = {}): Generator<SectorBoundaries, void, void> {
  let prev: SectorBoundaries | null = null, prev2: SectorBoundaries | null = null;
  for (const m of mlts) {
    const b = sectorBoundaries(model, tracer, hemisphere, m, opts, predictHint(prev, prev2));
    yield b;
    prev2 = prev;
    prev = b;
  }
}

/** Boundaries per MLT for the chosen hemispheres (ovalSectors collected). */
export function ovalBoundaries(model: PreparedModel, tracer: Tracer, hemispheres: Hemisphere[], mlts: number[], opts: Partial<BoundaryOptions> = {}): HemisphereBoundaries[] {
  return hemispheres.map((h) => ({ hemisphere: h, sectors: [...ovalSectors(model, tracer, h, mlts, opts)] }));
}

/** Where a footpoint stands against the oval. */
export type OvalRelation = 'poleward' | 'inside' | 'equatorward' | 'unknown';

/**
 * Where a footpoint stands against the oval at its MLT: poleward of the
 * open–closed boundary, inside (between the edges), or equatorward.
 */
export function ovalRelation(magLatDeg: number, sector: SectorBoundaries): OvalRelation {
  const a = Math.abs(magLatDeg);
  if (sector.openClosed && a >= Math.abs(sector.openClosed.magLatDeg)) return 'poleward';
  if (sector.equatorward && a < Math.abs(sector.equatorward.magLatDeg)) return 'equatorward';
  if (sector.openClosed) return 'inside'; // with or without an equatorward edge
  return 'unknown';
}
