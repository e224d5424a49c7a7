/**
 * Display geometry for sky visibility: how far from an auroral arc at height h
 * a ground observer can still see it above a minimum elevation e, and the
 * curve that lies that far equatorward of a boundary.
 */
import { RE_KM, RAD_PER_DEG } from '../../physics/constants';

/**
 * Central angle (deg) between a ground site and a point at height h that the
 * site sees at elevation e: γ = acos(RE cos e / (RE + h)) − e (derived; references §7).
 */
export function visibilityAngleDeg(heightKm: number, minElevationDeg: number): number {
  const e = minElevationDeg * RAD_PER_DEG;
  return (Math.acos((RE_KM * Math.cos(e)) / (RE_KM + heightKm)) - e) / RAD_PER_DEG;
}

/** Ground distance (km, along RE) of that central angle. */
export function visibilityDistanceKm(heightKm: number, minElevationDeg: number): number {
  return visibilityAngleDeg(heightKm, minElevationDeg) * RAD_PER_DEG * RE_KM;
}

/**
 * Point at angular distance dDeg from (lat, lon) along initial bearing bDeg
 * (from north, clockwise): spherical destination formula (standard spherical trigonometry).
 */
export function destination(latDeg: number, lonDeg: number, bearingDeg: number, dDeg: number): [number, number] {
  const p1 = latDeg * RAD_PER_DEG;
  const l1 = lonDeg * RAD_PER_DEG;
  const b = bearingDeg * RAD_PER_DEG;
  const d = dDeg * RAD_PER_DEG;
  const sp2 = Math.sin(p1) * Math.cos(d) + Math.cos(p1) * Math.sin(d) * Math.cos(b);
  const p2 = Math.asin(Math.max(-1, Math.min(1, sp2)));
  const l2 = l1 + Math.atan2(Math.sin(b) * Math.sin(d) * Math.cos(p1), Math.cos(d) - Math.sin(p1) * sp2);
  let lon = ((l2 / RAD_PER_DEG + 540) % 360) - 180;
  if (lon === -180) lon = 180;
  return [p2 / RAD_PER_DEG, lon];
}

/** Initial bearing (deg from north) from point 1 to point 2 (standard spherical trigonometry). */
export function bearingDeg(lat1Deg: number, lon1Deg: number, lat2Deg: number, lon2Deg: number): number {
  const p1 = lat1Deg * RAD_PER_DEG;
  const p2 = lat2Deg * RAD_PER_DEG;
  const dl = (lon2Deg - lon1Deg) * RAD_PER_DEG;
  const y = Math.sin(dl) * Math.cos(p2);
  const x = Math.cos(p1) * Math.sin(p2) - Math.sin(p1) * Math.cos(p2) * Math.cos(dl);
  return (Math.atan2(y, x) / RAD_PER_DEG + 360) % 360;
}

/** Great-circle central angle (deg) between two points (haversine form). */
export function centralAngleDeg(lat1Deg: number, lon1Deg: number, lat2Deg: number, lon2Deg: number): number {
  const p1 = lat1Deg * RAD_PER_DEG;
  const p2 = lat2Deg * RAD_PER_DEG;
  const h = Math.sin((p2 - p1) / 2) ** 2 + Math.cos(p1) * Math.cos(p2) * Math.sin(((lon2Deg - lon1Deg) * RAD_PER_DEG) / 2) ** 2;
  return (2 * Math.asin(Math.min(1, Math.sqrt(h)))) / RAD_PER_DEG;
}

/**
 * The visibility limit: each boundary point moved by γ away from the magnetic
 * pole (poleLat/poleLon of its hemisphere), i.e. equatorward. NaN points stay NaN.
 * Returns [lon, lat] pairs (GeoJSON order).
 */
export function visibilityLimit(
  latDeg: ArrayLike<number>,
  lonDeg: ArrayLike<number>,
  poleLatDeg: number,
  poleLonDeg: number,
  gammaDeg: number,
): Array<[number, number]> {
  const out: Array<[number, number]> = [];
  for (let i = 0; i < latDeg.length; i++) {
    const la = latDeg[i];
    const lo = lonDeg[i];
    if (!Number.isFinite(la) || !Number.isFinite(lo)) {
      out.push([NaN, NaN]);
      continue;
    }
    const away = (bearingDeg(la, lo, poleLatDeg, poleLonDeg) + 180) % 360;
    const [la2, lo2] = destination(la, lo, away, gammaDeg);
    out.push([lo2, la2]);
  }
  return out;
}
