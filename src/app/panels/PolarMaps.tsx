/** North and south polar maps side by side, the basemap choice, the legend, and a map enlarged on request. */
import { useEffect } from 'react';
import { MAP_STYLES } from '../lib/palette';
import { visibilityAngleDeg } from '../lib/visibility';
import { useGraticule, useGraticuleRequests, wantGraticule } from '../lib/cgmGraticule';
import { setView, useStore } from '../store';
import { PolarMap } from './PolarMap';
import { hatchDef, mapLegend } from './mapLegend';
import { ui, useUi, type Basemap } from './selection';

function EnlargedMap({ hemisphere }: { hemisphere: 'north' | 'south' }) {
  return (
    <div className="map-dialog" role="dialog" aria-modal="true" aria-label={`${hemisphere === 'north' ? 'North' : 'South'} polar map, enlarged`} onKeyDown={(e) => { if (e.key === 'Escape') ui.set({ enlargedMap: null }); }}>
      <div className="inner">
        <div className="row">
          <span>Click the map to add a site there.</span>
          <button type="button" autoFocus onClick={() => ui.set({ enlargedMap: null })}>Close</button>
        </div>
        <PolarMap hemisphere={hemisphere} big />
      </div>
    </div>
  );
}

export function PolarMaps() {
  const altKm = useStore((s) => s.products.altKm);
  const minEl = useStore((s) => s.products.minElevationDeg);
  const basemap = useUi((s) => s.basemap);
  const enlarged = useUi((s) => s.enlargedMap);
  const st = MAP_STYLES[basemap];
  const h = altKm >= 80 ? altKm : 110;
  const cgmOn = useStore((s) => s.view.cgmGraticule);
  const time = useStore((s) => s.conditions.time);
  const internal = useStore((s) => s.conditions.internal);
  const tiltDeg = useStore((s) => s.conditions.tiltDeg ?? null);
  // The graticule depends on the main field, the time, the tilt and the height only (cached by them).
  useEffect(() => {
    wantGraticule(cgmOn ? { time, internal, tiltDeg, heightKm: altKm } : null);
  }, [cgmOn, time, internal, tiltDeg, altKm]);
  const grat = useGraticule();
  const gratRequests = useGraticuleRequests();
  const legend = mapLegend(st, minEl, visibilityAngleDeg(h, minEl), h, 'legend-hatch', cgmOn ? { heightKm: altKm, maxLatDeg: grat.graticule?.maxLatDeg ?? null } : undefined);
  return (
    <section className="panel maps" aria-labelledby="maps-h">
      <div className="maps-head">
        <h2 id="maps-h">Polar maps</h2>
        <label>
          Basemap{' '}
          <select value={basemap} onChange={(e) => ui.set({ basemap: e.target.value as Basemap })}>
            <option value="light">light (paper)</option>
            <option value="dark">dark (slate)</option>
          </select>
        </label>
        <label className="cgm-toggle">
          <input type="checkbox" checked={cgmOn} onChange={(e) => setView({ cgmGraticule: e.target.checked })} aria-describedby="cgm-status" />{' '}
          CGM grid (corrected geomagnetic latitude and MLT)
        </label>
        <span id="cgm-status" className="hint" role="status">
          {cgmOn && (grat.error ? `CGM grid not drawn: ${grat.error}` : grat.busy ? (grat.partial ? 'computing the CGM grid\'s MLT meridians for this time…' : 'computing the CGM grid…') : '')}
        </span>
      </div>
      <div className="map-pair" id="polar-maps" data-cgm-requests={gratRequests}>
        {(['north', 'south'] as const).map((hemi) => (
          <div key={hemi} className="map-slot">
            <PolarMap hemisphere={hemi} />
            <button type="button" className="enlarge" aria-label={`Enlarge the ${hemi} polar map`} onClick={() => ui.set({ enlargedMap: hemi })}><span aria-hidden="true">⤢ </span>Enlarge</button>
          </div>
        ))}
      </div>
      <svg width="0" height="0" aria-hidden="true" style={{ position: 'absolute' }} dangerouslySetInnerHTML={{ __html: `<defs>${hatchDef(st, 'legend-hatch')}</defs>` }} />
      <ul className="legend map-legend" aria-label="Polar map legend">
        {legend.map((l) => (
          <li key={l.key}>
            <svg width="22" height="12" viewBox="0 0 22 12" aria-hidden="true" style={{ background: st.ocean, borderRadius: 2 }} dangerouslySetInnerHTML={{ __html: l.swatch }} />{' '}
            {l.label}
          </li>
        ))}
      </ul>
      <p className="hint">Geographic latitude and longitude, poleward of 40°; marks at the rim give local solar time (12 noon under the Sun). The CGM grid adds corrected geomagnetic latitude and magnetic local time at the footpoint altitude. Use the button on a map to open it larger.</p>
      {enlarged && <EnlargedMap hemisphere={enlarged} />}
    </section>
  );
}
