/** One row per site with the engine's SiteResult fields. Names are rendered as text only. */
import { conjugateAltOf, useStore } from '../store';
import { removeSite } from '../sites';
import { fmt, fmtMlt } from '../lib/units';
import { LINE_COLOURS } from '../lib/palette';

export function SiteTable() {
  const sites = useStore((s) => s.sites);
  const res = useStore((s) => s.siteResults);
  const pending = useStore((s) => s.pending.sites);
  const conjAltKm = useStore((s) => conjugateAltOf(s.products));
  const byIndex = res?.sites ?? [];
  return (
    <div className="table-wrap">
      <table aria-label="Site results" aria-busy={pending}>
        <thead>
          <tr>
            <th scope="col">Site</th>
            <th scope="col">Lat (°)</th>
            <th scope="col">Lon (°)</th>
            <th scope="col">Line</th>
            <th scope="col">Conjugate lat (°) at {conjAltKm} km</th>
            <th scope="col">Conjugate lon (°) at {conjAltKm} km</th>
            <th scope="col">Equator (RE)</th>
            <th scope="col">L</th>
            <th scope="col">MLT</th>
            <th scope="col">Mag lat (°)</th>
            <th scope="col" title="open–closed boundary at the site's MLT (magnetic latitude)">OCB (°)</th>
            <th scope="col" title="equatorward edge at the site's MLT (magnetic latitude)">Eq. edge (°)</th>
            <th scope="col">Oval</th>
            <th scope="col">Sky elev (°)</th>
            <th scope="col">Sky az (°)</th>
            <th scope="col">Sky dist (km)</th>
            <th scope="col"><span className="sr">Remove</span></th>
          </tr>
        </thead>
        <tbody>
          {sites.map((s, i) => {
            const r = byIndex[i] && byIndex[i].name === s.name ? byIndex[i] : undefined;
            return (
              <tr key={`${i}-${s.name}`} data-site-index={i}>
                <th scope="row" className="name">{s.name}</th>
                <td>{fmt(s.latDeg, 3)}</td>
                <td>{fmt(s.lonDeg, 3)}</td>
                <td>{r ? <span style={{ color: LINE_COLOURS[r.type] }}>{r.error ? `error: ${r.error}` : r.type}</span> : '…'}</td>
                <td data-col="conj-lat">{fmt(r?.conjugate?.geoLatDeg, 3)}</td>
                <td data-col="conj-lon">{fmt(r?.conjugate?.geoLonDeg, 3)}</td>
                <td>{fmt(r?.equatorRe, 2)}</td>
                <td>{fmt(r?.lShell, 2)}</td>
                <td>{fmtMlt(r?.mltHours)}</td>
                <td>{fmt(r?.magLatDeg, 2)}</td>
                <td>{fmt(r?.boundaries?.openClosedMagLatDeg, 2)}</td>
                <td>{fmt(r?.boundaries?.equatorwardMagLatDeg, 2)}</td>
                <td>{r?.ovalRelation ?? '…'}</td>
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
