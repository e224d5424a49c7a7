/** The polar map's computed layers (pure functions of the projection and the engine's answers): oval band and edges, visibility limit, local-time marks. */
import type { GeoProjection } from 'd3-geo';
import type { BoundaryCurve } from '../../../workers/protocol';
import { visibilityAngleDeg, visibilityLimit } from '../lib/visibility';
import { bandRuns, gapRuns, runIndices } from './mapGeometry';

/** A screen box, px. */
export interface Box { x0: number; y0: number; x1: number; y1: number }

export const RIM_DEG = 50; // colatitude shown: poleward of 40°
export const FONT = 11;

type Xy = [number, number] | null;

function reasonAt(curve: BoundaryCurve, which: 'openClosed' | 'equatorward', i: number): string {
  const r = (which === 'openClosed' ? curve.openClosedReason : curve.equatorwardReason)?.[i];
  return typeof r === 'string' && r.trim() !== '' ? r : 'not found';
}

/** Screen position of a geographic point (null when off the map or not finite). */
export function screenXy(proj: GeoProjection, lat: number, lon: number): Xy {
  return Number.isFinite(lat) && Number.isFinite(lon) ? (proj([lon, lat]) as Xy) : null;
}

/** SVG path through the points idx (pen lifted where a point is off the map). */
export function polyline(proj: GeoProjection, idx: number[], lat: ArrayLike<number>, lon: ArrayLike<number>, close = false): string {
  let d = '';
  let pen = false;
  for (const k of idx) {
    const p = screenXy(proj, lat[k], lon[k]);
    if (!p) { pen = false; continue; }
    d += `${pen ? 'L' : 'M'}${p[0].toFixed(1)},${p[1].toFixed(1)}`;
    pen = true;
  }
  return d && close ? `${d}Z` : d;
}

const loop = (lat: ArrayLike<number>) => [...Array.from({ length: lat.length }, (_, i) => i), 0];

export interface Gap { p: Xy; mlt: [number, number]; reason: string }
export interface OvalShapes { band: string; oc: string; eq: string; gaps: Gap[]; ocGaps: Gap[] }

/** The band only where both edges exist (never filled from the pole), both edges, and the gaps with the engine's reason. */
export function ovalShapes(proj: GeoProjection, curve: BoundaryCurve): OvalShapes {
  const n = curve.mltHours.length;
  const oc = [curve.openClosedGeoLatDeg, curve.openClosedGeoLonDeg] as const;
  const eq = [curve.equatorwardGeoLatDeg, curve.equatorwardGeoLonDeg] as const;
  let band = '';
  for (const r of bandRuns(curve.openClosedGeoLatDeg, curve.equatorwardGeoLatDeg)) {
    if (r.whole) band += polyline(proj, loop(oc[0]).slice(0, n), oc[0], oc[1], true) + polyline(proj, loop(eq[0]).slice(0, n), eq[0], eq[1], true);
    else if (r.length >= 2) {
      const idx = runIndices(r, n);
      band += polyline(proj, idx, oc[0], oc[1]) + polyline(proj, [...idx].reverse(), eq[0], eq[1]).replace(/^M/, 'L') + 'Z';
    }
  }
  const gapsOf = (have: ArrayLike<number>, missing: ArrayLike<number>, at: readonly [ArrayLike<number>, ArrayLike<number>], which: 'openClosed' | 'equatorward'): Gap[] =>
    gapRuns(have, missing).map((r) => {
      const idx = runIndices(r, n);
      const mid = idx[Math.floor(idx.length / 2)];
      return { p: screenXy(proj, at[0][mid], at[1][mid]), mlt: [curve.mltHours[idx[0]], curve.mltHours[idx[idx.length - 1]]], reason: reasonAt(curve, which, mid) };
    });
  return {
    band,
    oc: polyline(proj, loop(oc[0]), oc[0], oc[1]),
    eq: polyline(proj, loop(eq[0]), eq[0], eq[1]),
    gaps: gapsOf(curve.openClosedGeoLatDeg, curve.equatorwardGeoLatDeg, oc, 'equatorward'),
    ocGaps: gapsOf(curve.equatorwardGeoLatDeg, curve.openClosedGeoLatDeg, eq, 'openClosed'),
  };
}

/** Visibility limit: each equatorward-edge point moved equatorward by the visibility angle; ticks point back to the oval. */
export function visibilityShapes(proj: GeoProjection, curve: BoundaryCurve, pole: [number, number], altKm: number, minElevationDeg: number): { line: string; ticks: string } {
  const h = altKm >= 80 ? altKm : 110; // a ground footprint has no emission height: use green
  const pts = visibilityLimit(curve.equatorwardGeoLatDeg, curve.equatorwardGeoLonDeg, pole[0], pole[1], visibilityAngleDeg(h, minElevationDeg));
  const lat = pts.map((p) => p[1]);
  const lon = pts.map((p) => p[0]);
  let ticks = '';
  for (let i = 0; i < pts.length; i += 2) {
    const a = screenXy(proj, lat[i], lon[i]);
    const b = screenXy(proj, curve.equatorwardGeoLatDeg[i], curve.equatorwardGeoLonDeg[i]);
    if (!a || !b) continue;
    const dx = b[0] - a[0], dy = b[1] - a[1], L = Math.hypot(dx, dy) || 1;
    ticks += `M${a[0].toFixed(1)},${a[1].toFixed(1)}l${((dx / L) * 5).toFixed(1)},${((dy / L) * 5).toFixed(1)}`;
  }
  return { line: polyline(proj, loop(lat), lat, lon), ticks };
}

export interface LocalTimeMark { x1: number; y1: number; x2: number; y2: number; tx: number; ty: number; ux: number; uy: number; text: string }

/** Local-time marks outside the rim (local noon under the Sun's longitude). */
export function localTimeMarks(proj: GeoProjection, sunLonDeg: number, north: boolean, size: number, radius: number): (LocalTimeMark | null)[] {
  const c = size / 2;
  return ([[0, '12 noon'], [90, '18 dusk'], [180, '00 midnight'], [-90, '06 dawn']] as const).map(([dl, text]) => {
    const p = proj([sunLonDeg + dl, north ? 90 - RIM_DEG : RIM_DEG - 90]);
    if (!p) return null;
    const ux = (p[0] - c) / radius, uy = (p[1] - c) / radius;
    return { x1: c + ux * (radius - 6), y1: c + uy * (radius - 6), x2: c + ux * (radius + 8), y2: c + uy * (radius + 8), tx: c + ux * (radius - 9), ty: c + uy * (radius - 9), ux, uy, text };
  });
}

/** Baseline of a local-time label: outside-facing labels sit just inside the rim. */
export const markTextY = (m: LocalTimeMark): number => m.ty + (m.uy > 0.5 ? -2 : m.uy < -0.5 ? FONT * 0.8 : FONT * 0.35);

/** Boxes the site labels must avoid: the title and time corners, the gap notes and the local-time labels. */
export function reservedBoxes(size: number, gaps: readonly Gap[], marks: readonly (LocalTimeMark | null)[]): Box[] {
  const reserved: Box[] = [{ x0: 0, y0: 0, x1: 150, y1: 18 }, { x0: size - 60, y0: 0, x1: size, y1: 18 }];
  for (const g of gaps) {
    if (!g.p) continue;
    const w = 'no equatorward edge'.length * (FONT - 1) * 0.6;
    reserved.push({ x0: g.p[0] - w / 2, y0: g.p[1] - 8 - FONT, x1: g.p[0] + w / 2, y1: g.p[1] - 6 });
  }
  for (const m of marks) {
    if (!m) continue;
    const w = m.text.length * FONT * 0.6;
    const x0 = m.ux > 0.5 ? m.tx - w : m.ux < -0.5 ? m.tx : m.tx - w / 2;
    const y1 = markTextY(m);
    reserved.push({ x0, y0: y1 - FONT, x1: x0 + w, y1: y1 + 2 });
  }
  return reserved;
}

/** Whether a CGM grid label at p stays clear of every local-time label. */
export function clearOfMarks(p: [number, number], text: string, marks: readonly (LocalTimeMark | null)[]): boolean {
  return marks.every((m) => {
    if (!m) return true;
    const w = m.text.length * FONT * 0.6;
    const cx = m.ux > 0.5 ? m.tx - w / 2 : m.ux < -0.5 ? m.tx + w / 2 : m.tx;
    return Math.abs(cx - p[0]) > (w + text.length * (FONT - 2) * 0.6) / 2 + 4 || Math.abs(m.ty - p[1]) > FONT + 6;
  });
}
