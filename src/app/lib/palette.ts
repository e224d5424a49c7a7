/**
 * Fieldline Atlas colours (our own palette, documented in DEVELOPERS.md):
 * closed lines teal, open lines amber, unresolved lines grey-violet; the
 * oval band a bright green (land is a neutral stone so the two never blend), its poleward (open–closed) edge amber, its
 * equatorward edge teal to echo the line types they separate.
 */
import { LINE_TYPE_NAMES, LINE_UNRESOLVED, type LineType } from '../../physics/trace/line-type';

export const LINE_COLOURS: Record<LineType, string> = {
  closed: '#2bb5a8',
  open: '#f0a030',
  unresolved: '#9a8fb8',
};

/** Globe and map base colours: land a neutral stone, ocean deep blue, coastlines pale. */
export const BASE_COLOURS = { land: '#7a776a', ocean: '#123a5c', coast: '#d9dccb' } as const;

export const OVAL_COLOURS = { band: '#5cf07a', openClosed: '#f0a030', equatorward: '#2bb5a8', visibility: '#e86a8a' } as const;

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
  label: string;
  colour: string;
}

/** The legend, with the count of lines of each type in a bundle (tracer line-type codes). */
export function lineLegend(types: ArrayLike<number>): LegendEntry[] {
  const counts = LINE_TYPE_NAMES.map(() => 0);
  for (let i = 0; i < types.length; i++) counts[LINE_TYPE_NAMES.indexOf(lineTypeName(types[i]))]++;
  return LINE_TYPE_NAMES.map((n, i) => ({ label: `${n} (${counts[i]})`, colour: LINE_COLOURS[n] }));
}
