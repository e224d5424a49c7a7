import { describe, expect, it } from 'vitest';
import * as Astro from 'astronomy-engine';
import { expectAtMost, expectClose } from '../../helpers';
import { InputError } from '../../../src/physics/errors';
import { decimalYear, gmstRad, julianDate, obliquityRad, parseUtc, sunDirectionGei, sunEclipticLongitudeRad } from '../../../src/physics/frames/time';
import { DEG_PER_RAD, RAD_PER_DEG } from '../../../src/physics/constants';


/** Signed difference a − b of two angles in degrees, wrapped to −180..180. */
function angleDiffDeg(a: number, b: number): number {
  return ((((a - b) % 360) + 540) % 360) - 180;
}

/** A few dozen instants spread over 1950–2030 at assorted times of day. */
function sampleInstants(): number[] {
  const out: number[] = [];
  const t0 = Date.UTC(1950, 0, 1);
  const t1 = Date.UTC(2030, 11, 31);
  const n = 40;
  for (let i = 0; i < n; i++) out.push(t0 + ((t1 - t0) * i) / (n - 1) + ((i * 7919) % 1440) * 60_000);
  return out;
}

/**
 * The Sun's mean-of-date equatorial direction from astronomy-engine: its apparent
 * geocentric vector on the true ecliptic of date, with the nutation in longitude
 * (Δψ) removed, rotated to the equator by the mean obliquity.
 */
function astroSunMeanOfDate(ms: number): { v: number[]; lonDeg: number; meanOblDeg: number } {
  const t = Astro.MakeTime(new Date(ms));
  const tilt = Astro.e_tilt(t);
  const ect = Astro.RotateVector(Astro.Rotation_EQJ_ECT(t), Astro.GeoVector(Astro.Body.Sun, t, true));
  const lon = Math.atan2(ect.y, ect.x) - (tilt.dpsi / 3600) * RAD_PER_DEG;
  const beta = Math.atan2(ect.z, Math.hypot(ect.x, ect.y));
  const e = tilt.mobl * RAD_PER_DEG;
  const cx = Math.cos(beta) * Math.cos(lon);
  const cy = Math.cos(beta) * Math.sin(lon);
  const cz = Math.sin(beta);
  return {
    v: [cx, cy * Math.cos(e) - cz * Math.sin(e), cy * Math.sin(e) + cz * Math.cos(e)],
    lonDeg: lon * DEG_PER_RAD,
    meanOblDeg: tilt.mobl,
  };
}

describe('parseUtc (ISO 8601; reference: ECMAScript Date.UTC)', () => {
  it('reads full date-times with Z', () => {
    expect(parseUtc('2025-03-20T22:00:00Z')).toBe(Date.UTC(2025, 2, 20, 22, 0, 0));
    expect(parseUtc('1999-12-31T23:59:59.250Z')).toBe(Date.UTC(1999, 11, 31, 23, 59, 59, 250));
    expect(parseUtc('2025-06-21T16:50Z')).toBe(Date.UTC(2025, 5, 21, 16, 50));
  });
  it('reads a bare date as 00:00 UTC and a zone-less time as UTC (documented rule)', () => {
    expect(parseUtc('2025-12-21')).toBe(Date.UTC(2025, 11, 21));
    expect(parseUtc('2025-12-21T04:50:00')).toBe(Date.UTC(2025, 11, 21, 4, 50));
  });
  it('applies ±HH:MM offsets (local = UTC + offset)', () => {
    expect(parseUtc('2025-03-21T00:30:00+02:30')).toBe(Date.UTC(2025, 2, 20, 22, 0));
    expect(parseUtc('2025-03-20T17:00:00-05:00')).toBe(Date.UTC(2025, 2, 20, 22, 0));
  });
  it('handles leap days by the Gregorian rule', () => {
    expect(parseUtc('2024-02-29T12:00:00Z')).toBe(Date.UTC(2024, 1, 29, 12));
    expect(parseUtc('2000-02-29')).toBe(Date.UTC(2000, 1, 29));
    expect(parseUtc('1600-03-01')).toBe(Date.UTC(1600, 2, 1));
  });
  const bad = [
    '',
    'yesterday',
    '2025-13-01T00:00:00Z',
    '2025-00-10',
    '2025-02-30',
    '2023-02-29',
    '2100-02-29T00:00Z',
    '2025-04-31',
    '2025-06-21T24:00:00Z',
    '2025-06-21T12:60:00Z',
    '2025-06-21T12:00:61Z',
    '2025-06-21T12:00:00+25:00',
    '2025-06-21T12',
    '2025-6-21',
    '21/06/2025',
    '2025-06-21T12:00:00ZZ',
    '2025-06-21T12:00:00 +01:00',
  ];
  for (const s of bad) {
    it(`rejects ${JSON.stringify(s)} with a message naming the field and the expected form`, () => {
      let err: unknown;
      try {
        parseUtc(s);
      } catch (e) {
        err = e;
      }
      expect(err).toBeInstanceOf(InputError);
      expect((err as InputError).field).toBe('time');
      expect((err as Error).message).toBe(`time: expected an ISO 8601 UTC time such as 2025-03-20T22:00:00Z, got "${s}"`);
    });
  }
});

describe('julianDate and decimalYear', () => {
  it('J2000.0 = JD 2451545.0 and the Unix epoch = JD 2440587.5 (standard epochs)', () => {
    expect(julianDate(Date.UTC(2000, 0, 1, 12))).toBe(2451545.0);
    expect(julianDate(0)).toBe(2440587.5);
  });
  it('decimal year respects leap years (derived: day count / year length)', () => {
    expect(decimalYear(Date.UTC(2025, 0, 1))).toBe(2025);
    // 2024 is a leap year: 2 July 00:00 is 183 of 366 days in.
    expectClose(decimalYear(Date.UTC(2024, 6, 2)), 2024 + 183 / 366, 1e-12, '2024-07-02 decimal year');
    // 2025: 2 July 12:00 is 182.5 of 365 days in.
    expectClose(decimalYear(Date.UTC(2025, 6, 2, 12)), 2025 + 182.5 / 365, 1e-12, '2025-07-02T12 decimal year');
    // The same day of 2024 gives a different fraction (366-day year).
    expectClose(decimalYear(Date.UTC(2024, 6, 2, 12)), 2024 + 183.5 / 366, 1e-12, '2024-07-02T12 decimal year');
    expectClose(decimalYear(Date.UTC(1969, 11, 31, 12)), 1969 + 364.5 / 365, 1e-12, 'before the Unix epoch');
    const lastMs = Date.UTC(2025, 0, 1) - 1;
    expect(decimalYear(lastMs)).toBeLessThan(2025);
    expect(decimalYear(lastMs)).toBeGreaterThan(2024.99999);
  });
});

describe('Hapgood (1992) GMST, obliquity and Sun against astronomy-engine, 1950–2030', () => {
  it('GMST agrees with astronomy-engine GAST minus the equation of the equinoxes (measured 4.1e-4°)', () => {
    let worst = 0;
    for (const ms of sampleInstants()) {
      const t = Astro.MakeTime(new Date(ms));
      // SiderealTime returns GAST in hours; e_tilt().ee is the equation of the equinoxes in seconds of time.
      const gmstDeg = Astro.SiderealTime(t) * 15 - (Astro.e_tilt(t).ee * 15) / 3600;
      worst = Math.max(worst, Math.abs(angleDiffDeg(gmstRad(ms) * DEG_PER_RAD, gmstDeg)));
    }
    expectAtMost(worst, 5e-4, 'max |GMST − astronomy-engine GMST| (deg)');
  });
  it('GMST is within the nutation allowance of astronomy-engine GAST (measured 0.0050°)', () => {
    let worst = 0;
    for (const ms of sampleInstants()) worst = Math.max(worst, Math.abs(angleDiffDeg(gmstRad(ms) * DEG_PER_RAD, Astro.SiderealTime(new Date(ms)) * 15)));
    expectAtMost(worst, 0.0055, 'max |GMST − GAST| (deg)');
  });
  it('mean obliquity agrees with astronomy-engine (measured 2.8e-4°)', () => {
    let worst = 0;
    for (const ms of sampleInstants()) worst = Math.max(worst, Math.abs(obliquityRad(ms) * DEG_PER_RAD - astroSunMeanOfDate(ms).meanOblDeg));
    expectAtMost(worst, 3e-4, 'max |ε − astronomy-engine mean obliquity| (deg)');
  });
  it('solar ecliptic longitude and GEI direction agree with astronomy-engine mean-of-date (measured 0.0052°)', () => {
    let worstLon = 0;
    let worstDir = 0;
    const s = new Float64Array(3);
    for (const ms of sampleInstants()) {
      const ref = astroSunMeanOfDate(ms);
      worstLon = Math.max(worstLon, Math.abs(angleDiffDeg(sunEclipticLongitudeRad(ms) * DEG_PER_RAD, ref.lonDeg)));
      sunDirectionGei(s, ms);
      expectClose(Math.hypot(s[0], s[1], s[2]), 1, 1e-15, 'Sun direction is a unit vector');
      const dot = s[0] * ref.v[0] + s[1] * ref.v[1] + s[2] * ref.v[2];
      worstDir = Math.max(worstDir, Math.acos(Math.min(1, dot)) * DEG_PER_RAD);
    }
    expectAtMost(worstLon, 0.0055, 'max |λ − astronomy-engine λ (mean of date)| (deg)');
    expectAtMost(worstDir, 0.0055, 'max angle between Sun directions (deg)');
  });
  it('Sun longitude is 0°, 90°, 180°, 270° at astronomy-engine’s 2025 equinoxes and solstices (measured 0.0074°; includes nutation, as Seasons uses the true equinox)', () => {
    const seasons = Astro.Seasons(2025);
    const events = [seasons.mar_equinox, seasons.jun_solstice, seasons.sep_equinox, seasons.dec_solstice];
    events.forEach((ev, i) => {
      const lon = sunEclipticLongitudeRad(ev.date.getTime()) * DEG_PER_RAD;
      expectClose(angleDiffDeg(lon, 90 * i), 0, 0.008, `Sun longitude at 2025 season ${i}`);
    });
  });
});
