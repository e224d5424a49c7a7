/**
 * Storm index: the pressure-corrected Dst* and the injection–decay equation that
 * estimates it from the solar wind (references §10).
 *
 * Pressure correction: Dst* = Dst − b·√Pdyn + c removes the magnetopause-current part of
 * the index (b√Pdyn) and the quiet-time offset (c). Constants: O'Brien & McPherron (2000),
 * J. Geophys. Res. 105, 7707: b = 7.26 nT/√nPa, c = 11 nT (the default); Burton, McPherron &
 * Russell (1975), J. Geophys. Res. 80, 4204: b = 15.8, c = 20 (from memory).
 *
 * Injection–decay: d(Dst*)/dt = Q − Dst* / τ. With VBs = V·max(0, −Bz)·1e-3 mV/m (V in km/s,
 * Bz GSM nT):
 *  - O'Brien & McPherron (2000): Q = −4.4·(VBs − 0.49) nT/h for VBs > 0.49 mV/m, else 0;
 *    τ = 2.40·exp(9.74/(4.69 + VBs)) h;
 *  - Burton et al. (1975): Q = −5.4·(VBs − 0.5) nT/h for VBs > 0.5 mV/m (d = −1.5e-3 nT/s
 *    per mV/m), τ = 7.7 h (both from memory).
 * Steady state Dst* = Q·τ (derived). Over a step with constant drivers the equation is solved
 * exactly: D(t + Δt) = Qτ + (D(t) − Qτ)·exp(−Δt/τ) (derived), so the stepper is stable for any
 * step and reproduces the steady state for a constant series.
 *
 * Pure functions; no allocation in `step`.
 */
import { InputError, requireFinite, requireInRange } from '../errors';

/** Largest |Dst| accepted, nT (the greatest storms on record are a few times smaller). */
export const DST_LIMIT_NT = 2000;
/** Largest solar-wind speed accepted, km/s. */
export const SPEED_LIMIT_KMS = 3000;
/**
 * Solar-wind speed used when only the pressure is given, km/s: the typical slow solar wind
 * near 1 AU (≈ 400 km/s; common practice, from memory). Documented in the README's storm notes.
 */
export const NOMINAL_SPEED_KMS = 400;

/** The two constants of the pressure correction Dst* = Dst − b√Pdyn + c. */
export interface PressureCorrection {
  /** b, nT per √nPa. */
  bNtPerSqrtNpa: number;
  /** c, nT. */
  cNt: number;
}

/** O'Brien & McPherron (2000), J. Geophys. Res. 105, 7707 (references §10). */
export const OBRIEN_MCPHERRON_CORRECTION: Readonly<PressureCorrection> = Object.freeze({ bNtPerSqrtNpa: 7.26, cNt: 11 });
/** Burton, McPherron & Russell (1975), J. Geophys. Res. 80, 4204 (references §10; from memory). */
export const BURTON_CORRECTION: Readonly<PressureCorrection> = Object.freeze({ bNtPerSqrtNpa: 15.8, cNt: 20 });

/** Validate a storm index (Dst or SYM-H), nT. */
export function requireDst(field: string, dstNt: unknown): number {
  return requireInRange(field, dstNt, -DST_LIMIT_NT, DST_LIMIT_NT, 'nT');
}

/** Validate a solar-wind speed, km/s (0 < V ≤ 3000). */
export function requireSpeed(field: string, speedKms: unknown): number {
  const v = requireFinite(field, speedKms);
  if (!(v > 0) || v > SPEED_LIMIT_KMS) {
    throw new InputError(field, `${v} km/s is outside the allowed range: above 0 and at most ${SPEED_LIMIT_KMS} km/s`);
  }
  return v;
}

/** Dst* = Dst − b√Pdyn + c, nT. */
export function pressureCorrectedDst(dstNt: number, pdynNpa: number, k: Readonly<PressureCorrection> = OBRIEN_MCPHERRON_CORRECTION): number {
  requireDst('dstNt', dstNt);
  requireInRange('pdynNpa', pdynNpa, 0, 1e4, 'nPa');
  return dstNt - k.bNtPerSqrtNpa * Math.sqrt(pdynNpa) + k.cNt;
}

/** Inverse of the correction: Dst = Dst* + b√Pdyn − c, nT. */
export function dstFromCorrected(dstStarNt: number, pdynNpa: number, k: Readonly<PressureCorrection> = OBRIEN_MCPHERRON_CORRECTION): number {
  return dstStarNt + k.bNtPerSqrtNpa * Math.sqrt(pdynNpa) - k.cNt;
}

/** The rectified solar-wind electric field V·Bs, mV/m (V km/s, Bz GSM nT). */
export function vbsMvPerM(speedKms: number, bzNt: number): number {
  return speedKms * Math.max(0, -bzNt) * 1e-3;
}

export type InjectionDecayModel = 'obrien-mcpherron' | 'burton';

/** Injection Q (nT/h, ≤ 0) and decay time τ (h) for a driver VBs (mV/m). Writes [Q, τ] into out. */
export function injectionDecay(out: Float64Array, vbs: number, model: InjectionDecayModel = 'obrien-mcpherron'): Float64Array {
  if (model === 'burton') {
    out[0] = vbs > 0.5 ? -5.4 * (vbs - 0.5) : 0;
    out[1] = 7.7;
  } else {
    out[0] = vbs > 0.49 ? -4.4 * (vbs - 0.49) : 0;
    out[1] = 2.4 * Math.exp(9.74 / (4.69 + vbs));
  }
  return out;
}

const qt = new Float64Array(2);

/** Steady state of the injection–decay equation, Dst* = Q·τ, nT (references §10). */
export function steadyDstStar(speedKms: number, bzNt: number, model: InjectionDecayModel = 'obrien-mcpherron'): number {
  requireSpeed('speedKms', speedKms);
  requireInRange('bzNt', bzNt, -1000, 1000, 'nT');
  injectionDecay(qt, vbsMvPerM(speedKms, bzNt), model);
  return qt[0] * qt[1];
}

/**
 * Incremental integrator of d(Dst*)/dt = Q − Dst* / τ through a series (batch rows, app
 * series). Each `step` holds the drivers constant over the step and solves exactly.
 */
export class DstStarStepper {
  /** Current Dst*, nT. */
  dstStarNt: number;
  private readonly model: InjectionDecayModel;
  private readonly buf = new Float64Array(2);

  constructor(initialDstStarNt = 0, model: InjectionDecayModel = 'obrien-mcpherron') {
    this.dstStarNt = requireInRange('initialDstStarNt', initialDstStarNt, -DST_LIMIT_NT, DST_LIMIT_NT, 'nT');
    if (model !== 'obrien-mcpherron' && model !== 'burton') {
      throw new InputError('model', `expected "obrien-mcpherron" or "burton", got "${String(model)}"`);
    }
    this.model = model;
  }

  /** Advance by dtHours (≥ 0) under constant speed (km/s) and Bz (nT); returns the new Dst*. */
  step(dtHours: number, speedKms: number, bzNt: number): number {
    if (!(dtHours >= 0) || !Number.isFinite(dtHours)) throw new InputError('dtHours', `expected a finite step ≥ 0 h, got ${dtHours}`);
    requireSpeed('speedKms', speedKms);
    requireInRange('bzNt', bzNt, -1000, 1000, 'nT');
    injectionDecay(this.buf, vbsMvPerM(speedKms, bzNt), this.model);
    const steady = this.buf[0] * this.buf[1];
    this.dstStarNt = steady + (this.dstStarNt - steady) * Math.exp(-dtHours / this.buf[1]);
    return this.dstStarNt;
  }
}

/**
 * Dst* through a series: row i's drivers act from time i to time i + 1 (times in ms, increasing);
 * result[0] = initial, result[i] = Dst* at time i. Speeds may be NaN/undefined rows: the
 * nominal speed is used there.
 */
export function integrateDstStar(timesMs: ArrayLike<number>, speedKms: ArrayLike<number>, bzNt: ArrayLike<number>, initialDstStarNt = 0, model: InjectionDecayModel = 'obrien-mcpherron'): Float64Array {
  const n = timesMs.length;
  if (speedKms.length !== n || bzNt.length !== n) {
    throw new InputError('series', `times, speeds and Bz must have the same length (got ${n}, ${speedKms.length}, ${bzNt.length})`);
  }
  const out = new Float64Array(n);
  if (n === 0) return out;
  const s = new DstStarStepper(initialDstStarNt, model);
  out[0] = s.dstStarNt;
  for (let i = 1; i < n; i++) {
    const dt = (timesMs[i] - timesMs[i - 1]) / 3.6e6;
    if (!(dt >= 0)) throw new InputError('time', `series times must increase; row ${i} is earlier than row ${i - 1}`);
    const v = Number.isFinite(speedKms[i - 1]) ? speedKms[i - 1] : NOMINAL_SPEED_KMS;
    out[i] = s.step(dt, v, bzNt[i - 1]);
  }
  return out;
}

/** The storm index a model uses, and where it came from (metadata of every export). */
export interface StormState {
  /** 'given': the user's Dst/SYM-H; 'estimated': the O'Brien–McPherron steady state for the solar wind. */
  dstSource: 'given' | 'estimated';
  /** The index (given, or the estimate converted back with the pressure correction), nT. */
  dstNt: number;
  /** Pressure-corrected index used by the ring current, nT. */
  dstStarNt: number;
  /** Solar-wind speed used, km/s, and whether it was given or the nominal value. */
  speedKms: number;
  speedSource: 'given' | 'nominal';
  warnings: string[];
}

/** Resolve the storm index for one condition (given, or estimated from Bz and speed). */
export function stormState(pdynNpa: number, bzNt: number, dstNt: number | null, speedKms: number | null): StormState {
  const speed = speedKms === null ? NOMINAL_SPEED_KMS : requireSpeed('speedKms', speedKms);
  const speedSource = speedKms === null ? 'nominal' : 'given';
  if (dstNt !== null) {
    const d = requireDst('dstNt', dstNt);
    return { dstSource: 'given', dstNt: d, dstStarNt: pressureCorrectedDst(d, pdynNpa), speedKms: speed, speedSource, warnings: [] };
  }
  const star = steadyDstStar(speed, bzNt);
  // Fixed text (the values are in the metadata), so a sweep counts it once.
  const how = speedKms === null ? `the nominal solar-wind speed ${NOMINAL_SPEED_KMS} km/s` : 'the given solar-wind speed';
  return {
    dstSource: 'estimated',
    dstNt: dstFromCorrected(star, pdynNpa),
    dstStarNt: star,
    speedKms: speed,
    speedSource,
    warnings: [`storm index: none given, so Dst* is estimated from IMF Bz and ${how} (O'Brien–McPherron steady state; give the Dst or SYM-H index for a storm in progress or recovering)`],
  };
}
