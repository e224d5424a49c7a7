/**
 * Penetrating interplanetary field: a uniform ε·(0, By, Bz) added to the
 * magnetospheric field, the open-magnetosphere superposition of Dungey (1961)
 * Phys. Rev. Lett. 6, 47. With southward Bz it creates the equatorial neutral ring
 * at r_n = (B0/(ε|Bz|))^(1/3) and opens the field lines poleward of it (CHECKS §5).
 * The term is unconditional: gating to the inside of the magnetopause is the
 * composer's job (src/physics/model.ts). IMF Bx is not represented (GSM y–z only).
 */
import { InputError } from './errors';

/**
 * Default penetration efficiency ε. Justification, FROM MEMORY (not verified against
 * the sources): the fraction of IMF By seen in the near-Earth tail and plasma sheet,
 * and the fraction of the solar-wind electric potential across the magnetosphere that
 * appears as polar-cap potential ("reconnection efficiency"), are both reported at
 * roughly 0.1–0.3; 0.2 is the middle. Derived check (CHECKS §5 formulas, B0 = 29,800 nT):
 * with Bz = −5 nT, ε·b = 1 nT gives r_n = 31.0 RE, a polar-cap boundary at 77.3° and an
 * open flux of 0.37 GWb per hemisphere, inside the typical 0.3–0.9 GWb of Boakes et al.
 * (2009) GRL 36. To be recalibrated against oval statistics (CHECKS §8).
 */
export const DEFAULT_IMF_EFFICIENCY = 0.2;

const IMF_LIMIT_NT = 1000;

export interface ImfField {
  /** The added uniform field, GSM nT (ε·By, ε·Bz). */
  readonly byNt: number;
  readonly bzNt: number;
  /** ADDS ε·(0, By, Bz) into out, everywhere; allocation-free. */
  evaluate(out: Float64Array, x: number, y: number, z: number): void;
}

/** Prepare the penetrating-IMF term from IMF By, Bz (GSM, nT) and an efficiency in [0, 1]. */
export function prepareImf(byNt: number, bzNt: number, efficiency: number): ImfField {
  for (const [field, v] of [['byNt', byNt], ['bzNt', bzNt]] as const) {
    if (typeof v !== 'number' || !Number.isFinite(v) || Math.abs(v) > IMF_LIMIT_NT) {
      throw new InputError(field, `expected a finite IMF component in −${IMF_LIMIT_NT}..${IMF_LIMIT_NT} nT, got ${String(v)}`);
    }
  }
  if (typeof efficiency !== 'number' || !Number.isFinite(efficiency) || efficiency < 0 || efficiency > 1) {
    throw new InputError('imfEfficiency', `expected a penetration efficiency in 0..1 (0 turns the term off), got ${String(efficiency)}`);
  }
  const by = efficiency * byNt;
  const bz = efficiency * bzNt;
  return {
    byNt: by,
    bzNt: bz,
    evaluate(out: Float64Array, _x: number, _y: number, _z: number): void {
      out[1] += by;
      out[2] += bz;
    },
  };
}
