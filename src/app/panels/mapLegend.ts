/** The polar maps' legend entries (shared by the page and the SVG export) and their swatches as SVG markup. */
import type { MapStyle } from '../lib/palette';

export interface MapLegendEntry {
  key: string;
  label: string;
  /** SVG markup of a 22×12 swatch. */
  swatch: string;
}

/** The CGM graticule's legend entry (its name, its height, and where its lines stop). */
export function cgmLegendEntry(st: MapStyle, heightKm: number, maxLatDeg: number | null): MapLegendEntry {
  const top = maxLatDeg === null ? '' : ` (about ${maxLatDeg.toFixed(1)}°: the field line reaches beyond 60 RE)`;
  return {
    key: 'cgm',
    label: `CGM grid at ${heightKm} km: corrected geomagnetic latitude every 10° (dashed) and MLT (CGM) every 3 h (dotted); the lines stop where CGM is undefined — poleward of its highest latitude${top} and near the dipole equator`,
    swatch: `<line x1="1" y1="4" x2="21" y2="4" stroke="${st.cgm}" stroke-width="1.2" stroke-dasharray="5 3"/><line x1="1" y1="9" x2="21" y2="9" stroke="${st.cgm}" stroke-width="1.2" stroke-dasharray="1.5 2.5"/>`,
  };
}

/** The legend entries; `cgm` adds the CGM graticule's entry (when the maps show it). */
export function mapLegend(st: MapStyle, minElevationDeg: number, visAngleDeg: number, heightKm: number, hatchId: string, cgm?: { heightKm: number; maxLatDeg: number | null }): MapLegendEntry[] {
  return [
    { key: 'band', label: 'oval (between its two edges; hatched)', swatch: `<rect x="1" y="1" width="20" height="10" fill="url(#${hatchId})" stroke="none"/>` },
    { key: 'oc', label: 'open–closed boundary (poleward edge)', swatch: `<line x1="1" y1="6" x2="21" y2="6" stroke="${st.openClosed}" stroke-width="2"/>` },
    { key: 'eq', label: 'equatorward edge', swatch: `<line x1="1" y1="6" x2="21" y2="6" stroke="${st.equatorward}" stroke-width="2"/>` },
    { key: 'gap', label: 'edge not found: no band drawn (hover for the reason)', swatch: `<circle cx="11" cy="6" r="4.5" fill="none" stroke="${st.equatorward}" stroke-dasharray="2 2"/>` },
    {
      key: 'vis',
      label: `seen ≥ ${minElevationDeg}° above the horizon as far as this line (${visAngleDeg.toFixed(1)}° from the equatorward edge at ${heightKm} km); ticks point to the oval`,
      swatch: `<line x1="2" y1="8" x2="20" y2="8" stroke="${st.visibility}" stroke-width="2" stroke-linecap="round" stroke-dasharray="0.1 5"/><line x1="11" y1="8" x2="11" y2="3" stroke="${st.visibility}"/>`,
    },
    { key: 'night', label: 'night side (veil; dotted line: terminator at the ground)', swatch: `<rect x="1" y="1" width="20" height="10" fill="${st.night}" fill-opacity="${Math.min(1, st.nightOpacity * 2)}"/>` },
    { key: 'site', label: 'site', swatch: `<circle cx="11" cy="6" r="3.2" fill="${st.site}"/>` },
    { key: 'conj', label: 'conjugate point', swatch: `<rect x="8" y="3" width="6" height="6" transform="rotate(45 11 6)" fill="none" stroke="${st.conjugate}" stroke-width="1.6"/>` },
    { key: 'pole', label: 'dipole pole', swatch: `<path d="M7,2l8,8M15,2l-8,8" stroke="${st.pole}" stroke-width="1.5"/>` },
    ...(cgm ? [cgmLegendEntry(st, cgm.heightKm, cgm.maxLatDeg)] : []),
  ];
}

/** The hatch pattern of the band, as SVG markup (for legends outside the map SVGs). */
export function hatchDef(st: MapStyle, id: string): string {
  return `<pattern id="${id}" patternUnits="userSpaceOnUse" width="6" height="6" patternTransform="rotate(35)"><rect width="6" height="6" fill="${st.band}" fill-opacity="0.14"/><line x1="0" y1="0" x2="0" y2="6" stroke="${st.band}" stroke-width="2" stroke-opacity="0.7"/></pattern>`;
}
