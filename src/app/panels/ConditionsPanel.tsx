/** Solar-wind and model conditions. Every control names its quantity and unit. */
import { useState } from 'react';
import { setConditions, setProducts, setView, useStore, type AltPreset } from '../store';
import { ALT_PRESETS } from '../scenario';
import { logToSlider, sliderToLog } from '../lib/units';
import { pdynFromPlasmaNominal } from '../../physics/field/magnetopause';
import { NumberField } from './NumberField';
import { TimeControl } from './TimeControl';

const P_LO = 0.1;
const P_HI = 100;

export function ConditionsPanel() {
  const c = useStore((s) => s.conditions);
  const p = useStore((s) => s.products);
  const view = useStore((s) => s.view);
  const [nv, setNv] = useState({ n: 5, v: 450 });
  const pFromNv = Number(pdynFromPlasmaNominal(nv.n, nv.v).toPrecision(3)); // the field bounds keep n, v valid
  return (
    <section className="panel" aria-labelledby="cond-h">
      <h2 id="cond-h">Conditions</h2>
      <TimeControl />
      <NumberField label="Dynamic pressure (nPa)" value={c.pdynNpa} min={P_LO} max={P_HI} step={0.1} onCommit={(v) => setConditions({ pdynNpa: v })} />
      <input
        type="range"
        aria-label="Dynamic pressure slider (log scale 0.1–100 nPa)"
        min={0}
        max={1000}
        value={logToSlider(c.pdynNpa, P_LO, P_HI)}
        onChange={(e) => setConditions({ pdynNpa: sliderToLog(Number(e.target.value), P_LO, P_HI) })}
      />
      <details className="nv">
        <summary>From density and speed</summary>
        <NumberField label="Proton density (cm⁻³)" value={nv.n} min={0.01} max={500} onCommit={(n) => setNv({ ...nv, n })} />
        <NumberField label="Solar-wind speed (km/s)" value={nv.v} min={100} max={3000} step={10} onCommit={(v) => setNv({ ...nv, v })} />
        <button type="button" onClick={() => setConditions({ pdynNpa: Math.min(P_HI, Math.max(P_LO, pFromNv)) })}>
          Use {pFromNv} nPa
        </button>
      </details>
      <NumberField label="IMF Bz (nT)" value={c.bzNt} min={-50} max={50} step={0.5} onCommit={(v) => setConditions({ bzNt: v })} />
      <input type="range" aria-label="IMF Bz slider (GSM, nT)" min={-30} max={30} step={0.5} value={c.bzNt} onChange={(e) => setConditions({ bzNt: Number(e.target.value) })} />
      <NumberField label="IMF By (nT)" value={c.byNt} min={-50} max={50} step={0.5} onCommit={(v) => setConditions({ byNt: v })} />
      <input type="range" aria-label="IMF By slider (GSM, nT)" min={-30} max={30} step={0.5} value={c.byNt} onChange={(e) => setConditions({ byNt: Number(e.target.value) })} />
      <div className="field">
        <label htmlFor="alt-preset">Altitude preset</label>
        <select
          id="alt-preset"
          value={p.altPreset}
          onChange={(e) => {
            const k = e.target.value as AltPreset;
            setProducts(k === 'custom' ? { altPreset: k } : { altPreset: k, altKm: ALT_PRESETS[k] });
          }}
        >
          <option value="ground">ground (0 km)</option>
          <option value="green">green 557.7 nm (110 km)</option>
          <option value="red">red 630.0 nm (250 km)</option>
          <option value="custom">custom</option>
        </select>
      </div>
      <NumberField label="Footpoint altitude (km)" value={p.altKm} min={0} max={2000} step={10} onCommit={(v) => setProducts({ altPreset: 'custom', altKm: v })} />
      <div className="field">
        <label htmlFor="internal">Internal field</label>
        <select id="internal" value={c.internal} onChange={(e) => setConditions({ internal: e.target.value === 'igrf' ? 'igrf' : 'dipole' })}>
          <option value="dipole">centred dipole</option>
          <option value="igrf">IGRF-14</option>
        </select>
      </div>
      <NumberField label="IMF efficiency ε" value={c.imfEfficiency} min={0} max={1} step={0.05} onCommit={(v) => setConditions({ imfEfficiency: v })} />
      <NumberField label="Source distance (RE)" value={p.sourceRe} min={2} max={60} step={0.5} onCommit={(v) => setProducts({ sourceRe: v })} hint="equatorial distance whose footprint is the equatorward edge" />
      <NumberField label="Minimum elevation (deg)" value={p.minElevationDeg} min={0} max={60} step={1} onCommit={(v) => setProducts({ minElevationDeg: v })} />
      <fieldset>
        <legend>Show</legend>
        <label><input type="checkbox" checked={c.magnetopause} onChange={(e) => setConditions({ magnetopause: e.target.checked })} /> magnetopause term</label>
        <label><input type="checkbox" checked={c.tail !== false} onChange={(e) => setConditions({ tail: e.target.checked })} /> tail current sheet</label>
        <label><input type="checkbox" checked={view.magnetopauseSurface} onChange={(e) => setView({ magnetopauseSurface: e.target.checked })} /> magnetopause surface</label>
        <label><input type="checkbox" checked={view.fan} onChange={(e) => setView({ fan: e.target.checked })} /> field-line fan</label>
        <label><input type="checkbox" checked={view.magGraticule} onChange={(e) => setView({ magGraticule: e.target.checked })} /> magnetic graticule</label>
      </fieldset>
    </section>
  );
}
