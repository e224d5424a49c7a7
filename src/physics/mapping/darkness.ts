/**
 * How dark a site's sky is: the Sun's elevation and its twilight class, and
 * the Moon's elevation and illuminated fraction. Elevations are geometric
 * (no refraction) and topocentric, above the horizon of the WGS84 normal, as
 * twilight is defined (common practice: civil −6°, nautical −12°,
 * astronomical −18° for the Sun's centre).
 *
 * The Sun comes from Hapgood (1992) (src/physics/frames/time.ts: mean Sun and
 * GMST, ~0.01°; its 8.8″ parallax is neglected); the Moon from
 * astronomy-engine (topocentric, of date; Moon parallax is up to ~1°, so the
 * site matters). Pure: no DOM, React, three or Node APIs.
 */
import * as Astro from 'astronomy-engine';
import { RAD_PER_DEG, DEG_PER_RAD } from '../constants';
import { requireFinite, requireInRange } from '../errors';
import { gmstRad, sunDirectionGei } from '../frames/time';

export type TwilightClass = 'day' | 'civil' | 'nautical' | 'astronomical' | 'night';

/** Depression of the Sun's centre at the end of each twilight, deg (common practice). */
export const TWILIGHT_LIMIT_DEG = { civil: -6, nautical: -12, astronomical: -18 } as const;

/**
 * Geometric elevation of the Sun's centre at sunrise and sunset: −(34′ refraction
 * + 16′ semi-diameter) = −0.833° (common practice, the almanacs' standard).
 */
export const SUNSET_ELEVATION_DEG = -50 / 60;

/** Default Sun limit of `dark`: the end of nautical twilight. */
export const DEFAULT_SUN_LIMIT_DEG = TWILIGHT_LIMIT_DEG.nautical;

export interface SkyDarkness {
  /** Geometric elevation of the Sun's centre, deg. */
  sunElevationDeg: number;
  twilight: TwilightClass;
  /** The Sun is below `sunLimitDeg`. */
  dark: boolean;
  /** Topocentric geometric elevation of the Moon's centre, deg. */
  moonElevationDeg: number;
  /** Illuminated fraction of the Moon's disc, 0..1. */
  moonIlluminatedFraction: number;
}

export interface SkyDarknessOptions {
  /** The Sun must be below this elevation (deg, −30..0) for `dark`; default −12 (nautical). */
  sunLimitDeg?: number;
}

const sun = new Float64Array(3);
/** The Moon's phase does not depend on the site: the last time's value is kept for the next site. */
let phaseMs = NaN;
let phaseFraction = NaN;

/** Twilight class of a Sun elevation (deg): day ≥ −0.833° > civil ≥ −6° > nautical ≥ −12° > astronomical ≥ −18° > night. */
export function twilightClass(sunElevationDeg: number): TwilightClass {
  if (sunElevationDeg >= SUNSET_ELEVATION_DEG) return 'day';
  if (sunElevationDeg >= TWILIGHT_LIMIT_DEG.civil) return 'civil';
  if (sunElevationDeg >= TWILIGHT_LIMIT_DEG.nautical) return 'nautical';
  if (sunElevationDeg >= TWILIGHT_LIMIT_DEG.astronomical) return 'astronomical';
  return 'night';
}

/**
 * Geometric elevation (deg) of the Sun's centre seen from geodetic (lat, lon),
 * Unix-ms time: the Hapgood Sun direction rotated from GEI to GEO by GMST,
 * dotted with the geodetic up vector. Allocation-free; unchecked inputs.
 */
export function sunElevationDegUnchecked(latDeg: number, lonDeg: number, ms: number): number {
  sunDirectionGei(sun, ms);
  const g = gmstRad(ms);
  const cg = Math.cos(g), sg = Math.sin(g);
  const sx = cg * sun[0] + sg * sun[1];
  const sy = -sg * sun[0] + cg * sun[1];
  const sz = sun[2];
  const la = latDeg * RAD_PER_DEG, lo = lonDeg * RAD_PER_DEG;
  const cla = Math.cos(la);
  const up = cla * Math.cos(lo) * sx + cla * Math.sin(lo) * sy + Math.sin(la) * sz;
  return Math.asin(Math.max(-1, Math.min(1, up))) * DEG_PER_RAD;
}

function checkSite(latDeg: number, lonDeg: number, heightKm: number, ms: number): void {
  requireInRange('latDeg', latDeg, -90, 90, 'deg');
  requireInRange('lonDeg', lonDeg, -360, 360, 'deg');
  requireInRange('heightKm', heightKm, -1, 100_000, 'km');
  requireFinite('time', ms);
}

/** Sun elevation (deg) at a site and Unix-ms time, with the inputs checked. The height does not matter at 0.001°. */
export function sunElevationDeg(latDeg: number, lonDeg: number, heightKm: number, ms: number): number {
  checkSite(latDeg, lonDeg, heightKm, ms);
  return sunElevationDegUnchecked(latDeg, lonDeg, ms);
}

/** Topocentric geometric Moon elevation (deg) and illuminated fraction (geocentric phase), from astronomy-engine. */
export function moonSky(latDeg: number, lonDeg: number, heightKm: number, ms: number): { elevationDeg: number; illuminatedFraction: number } {
  checkSite(latDeg, lonDeg, heightKm, ms);
  const t = Astro.MakeTime(new Date(ms));
  const obs = new Astro.Observer(latDeg, lonDeg, heightKm * 1000);
  const eq = Astro.Equator(Astro.Body.Moon, t, obs, true, true);
  const hor = Astro.Horizon(t, obs, eq.ra, eq.dec);
  if (ms !== phaseMs) {
    phaseFraction = Astro.Illumination(Astro.Body.Moon, t).phase_fraction;
    phaseMs = ms;
  }
  return { elevationDeg: hor.altitude, illuminatedFraction: phaseFraction };
}

/** The darkness of a site's sky at a Unix-ms time (geodetic lat/lon deg, height km above the ellipsoid). */
export function skyDarkness(latDeg: number, lonDeg: number, heightKm: number, ms: number, options: SkyDarknessOptions = {}): SkyDarkness {
  const limit = options.sunLimitDeg === undefined ? DEFAULT_SUN_LIMIT_DEG : requireInRange('sunLimitDeg', options.sunLimitDeg, -30, 0, 'deg');
  const moon = moonSky(latDeg, lonDeg, heightKm, ms);
  const sunElevationDeg = sunElevationDegUnchecked(latDeg, lonDeg, ms);
  return {
    sunElevationDeg,
    twilight: twilightClass(sunElevationDeg),
    dark: sunElevationDeg < limit,
    moonElevationDeg: moon.elevationDeg,
    moonIlluminatedFraction: moon.illuminatedFraction,
  };
}
