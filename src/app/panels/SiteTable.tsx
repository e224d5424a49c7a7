/**
 * One row per site with the engine's SiteResult fields, in words a reader
 * uses (each header carries its definition as a tooltip). The table scrolls
 * inside its own box with the site column sticky. Names are rendered as text only.
 */
import { conjugateAltOf, useStore } from '../store';
import { removeSite } from '../sites';
import { fmt, fmtMlt } from '../lib/units';
import { LINE_COLOURS } from '../lib/palette';
import { MLT_LABEL_CGM, MLT_LABEL_MAG } from '../../physics/mapping/cgm-model';
import { cgmLatText, ovalPlace } from './answer';
import { ui, useUi } from './selection';

export function SiteTable() {
  const sites = useStore((s) => s.sites);
  const res = useStore((s) => s.siteResults);
  const pending = useStore((s) => s.pending.sites);
  const products = useStore((s) => s.products);
  const chosen = useUi((s) => s.selectedSite);
  const selected = chosen != null && sites.some((s) => s.name === chosen) ? chosen : sites[0]?.name;
  const conjAltKm = conjugateAltOf(products);
  const conjAt = conjAltKm === 0 ? 'ground' : `${conjAltKm} km`;
  const byIndex = res?.sites ?? [];
  return (
    <div className="table-wrap" tabIndex={0} role="region" aria-label="Site results (scrolls sideways)">
      <table aria-label="Site results" aria-busy={pending}>
        <thead>
          <tr>
            <th scope="col" className="name">Site</th>
            <th scope="col" title="geodetic latitude of the site, north positive">Lat (°)</th>
            <th scope="col" title="longitude of the site, east positive">Lon (°)</th>
            <th scope="col" title="closed: the line returns to Earth in the other hemisphere; open: it leaves into the solar wind">Field line</th>
            <th scope="col" title={`latitude where the site's field line comes down in the other hemisphere (at the ${conjAt})`}>Conjugate lat (°, {conjAt})</th>
            <th scope="col" title={`longitude of that conjugate point (at the ${conjAt})`}>Conjugate lon (°, {conjAt})</th>
            <th scope="col" title="distance from Earth's centre where the site's field line crosses the magnetic equator (weakest field), in Earth radii; in a pure dipole this is the L-shell value">Equatorial distance (RE) = L in a dipole</th>
            <th scope="col" title={`magnetic local time at the footpoint (${products.altKm} km) in centred-dipole (MAG) coordinates: 00:00 magnetic midnight, 12:00 magnetic noon`}>{MLT_LABEL_MAG}</th>
            <th scope="col" title={`centred-dipole (MAG) magnetic latitude of the footpoint (${products.altKm} km)`}>Mag lat (°, MAG)</th>
            <th scope="col" title="corrected geomagnetic latitude of the site: the main field's line followed to the dipole equator, then the dipole latitude with the same apex (the same all along the line); undefined near the dipole equator">CGM lat (°)</th>
            <th scope="col" title="magnetic local time from the site's corrected geomagnetic longitude">{MLT_LABEL_CGM}</th>
            <th scope="col" title="open–closed boundary (OCB): poleward edge of the oval at the site's MLT, magnetic latitude">Open–closed boundary (°)</th>
            <th scope="col" title="equatorward edge of the oval at the site's MLT, magnetic latitude">Equatorward edge (°)</th>
            <th scope="col" title="where the site is against the oval at its MLT, in its own hemisphere (north of, inside, south of)">Where the oval is</th>
            <th scope="col" title={`nearest oval point at ${products.altKm} km seen from the site: angle above the horizon; "(low)" when under the minimum elevation`}>Elevation (°)</th>
            <th scope="col" title="direction of that point: degrees from north, eastward (90 = east)">Azimuth (° from north, eastward)</th>
            <th scope="col" title="straight-line distance from the site to that point">Slant distance (km)</th>
            <th scope="col" className="rm"><span className="sr">Remove</span></th>
          </tr>
        </thead>
        <tbody>
          {sites.map((s, i) => {
            const r = byIndex[i] && byIndex[i].name === s.name ? byIndex[i] : undefined;
            const isSel = s.name === selected;
            return (
              <tr key={`${i}-${s.name}`} data-site-index={i} className={isSel ? 'sel' : undefined}>
                <th scope="row" className="name">
                  <button type="button" className="pick" aria-pressed={isSel} title="Show this site in the answer card" onClick={() => ui.set({ selectedSite: s.name })}>{s.name}</button>
                </th>
                <td>{fmt(s.latDeg, 3)}</td>
                <td>{fmt(s.lonDeg, 3)}</td>
                <td>{r ? <span style={{ color: LINE_COLOURS[r.type] }}>{r.error ? `error: ${r.error}` : r.type}</span> : '…'}</td>
                <td data-col="conj-lat">{fmt(r?.conjugate?.geoLatDeg, 3)}</td>
                <td data-col="conj-lon">{fmt(r?.conjugate?.geoLonDeg, 3)}</td>
                <td>{fmt(r?.equatorRe, 2)}</td>
                <td>{fmtMlt(r?.mltHours)}</td>
                <td>{fmt(r?.magLatDeg, 2)}</td>
                <td data-col="cgm-lat" title={r?.cgm && !r.cgm.defined ? r.cgm.reason : undefined}>{cgmLatText(r?.cgm)}</td>
                <td data-col="cgm-mlt">{r?.cgm?.defined ? fmtMlt(r.cgm.mltH) : '–'}</td>
                <td>{fmt(r?.boundaries?.openClosedMagLatDeg, 2)}</td>
                <td>{fmt(r?.boundaries?.equatorwardMagLatDeg, 2)}</td>
                <td className="words">{r ? ovalPlace(r).short : '…'}</td>
                <td>{r?.sky ? `${fmt(r.sky.elevationDeg, 1)}${r.sky.visible ? '' : ' (low)'}` : '–'}</td>
                <td>{fmt(r?.sky?.azimuthDeg, 0)}</td>
                <td>{fmt(r?.sky?.distanceKm, 0)}</td>
                <td>
                  <button type="button" className="x" aria-label={`Remove site ${s.name}`} onClick={() => removeSite(i)}>×</button>
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}
