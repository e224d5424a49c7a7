/**
 * Centred dipole field kernel. Frame: any right-handed frame whose +z is the
 * dipole's north axis (the direction of the geomagnetic north pole), i.e. SM or MAG.
 * Earth's moment points along −z, so B at the equator points +z (northward).
 * B = B0 [ −3xz, −3yz, r² − 3z² ] / r⁵ (derived from B = (3(m·r̂)r̂ − m)/r³, m = −B0 ẑ;
 * r in RE, B0 the equatorial surface field in nT).
 */
export function dipoleField(out: Float64Array, x: number, y: number, z: number, b0Nt: number): Float64Array {
  const r2 = x * x + y * y + z * z;
  const r = Math.sqrt(r2);
  const k = b0Nt / (r2 * r2 * r);
  out[0] = -3 * x * z * k;
  out[1] = -3 * y * z * k;
  out[2] = (r2 - 3 * z * z) * k;
  return out;
}

/**
 * Dipole field for an axis tilted by ψ in the x–z plane: axis = (sin ψ, 0, cos ψ).
 * This is the GSM form (ψ > 0 when the north pole leans sunward, +x). Adds into out.
 */
export function addTiltedDipoleField(out: Float64Array, x: number, y: number, z: number, b0Nt: number, sinTilt: number, cosTilt: number): void {
  // Rotate GSM → SM: z_sm along the axis.
  const xs = x * cosTilt - z * sinTilt;
  const zs = x * sinTilt + z * cosTilt;
  const r2 = x * x + y * y + z * z;
  const r = Math.sqrt(r2);
  const k = b0Nt / (r2 * r2 * r);
  const bx = -3 * xs * zs * k;
  const by = -3 * y * zs * k;
  const bz = (r2 - 3 * zs * zs) * k;
  out[0] += bx * cosTilt + bz * sinTilt;
  out[1] += by;
  out[2] += -bx * sinTilt + bz * cosTilt;
}
