import { describe, expect, it } from 'vitest';
import * as Astro from 'astronomy-engine';
import { expectAtMost, expectBetween, expectClose } from '../../helpers';
import { InputError } from '../../../src/physics/errors';
import {
  applyMat3,
  applyMat3T,
  cartesianFromSpherical,
  dipoleTiltRad,
  geiFromGeo,
  geiFromGse,
  geoFromGei,
  geoFromGsm,
  geoFromMag,
  geoFromSm,
  gseFromGei,
  gseFromGsm,
  gsmFromGeo,
  gsmFromGse,
  gsmFromSm,
  magFromGeo,
  mltHours,
  mltOfGeo,
  prepareFrames,
  smFromGeo,
  smFromGsm,
  sphericalFromCartesian,
  type FrameSet,
  type Mat3,
} from '../../../src/physics/frames/rotations';
import { gmstRad, obliquityRad, parseUtc, sunDirectionGei } from '../../../src/physics/frames/time';
import { RAD_PER_DEG, DEG_PER_RAD } from '../../../src/physics/constants';

const HOUR = 3_600_000;

/** Unit GEO vector of a geocentric latitude/longitude (deg). */
function unitGeo(latDeg: number, lonDeg: number): Float64Array {
  return cartesianFromSpherical(new Float64Array(3), 1, latDeg * RAD_PER_DEG, lonDeg * RAD_PER_DEG);
}

/** 2025 geomagnetic north pole from IGRF-14 g10, g11, h11 (references §2, derived): 80.789°N, 72.763°W. */
const AXIS_2025 = unitGeo(80.789, -72.763);

const INSTANTS = ['1965-03-04T05:06:07Z', '2000-01-01T12:00:00Z', '2025-03-20T22:00:00Z', '2025-06-21T16:50:00Z', '2025-12-21T04:50:00Z', '2029-09-09T09:09:09Z'].map(parseUtc);

function frameSets(): FrameSet[] {
  const out: FrameSet[] = [];
  for (const ms of INSTANTS) {
    out.push(prepareFrames(ms, AXIS_2025));
    out.push(prepareFrames(ms, AXIS_2025, 0));
    out.push(prepareFrames(ms, AXIS_2025, -35));
  }
  out.push(prepareFrames(INSTANTS[0], unitGeo(90, 0))); // axis on the rotation axis (MAG y fallback)
  out.push(prepareFrames(INSTANTS[2], AXIS_2025, 90)); // Sun along the axis (GSM y fallback)
  out.push(prepareFrames(INSTANTS[3], AXIS_2025, -90));
  return out;
}

const MATRICES = ['geiFromGeo', 'gseFromGei', 'gsmFromGse', 'smFromGsm', 'magFromGeo', 'gsmFromGeo'] as const;

function det(m: Mat3): number {
  return m[0] * (m[4] * m[8] - m[5] * m[7]) - m[1] * (m[3] * m[8] - m[5] * m[6]) + m[2] * (m[3] * m[7] - m[4] * m[6]);
}

type Conv = (out: Float64Array, v: ArrayLike<number>, f: FrameSet) => Float64Array;
const PAIRS: [string, Conv, Conv][] = [
  ['geiFromGeo/geoFromGei', geiFromGeo, geoFromGei],
  ['gseFromGei/geiFromGse', gseFromGei, geiFromGse],
  ['gsmFromGse/gseFromGsm', gsmFromGse, gseFromGsm],
  ['smFromGsm/gsmFromSm', smFromGsm, gsmFromSm],
  ['magFromGeo/geoFromMag', magFromGeo, geoFromMag],
  ['gsmFromGeo/geoFromGsm', gsmFromGeo, geoFromGsm],
  ['smFromGeo/geoFromSm', smFromGeo, geoFromSm],
];

/** Deterministic pseudo-random vectors with components in −20..20 RE. */
function vectors(n: number): Float64Array[] {
  let seed = 12345;
  const rnd = () => {
    seed = (seed * 1103515245 + 12345) % 2147483648;
    return seed / 2147483648;
  };
  return Array.from({ length: n }, () => Float64Array.of(40 * rnd() - 20, 40 * rnd() - 20, 40 * rnd() - 20));
}

describe('frame matrices (Hapgood 1992 definitions)', () => {
  it('every matrix is orthonormal with determinant +1 (rotation; derived)', () => {
    for (const f of frameSets()) {
      for (const name of MATRICES) {
        const m = f[name];
        for (let i = 0; i < 3; i++) {
          for (let j = 0; j < 3; j++) {
            const d = m[3 * i] * m[3 * j] + m[3 * i + 1] * m[3 * j + 1] + m[3 * i + 2] * m[3 * j + 2];
            expectClose(d, i === j ? 1 : 0, 1e-15, `${name} rows ${i}·${j}`);
          }
        }
        expectClose(det(m), 1, 1e-15, `det ${name}`);
      }
    }
  });

  it('every conversion pair round-trips to 1e-12 (relative), in place too', () => {
    const tmp = new Float64Array(3);
    let worst = 0;
    for (const f of frameSets()) {
      for (const v of vectors(20)) {
        const r = Math.hypot(v[0], v[1], v[2]);
        for (const [name, fwd, inv] of PAIRS) {
          inv(tmp, fwd(tmp, v, f), f);
          const e1 = Math.hypot(tmp[0] - v[0], tmp[1] - v[1], tmp[2] - v[2]) / r;
          fwd(tmp, inv(tmp, v, f), f);
          const e2 = Math.hypot(tmp[0] - v[0], tmp[1] - v[1], tmp[2] - v[2]) / r;
          worst = Math.max(worst, e1, e2);
          expectAtMost(Math.max(e1, e2), 1e-12, `${name} round trip`);
          // out === v gives the same answer as a separate output.
          const sep = fwd(new Float64Array(3), v, f);
          const same = Float64Array.from(v);
          fwd(same, same, f);
          for (let k = 0; k < 3; k++) expect(same[k], `${name} in place [${k}]`).toBe(sep[k]);
        }
      }
    }
    expectAtMost(worst, 2e-15, 'worst round-trip error (measured 9.4e-16)');
  });

  it('applyMat3T inverts applyMat3 in place', () => {
    const f = prepareFrames(INSTANTS[2], AXIS_2025);
    const v = Float64Array.of(3, -4, 5);
    applyMat3(v, f.gsmFromGeo, v[0], v[1], v[2]);
    applyMat3T(v, f.gsmFromGeo, v[0], v[1], v[2]);
    expectClose(v[0], 3, 1e-14, 'x');
    expectClose(v[1], -4, 1e-14, 'y');
    expectClose(v[2], 5, 1e-14, 'z');
  });

  it('gsmFromGeo equals gsmFromGse ∘ gseFromGei ∘ geiFromGeo; smFromGeo equals smFromGsm ∘ gsmFromGeo', () => {
    for (const f of frameSets()) {
      for (const v of vectors(5)) {
        const a = gsmFromGse(new Float64Array(3), gseFromGei(new Float64Array(3), geiFromGeo(new Float64Array(3), v, f), f), f);
        const b = gsmFromGeo(new Float64Array(3), v, f);
        const c = smFromGsm(new Float64Array(3), b, f);
        const d = smFromGeo(new Float64Array(3), v, f);
        for (let k = 0; k < 3; k++) {
          expectClose(a[k], b[k], 1e-13, `composed GSM [${k}]`);
          expectClose(c[k], d[k], 1e-13, `composed SM [${k}]`);
        }
      }
    }
  });
});

describe('frame axes (definitions, Hapgood 1992)', () => {
  const ms = parseUtc('2025-03-20T22:00:00Z');
  const f = prepareFrames(ms, AXIS_2025);
  const v = new Float64Array(3);

  it('GEI: the Greenwich meridian lies at right ascension GMST', () => {
    geiFromGeo(v, [1, 0, 0], f);
    expectClose(Math.atan2(v[1], v[0]), Math.atan2(Math.sin(gmstRad(ms)), Math.cos(gmstRad(ms))), 1e-15, 'RA of Greenwich');
    expectClose(v[2], 0, 0, 'z unchanged');
  });
  it('GSE: the Sun is +x and ecliptic north is +z', () => {
    const s = sunDirectionGei(new Float64Array(3), ms);
    gseFromGei(v, s, f);
    expectClose(v[0], 1, 1e-15, 'Sun x_GSE');
    const eps = obliquityRad(ms);
    gseFromGei(v, [0, -Math.sin(eps), Math.cos(eps)], f);
    expectClose(v[2], 1, 1e-15, 'ecliptic pole z_GSE');
  });
  it('GSM shares x with GSE; the dipole axis lies in the GSM x–z plane at (sin ψ, 0, cos ψ)', () => {
    expectClose(f.gsmFromGse[0], 1, 1e-15, 'GSM x = GSE x');
    gsmFromGeo(v, f.axisGeo, f);
    expectClose(v[1], 0, 1e-15, 'axis y_GSM');
    expectClose(v[0], f.sinTilt, 1e-15, 'axis x_GSM = sin ψ');
    expectClose(v[2], f.cosTilt, 1e-15, 'axis z_GSM = cos ψ');
    gsmFromGeo(v, f.sunGeo, f);
    expectClose(v[0], 1, 1e-15, 'Sun x_GSM');
  });
  it('SM and MAG: the dipole axis is +z; MAG y is ⟂ the rotation axis', () => {
    smFromGeo(v, f.axisGeo, f);
    expectClose(v[2], 1, 1e-15, 'axis z_SM');
    magFromGeo(v, f.axisGeo, f);
    expectClose(v[2], 1, 1e-15, 'axis z_MAG');
    expectClose(f.magFromGeo[5], 0, 0, 'MAG y·ẑ_GEO');
    // The geographic north pole sits at MAG longitude 180°, at the pole's colatitude from the MAG z axis (derived; Hapgood T5).
    magFromGeo(v, [0, 0, 1], f);
    expectClose(v[1], 0, 1e-15, 'geographic pole y_MAG');
    expectClose(v[0], -Math.sin((90 - 80.789) * RAD_PER_DEG), 1e-15, 'geographic pole x_MAG = −sin(colatitude)');
  });
});

describe('dipole tilt (references §6)', () => {
  it('agrees with a tilt built from astronomy-engine (mean GMST, mean-of-date Sun) to 0.0025° over 1950–2030 (measured 0.0020°)', () => {
    let worst = 0;
    for (let i = 0; i < 40; i++) {
      const ms = Date.UTC(1950, 0, 1) + i * 740 * 86_400_000 + i * 37 * 60_000;
      const t = Astro.MakeTime(new Date(ms));
      const tilt = Astro.e_tilt(t);
      const th = (Astro.SiderealTime(t) * 15 - (tilt.ee * 15) / 3600) * RAD_PER_DEG;
      const ect = Astro.RotateVector(Astro.Rotation_EQJ_ECT(t), Astro.GeoVector(Astro.Body.Sun, t, true));
      const lon = Math.atan2(ect.y, ect.x) - (tilt.dpsi / 3600) * RAD_PER_DEG;
      const e = tilt.mobl * RAD_PER_DEG;
      const sGei = [Math.cos(lon), Math.sin(lon) * Math.cos(e), Math.sin(lon) * Math.sin(e)];
      // Sun in GEO: rotate by −θ about z.
      const sGeo = [Math.cos(th) * sGei[0] + Math.sin(th) * sGei[1], -Math.sin(th) * sGei[0] + Math.cos(th) * sGei[1], sGei[2]];
      const ref = Math.asin(AXIS_2025[0] * sGeo[0] + AXIS_2025[1] * sGeo[1] + AXIS_2025[2] * sGeo[2]) * DEG_PER_RAD;
      const got = prepareFrames(ms, AXIS_2025).tiltRad * DEG_PER_RAD;
      expectClose(dipoleTiltRad(ms, AXIS_2025) * DEG_PER_RAD, got, 1e-12, 'dipoleTiltRad = prepareFrames().tiltRad');
      worst = Math.max(worst, Math.abs(got - ref));
    }
    expectAtMost(worst, 0.0025, 'max |ψ − astronomy-engine ψ| (deg)');
  });

  it('2025 extremes are ±(obliquity + pole colatitude) ≈ ±32.65° (derived; measured within 0.001°)', () => {
    let max = -Infinity;
    let min = Infinity;
    const t0 = Date.UTC(2025, 0, 1);
    const step = 10 * 60_000;
    for (let ms = t0; ms < Date.UTC(2026, 0, 1); ms += step) {
      const p = dipoleTiltRad(ms, AXIS_2025) * DEG_PER_RAD;
      if (p > max) max = p;
      if (p < min) min = p;
    }
    // Reached exactly only if the solstice falls when the pole faces the Sun; the 10-min scan and that offset cost < 0.002°.
    const bound = obliquityRad(Date.UTC(2025, 5, 21)) * DEG_PER_RAD + (90 - 80.789);
    expectClose(bound, 32.65, 0.005, 'obliquity + pole colatitude (references §6)');
    expectClose(max, bound, 0.002, '2025 maximum tilt (deg)');
    expectClose(min, -bound, 0.002, '2025 minimum tilt (deg)');
  });

  function extremeOfDay(dayMs: number, sign: 1 | -1): { tiltDeg: number; hourUt: number } {
    let best = -Infinity;
    let bestMs = dayMs;
    for (let ms = dayMs; ms < dayMs + 24 * HOUR; ms += 60_000) {
      const p = sign * dipoleTiltRad(ms, AXIS_2025);
      if (p > best) {
        best = p;
        bestMs = ms;
      }
    }
    return { tiltDeg: sign * best * DEG_PER_RAD, hourUt: (bestMs - dayMs) / HOUR };
  }

  it('about +32.6° near 16:50 UT on the June solstice 2025 (references §6; 0.1°, 5 min; measured 32.645° at 16:53)', () => {
    const { tiltDeg, hourUt } = extremeOfDay(Date.UTC(2025, 5, 21), 1);
    expectClose(tiltDeg, 32.6, 0.1, 'June-solstice maximum tilt (deg)');
    expectClose(hourUt, 16 + 50 / 60, 5 / 60, 'UT of the June-solstice maximum (h)');
    expectClose(dipoleTiltRad(parseUtc('2025-06-21T16:50:00Z'), AXIS_2025) * DEG_PER_RAD, 32.6, 0.1, 'tilt at 16:50 UT');
  });

  it('about −32.6° near 04:50 UT on the December solstice 2025 (references §6; 0.1°, 5 min; measured −32.646° at 04:49)', () => {
    const { tiltDeg, hourUt } = extremeOfDay(Date.UTC(2025, 11, 21), -1);
    expectClose(tiltDeg, -32.6, 0.1, 'December-solstice minimum tilt (deg)');
    expectClose(hourUt, 4 + 50 / 60, 5 / 60, 'UT of the December-solstice minimum (h)');
  });
});

describe('tilt override (our documented rule)', () => {
  const ms = parseUtc('2025-03-20T22:00:00Z');
  const base = prepareFrames(ms, AXIS_2025);
  const points = [unitGeo(65, 20), unitGeo(-70, 150), unitGeo(10, -100), unitGeo(80, 0)];

  for (const tiltDeg of [-90, -35, -10, 0, 20, 32.6, 89.9, 90]) {
    it(`override ${tiltDeg}°: tilt equals the override, MLT of fixed GEO points unchanged`, () => {
      const f = prepareFrames(ms, AXIS_2025, tiltDeg);
      expectClose(f.tiltRad * DEG_PER_RAD, tiltDeg, 1e-12, 'tiltRad');
      const d = f.axisGeo[0] * f.sunGeo[0] + f.axisGeo[1] * f.sunGeo[1] + f.axisGeo[2] * f.sunGeo[2];
      expectClose(d, Math.sin(tiltDeg * RAD_PER_DEG), 1e-15, 'axis·sun′ = sin(override)');
      expectClose(Math.hypot(f.sunGeo[0], f.sunGeo[1], f.sunGeo[2]), 1, 1e-15, '|sun′|');
      // sun′ stays in the plane of the true Sun direction and the axis.
      const n = [
        base.sunGeo[1] * AXIS_2025[2] - base.sunGeo[2] * AXIS_2025[1],
        base.sunGeo[2] * AXIS_2025[0] - base.sunGeo[0] * AXIS_2025[2],
        base.sunGeo[0] * AXIS_2025[1] - base.sunGeo[1] * AXIS_2025[0],
      ];
      expectClose(n[0] * f.sunGeo[0] + n[1] * f.sunGeo[1] + n[2] * f.sunGeo[2], 0, 1e-15, 'sun′ in the (sun, axis) plane');
      if (Math.abs(tiltDeg) < 90) {
        for (const p of points) {
          expectClose(mltOfGeo(f, p[0], p[1], p[2]), mltOfGeo(base, p[0], p[1], p[2]), 1e-11, 'MLT unchanged by the override');
        }
      }
    });
  }

  it('the time-following tilt reproduces the unforced frames', () => {
    const f = prepareFrames(ms, AXIS_2025, base.tiltRad * DEG_PER_RAD);
    for (const name of MATRICES) for (let k = 0; k < 9; k++) expectClose(f[name][k], base[name][k], 1e-13, `${name}[${k}]`);
  });

  it('validates the override and the inputs', () => {
    for (const bad of [90.0001, -91, Number.NaN, Number.POSITIVE_INFINITY]) {
      let err: unknown;
      try {
        prepareFrames(ms, AXIS_2025, bad);
      } catch (e) {
        err = e;
      }
      expect(err).toBeInstanceOf(InputError);
      expect((err as InputError).field).toBe('tiltDeg');
    }
    expect(() => prepareFrames(ms, [0, 0, 0])).toThrow(/axisGeo: expected a finite non-zero 3-vector/);
    expect(() => prepareFrames(Number.NaN, AXIS_2025)).toThrow(InputError);
    expect(prepareFrames(ms, AXIS_2025, null).tiltRad).toBe(base.tiltRad);
  });
});

describe('MLT (common practice: 12 + atan2(y_SM, x_SM)/15°)', () => {
  it('subsolar 12 h, antisolar 0 h, dusk (+y_SM) 18 h, dawn 6 h (derived)', () => {
    for (const ms of INSTANTS) {
      const f = prepareFrames(ms, AXIS_2025);
      const s = f.sunGeo;
      expectClose(mltOfGeo(f, s[0], s[1], s[2]), 12, 1e-12, 'subsolar MLT');
      const a = mltOfGeo(f, -s[0], -s[1], -s[2]);
      expectClose(Math.min(a, 24 - a), 0, 1e-12, 'antisolar MLT');
      expectBetween(a, 0, 24 - 1e-15, 'MLT range');
      const dusk = geoFromSm(new Float64Array(3), [0, 1, 0], f);
      expectClose(mltOfGeo(f, dusk[0], dusk[1], dusk[2]), 18, 1e-12, 'dusk MLT');
      expectClose(mltOfGeo(f, -dusk[0], -dusk[1], -dusk[2]), 6, 1e-12, 'dawn MLT');
    }
  });
  it('stays in [0, 24) at the midnight cut', () => {
    expect(mltHours(-1, 0)).toBe(0);
    expect(mltHours(-1, -0)).toBe(0);
    expect(mltHours(-1, 1e-300)).toBe(0); // atan2 rounds to π: 24 h wraps to 0
    expectClose(mltHours(-1, 1e-9), 24, 1e-8, 'just before midnight (dusk side)');
    expectClose(mltHours(-1, -1e-9), 0, 1e-8, 'just after midnight (dawn side)');
    expect(mltHours(1, 0)).toBe(12);
  });
  it('advances 1 h per 15° of magnetic longitude eastward (derived)', () => {
    const f = prepareFrames(INSTANTS[3], AXIS_2025);
    const p = new Float64Array(3);
    const m0 = mltOfGeo(f, ...(geoFromMag(p, cartesianFromSpherical(p, 1, 60 * RAD_PER_DEG, 0), f) as unknown as [number, number, number]));
    const m1 = mltOfGeo(f, ...(geoFromMag(p, cartesianFromSpherical(p, 1, 60 * RAD_PER_DEG, 15 * RAD_PER_DEG), f) as unknown as [number, number, number]));
    expectClose((((m1 - m0) % 24) + 24) % 24, 1, 1e-12, 'MLT step per 15° MAG longitude');
  });
});

describe('spherical helpers', () => {
  it('round-trip and known points', () => {
    const p = new Float64Array(3);
    for (const [r, lat, lon] of [
      [1, 0, 0],
      [2.5, 45, 170],
      [6.6, -80, -30],
      [1, 90, 0],
      [10, -45, 179.999],
    ]) {
      cartesianFromSpherical(p, r, lat * RAD_PER_DEG, lon * RAD_PER_DEG);
      const s = sphericalFromCartesian(p[0], p[1], p[2]);
      expectClose(s.rRe, r, 1e-14 * r, 'r');
      expectClose(s.latRad * DEG_PER_RAD, lat, 1e-12, 'lat');
      if (Math.abs(lat) < 90) expectClose(s.lonRad * DEG_PER_RAD, lon, 1e-12, 'lon');
    }
    const s = sphericalFromCartesian(0, -3, 0);
    expectClose(s.lonRad * DEG_PER_RAD, -90, 0, 'lon of −y');
    expectClose(s.rRe, 3, 0, 'r of −y');
  });
});
