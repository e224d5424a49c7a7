/**
 * Penetrating interplanetary field: a uniform ε·(0, By, Bz) added to the
 * magnetospheric field, the open-magnetosphere superposition of Dungey (1961)
 * Phys. Rev. Lett. 6, 47. With southward Bz it creates the equatorial neutral ring
 * at r_n = (B0/(ε|Bz|))^(1/3) and opens the field lines poleward of it (references §5).
 * The term is unconditional: gating to the inside of the magnetopause is the
 * composer's job (src/physics/field/model.ts). IMF Bx is not represented (GSM y–z only).
 */
import { InputError } from '../errors';

/**
 * Default penetration efficiency ε: a calibration constant of this model (references §12), not a
 * measured penetration fraction. The storm-time model added the saturation (DEFAULT_IMF_SATURATION_NT) and
 * raised ε from 0.7 to 0.9333 so that the penetrated field at Bz −5 nT stays 3.5 nT; the figures
 * below are the earlier calibration at ε = 0.7 without saturation, which that reproduces.
 * With the tail sheet on (src/physics/field/tail.ts), ε = 0.7 makes
 * the noon open–closed boundary move equatorward by ≈ 0.54 ° per nT of southward Bz at
 * Pdyn 2 nPa, inside the 0.5–0.8 °/nT of the cusp statistics (Zhou et al., 2000,
 * J. Geophys. Res. 105, 245: ~80° for Bz ≥ 0 to ~73° at −10 nT; references §8), and an open flux
 * of ≈ 0.54 GWb at Bz −5 nT, inside the typical 0.3–0.9 GWb of Boakes et al. (2009) GRL 36
 * (the realism table in the README, scripts/realism.ts). The fractions of IMF By seen in the
 * plasma sheet and of the solar-wind potential seen across the polar cap are smaller,
 * roughly 0.1–0.3 (from memory, references §12): the larger ε here stands in for the dayside merging and
 * the Region 1 currents the model leaves out. Derived check (references §5 formulas, B0 = 29,800 nT,
 * no magnetopause): Bz = −5 nT, ε·b = 3.5 nT gives r_n = 20.4 RE, a polar-cap boundary at
 * 74.3° and 0.56 GWb per hemisphere.
 */
export const DEFAULT_IMF_EFFICIENCY = 0.9333;

const IMF_LIMIT_NT = 1000;

export interface ImfField {
  /** The added uniform field, GSM nT (ε·By, ε·Bz). */
  readonly byNt: number;
  readonly bzNt: number;
  /** ADDS ε·(0, By, Bz) into out, everywhere; allocation-free. */
  evaluate(out: Float64Array, x: number, y: number, z: number): void;
}

/**
 * Saturation of the penetrated field, nT: the penetrated transverse field
 * b = ε·B_T is replaced by b·B_s/(b + B_s), the Hill–Siscoe form Φ = Φ_sw Φ_s/(Φ_sw + Φ_s) of the
 * polar-cap potential saturation (Hill, 1984; Siscoe et al., 2002, J. Geophys. Res. 107, 1075;
 * references §10) applied to the model's driver, the penetrated field. B_s = 14 nT is our
 * calibration: with it and ε = 0.9333 the penetrated field at Bz −5 nT is the earlier calibration's value
 * (3.5 nT, so the quiet calibration holds), and the open flux levels off (< 0.15 GWb more from
 * Bz −30 to −50 nT, ≤ 1.2 GWb; references §10). (15 nT with ε 0.913 until the far-tail band of the
 * compression fit, which added ~0.006 GWb to that growth at 10 nPa: 0.151 GWb; references §12.) Infinity turns the saturation off; the model
 * (model.ts) applies it only with the magnetopause on (bare Dungey superposition without it).
 */
export const DEFAULT_IMF_SATURATION_NT = 14;

/** Prepare the penetrating-IMF term from IMF By, Bz (GSM, nT), an efficiency in [0, 1] and a saturation field (nT). */
export function prepareImf(byNt: number, bzNt: number, efficiency: number, saturationNt = DEFAULT_IMF_SATURATION_NT): ImfField {
  for (const [field, v] of [['byNt', byNt], ['bzNt', bzNt]] as const) {
    if (typeof v !== 'number' || !Number.isFinite(v) || Math.abs(v) > IMF_LIMIT_NT) {
      throw new InputError(field, `expected a finite IMF component in −${IMF_LIMIT_NT}..${IMF_LIMIT_NT} nT, got ${String(v)}`);
    }
  }
  if (typeof efficiency !== 'number' || !Number.isFinite(efficiency) || efficiency < 0 || efficiency > 1) {
    throw new InputError('imfEfficiency', `expected a penetration efficiency in 0..1 (0 turns the term off), got ${String(efficiency)}`);
  }
  if (typeof saturationNt !== 'number' || !(saturationNt > 0)) {
    throw new InputError('imfSaturationNt', `expected a saturation field > 0 nT (Infinity: none), got ${String(saturationNt)}`);
  }
  const bt = efficiency * Math.hypot(byNt, bzNt);
  const sat = Number.isFinite(saturationNt) ? saturationNt / (bt + saturationNt) : 1;
  const by = efficiency * byNt * sat;
  const bz = efficiency * bzNt * sat;
  return {
    byNt: by,
    bzNt: bz,
    evaluate(out: Float64Array, _x: number, _y: number, _z: number): void {
      out[1] += by;
      out[2] += bz;
    },
  };
}
