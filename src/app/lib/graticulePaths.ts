/**
 * The CGM graticule (from the worker) as map geometry: GeoJSON lines split
 * where CGM is undefined (a NaN sample: no line is drawn through it), and the
 * label anchors. Pure (no DOM); the polar map projects and draws them.
 */
import type { CgmGraticule, GraticuleLine } from '../../physics/mapping';

type Position = [number, number];

/** Runs of finite samples (≥ 2 points each) as [lon, lat] positions: a NaN sample breaks the line. */
export function splitAtUndefined(latDeg: ArrayLike<number>, lonDeg: ArrayLike<number>): Position[][] {
  const out: Position[][] = [];
  let run: Position[] = [];
  for (let i = 0; i <= latDeg.length; i++) {
    const ok = i < latDeg.length && Number.isFinite(latDeg[i]) && Number.isFinite(lonDeg[i]);
    if (ok) run.push([lonDeg[i], latDeg[i]]);
    else {
      if (run.length >= 2) out.push(run);
      run = [];
    }
  }
  return out;
}

export interface GraticuleLabel {
  latDeg: number;
  lonDeg: number;
  text: string;
  kind: 'latitude' | 'mlt';
}

export interface HemisphereGraticule {
  circles: { type: 'MultiLineString'; coordinates: Position[][] };
  meridians: { type: 'MultiLineString'; coordinates: Position[][] };
  labels: GraticuleLabel[];
}

/** MLT of the meridian that carries the latitude labels, h (between the dawn and midnight labels). */
const LAT_LABEL_MLT = 3;
/** CGM latitude (deg) where the meridians carry their MLT labels; only the four main meridians are labelled. */
const MLT_LABEL_LAT = 54;
const MLT_LABELLED = [0, 6, 12, 18];

const at = (l: GraticuleLine, absLat: number): number => {
  for (let i = 0; i < l.cgmLatDeg.length; i++) if (Math.abs(Math.abs(l.cgmLatDeg[i]) - absLat) < 1e-9 && Number.isFinite(l.latDeg[i])) return i;
  return -1;
};

/** One hemisphere's circles, meridians and labels. */
export function hemisphereGraticule(g: CgmGraticule, hemisphere: 'north' | 'south'): HemisphereGraticule {
  const mine = g.lines.filter((l) => l.hemisphere === hemisphere);
  const circles = mine.filter((l) => l.kind === 'latitude');
  const meridians = mine.filter((l) => l.kind === 'mlt');
  const labels: GraticuleLabel[] = [];
  const carrier = meridians.find((m) => m.value === LAT_LABEL_MLT);
  if (carrier) {
    for (const c of circles) {
      const i = at(carrier, Math.abs(c.value));
      if (i >= 0) labels.push({ latDeg: carrier.latDeg[i], lonDeg: carrier.lonDeg[i], text: `${Math.abs(c.value)}°`, kind: 'latitude' });
    }
  }
  for (const m of meridians) {
    if (!MLT_LABELLED.includes(m.value)) continue;
    const i = at(m, MLT_LABEL_LAT);
    if (i >= 0) labels.push({ latDeg: m.latDeg[i], lonDeg: m.lonDeg[i], text: `${String(m.value).padStart(2, '0')} MLT`, kind: 'mlt' });
  }
  return {
    circles: { type: 'MultiLineString', coordinates: circles.flatMap((l) => splitAtUndefined(l.latDeg, l.lonDeg)) },
    meridians: { type: 'MultiLineString', coordinates: meridians.flatMap((l) => splitAtUndefined(l.latDeg, l.lonDeg)) },
    labels,
  };
}
