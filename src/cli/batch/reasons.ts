/**
 * Why a boundary cell is empty (the `boundary_reason` column): the reasons the
 * engine's search gives (SectorBoundaries.openClosedReason / equatorwardReason,
 * mapping/boundaries.ts), named by boundary. The interpolated grid
 * (--boundary-mlt-step) keeps no reasons: its empty cells say so.
 */
import type { SectorBoundaries } from '../../physics/mapping';

/** The reason text for the empty boundaries of `b` (null when both exist). */
export function boundaryReason(b: SectorBoundaries): string | null {
  if (b.openClosed && b.equatorward) return null;
  const parts: string[] = [];
  if (!b.openClosed) parts.push(`open_closed: ${b.openClosedReason ?? 'not found (no reason kept by the interpolated grid)'}`);
  if (!b.equatorward) parts.push(`equatorward: ${b.equatorwardReason ?? 'not found (no reason kept by the interpolated grid)'}`);
  return parts.join('; ');
}
