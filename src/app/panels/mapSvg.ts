/**
 * The polar maps as one stand-alone SVG document: a title, the time, the
 * conditions and product settings, the maps as drawn on the page, and the
 * legend. Text is escaped (site names stay text).
 */
import type { FieldConditions } from '../../physics/field/conditions';
import type { ProductSettings } from '../store';
import { MAP_STYLES } from '../lib/palette';
import { visibilityAngleDeg } from '../lib/visibility';
import { hatchDef, mapLegend } from './mapLegend';
import { utcText } from './answer';
import type { Basemap } from './selection';

/** Escape text for SVG/XML content and attributes. */
export function xmlText(s: string): string {
  return s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');
}

/** Two lines describing the conditions and the product settings. */
export function conditionsLines(c: FieldConditions, p: ProductSettings): [string, string] {
  const parts = [
    `Pdyn ${c.pdynNpa} nPa`,
    `IMF Bz ${c.bzNt} nT`,
    `IMF By ${c.byNt} nT`,
    c.dstNt != null ? `Dst ${c.dstNt} nT` : 'Dst estimated',
    `main field ${c.internal === 'igrf' ? 'IGRF-14' : 'centred dipole'}`,
    `IMF efficiency ${c.imfEfficiency}`,
    `magnetopause ${c.magnetopause ? 'on' : 'off'}`,
    `tail ${c.tail === false ? 'off' : 'on'}`,
  ];
  const q = [`footpoint altitude ${p.altKm} km`, `source distance ${p.sourceRe} RE`, `minimum elevation ${p.minElevationDeg}°`];
  return [parts.join(', '), q.join(', ')];
}

export interface MapSvgInput {
  /** Serialized <svg> elements of the maps with their pixel sizes. */
  maps: { markup: string; width: number; height: number }[];
  conditions: FieldConditions;
  products: ProductSettings;
  basemap: Basemap;
  title?: string;
  /** The CGM graticule, when the maps show it: its height and highest latitude (for the legend). */
  cgm?: { heightKm: number; maxLatDeg: number | null };
}

export function mapsSvgDocument(m: MapSvgInput): string {
  const st = MAP_STYLES[m.basemap];
  const gap = 10;
  const pad = 10;
  const mapsW = m.maps.reduce((a, x) => a + x.width, 0) + gap * Math.max(0, m.maps.length - 1);
  const width = Math.max(mapsW + 2 * pad, 560);
  const mapsH = Math.max(0, ...m.maps.map((x) => x.height));
  const head = 76;
  const h = m.products.altKm >= 80 ? m.products.altKm : 110;
  const legend = mapLegend(st, m.products.minElevationDeg, visibilityAngleDeg(h, m.products.minElevationDeg), h, 'export-hatch', m.cgm);
  const lineH = 18;
  const legendTop = head + mapsH + 14;
  const height = legendTop + 18 + legend.length * lineH + pad;
  let x = pad;
  const maps = m.maps.map((mp) => {
    const g = `<g transform="translate(${x},${head})">${mp.markup}</g>`;
    x += mp.width + gap;
    return g;
  });
  const items = legend
    .map((l, i) => `<g transform="translate(${pad},${legendTop + 18 + i * lineH - 10})"><rect width="22" height="12" fill="${st.ocean}" rx="2"/>${l.swatch}<text x="30" y="10">${xmlText(l.label)}</text></g>`)
    .join('');
  const [cond1, cond2] = conditionsLines(m.conditions, m.products);
  return [
    '<?xml version="1.0" encoding="UTF-8"?>',
    `<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}" viewBox="0 0 ${width} ${height}" font-family="system-ui, 'DejaVu Sans', sans-serif" font-size="12">`,
    `<title>${xmlText(m.title ?? 'Fieldline Atlas polar maps')} — ${xmlText(utcText(m.conditions.time))}</title>`,
    `<defs>${hatchDef(st, 'export-hatch')}</defs>`,
    `<rect width="${width}" height="${height}" fill="${st.halo}"/>`,
    `<text x="${pad}" y="20" font-size="16" font-weight="bold" fill="${st.ink}">${xmlText(m.title ?? 'Fieldline Atlas polar maps')}</text>`,
    `<text x="${pad}" y="38" fill="${st.ink}" data-field="time">${xmlText(utcText(m.conditions.time))} · geographic, poleward of 40°${m.cgm ? ` · CGM grid at ${m.cgm.heightKm} km` : ''} · simplified model, not a forecast</text>`,
    `<text x="${pad}" y="54" fill="${st.ink}" font-size="11" data-field="conditions">${xmlText(cond1)}</text>`,
    `<text x="${pad}" y="68" fill="${st.ink}" font-size="11" data-field="settings">${xmlText(cond2)}</text>`,
    ...maps,
    `<g id="legend" fill="${st.ink}"><text x="${pad}" y="${legendTop + 4}" font-weight="bold">Legend</text>${items}</g>`,
    '</svg>',
    '',
  ].join('\n');
}
