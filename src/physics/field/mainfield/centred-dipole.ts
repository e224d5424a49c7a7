/** The centred (degree-1) dipole of a main-field coefficient set. */
import { DEG_PER_RAD as RAD } from '../../constants';
import type { MainFieldCoefficients } from './coefficients';

export interface CentredDipole {
  /** Equatorial surface field of the dipole, nT: √(g10² + g11² + h11²). */
  b0Nt: number;
  /** Unit vector towards the geomagnetic north pole, GEO. */
  axisGeo: Float64Array;
  /** Geocentric latitude/longitude of the geomagnetic north pole, degrees (lon −180..180). */
  poleLatDeg: number;
  poleLonDeg: number;
}

/**
 * Dipole moment and axis from g10, g11, h11. The degree-1 potential is
 * a³ (m·r)/r³ with m = (g11, h11, g10), so the north pole lies along −m.
 * Pole latitude by arctan, not arcsin (Hapgood 1997, Planet. Space Sci. 45, 1047).
 */
export function centredDipole(c: MainFieldCoefficients): CentredDipole {
  const g10 = c.g[1], g11 = c.g[2], h11 = c.h[2];
  const b0Nt = Math.sqrt(g10 * g10 + g11 * g11 + h11 * h11);
  const axisGeo = new Float64Array([-g11 / b0Nt, -h11 / b0Nt, -g10 / b0Nt]);
  const poleLatDeg = Math.atan2(-g10, Math.hypot(g11, h11)) * RAD;
  const poleLonDeg = Math.atan2(-h11, -g11) * RAD;
  return { b0Nt, axisGeo, poleLatDeg, poleLonDeg };
}
