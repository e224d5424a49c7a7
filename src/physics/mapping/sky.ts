/**
 * Sky visibility: where a point at emission height appears in a ground
 * site's sky. Topocentric east/north/up on the WGS84 normal (common practice).
 */
import { RAD_PER_DEG, DEG_PER_RAD, RE_KM } from '../constants';
import { geoFromGeodetic } from '../frames/geodesy';
import { requireInRange } from '../errors';

export interface SkyPosition {
  /** Elevation above the site's horizon, deg. */
  elevationDeg: number;
  /** Azimuth east of geographic north, 0..360 deg. */
  azimuthDeg: number;
  /** Straight-line distance, km. */
  distanceKm: number;
}

const a = new Float64Array(3);
const b = new Float64Array(3);

/** Elevation/azimuth of a target (geodetic lat/lon, height km) seen from a site (geodetic, height km). */
export function skyPosition(siteLatDeg: number, siteLonDeg: number, siteHeightKm: number, tLatDeg: number, tLonDeg: number, tHeightKm: number): SkyPosition {
  geoFromGeodetic(a, siteLatDeg, siteLonDeg, siteHeightKm);
  geoFromGeodetic(b, tLatDeg, tLonDeg, tHeightKm);
  const dx = (b[0] - a[0]) * RE_KM, dy = (b[1] - a[1]) * RE_KM, dz = (b[2] - a[2]) * RE_KM;
  const la = siteLatDeg * RAD_PER_DEG, lo = siteLonDeg * RAD_PER_DEG;
  const sla = Math.sin(la), cla = Math.cos(la), slo = Math.sin(lo), clo = Math.cos(lo);
  const e = -slo * dx + clo * dy;
  const n = -sla * clo * dx - sla * slo * dy + cla * dz;
  const u = cla * clo * dx + cla * slo * dy + sla * dz;
  const d = Math.hypot(dx, dy, dz);
  let az = Math.atan2(e, n) * DEG_PER_RAD;
  if (az < 0) az += 360;
  return { elevationDeg: Math.asin(u / d) * DEG_PER_RAD, azimuthDeg: az, distanceKm: d };
}

/**
 * Central angle (deg) at which a point at height h sits at elevation e for a
 * ground observer on a sphere of radius RE: γ = acos(RE cos e / (RE + h)) − e
 * (derived; references §7).
 */
export function horizonCentralAngleDeg(heightKm: number, minElevationDeg: number): number {
  requireInRange('heightKm', heightKm, 0, 100_000, 'km');
  requireInRange('minElevationDeg', minElevationDeg, 0, 90, 'deg');
  const e = minElevationDeg * RAD_PER_DEG;
  return (Math.acos((RE_KM * Math.cos(e)) / (RE_KM + heightKm)) - e) * DEG_PER_RAD;
}

/** Elevation (deg) of a point at height h seen at central angle γ on a sphere (inverse of the above; derived). */
export function elevationAtCentralAngleDeg(heightKm: number, centralAngleDeg: number): number {
  const g = centralAngleDeg * RAD_PER_DEG;
  const r = RE_KM + heightKm;
  // Observer at (RE, 0), target at (r cos γ, r sin γ): elevation = atan2(r cos γ − RE, r sin γ).
  return Math.atan2(r * Math.cos(g) - RE_KM, r * Math.sin(g)) * DEG_PER_RAD;
}
