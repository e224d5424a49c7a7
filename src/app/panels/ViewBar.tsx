/** Preset viewpoints, the line legend and the engine status, over the 3D view. */
import { requestView, VIEW_PRESETS } from '../scene/CameraRig';
import { lineLegend } from '../lib/palette';
import { useStore } from '../store';
import { fmt } from '../lib/units';

export function ViewBar() {
  const scene = useStore((s) => s.scene);
  const pending = useStore((s) => s.pending);
  const legend = lineLegend(scene?.lines.types ?? []);
  const f = scene?.frames;
  const mp = scene?.magnetopause;
  return (
    <div className="viewbar">
      <div className="row" role="group" aria-label="Viewpoints">
        {VIEW_PRESETS.map((p) => (
          <button key={p.id} type="button" onClick={() => requestView(p.id)}>{p.label}</button>
        ))}
      </div>
      <ul className="legend" aria-label="Field-line legend">
        {legend.map((l) => (
          <li key={l.type}><i style={{ background: l.colour }} /> {l.label}</li>
        ))}
        <li><i style={{ background: '#ffd24a' }} /> Sun</li>
        <li><i style={{ background: '#ff7b5c' }} /> dipole axis (N)</li>
      </ul>
      <p className="status" aria-live="off" title="dipole tilt: angle of the dipole axis towards the Sun; B0: equatorial surface field of the centred dipole; magnetopause nose: standoff distance r0 of the Shue surface, α its flaring">
        {f ? `dipole tilt ${fmt(f.tiltDeg, 1)}° · dipole strength B0 ${fmt(f.b0Nt, 0)} nT · dipole pole ${fmt(f.poleLatDeg, 2)}°, ${fmt(f.poleLonDeg, 2)}° E` : 'starting engine…'}
        {mp?.enabled ? ` · magnetopause nose ${fmt(mp.r0Re, 2)} RE (flaring α ${fmt(mp.alpha, 3)})` : ''}
        {pending.scene || pending.oval ? ' · updating…' : ''}
      </p>
    </div>
  );
}
