/**
 * Why a boundary is missing at one MLT: every empty boundary cell in the CLI's
 * tables carries a reason (references §13), the one the engine's search gives
 * (SectorBoundaries.openClosedReason / equatorwardReason, mapping/boundaries.ts).
 */
import type { SectorBoundaries } from '../physics/mapping';

export type BoundaryKey = 'openClosed' | 'equatorward';

/** The reason a boundary is missing in this sector, or '' when it was found. */
export function boundaryReason(s: SectorBoundaries, key: BoundaryKey): string {
  if (s[key] !== null) return '';
  const own = key === 'openClosed' ? s.openClosedReason : s.equatorwardReason;
  return own ?? 'not found (no reason kept by the interpolated grid)';
}

/** Both reasons of a sector as one text naming each boundary (null when both exist). */
export function sectorReasons(s: SectorBoundaries): string | null {
  if (s.openClosed && s.equatorward) return null;
  const parts: string[] = [];
  if (!s.openClosed) parts.push(`open_closed: ${boundaryReason(s, 'openClosed')}`);
  if (!s.equatorward) parts.push(`equatorward: ${boundaryReason(s, 'equatorward')}`);
  return parts.join('; ');
}
