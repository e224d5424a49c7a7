/**
 * One polar map (azimuthal equidistant, d3-geo, SVG) in our own style: a paper
 * (or slate) basemap, night as a light veil with the terminator, the oval as a
 * hatched band drawn only where both edges exist (gaps marked with the
 * engine's reason), the visibility limit as dots with ticks towards the oval,
 * latitude labels, local noon/midnight/dawn/dusk marks, the time stamp, sites
 * and conjugates with non-overlapping labels. Sized to its box (labels keep
 * their pixel size).
 */
import { useEffect, useId, useMemo, useRef, useState, type MouseEvent } from 'react';
import { geoAzimuthalEquidistant, geoCircle, geoGraticule, geoPath } from 'd3-geo';
import type { BoundaryCurve } from '../../../workers/protocol';
import { landFeature } from '../lib/atlas';
import { MAP_STYLES } from '../lib/palette';
import { visibilityAngleDeg, visibilityLimit } from '../lib/visibility';
import { directionLatLon } from '../lib/units';
import { useStore } from '../store';
import { addSiteAt } from '../sites';
import { RAD_PER_DEG } from '../../physics/constants';
import { bandRuns, gapRuns, placeLabels, runIndices } from './mapGeometry';
import { utcText } from './answer';
import { useUi } from './selection';
import { useGraticule } from '../lib/cgmGraticule';
import { hemisphereGraticule } from '../lib/graticulePaths';

const RIM_DEG = 50; // colatitude shown: poleward of 40°
const FONT = 11;
const MARGIN = 12; // room outside the rim for the local-time ticks

/** Width of an element, kept up to date (ResizeObserver). */
function useWidth(fallback: number): [React.RefObject<HTMLDivElement | null>, number] {
  const ref = useRef<HTMLDivElement>(null);
  const [w, setW] = useState(fallback);
  useEffect(() => {
    const el = ref.current;
    if (!el || typeof ResizeObserver === 'undefined') return;
    const ro = new ResizeObserver((es) => {
      const cw = Math.round(es[0].contentRect.width);
      if (cw > 0) setW((old) => (Math.abs(old - cw) >= 2 ? cw : old));
    });
    ro.observe(el);
    return () => ro.disconnect();
  }, []);
  return [ref, w];
}

function reasonAt(curve: BoundaryCurve, which: 'openClosed' | 'equatorward', i: number): string {
  const r = (which === 'openClosed' ? curve.openClosedReason : curve.equatorwardReason)?.[i];
  return typeof r === 'string' && r.trim() !== '' ? r : 'not found';
}

export function PolarMap({ hemisphere, big = false }: { hemisphere: 'north' | 'south'; big?: boolean }) {
  const north = hemisphere === 'north';
  const uid = useId().replace(/[^a-zA-Z0-9_-]/g, '');
  const [box, width] = useWidth(big ? 700 : 320);
  const size = Math.max(220, Math.min(width, 1400));
  const st = MAP_STYLES[useUi((s) => s.basemap)];
  const oval = useStore((s) => s.oval);
  const frames = useStore((s) => s.scene?.frames);
  const time = useStore((s) => s.conditions.time);
  const sites = useStore((s) => s.sites);
  const results = useStore((s) => s.siteResults);
  const altKm = useStore((s) => s.products.altKm);
  const minEl = useStore((s) => s.products.minElevationDeg);
  const radius = size / 2 - MARGIN;
  const proj = useMemo(
    () => geoAzimuthalEquidistant().rotate([0, north ? -90 : 90, 0]).clipAngle(RIM_DEG).scale(radius / (RIM_DEG * RAD_PER_DEG)).translate([size / 2, size / 2]).precision(0.3),
    [north, size, radius],
  );
  const path = useMemo(() => geoPath(proj), [proj]);
  const base = useMemo(() => ({ land: path(landFeature()) ?? '', grat: path(geoGraticule().step([30, 10]).extentMinor([[-180, -80], [180, 80.01]])()) ?? '', rim: path({ type: 'Sphere' }) ?? '' }), [path]);
  const cgmOn = useStore((s) => s.view.cgmGraticule);
  const { graticule } = useGraticule();
  const cgm = useMemo(() => {
    if (!cgmOn || !graticule) return null;
    const h = hemisphereGraticule(graticule, hemisphere);
    const labels = h.labels.map((l) => ({ ...l, p: proj([l.lonDeg, l.latDeg]) })).filter((l) => l.p && Math.hypot(l.p[0] - size / 2, l.p[1] - size / 2) < size / 2 - MARGIN - 4);
    return { circles: path(h.circles) ?? '', meridians: path(h.meridians) ?? '', labels, heightKm: graticule.heightKm };
  }, [cgmOn, graticule, hemisphere, path, proj, size]);
  const curve: BoundaryCurve | undefined = oval?.curves.find((c) => c.hemisphere === hemisphere);
  const sunLatLon = frames ? directionLatLon(frames.sunGeo) : null;

  const night = useMemo(() => {
    if (!sunLatLon) return { fill: '', edge: '' };
    const [la, lo] = sunLatLon;
    const c = geoCircle().center([lo + 180, -la]).radius(90)();
    return { fill: path(c) ?? '', edge: path({ type: 'LineString', coordinates: c.coordinates[0] }) ?? '' };
  }, [sunLatLon?.[0], sunLatLon?.[1], path]); // eslint-disable-line react-hooks/exhaustive-deps

  const xy = (lat: number, lon: number) => (Number.isFinite(lat) && Number.isFinite(lon) ? proj([lon, lat]) : null);
  const polyline = (idx: number[], lat: ArrayLike<number>, lon: ArrayLike<number>, close = false): string => {
    let d = '';
    let pen = false;
    for (const k of idx) {
      const p = xy(lat[k], lon[k]);
      if (!p) { pen = false; continue; }
      d += `${pen ? 'L' : 'M'}${p[0].toFixed(1)},${p[1].toFixed(1)}`;
      pen = true;
    }
    return d && close ? `${d}Z` : d;
  };
  const loop = (lat: ArrayLike<number>) => [...Array.from({ length: lat.length }, (_, i) => i), 0];

  // The band only where both edges exist: never filled from the pole.
  const shapes = useMemo(() => {
    if (!curve) return null;
    const n = curve.mltHours.length;
    const oc = [curve.openClosedGeoLatDeg, curve.openClosedGeoLonDeg] as const;
    const eq = [curve.equatorwardGeoLatDeg, curve.equatorwardGeoLonDeg] as const;
    let band = '';
    for (const r of bandRuns(curve.openClosedGeoLatDeg, curve.equatorwardGeoLatDeg)) {
      if (r.whole) band += polyline(loop(oc[0]).slice(0, n), oc[0], oc[1], true) + polyline(loop(eq[0]).slice(0, n), eq[0], eq[1], true);
      else if (r.length >= 2) {
        const idx = runIndices(r, n);
        band += polyline(idx, oc[0], oc[1]) + polyline([...idx].reverse(), eq[0], eq[1]).replace(/^M/, 'L') + 'Z';
      }
    }
    const gaps = gapRuns(curve.openClosedGeoLatDeg, curve.equatorwardGeoLatDeg).map((r) => {
      const idx = runIndices(r, n);
      const mid = idx[Math.floor(idx.length / 2)];
      return { p: xy(oc[0][mid], oc[1][mid]), mlt: [curve.mltHours[idx[0]], curve.mltHours[idx[idx.length - 1]]], reason: reasonAt(curve, 'equatorward', mid) };
    });
    const ocGaps = gapRuns(curve.equatorwardGeoLatDeg, curve.openClosedGeoLatDeg).map((r) => {
      const idx = runIndices(r, n);
      const mid = idx[Math.floor(idx.length / 2)];
      return { p: xy(eq[0][mid], eq[1][mid]), mlt: [curve.mltHours[idx[0]], curve.mltHours[idx[idx.length - 1]]], reason: reasonAt(curve, 'openClosed', mid) };
    });
    return { band, oc: polyline(loop(oc[0]), oc[0], oc[1]), eq: polyline(loop(eq[0]), eq[0], eq[1]), gaps, ocGaps };
  }, [curve, proj]); // eslint-disable-line react-hooks/exhaustive-deps

  // Visibility limit: each equatorward-edge point moved equatorward by the visibility angle; ticks point back to the oval.
  const vis = useMemo(() => {
    if (!curve || !frames) return null;
    const h = altKm >= 80 ? altKm : 110; // a ground footprint has no emission height: use green
    const pole = north ? [frames.poleLatDeg, frames.poleLonDeg] : [-frames.poleLatDeg, frames.poleLonDeg + 180];
    const pts = visibilityLimit(curve.equatorwardGeoLatDeg, curve.equatorwardGeoLonDeg, pole[0], pole[1], visibilityAngleDeg(h, minEl));
    const lat = pts.map((p) => p[1]);
    const lon = pts.map((p) => p[0]);
    let ticks = '';
    for (let i = 0; i < pts.length; i += 2) {
      const a = xy(lat[i], lon[i]);
      const b = xy(curve.equatorwardGeoLatDeg[i], curve.equatorwardGeoLonDeg[i]);
      if (!a || !b) continue;
      const dx = b[0] - a[0], dy = b[1] - a[1], L = Math.hypot(dx, dy) || 1;
      ticks += `M${a[0].toFixed(1)},${a[1].toFixed(1)}l${((dx / L) * 5).toFixed(1)},${((dy / L) * 5).toFixed(1)}`;
    }
    return { line: polyline(loop(lat), lat, lon), ticks };
  }, [curve, frames, altKm, minEl, north, proj]); // eslint-disable-line react-hooks/exhaustive-deps

  const inMap = (lat: number) => (north ? lat > 90 - RIM_DEG : lat < RIM_DEG - 90);
  const onClick = (e: MouseEvent<SVGSVGElement>) => {
    const r = e.currentTarget.getBoundingClientRect();
    const ll = proj.invert?.([((e.clientX - r.left) * size) / r.width, ((e.clientY - r.top) * size) / r.height]);
    if (ll && Math.abs(ll[1]) <= 90 && inMap(ll[1])) addSiteAt(ll[1], ll[0]);
  };
  const mark = (lat: number, lon: number) => (inMap(lat) ? proj([lon, lat]) : null);

  // Local-time marks outside the rim (local noon under the Sun's longitude) and latitude labels.
  const c = size / 2;
  const ltMarks = sunLatLon
    ? ([[0, '12 noon'], [90, '18 dusk'], [180, '00 midnight'], [-90, '06 dawn']] as const).map(([dl, text]) => {
        const p = proj([sunLatLon[1] + dl, north ? 90 - RIM_DEG : RIM_DEG - 90]);
        if (!p) return null;
        const ux = (p[0] - c) / radius, uy = (p[1] - c) / radius;
        return { x1: c + ux * (radius - 6), y1: c + uy * (radius - 6), x2: c + ux * (radius + 8), y2: c + uy * (radius + 8), tx: c + ux * (radius - 9), ty: c + uy * (radius - 9), ux, uy, text };
      })
    : [];
  // CGM grid labels that would sit on a local-time label at the rim are left out (the line keeps its place).
  const cgmLabels = (cgm?.labels ?? []).filter((l) => ltMarks.every((m) => {
    if (!m) return true;
    const w = m.text.length * FONT * 0.6;
    const cx = m.ux > 0.5 ? m.tx - w / 2 : m.ux < -0.5 ? m.tx + w / 2 : m.tx;
    return Math.abs(cx - l.p![0]) > (w + l.text.length * (FONT - 2) * 0.6) / 2 + 4 || Math.abs(m.ty - l.p![1]) > FONT + 6;
  }));
  const latLabelLon = sunLatLon ? sunLatLon[1] + 135 : 45;
  const latLabels = [50, 60, 70, 80].map((a) => {
    const lat = north ? a : -a;
    const p = proj([latLabelLon, lat]);
    return p && { x: p[0], y: p[1], text: `${a}°${north ? 'N' : 'S'}` };
  });

  // Site labels, placed so they do not overlap (the corners hold the title and the time).
  const sitePts = sites.map((s, i) => ({ i, p: mark(s.latDeg, s.lonDeg), name: s.name })).filter((s) => s.p);
  const reserved = [{ x0: 0, y0: 0, x1: 150, y1: 18 }, { x0: size - 60, y0: 0, x1: size, y1: 18 }];
  for (const g of shapes?.gaps ?? []) {
    if (!g.p) continue;
    const w = 'no equatorward edge'.length * (FONT - 1) * 0.6;
    reserved.push({ x0: g.p[0] - w / 2, y0: g.p[1] - 8 - FONT, x1: g.p[0] + w / 2, y1: g.p[1] - 6 });
  }
  for (const m of ltMarks) {
    if (!m) continue;
    const w = m.text.length * FONT * 0.6;
    const x0 = m.ux > 0.5 ? m.tx - w : m.ux < -0.5 ? m.tx : m.tx - w / 2;
    const y1 = m.ty + (m.uy > 0.5 ? -2 : m.uy < -0.5 ? FONT * 0.8 : FONT * 0.35);
    reserved.push({ x0, y0: y1 - FONT, x1: x0 + w, y1: y1 + 2 });
  }
  const placed = placeLabels(sitePts.map((s) => ({ x: s.p![0], y: s.p![1], text: s.name })), size, FONT * 0.6, FONT + 2, reserved);
  const hatch = `hatch-${hemisphere}-${uid}`;
  const title = `${north ? 'North' : 'South'} polar map`;

  return (
    <div ref={box} className="map-box">
      <svg
        viewBox={`0 0 ${size} ${size}`}
        width={size}
        height={size}
        role="img"
        aria-label={`${title}, geographic, poleward of 40°${cgm ? `, with the CGM grid at ${cgm.heightKm} km` : ''}, ${utcText(time)}`}
        onClick={onClick}
        data-map={hemisphere}
        xmlns="http://www.w3.org/2000/svg"
        fontFamily="system-ui, 'DejaVu Sans', sans-serif"
        fontSize={FONT}
      >
        <title>{`${title} (GEO, azimuthal equidistant), ${utcText(time)}`}</title>
        <defs>
          <pattern id={hatch} patternUnits="userSpaceOnUse" width={6} height={6} patternTransform="rotate(35)">
            <rect width={6} height={6} fill={st.band} fillOpacity={0.14} />
            <line x1={0} y1={0} x2={0} y2={6} stroke={st.band} strokeWidth={2} strokeOpacity={0.7} />
          </pattern>
        </defs>
        <rect width={size} height={size} fill={st.halo} />
        <path d={base.rim} fill={st.ocean} />
        <path d={base.land} fill={st.land} stroke={st.coast} strokeWidth={0.6} />
        <path d={night.fill} fill={st.night} fillOpacity={st.nightOpacity} data-layer="night" />
        <path d={night.edge} fill="none" stroke={st.night} strokeOpacity={0.6} strokeWidth={0.8} strokeDasharray="1 2" />
        <path d={base.grat} fill="none" stroke={st.graticule} strokeOpacity={0.55} strokeWidth={0.5} />
        {cgm && (
          <g data-layer="cgm-graticule" fill="none" stroke={st.cgm} strokeWidth={0.9}>
            <title>{`CGM grid at ${cgm.heightKm} km: corrected geomagnetic latitude every 10° and MLT (CGM) every 3 h`}</title>
            <path d={cgm.circles} strokeDasharray="5 3" data-cgm="latitude" />
            <path d={cgm.meridians} strokeDasharray="1.5 2.5" strokeLinecap="round" data-cgm="mlt" />
            {cgmLabels.map((l) => (
              <text key={l.text} x={l.p![0]} y={l.p![1] + 3} textAnchor="middle" fill={st.cgm} stroke={st.ocean} strokeWidth={2.5} paintOrder="stroke" fontSize={FONT - 2} data-cgm-label={l.kind}>{l.text}</text>
            ))}
          </g>
        )}
        {shapes?.band && <path d={shapes.band} fill={`url(#${hatch})`} fillRule="evenodd" stroke="none" data-layer="oval" />}
        {shapes && <path d={shapes.oc} fill="none" stroke={st.openClosed} strokeWidth={1.8} data-layer="open-closed" />}
        {shapes && <path d={shapes.eq} fill="none" stroke={st.equatorward} strokeWidth={1.8} data-layer="equatorward" />}
        {shapes?.gaps.map((g, k) => g.p && (
          <g key={`g${k}`} data-layer="gap">
            <circle cx={g.p[0]} cy={g.p[1]} r={5} fill="none" stroke={st.equatorward} strokeWidth={1.2} strokeDasharray="2 2" />
            <text x={g.p[0]} y={g.p[1] - 8} textAnchor="middle" fill={st.ink} stroke={st.halo} strokeWidth={3} paintOrder="stroke" fontSize={FONT - 1}>no equatorward edge</text>
            <title>{`equatorward edge ${g.reason} at MLT ${g.mlt[0].toFixed(1)}–${g.mlt[1].toFixed(1)} h: no band drawn there`}</title>
          </g>
        ))}
        {shapes?.ocGaps.map((g, k) => g.p && (
          <g key={`o${k}`} data-layer="gap">
            <circle cx={g.p[0]} cy={g.p[1]} r={5} fill="none" stroke={st.openClosed} strokeWidth={1.2} strokeDasharray="2 2" />
            <title>{`open–closed boundary ${g.reason} at MLT ${g.mlt[0].toFixed(1)}–${g.mlt[1].toFixed(1)} h: no band drawn there`}</title>
          </g>
        ))}
        {vis && <path d={vis.line} fill="none" stroke={st.visibility} strokeWidth={2} strokeLinecap="round" strokeDasharray="0.1 5" data-layer="visibility" />}
        {vis && <path d={vis.ticks} fill="none" stroke={st.visibility} strokeWidth={1} />}
        <path d={base.rim} fill="none" stroke={st.rim} strokeWidth={1} />
        {latLabels.map((l) => l && (
          <text key={l.text} x={l.x} y={l.y - 2} fill={st.ink} fillOpacity={0.75} fontSize={FONT - 1} textAnchor="middle" stroke={st.ocean} strokeWidth={2.5} paintOrder="stroke">{l.text}</text>
        ))}
        {ltMarks.map((m) => m && (
          <g key={m.text} data-layer="local-time">
            <line x1={m.x1} y1={m.y1} x2={m.x2} y2={m.y2} stroke={st.rim} strokeWidth={1.5} />
            <text x={m.tx} y={m.ty + (m.uy > 0.5 ? -2 : m.uy < -0.5 ? FONT * 0.8 : FONT * 0.35)} textAnchor={m.ux > 0.5 ? 'end' : m.ux < -0.5 ? 'start' : 'middle'} fill={st.ink} fontSize={FONT - 1} fontWeight="bold" stroke={st.halo} strokeWidth={3} paintOrder="stroke">{m.text}</text>
          </g>
        ))}
        <text x={4} y={13} fill={st.ink} fontWeight="bold">{utcText(time)}</text>
        <text x={size - 4} y={13} fill={st.ink} textAnchor="end">{north ? 'North' : 'South'}</text>
        {frames && (() => {
          const p = north ? mark(frames.poleLatDeg, frames.poleLonDeg) : mark(-frames.poleLatDeg, frames.poleLonDeg + 180);
          return p && <path d={`M${p[0] - 4},${p[1] - 4}l8,8M${p[0] + 4},${p[1] - 4}l-8,8`} stroke={st.pole} strokeWidth={1.5}><title>dipole pole</title></path>;
        })()}
        {results?.sites.map((r, i) => {
          const p = r.conjugate ? mark(r.conjugate.geoLatDeg, r.conjugate.geoLonDeg) : null;
          return p && <rect key={`c${i}`} x={p[0] - 3} y={p[1] - 3} width={6} height={6} transform={`rotate(45 ${p[0]} ${p[1]})`} fill="none" stroke={st.conjugate} strokeWidth={1.6}><title>{`conjugate of ${r.name}`}</title></rect>;
        })}
        {sitePts.map((s, k) => (
          <g key={`s${s.i}`}>
            <circle cx={s.p![0]} cy={s.p![1]} r={3.2} fill={st.site} stroke={st.halo} strokeWidth={1}><title>{s.name}</title></circle>
            {placed[k] && <text x={placed[k]!.x} y={placed[k]!.y} textAnchor={placed[k]!.anchor} fill={st.ink} stroke={st.halo} strokeWidth={3} paintOrder="stroke">{s.name}</text>}
          </g>
        ))}
      </svg>
    </div>
  );
}
