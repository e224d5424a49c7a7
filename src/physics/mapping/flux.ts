/**
 * Open magnetic flux of one hemisphere: the flux of B through the polar cap
 * poleward of the open–closed boundary, Φ = |∫ B_r dA| over the cap on the
 * sphere r = 1 + h/RE (derived: with ∇·B = 0 every field line crossing the cap is
 * open, so this is the flux the open lines carry; Boakes et al., 2009, GRL 36,
 * give 0.3–0.9 GWb as typical).
 *
 * Quadrature (our own): the boundary colatitude θ_b(MLT) is interpolated linearly
 * (periodic) between the sectors of `sectorBoundaries`; the cap integral is a
 * midpoint rule in MLT (`subdivisions` per sector) times a Gauss–Legendre rule in
 * colatitude from the pole to θ_b (12 nodes: exact to < 1e-12 for the dipole's
 * B_r sin θ), using the model's total field. The boundary latitudes are those of
 * the footpoints on the WGS84 ellipsoid at the tracer's altitude, here placed on
 * the sphere of the same altitude; the difference (≤ 21 km in radius) changes the
 * flux by < 1 % (derived: Φ ∝ 1/r for the dipole at fixed colatitude, ≤ 0.3 %).
 */
import { RE_KM, RAD_PER_DEG } from '../constants';
import { InputError, expectedGot, requireInRange } from '../errors';
import { gsmAtMagneticLatMlt } from '../trace/footpoint';
import type { PreparedModel } from '../field/model';
import type { HemisphereBoundaries } from './oval';

/** Gauss–Legendre nodes and weights on [−1, 1], 12 points (Abramowitz & Stegun, 1964, table 25.4). */
const GL_X = [-0.9815606342467192, -0.9041172563704749, -0.7699026741943047, -0.5873179542866175, -0.3678314989981802, -0.1252334085114689,
  0.1252334085114689, 0.3678314989981802, 0.5873179542866175, 0.7699026741943047, 0.9041172563704749, 0.9815606342467192];
const GL_W = [0.0471753363865118, 0.1069393259953184, 0.1600783285433462, 0.2031674267230659, 0.2334925365383548, 0.2491470458134028,
  0.2491470458134028, 0.2334925365383548, 0.2031674267230659, 0.1600783285433462, 0.1069393259953184, 0.0471753363865118];

export interface OpenFluxOptions {
  /** Height of the sphere the cap lies on, km (use the tracer's altitude; default 110). */
  altKm?: number;
  /** MLT midpoints per boundary sector (default 8). */
  subdivisions?: number;
}

/**
 * Open flux (Wb, ≥ 0) of one hemisphere from its boundaries per MLT. NaN when a
 * sector has no open–closed boundary (the cap is then not a closed curve).
 * The sectors must be equally spaced in MLT and cover 24 h (as `mltGrid` makes them).
 */
export function openFluxWb(model: PreparedModel, boundaries: HemisphereBoundaries, options: OpenFluxOptions = {}): number {
  const altKm = requireInRange('altKm', options.altKm ?? 110, -1, 100_000, 'km');
  const sub = options.subdivisions ?? 8;
  if (!Number.isInteger(sub) || sub < 1 || sub > 1000) throw new InputError('subdivisions', expectedGot('an integer 1..1000', sub));
  const secs = [...boundaries.sectors].sort((a, b) => a.mltHours - b.mltHours);
  const n = secs.length;
  if (n < 2) throw new InputError('boundaries', expectedGot('at least 2 MLT sectors', n));
  const step = 24 / n;
  for (let i = 0; i < n; i++) {
    if (Math.abs(secs[i].mltHours - (secs[0].mltHours + i * step)) > 1e-9) {
      throw new InputError('boundaries', 'expected sectors equally spaced in MLT over 24 h (as mltGrid makes them)');
    }
  }
  const colat = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const oc = secs[i].openClosed;
    if (oc === null) return NaN;
    colat[i] = (90 - Math.abs(oc.magLatDeg)) * RAD_PER_DEG;
  }
  const sgn = boundaries.hemisphere === 'north' ? 1 : -1;
  const r = 1 + altKm / RE_KM;
  const p = new Float64Array(3);
  const b = new Float64Array(3);
  const m = n * sub;
  const dPhi = (2 * Math.PI) / m;
  let total = 0; // ∫∫ B_r sin θ dθ dφ, nT·rad²
  for (let k = 0; k < m; k++) {
    const f = (k + 0.5) / sub; // position in sector units from the first sector
    const i0 = Math.floor(f) % n;
    const w = f - Math.floor(f);
    const thB = (1 - w) * colat[i0] + w * colat[(i0 + 1) % n];
    const mlt = secs[0].mltHours + f * step;
    let inner = 0;
    for (let g = 0; g < GL_X.length; g++) {
      const th = 0.5 * thB * (GL_X[g] + 1);
      const latDeg = sgn * (90 - (th * 180) / Math.PI);
      gsmAtMagneticLatMlt(p, model.frames, latDeg, mlt, altKm, false);
      model.evaluate(b, p[0], p[1], p[2]);
      const br = (b[0] * p[0] + b[1] * p[1] + b[2] * p[2]) / r;
      inner += GL_W[g] * br * Math.sin(th);
    }
    total += 0.5 * thB * inner * dPhi;
  }
  const reM = RE_KM * 1e3;
  // Flux into the north cap is inward (B_r < 0): sign so both hemispheres give ≥ 0.
  return -sgn * total * 1e-9 * r * r * reM * reM;
}
