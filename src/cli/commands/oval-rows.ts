/**
 * The oval's boundaries for one prepared model as table rows: shared by `oval`
 * (one instant) and `oval --conditions` (every step of a series, in workers),
 * so both write the same columns.
 */
import { makeTracer, ovalBoundaries, sectorBoundaries, cgmPair, type BoundaryHint, type BoundaryPoint, type Hemisphere, type HemisphereBoundaries, type SectorBoundaries, type CgmPair } from '../../physics/mapping';
import type { PreparedModel } from '../../physics/field/model';
import type { CsvCell } from '../../io/csv';
import { CONDITION_COLUMNS, conditionCells, cgmJson, cgmNote } from '../common';
import { boundaryReason, type BoundaryKey } from '../reasons';

export interface OvalRowSettings {
  mlts: number[];
  hemispheres: Hemisphere[];
  altKm: number;
  /** Equatorial source distance of the equatorward edge, RE; null = from the conditions (storm-following). */
  sourceRe: number | null;
}

/**
 * Starting guesses carried from one series step to the next, per hemisphere and MLT. The boundary
 * searches verify their bracket, so a hint changes the cost, not the answer, wherever the open–closed
 * transition is unique along the meridian. Where it is not (northward IMF: measured in ~1 % of
 * sectors of an invented 1,000-step series, by up to ~15°), a hinted search may settle on another
 * transition than the full scan from the lowest latitude, as the single `oval`'s neighbour hints do.
 */
export type StepHints = Map<string, BoundaryHint>;

const BOUNDARY_KEYS: readonly BoundaryKey[] = ['openClosed', 'equatorward'];

/** CSV columns: time and conditions, then per boundary MAG, CGM (at the altitude and at the ground), geographic and the reason when missing. */
export const OVAL_COLUMNS: readonly string[] = [
  ...CONDITION_COLUMNS, 'source_re', 'alt_km', 'hemisphere', 'mlt_h',
  ...['open_closed', 'equatorward'].flatMap((b) => [
    `${b}_mag_lat_deg`, `${b}_cgm_lat_deg`, `${b}_ground_cgm_lat_deg`, `${b}_geo_lat_deg`, `${b}_geo_lon_deg`, `${b}_reason`,
  ]),
];

/** One boundary point with its CGM latitudes, or why it or its CGM is missing. */
interface BoundaryOut { point: BoundaryPoint | null; cgm: CgmPair | null; cgmLatDeg: number | null; groundCgmLatDeg: number | null; reason: string }

export interface OvalStep {
  hemispheres: HemisphereBoundaries[];
  /** Per hemisphere, per sector, per boundary key. */
  details: Map<SectorBoundaries, Record<BoundaryKey, BoundaryOut>>;
  rows: CsvCell[][];
  found: number;
  missing: number;
  sourceRe: number;
}

/** Boundaries, CGM latitudes and reasons for one model. */
export function ovalStep(model: PreparedModel, s: OvalRowSettings, hints?: StepHints): OvalStep {
  const tracer = makeTracer(model, { altKm: s.altKm, ellipsoid: true });
  const sourceRe = s.sourceRe ?? model.sourceRe;
  const hemispheres: HemisphereBoundaries[] = hints
    ? s.hemispheres.map((h) => ({
      hemisphere: h,
      sectors: s.mlts.map((mlt) => {
        const key = `${h} ${mlt}`;
        const sec = sectorBoundaries(model, tracer, h, mlt, { sourceRe }, hints.get(key) ?? null);
        const hint: BoundaryHint = {};
        if (sec.openClosed) hint.openClosedLatDeg = Math.abs(sec.openClosed.magLatDeg);
        if (sec.equatorward) hint.equatorwardLatDeg = Math.abs(sec.equatorward.magLatDeg);
        if (hint.openClosedLatDeg !== undefined) hints.set(key, hint); else hints.delete(key);
        return sec;
      }),
    }))
    : ovalBoundaries(model, tracer, s.hemispheres, s.mlts, { sourceRe });
  const cond = conditionCells(model);
  const details = new Map<SectorBoundaries, Record<BoundaryKey, BoundaryOut>>();
  const rows: CsvCell[][] = [];
  let found = 0, missing = 0;
  for (const h of hemispheres)
    for (const sec of h.sectors) {
      const d = {} as Record<BoundaryKey, BoundaryOut>;
      const cells: CsvCell[] = [...cond, sourceRe, s.altKm, h.hemisphere, sec.mltHours];
      for (const key of BOUNDARY_KEYS) {
        const p = sec[key];
        let out: BoundaryOut;
        if (p) {
          found++;
          const pair = cgmPair(model, p.geoLatDeg, p.geoLonDeg, s.altKm);
          out = {
            point: p,
            cgm: pair,
            cgmLatDeg: pair.atAlt.defined ? pair.atAlt.latDeg : null,
            groundCgmLatDeg: pair.ground.defined ? pair.ground.latDeg : null,
            reason: cgmNote(pair.atAlt, pair.ground),
          };
        } else {
          missing++;
          out = { point: null, cgm: null, cgmLatDeg: null, groundCgmLatDeg: null, reason: boundaryReason(sec, key) };
        }
        d[key] = out;
        cells.push(p?.magLatDeg, out.cgmLatDeg, out.groundCgmLatDeg, p?.geoLatDeg, p?.geoLonDeg, out.reason);
      }
      details.set(sec, d);
      rows.push(cells);
    }
  return { hemispheres, details, rows, found, missing, sourceRe };
}

/** The JSON of one step's hemispheres: each sector's boundaries with their CGM latitudes, or the reason they are missing. */
export function ovalStepJson(step: OvalStep): unknown[] {
  return step.hemispheres.map((h) => ({
    hemisphere: h.hemisphere,
    sectors: h.sectors.map((sec) => {
      const d = step.details.get(sec)!;
      const o: Record<string, unknown> = { mltHours: sec.mltHours };
      for (const key of BOUNDARY_KEYS) {
        const b = d[key];
        if (b.point && b.cgm) {
          o[key] = { ...b.point, cgm: cgmJson(b.cgm.atAlt), groundCgm: cgmJson(b.cgm.ground) };
        } else {
          o[key] = null;
          o[`${key}Reason`] = b.reason;
        }
      }
      return o;
    }),
  }));
}

/** One line on what was found: "47 of 48 boundaries found; 1 missing (reasons in the *_reason columns)". */
export function foundSummary(found: number, missing: number): string {
  const total = found + missing;
  return `${found} of ${total} boundaries found${missing ? `; ${missing} missing, each with its reason (JSON *Reason members, CSV *_reason columns)` : ''}`;
}
