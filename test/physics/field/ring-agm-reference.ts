/**
 * The ring-current field with K and E by the AGM at every point (ellipticKE, A&S §17.6, to rounding):
 * the reference the production ring (A&S 17.3.34/36 polynomials for m ≥ RING_POLY_MIN_M) is checked
 * against. Same loop formulas as src/physics/field/ringcurrent.ts (Jackson §5.5, softened), written
 * out here so the comparison does not depend on the code under test.
 */
import { ellipticKE, type RingCurrentField } from '../../../src/physics/field/ringcurrent';

export function agmRingEvaluate(ring: RingCurrentField, sinTilt: number, cosTilt: number): (out: Float64Array, x: number, y: number, z: number) => void {
  const p = ring.params;
  const n = p.radiiRe.length;
  const cArr = p.radiiRe.map((a, j) => {
    const d = p.thicknessRe[j], q = a * a + d * d;
    return (2 * p.shares[j] * p.centreNt * q * Math.sqrt(q)) / (a * a) / Math.PI; // C = μ0 I/π
  });
  const ke = new Float64Array(2);
  return (out, x, y, z) => {
    if (p.centreNt === 0) return;
    const xs = x * cosTilt - z * sinTilt, zs = x * sinTilt + z * cosTilt;
    const rho2 = xs * xs + y * y, rho = Math.sqrt(rho2);
    let bz = 0, brr = 0;
    for (let j = 0; j < n; j++) {
      const a = p.radiiRe[j], a2 = a * a, d = p.thicknessRe[j], c = cArr[j];
      const ze2 = zs * zs + d * d;
      const beta2 = (a + rho) ** 2 + ze2, alpha2 = (a - rho) ** 2 + ze2;
      const m = (4 * a * rho) / beta2;
      if (m < 1e-8) {
        const q = a2 + ze2, iq = 1 / (q * Math.sqrt(q));
        bz += 0.5 * Math.PI * c * a2 * iq;
        brr += (0.75 * Math.PI * c * a2 * zs * iq) / q;
      } else {
        ellipticKE(ke, m);
        const r2 = rho2 + ze2, f = c / (2 * alpha2 * Math.sqrt(beta2));
        bz += f * ((a2 - r2) * ke[1] + alpha2 * ke[0]);
        brr += (f * zs * ((a2 + r2) * ke[1] - alpha2 * ke[0])) / rho2;
      }
    }
    const bxs = brr * xs;
    out[0] += bxs * cosTilt + bz * sinTilt;
    out[1] += brr * y;
    out[2] += -bxs * sinTilt + bz * cosTilt;
  };
}
