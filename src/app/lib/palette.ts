/**
 * Fieldline Atlas colours (our own palette, documented in DEVELOPERS.md):
 * closed lines teal, open lines amber, unresolved lines grey-violet; the
 * oval a violet band (hatched on the maps), its poleward (open–closed) edge
 * amber and its equatorward edge teal, to echo the line types they separate;
 * the visibility limit a row of indigo dots with ticks towards the oval.
 * The maps default to a light "paper" basemap; a dark one is the option.
 */
import { LINE_TYPE_NAMES, LINE_UNRESOLVED, type LineType } from '../../physics/trace/line-type';

export const LINE_COLOURS: Record<LineType, string> = {
  closed: '#2bb5a8',
  open: '#f0a030',
  unresolved: '#9a8fb8',
};

/** Globe and map base colours: land a neutral stone, ocean deep blue, coastlines pale. */
export const BASE_COLOURS = { land: '#7a776a', ocean: '#123a5c', coast: '#d9dccb' } as const;

/** Oval colours on the dark 3D view and the sweep plot. */
export const OVAL_COLOURS = { band: '#9b7cf0', openClosed: '#f0a030', equatorward: '#2bb5a8', visibility: '#7f95ff' } as const;

export interface MapStyle {
  ocean: string;
  land: string;
  coast: string;
  graticule: string;
  rim: string;
  night: string;
  nightOpacity: number;
  ink: string;
  halo: string;
  band: string;
  openClosed: string;
  equatorward: string;
  visibility: string;
  /** Corrected geomagnetic (CGM) graticule: latitude circles and MLT meridians. */
  cgm: string;
  site: string;
  conjugate: string;
  pole: string;
}

/** Polar-map styles: a light paper basemap (default) and a dark slate one. */
export const MAP_STYLES: Record<'light' | 'dark', MapStyle> = {
  light: {
    ocean: '#f3f1ea', land: '#d9d2c0', coast: '#8f8672', graticule: '#8c97a6', rim: '#5d6673', night: '#33405e', nightOpacity: 0.16,
    ink: '#1d2430', halo: '#f3f1ea', band: '#6b46c8', openClosed: '#b85a10', equatorward: '#137a70', visibility: '#2c3fb0',
    cgm: '#5c7a1e', site: '#1d2430', conjugate: '#c8246e', pole: '#b83a2a',
  },
  dark: {
    ocean: '#1c2129', land: '#3d4350', coast: '#8d96a8', graticule: '#6d7890', rim: '#9aa6bb', night: '#000000', nightOpacity: 0.35,
    ink: '#eef2f8', halo: '#1c2129', band: '#b49cff', openClosed: '#f0a030', equatorward: '#4fd1c2', visibility: '#9fb0ff',
    cgm: '#b9d98a', site: '#ffffff', conjugate: '#ff6fb0', pole: '#ff7b5c',
  },
};

export const SITE_COLOURS = { site: '#ffffff', conjugate: '#ff5fa2' } as const;

/** Name of a tracer line-type code; out-of-range codes count as unresolved. */
export function lineTypeName(code: number): LineType {
  return LINE_TYPE_NAMES[code] ?? LINE_TYPE_NAMES[LINE_UNRESOLVED];
}

/** "#rrggbb" → [r, g, b] in 0..1. */
export function hexToRgb(hex: string): [number, number, number] {
  const m = /^#([0-9a-f]{6})$/i.exec(hex);
  if (!m) throw new RangeError(`colour: expected #rrggbb, got ${hex}`);
  const n = parseInt(m[1], 16);
  return [((n >> 16) & 255) / 255, ((n >> 8) & 255) / 255, (n & 255) / 255];
}

/** RGB (0..1) of a tracer line-type code. */
export function lineTypeRgb(code: number): [number, number, number] {
  return hexToRgb(LINE_COLOURS[lineTypeName(code)]);
}

interface LegendEntry {
  /** The line type's name (a stable key: the label changes with the counts). */
  type: string;
  label: string;
  colour: string;
}

/** The legend, with the count of lines of each type in a bundle (tracer line-type codes). */
export function lineLegend(types: ArrayLike<number>): LegendEntry[] {
  const counts = LINE_TYPE_NAMES.map(() => 0);
  for (let i = 0; i < types.length; i++) counts[LINE_TYPE_NAMES.indexOf(lineTypeName(types[i]))]++;
  return LINE_TYPE_NAMES.map((n, i) => ({ type: n, label: `${n} (${counts[i]})`, colour: LINE_COLOURS[n] }));
}
