import { describe, expect, it } from 'vitest';
import { hexToRgb, lineTypeName, lineTypeRgb, lineLegend, LINE_COLOURS } from '../../src/app/lib/palette';
import { LINE_TYPE_NAMES } from '../../src/physics/trace/line-type';

describe('line colours and legend', () => {
  it('maps every line-type code of the tracer to its own colour', () => {
    const seen = new Set<string>();
    LINE_TYPE_NAMES.forEach((name, code) => {
      expect(lineTypeName(code)).toBe(name);
      seen.add(LINE_COLOURS[name]);
    });
    expect(seen.size).toBe(LINE_TYPE_NAMES.length);
  });

  it('treats unknown codes as unresolved', () => {
    expect(lineTypeName(7)).toBe('unresolved');
    expect(lineTypeRgb(7)).toEqual(lineTypeRgb(2));
  });

  it('converts hex to 0..1 RGB and rejects bad input', () => {
    expect(hexToRgb('#ff8000')).toEqual([1, 128 / 255, 0]);
    expect(() => hexToRgb('orange')).toThrow(/expected #rrggbb/);
  });

  it('counts line types in the legend', () => {
    const legend = lineLegend(Uint8Array.from([0, 0, 1, 2, 0]));
    expect(legend.map((l) => l.label)).toEqual(['closed (3)', 'open (1)', 'unresolved (1)']);
    // The keys of the legend's items do not change with the counts (the items are updated, not replaced).
    expect(legend.map((l) => l.type)).toEqual(lineLegend(Uint8Array.from([1])).map((l) => l.type));
  });
});
