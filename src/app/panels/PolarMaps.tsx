/** North and south polar maps side by side, with the legend. */
import { OVAL_COLOURS, SITE_COLOURS } from '../lib/palette';
import { visibilityAngleDeg } from '../lib/visibility';
import { useStore } from '../store';
import { PolarMap } from './PolarMap';

export function PolarMaps() {
  const altKm = useStore((s) => s.products.altKm);
  const minEl = useStore((s) => s.products.minElevationDeg);
  const h = altKm >= 80 ? altKm : 110;
  return (
    <section className="panel maps" aria-labelledby="maps-h">
      <h2 id="maps-h">Polar maps</h2>
      <div className="map-pair" id="polar-maps">
        <PolarMap hemisphere="north" />
        <PolarMap hemisphere="south" />
      </div>
      <ul className="legend">
        <li><i style={{ background: OVAL_COLOURS.band }} /> oval band</li>
        <li><i style={{ background: OVAL_COLOURS.openClosed }} /> open–closed boundary</li>
        <li><i style={{ background: OVAL_COLOURS.equatorward }} /> equatorward edge</li>
        <li><i className="dash" style={{ borderColor: OVAL_COLOURS.visibility }} /> seen at ≥ {minEl}° elevation up to here ({visibilityAngleDeg(h, minEl).toFixed(1)}° from the edge, {h} km)</li>
        <li><i style={{ background: SITE_COLOURS.site }} /> site <i style={{ background: SITE_COLOURS.conjugate }} /> conjugate</li>
        <li><b style={{ color: '#ff7b5c' }}>+</b> dipole pole · shaded: night (terminator at the ground)</li>
      </ul>
    </section>
  );
}
