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
 * open–closed boundary, inside (between the two edges, both found), or
 * equatorward of the equatorward edge; 'unknown' when the edge that would decide
 * is missing (ovalRelationReason says which and why).
 */
export function ovalRelation(magLatDeg: number, sector: SectorBoundaries): OvalRelation {
  return relationAndReason(magLatDeg, sector).relation;
}

/** Why ovalRelation is 'unknown' (plain words, naming the missing edge and its reason); null when it is known. */
export function ovalRelationReason(magLatDeg: number, sector: SectorBoundaries): string | null {
  return relationAndReason(magLatDeg, sector).reason;
}

function relationAndReason(magLatDeg: number, sector: SectorBoundaries): { relation: OvalRelation; reason: string | null } {
  const a = Math.abs(magLatDeg);
  if (!Number.isFinite(a)) return { relation: 'unknown', reason: 'no magnetic latitude' };
  const { openClosed: oc, equatorward: eq } = sector;
  if (oc && a >= Math.abs(oc.magLatDeg)) return { relation: 'poleward', reason: null };
  if (eq && a < Math.abs(eq.magLatDeg)) return { relation: 'equatorward', reason: null };
  if (oc && eq) return { relation: 'inside', reason: null };
  const why = (what: string, r: string | null | undefined) => `${what} not found${r ? ` (${r})` : ''}`;
  if (!eq && !oc) return { relation: 'unknown', reason: `${why('open–closed boundary', sector.openClosedReason)}; ${why('equatorward edge', sector.equatorwardReason)}` };
  return eq
    ? { relation: 'unknown', reason: `poleward of the equatorward edge, ${why('open–closed boundary', sector.openClosedReason)}` }
    : { relation: 'unknown', reason: `equatorward of the open–closed boundary, ${why('equatorward edge', sector.equatorwardReason)}` };
}
