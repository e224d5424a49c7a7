/**
 * The storm index through a series, row by row in file order (references §10):
 *  - a row that carries an index (dst_nt / sym_h_nt, or the index word of a data
 *    file) uses it, and re-seeds the integration with its pressure-corrected Dst*;
 *  - a row without one gets Dst* by integrating the O'Brien–McPherron (2000)
 *    injection–decay equation d(Dst*)/dt = Q(VBs) − Dst* / τ(VBs) from the previous
 *    good row, whose drivers (speed, Bz) are held constant until this row's time
 *    (zero-order hold, also over skipped or broken rows); the first such row of a
 *    series starts from the steady state Q·τ of its own drivers; a row whose time
 *    lies before the previous good row's restarts from its steady state, with a warning.
 * The index handed to the model is Dst = Dst* + b√Pdyn − c (the same pressure
 * correction the model applies), so the model's Dst* is the integrated one.
 * Every shard of a batch feeds every good row of the file, so all shards give the
 * same index for a row as one run. Pure: no Node or DOM APIs.
 */
import {
  DstStarStepper, steadyDstStar, pressureCorrectedDst, dstFromCorrected, requireSpeed, NOMINAL_SPEED_KMS, DST_LIMIT_NT,
} from '../../physics/field/storm-index';
import type { SeriesValue } from './record';

/**
 * Where a row's storm index came from:
 * `dst` / `sym_h`: given by the series; `integrated`: O'Brien–McPherron through the series.
 */
export type SeriesDstSource = 'dst' | 'sym_h' | 'integrated';

export interface RowStorm {
  /** The index for the model (Dst or SYM-H, nT). */
  dstNt: number;
  dstSource: SeriesDstSource;
  /** The solar-wind speed used by the estimate, km/s (the row's, else the fallback). */
  speedKms: number;
  /** Set when the integration restarted (time going backwards). */
  warning: string | null;
}

const MS_PER_HOUR = 3.6e6;

function clampStar(v: number): number {
  return Math.max(-DST_LIMIT_NT, Math.min(DST_LIMIT_NT, v));
}

export class StormIndexTrack {
  private stepper: DstStarStepper | null = null;
  private lastMs = NaN;
  private lastSpeed = NaN;
  private lastBz = NaN;
  private lastLine = 0;

  /** `fallbackSpeedKms`: the speed of rows without one (default the nominal 400 km/s, storm-index.ts). */
  constructor(private readonly fallbackSpeedKms: number = NOMINAL_SPEED_KMS) {}

  /** The storm index of the next good row (call for every good row, in file order). */
  next(v: SeriesValue, line: number): RowStorm {
    // Checked before the state changes: a bad row leaves the track as it was (its drivers are not held).
    const speedKms = requireSpeed('speed_kms', v.speedKms ?? this.fallbackSpeedKms);
    let warning: string | null = null;
    let out: RowStorm;
    if (v.dstNt !== undefined) {
      this.stepper = new DstStarStepper(clampStar(pressureCorrectedDst(v.dstNt, v.pdynNpa)));
      out = { dstNt: v.dstNt, dstSource: v.dstKind ?? 'dst', speedKms, warning: null };
    } else {
      if (this.stepper === null) {
        this.stepper = new DstStarStepper(clampStar(steadyDstStar(speedKms, v.bzNt)));
      } else if (v.timeMs < this.lastMs) {
        warning = `time is earlier than line ${this.lastLine}: the storm-index integration restarted from the steady state (put the series in time order)`;
        this.stepper = new DstStarStepper(clampStar(steadyDstStar(speedKms, v.bzNt)));
      } else {
        this.stepper.step((v.timeMs - this.lastMs) / MS_PER_HOUR, this.lastSpeed, this.lastBz);
      }
      const dst = dstFromCorrected(this.stepper.dstStarNt, v.pdynNpa);
      out = { dstNt: Math.max(-DST_LIMIT_NT, Math.min(DST_LIMIT_NT, dst)), dstSource: 'integrated', speedKms, warning };
    }
    this.lastMs = v.timeMs;
    this.lastSpeed = speedKms;
    this.lastBz = v.bzNt;
    this.lastLine = line;
    return out;
  }
}
