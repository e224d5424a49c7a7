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
import { MAP_STYLES, type MapStyle } from '../lib/palette';
import { directionLatLon } from '../lib/units';
import { useStore } from '../store';
import { addSiteAt } from '../sites';
import { RAD_PER_DEG } from '../../physics/constants';
import { placeLabels } from './mapGeometry';
import { utcText } from './answer';
import { useUi } from './selection';
import { useGraticule } from '../lib/cgmGraticule';
import { hemisphereGraticule } from '../lib/graticulePaths';
import {
  FONT, RIM_DEG, clearOfMarks, localTimeMarks, markTextY, ovalShapes, reservedBoxes, visibilityShapes, type LocalTimeMark, type OvalShapes,
} from './polarMapShapes';

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

/** The oval band, its edges and the gaps where an edge is missing (with the engine's reason). */
function OvalLayer({ shapes, st, hatch }: { shapes: OvalShapes; st: MapStyle; hatch: string }) {
  return (
    <>
      {shapes.band && <path d={shapes.band} fill={`url(#${hatch})`} fillRule="evenodd" stroke="none" data-layer="oval" />}
      <path d={shapes.oc} fill="none" stroke={st.openClosed} strokeWidth={1.8} data-layer="open-closed" />
      <path d={shapes.eq} fill="none" stroke={st.equatorward} strokeWidth={1.8} data-layer="equatorward" />
      {shapes.gaps.map((g, k) => g.p && (
        <g key={`g${k}`} data-layer="gap">
          <circle cx={g.p[0]} cy={g.p[1]} r={5} fill="none" stroke={st.equatorward} strokeWidth={1.2} strokeDasharray="2 2" />
          <text x={g.p[0]} y={g.p[1] - 8} textAnchor="middle" fill={st.ink} stroke={st.halo} strokeWidth={3} paintOrder="stroke" fontSize={FONT - 1}>no equatorward edge</text>
          <title>{`equatorward edge ${g.reason} at MLT ${g.mlt[0].toFixed(1)}–${g.mlt[1].toFixed(1)} h: no band drawn there`}</title>
        </g>
      ))}
      {shapes.ocGaps.map((g, k) => g.p && (
        <g key={`o${k}`} data-layer="gap">
          <circle cx={g.p[0]} cy={g.p[1]} r={5} fill="none" stroke={st.openClosed} strokeWidth={1.2} strokeDasharray="2 2" />
          <title>{`open–closed boundary ${g.reason} at MLT ${g.mlt[0].toFixed(1)}–${g.mlt[1].toFixed(1)} h: no band drawn there`}</title>
        </g>
      ))}
    </>
  );
}

interface CgmDrawn { circles: string; meridians: string; heightKm: number; labels: { text: string; kind: string; p: [number, number] | null }[] }

/** The CGM grid: latitude circles, MLT (CGM) meridians and their labels. */
function CgmLayer({ cgm, labels, st }: { cgm: CgmDrawn; labels: CgmDrawn['labels']; st: MapStyle }) {
  return (
    <g data-layer="cgm-graticule" fill="none" stroke={st.cgm} strokeWidth={0.9}>
      <title>{`CGM grid at ${cgm.heightKm} km: corrected geomagnetic latitude every 10° and MLT (CGM) every 3 h`}</title>
      <path d={cgm.circles} strokeDasharray="5 3" data-cgm="latitude" />
      <path d={cgm.meridians} strokeDasharray="1.5 2.5" strokeLinecap="round" data-cgm="mlt" />
      {labels.map((l) => (
        <text key={l.text} x={l.p![0]} y={l.p![1] + 3} textAnchor="middle" fill={st.cgm} stroke={st.ocean} strokeWidth={2.5} paintOrder="stroke" fontSize={FONT - 2} data-cgm-label={l.kind}>{l.text}</text>
      ))}
    </g>
  );
}

/** Ticks and labels of local noon, dusk, midnight and dawn at the rim. */
function LocalTimeLayer({ marks, st }: { marks: (LocalTimeMark | null)[]; st: MapStyle }) {
  return (
    <>
      {marks.map((m) => m && (
        <g key={m.text} data-layer="local-time">
          <line x1={m.x1} y1={m.y1} x2={m.x2} y2={m.y2} stroke={st.rim} strokeWidth={1.5} />
          <text x={m.tx} y={markTextY(m)} textAnchor={m.ux > 0.5 ? 'end' : m.ux < -0.5 ? 'start' : 'middle'} fill={st.ink} fontSize={FONT - 1} fontWeight="bold" stroke={st.halo} strokeWidth={3} paintOrder="stroke">{m.text}</text>
        </g>
      ))}
    </>
  );
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

  // The band only where both edges exist: never filled from the pole.
  const shapes = useMemo(() => (curve ? ovalShapes(proj, curve) : null), [curve, proj]);
  const pole: [number, number] | null = frames ? (north ? [frames.poleLatDeg, frames.poleLonDeg] : [-frames.poleLatDeg, frames.poleLonDeg + 180]) : null;
  const vis = useMemo(() => (curve && pole ? visibilityShapes(proj, curve, pole, altKm, minEl) : null), [curve, pole?.[0], pole?.[1], altKm, minEl, proj]); // eslint-disable-line react-hooks/exhaustive-deps

  const inMap = (lat: number) => (north ? lat > 90 - RIM_DEG : lat < RIM_DEG - 90);
  const onClick = (e: MouseEvent<SVGSVGElement>) => {
    const r = e.currentTarget.getBoundingClientRect();
    const ll = proj.invert?.([((e.clientX - r.left) * size) / r.width, ((e.clientY - r.top) * size) / r.height]);
    if (ll && Math.abs(ll[1]) <= 90 && inMap(ll[1])) addSiteAt(ll[1], ll[0]);
  };
  const mark = (lat: number, lon: number) => (inMap(lat) ? proj([lon, lat]) : null);

  // Local-time marks outside the rim (local noon under the Sun's longitude) and latitude labels.
  const ltMarks = sunLatLon ? localTimeMarks(proj, sunLatLon[1], north, size, radius) : [];
  // CGM grid labels that would sit on a local-time label at the rim are left out (the line keeps its place).
  const cgmLabels = (cgm?.labels ?? []).filter((l) => clearOfMarks(l.p!, l.text, ltMarks));
  const latLabelLon = sunLatLon ? sunLatLon[1] + 135 : 45;
  const latLabels = [50, 60, 70, 80].map((a) => {
    const lat = north ? a : -a;
    const p = proj([latLabelLon, lat]);
    return p && { x: p[0], y: p[1], text: `${a}°${north ? 'N' : 'S'}` };
  });

  // Site labels, placed so they do not overlap (the corners hold the title and the time).
  const sitePts = sites.map((s, i) => ({ i, p: mark(s.latDeg, s.lonDeg), name: s.name })).filter((s) => s.p);
  const reserved = reservedBoxes(size, shapes?.gaps ?? [], ltMarks);
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
        {cgm && <CgmLayer cgm={cgm} labels={cgmLabels} st={st} />}
        {shapes && <OvalLayer shapes={shapes} st={st} hatch={hatch} />}
        {vis && <path d={vis.line} fill="none" stroke={st.visibility} strokeWidth={2} strokeLinecap="round" strokeDasharray="0.1 5" data-layer="visibility" />}
        {vis && <path d={vis.ticks} fill="none" stroke={st.visibility} strokeWidth={1} />}
        <path d={base.rim} fill="none" stroke={st.rim} strokeWidth={1} />
        {latLabels.map((l) => l && (
          <text key={l.text} x={l.x} y={l.y - 2} fill={st.ink} fillOpacity={0.75} fontSize={FONT - 1} textAnchor="middle" stroke={st.ocean} strokeWidth={2.5} paintOrder="stroke">{l.text}</text>
        ))}
        <LocalTimeLayer marks={ltMarks} st={st} />
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
