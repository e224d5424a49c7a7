/** Solar-wind and model conditions. Every control names its quantity and unit. */
import { useState } from 'react';
import { conjugateAltOf, setConditions, setProducts, setView, store, useStore, type AltPreset } from '../store';
import { ALT_PRESETS } from '../scenario';
import { logToSlider, sliderToLog } from '../lib/units';
import { APP_RANGES, pressureFromPlasma } from '../../io/app-inputs';
import { NOMINAL_SPEED_KMS } from '../../physics/field/storm-index';
import { NumberField } from './NumberField';
import { TimeControl } from './TimeControl';
import { HINTS } from './hints';

/** The slider's span (log scale); the number field takes the whole allowed range. */
const P_LO = 0.1;
const P_HI = 100;

/** What a shared link asked for that was refused or read in a particular way. */
function LinkNotices() {
  const notices = useStore((s) => s.notices);
  if (notices.length === 0) return null;
  return (
    <div className="link-notices" role="status" aria-label="Link notices">
      <p>From the link:</p>
      <ul>{notices.map((n, i) => <li key={i}>{n}</li>)}</ul>
      <button type="button" onClick={() => store.set({ notices: [] })}>Dismiss</button>
    </div>
  );
}

/** The storm index (given, or estimated from the solar wind: the default) and the solar-wind speed. */
function StormControls() {
  const dst = useStore((s) => s.conditions.dstNt ?? null);
  const speed = useStore((s) => s.conditions.speedKms ?? null);
  const used = useStore((s) => s.siteResults?.used ?? s.oval?.used ?? null);
  return (
    <fieldset>
      <legend>Storm</legend>
      <div className="field">
        <label htmlFor="dst-mode">Storm index</label>
        <select id="dst-mode" value={dst === null ? 'estimate' : 'given'} onChange={(e) => setConditions({ dstNt: e.target.value === 'given' ? Math.round(used?.dstNt ?? 0) : null })}>
          <option value="estimate">estimate from the solar wind</option>
          <option value="given">given (Dst or SYM-H)</option>
        </select>
        <span className="hint field-hint">{HINTS.stormIndex}</span>
      </div>
      {dst !== null && <NumberField label="Dst or SYM-H (nT)" value={dst} range={APP_RANGES.dstNt} step={5} onCommit={(v) => setConditions({ dstNt: v })} hint={HINTS.dst} />}
      {dst === null && used && <p className="hint">Estimated Dst {used.dstNt.toFixed(0)} nT (Dst* {used.dstStarNt.toFixed(0)} nT).</p>}
      <NumberField label="Solar-wind speed (km/s)" value={speed ?? NOMINAL_SPEED_KMS} range={APP_RANGES.speedKms} step={10} onCommit={(v) => setConditions({ speedKms: v })} hint={speed === null ? `${HINTS.speed}; nominal ${NOMINAL_SPEED_KMS} km/s until set` : HINTS.speed} />
      {speed !== null && <button type="button" onClick={() => setConditions({ speedKms: null })}>Use the nominal speed ({NOMINAL_SPEED_KMS} km/s)</button>}
    </fieldset>
  );
}

/** Dynamic pressure: number, log slider, or from proton density and the solar-wind speed. */
function PressureControls() {
  const c = useStore((s) => s.conditions);
  const [density, setDensity] = useState(5);
  const [pMsg, setPMsg] = useState('');
  const speedKms = c.speedKms ?? NOMINAL_SPEED_KMS;
  const fromPlasma = pressureFromPlasma(density, speedKms);
  return (
    <>
      <NumberField label="Dynamic pressure (nPa)" value={c.pdynNpa} range={APP_RANGES.pdynNpa} step={0.1} onCommit={(v) => setConditions({ pdynNpa: v })} hint={HINTS.pdyn} />
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
        <NumberField label="Proton density (cm⁻³)" value={density} range={APP_RANGES.protonDensityCm3} onCommit={setDensity} />
        <p className="hint">With the solar-wind speed below ({speedKms} km/s).</p>
        {fromPlasma.ok ? (
          <button type="button" onClick={() => { setConditions({ pdynNpa: fromPlasma.value }); setPMsg(`Dynamic pressure set to ${fromPlasma.value} nPa.`); }}>
            Use {fromPlasma.value} nPa
          </button>
        ) : (
          <p className="field-error">{fromPlasma.message}.</p>
        )}
        {pMsg && <p role="status" className="msg">{pMsg}</p>}
      </details>
    </>
  );
}

/** IMF Bz and By (GSM), number and slider each. */
function ImfControls() {
  const c = useStore((s) => s.conditions);
  return (
    <>
      <NumberField label="IMF Bz (nT)" value={c.bzNt} range={APP_RANGES.imfNt} step={0.5} onCommit={(v) => setConditions({ bzNt: v })} hint={HINTS.bz} />
      <input type="range" aria-label="IMF Bz slider (GSM, nT)" min={-30} max={30} step={0.5} value={c.bzNt} onChange={(e) => setConditions({ bzNt: Number(e.target.value) })} />
      <NumberField label="IMF By (nT)" value={c.byNt} range={APP_RANGES.imfNt} step={0.5} onCommit={(v) => setConditions({ byNt: v })} hint={HINTS.by} />
      <input type="range" aria-label="IMF By slider (GSM, nT)" min={-30} max={30} step={0.5} value={c.byNt} onChange={(e) => setConditions({ byNt: Number(e.target.value) })} />
    </>
  );
}

/** Footpoint altitude (preset or custom) and the conjugate altitude (the footpoint's unless set apart). */
function AltitudeControls() {
  const p = useStore((s) => s.products);
  return (
    <>
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
        <span className="hint field-hint">{HINTS.altPreset}</span>
      </div>
      <NumberField label="Footpoint altitude (km)" value={p.altKm} range={APP_RANGES.altKm} step={10} onCommit={(v) => setProducts({ altPreset: 'custom', altKm: v })} hint={HINTS.altKm} />
      <label>
        <input type="checkbox" checked={p.conjugateAltKm === null} onChange={(e) => setProducts({ conjugateAltKm: e.target.checked ? null : p.altKm })} /> conjugate point at the footpoint altitude
      </label>
      <NumberField label="Conjugate altitude (km)" value={conjugateAltOf(p)} range={APP_RANGES.altKm} step={10} disabled={p.conjugateAltKm === null} onCommit={(v) => setProducts({ conjugateAltKm: v })} hint={HINTS.conjugateAltKm} />
    </>
  );
}

/** Main field, IMF efficiency, source distance, minimum elevation and the boundary searches' floor. */
function ModelControls() {
  const c = useStore((s) => s.conditions);
  const p = useStore((s) => s.products);
  const used = useStore((s) => s.oval?.used ?? s.siteResults?.used ?? null);
  return (
    <>
      <div className="field">
        <label htmlFor="internal">Internal field</label>
        <select id="internal" value={c.internal} onChange={(e) => setConditions({ internal: e.target.value === 'igrf' ? 'igrf' : 'dipole' })}>
          <option value="igrf">IGRF-14</option>
          <option value="dipole">centred dipole</option>
        </select>
        <span className="hint field-hint">{c.internal === 'igrf' ? HINTS.igrf : HINTS.dipole}</span>
      </div>
      <NumberField label="IMF efficiency ε" value={c.imfEfficiency} range={APP_RANGES.imfEfficiency} step={0.05} onCommit={(v) => setConditions({ imfEfficiency: v })} hint={HINTS.epsilon} />
      <label>
        <input type="checkbox" checked={p.sourceRe === null} onChange={(e) => setProducts({ sourceRe: e.target.checked ? null : Number((used?.sourceRe ?? 7).toFixed(2)) })} /> source distance follows the conditions
      </label>
      <NumberField label="Source distance (RE)" value={p.sourceRe ?? Number((used?.sourceRe ?? NaN).toFixed(2))} range={APP_RANGES.sourceRe} step={0.5} disabled={p.sourceRe === null} onCommit={(v) => setProducts({ sourceRe: v })} hint={HINTS.sourceRe} />
      <NumberField label="Minimum elevation (deg)" value={p.minElevationDeg} range={APP_RANGES.minElevationDeg} step={1} onCommit={(v) => setProducts({ minElevationDeg: v })} hint={HINTS.minElevation} />
      <NumberField label="Lowest boundary MLAT (deg)" value={p.minLatDeg} range={APP_RANGES.minLatDeg} step={1} onCommit={(v) => setProducts({ minLatDeg: v })} hint={HINTS.minLat} />
    </>
  );
}

/** Model terms switched on or off, and what the 3D view shows. */
function ShowControls() {
  const c = useStore((s) => s.conditions);
  const view = useStore((s) => s.view);
  return (
    <fieldset>
      <legend>Show</legend>
      <label title={HINTS.magnetopause}><input type="checkbox" checked={c.magnetopause} aria-describedby="hint-mp" onChange={(e) => setConditions({ magnetopause: e.target.checked })} /> magnetopause term</label>
      <span id="hint-mp" className="hint field-hint">{HINTS.magnetopause}</span>
      <label title={HINTS.tail}><input type="checkbox" checked={c.tail !== false} aria-describedby="hint-tail" onChange={(e) => setConditions({ tail: e.target.checked })} /> tail current sheet</label>
      <span id="hint-tail" className="hint field-hint">{HINTS.tail}</span>
      <label><input type="checkbox" checked={view.magnetopauseSurface} onChange={(e) => setView({ magnetopauseSurface: e.target.checked })} /> magnetopause surface</label>
      <label><input type="checkbox" checked={view.fan} onChange={(e) => setView({ fan: e.target.checked })} /> field-line fan</label>
      <label><input type="checkbox" checked={view.magGraticule} onChange={(e) => setView({ magGraticule: e.target.checked })} /> magnetic graticule</label>
    </fieldset>
  );
}

export function ConditionsPanel() {
  return (
    <section className="panel" aria-labelledby="cond-h">
      <h2 id="cond-h">Conditions</h2>
      <LinkNotices />
      <TimeControl />
      <PressureControls />
      <StormControls />
      <ImfControls />
      <AltitudeControls />
      <ModelControls />
      <ShowControls />
    </section>
  );
}
