/** One polar map (azimuthal equidistant, d3-geo, SVG): land, night, oval band, visibility limit, sites, conjugates. */
import { useMemo, type MouseEvent } from 'react';
import { geoAzimuthalEquidistant, geoCircle, geoGraticule, geoPath } from 'd3-geo';
import type { BoundaryCurve } from '../../../workers/protocol';
import { landFeature } from '../lib/atlas';
import { BASE_COLOURS, OVAL_COLOURS, SITE_COLOURS } from '../lib/palette';
import { visibilityAngleDeg, visibilityLimit } from '../lib/visibility';
import { directionLatLon } from '../lib/units';
import { useStore } from '../store';
import { addSiteAt } from '../sites';
import { RAD_PER_DEG } from '../../physics/constants';

const SIZE = 300;
const RIM_DEG = 50; // colatitude shown: poleward of 40°

export function PolarMap({ hemisphere }: { hemisphere: 'north' | 'south' }) {
  const north = hemisphere === 'north';
  const oval = useStore((s) => s.oval);
  const frames = useStore((s) => s.scene?.frames);
  const sites = useStore((s) => s.sites);
  const results = useStore((s) => s.siteResults);
  const altKm = useStore((s) => s.products.altKm);
  const minEl = useStore((s) => s.products.minElevationDeg);
  const proj = useMemo(
    () => geoAzimuthalEquidistant().rotate([0, north ? -90 : 90, 0]).clipAngle(RIM_DEG).scale(SIZE / 2 / (RIM_DEG * RAD_PER_DEG) * 0.96).translate([SIZE / 2, SIZE / 2]).precision(0.3),
    [north],
  );
  const path = useMemo(() => geoPath(proj), [proj]);
  const base = useMemo(() => ({ land: path(landFeature()) ?? '', grat: path(geoGraticule().step([30, 10])()) ?? '', rim: path({ type: 'Sphere' }) ?? '' }), [path]);
  const curve: BoundaryCurve | undefined = oval?.curves.find((c) => c.hemisphere === hemisphere);

  const night = useMemo(() => {
    if (!frames) return '';
    const [la, lo] = directionLatLon(frames.sunGeo);
    return path(geoCircle().center([lo + 180, -la]).radius(90)()) ?? '';
  }, [frames, path]);

  const ring = (lat: ArrayLike<number>, lon: ArrayLike<number>): string => {
    let d = '';
    let pen = false;
    for (let i = 0; i <= lat.length; i++) {
      const k = i % lat.length;
      const p = Number.isFinite(lat[k]) && Number.isFinite(lon[k]) ? proj([lon[k], lat[k]]) : null;
      if (!p) { pen = false; continue; }
      d += `${pen ? 'L' : 'M'}${p[0].toFixed(1)},${p[1].toFixed(1)}`;
      pen = true;
    }
    return d;
  };
  const band = curve ? ring(curve.equatorwardGeoLatDeg, curve.equatorwardGeoLonDeg) + ring(curve.openClosedGeoLatDeg, curve.openClosedGeoLonDeg) : '';
  const vis = useMemo(() => {
    if (!curve || !frames) return '';
    const h = altKm >= 80 ? altKm : 110; // a ground footprint has no emission height: use green
    const pole = north ? [frames.poleLatDeg, frames.poleLonDeg] : [-frames.poleLatDeg, frames.poleLonDeg + 180];
    const pts = visibilityLimit(curve.equatorwardGeoLatDeg, curve.equatorwardGeoLonDeg, pole[0], pole[1], visibilityAngleDeg(h, minEl));
    return ring(pts.map((p) => p[1]), pts.map((p) => p[0]));
  }, [curve, frames, altKm, minEl, north]);

  const onClick = (e: MouseEvent<SVGSVGElement>) => {
    const box = e.currentTarget.getBoundingClientRect();
    const ll = proj.invert?.([((e.clientX - box.left) * SIZE) / box.width, ((e.clientY - box.top) * SIZE) / box.height]);
    if (ll && Math.abs(ll[1]) <= 90 && (north ? ll[1] > 90 - RIM_DEG : ll[1] < RIM_DEG - 90)) addSiteAt(ll[1], ll[0]);
  };
  const mark = (lat: number, lon: number) => (north ? lat > 90 - RIM_DEG : lat < RIM_DEG - 90) ? proj([lon, lat]) : null;

  return (
    <svg viewBox={`0 0 ${SIZE} ${SIZE}`} width={SIZE} height={SIZE} role="img" aria-label={`${north ? 'North' : 'South'} polar map, geographic, poleward of 40°`} onClick={onClick} data-map={hemisphere} xmlns="http://www.w3.org/2000/svg">
      <title>{`${north ? 'North' : 'South'} polar map (GEO, azimuthal equidistant)`}</title>
      <path d={base.rim} fill={BASE_COLOURS.ocean} />
      <path d={base.land} fill={BASE_COLOURS.land} stroke={BASE_COLOURS.coast} strokeWidth={0.5} />
      <path d={night} fill="#000010" fillOpacity={0.45} />
      <path d={base.grat} fill="none" stroke="#8aa4c0" strokeOpacity={0.35} strokeWidth={0.5} />
      {band && <path d={band} fill={OVAL_COLOURS.band} fillOpacity={0.45} fillRule="evenodd" stroke="none" data-layer="oval" />}
      {curve && <path d={ring(curve.openClosedGeoLatDeg, curve.openClosedGeoLonDeg)} fill="none" stroke={OVAL_COLOURS.openClosed} strokeWidth={1.2} />}
      {curve && <path d={ring(curve.equatorwardGeoLatDeg, curve.equatorwardGeoLonDeg)} fill="none" stroke={OVAL_COLOURS.equatorward} strokeWidth={1.2} />}
      {vis && <path d={vis} fill="none" stroke={OVAL_COLOURS.visibility} strokeWidth={1} strokeDasharray="4 3" data-layer="visibility" />}
      <path d={base.rim} fill="none" stroke="#8aa4c0" />
      {frames && (() => {
        const p = north ? mark(frames.poleLatDeg, frames.poleLonDeg) : mark(-frames.poleLatDeg, frames.poleLonDeg + 180);
        return p && <path d={`M${p[0] - 4},${p[1]}h8M${p[0]},${p[1] - 4}v8`} stroke="#ff7b5c" strokeWidth={1.5}><title>dipole pole</title></path>;
      })()}
      {sites.map((s, i) => {
        const p = mark(s.latDeg, s.lonDeg);
        return p && (
          <g key={`s${i}`}>
            <circle cx={p[0]} cy={p[1]} r={3} fill={SITE_COLOURS.site} stroke="#000" strokeWidth={0.5} />
            <text x={p[0] + 4} y={p[1] - 4} fontSize={8} fill="#fff">{s.name}</text>
          </g>
        );
      })}
      {results?.sites.map((r, i) => {
        const p = r.conjugate ? mark(r.conjugate.geoLatDeg, r.conjugate.geoLonDeg) : null;
        return p && <rect key={`c${i}`} x={p[0] - 2.5} y={p[1] - 2.5} width={5} height={5} transform={`rotate(45 ${p[0]} ${p[1]})`} fill={SITE_COLOURS.conjugate}><title>{`conjugate of ${r.name}`}</title></rect>;
      })}
    </svg>
  );
}
