/**
 * Why a boundary is missing at one MLT: every empty boundary cell in the CLI's
 * tables carries a reason (references §13). The mapping code may give its own
 * reason (a `<boundary>Reason` text beside the boundary); otherwise the reason
 * is worked out here from what the conditions say.
 */
import { DEG_PER_RAD, RAD_PER_DEG, RE_KM } from '../physics/constants';
import { shueMagnetopause, shueRadius } from '../physics/field/magnetopause';
import { DISTANT_NEUTRAL_LINE_RE } from '../physics/field/model';
import { DEFAULT_BOUNDARY_OPTIONS, type SectorBoundaries } from '../physics/mapping';

export type BoundaryKey = 'openClosed' | 'equatorward';

/** What the reason depends on. */
export interface ReasonContext {
  pdynNpa: number;
  bzNt: number;
  magnetopause: boolean;
  imfEfficiency: number;
  /** Equatorial source distance of the equatorward edge, RE. */
  sourceRe: number;
  /** Footpoint altitude, km. */
  altKm: number;
  /** The tail term (and its distant neutral line) is on. */
  tail?: boolean;
}

/** The mapping code's own reason for a missing boundary, if it gives one. */
function ownReason(s: SectorBoundaries, key: BoundaryKey): string | null {
  const r = (s as unknown as Record<string, unknown>)[`${key}Reason`];
  return typeof r === 'string' && r !== '' ? r : null;
}

/** The reason a boundary is missing in this sector, or '' when it was found. */
export function boundaryReason(s: SectorBoundaries, key: BoundaryKey, c: ReasonContext): string {
  if (s[key] !== null) return '';
  const own = ownReason(s, key);
  if (own) return own;
  const minLat = DEFAULT_BOUNDARY_OPTIONS.minLatDeg;
  if (key === 'openClosed') {
    if (!c.magnetopause && c.imfEfficiency === 0) return 'no open–closed boundary: without the magnetopause and with no IMF penetration every line is closed';
    return `no open–closed boundary: the traced lines from the pole down to ${minLat}° magnetic latitude are all open or all closed at this MLT`;
  }
  // Equatorward edge: is the source distance outside the magnetopause in this direction (equatorial plane)?
  if (c.magnetopause) {
    const mp = shueMagnetopause(c.pdynNpa, c.bzNt);
    const theta = Math.abs(((s.mltHours - 12) * 15 + 540) % 360 - 180) * RAD_PER_DEG; // angle from the Sun line
    const rMp = shueRadius(mp, theta);
    if (c.sourceRe >= rMp) return `no equatorward edge: the source distance ${c.sourceRe} RE lies outside the magnetopause at this MLT (${rMp.toFixed(2)} RE)`;
  }
  if (c.tail !== false && c.sourceRe >= DISTANT_NEUTRAL_LINE_RE) return `no equatorward edge: the source distance ${c.sourceRe} RE lies beyond the distant neutral line (${DISTANT_NEUTRAL_LINE_RE} RE), where the lines are open`;
  // A dipole line with apex R reaches the altitude at cos²λ = r/R (references §1).
  const r = 1 + c.altKm / RE_KM;
  const dipoleLat = c.sourceRe > r ? Math.acos(Math.sqrt(r / c.sourceRe)) * DEG_PER_RAD : 0;
  if (dipoleLat < minLat) return `no equatorward edge: the source distance ${c.sourceRe} RE maps to about ${dipoleLat.toFixed(1)}° magnetic latitude, below the lowest searched ${minLat}°`;
  if (s.openClosed === null) return `no equatorward edge: no closed region found at this MLT (no open–closed boundary above ${minLat}°)`;
  return `no equatorward edge: no closed line at this MLT has its minimum |B| at ${c.sourceRe} RE (the closed lines here all reach nearer or farther)`;
}
