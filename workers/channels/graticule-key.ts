/** The CGM graticule's request and cache key, without the physics (the app imports this file). */
import type { InternalFieldKind } from '../../src/physics/field/conditions';

export interface GraticuleRequest {
  /** UTC time, ISO 8601. */
  time: string;
  internal: InternalFieldKind;
  /** Dipole tilt override (deg) or null: it moves the Sun in the frames, so MLT. */
  tiltDeg: number | null;
  /** Height of the graticule above the ellipsoid (km): the maps' footpoint altitude. */
  heightKm: number;
}

/** The cache key of a request: everything the graticule depends on, nothing else. */
export function graticuleKey(r: GraticuleRequest): string {
  return `${r.internal}|${r.time}|${r.tiltDeg ?? ''}|${r.heightKm}`;
}

