import { describe, expect, it } from 'vitest';
import { hexToRgb, kindName, kindRgb, lineLegend, LINE_COLOURS } from '../../src/app/lib/palette';
import { LINE_KIND_NAMES } from '../../workers/protocol';

describe('line colours and legend', () => {
  it('maps every kind code of the protocol to its own colour', () => {
    const seen = new Set<string>();
    LINE_KIND_NAMES.forEach((name, code) => {
      expect(kindName(code)).toBe(name);
      seen.add(LINE_COLOURS[name]);
    });
    expect(seen.size).toBe(LINE_KIND_NAMES.length);
  });

  it('treats unknown codes as unresolved', () => {
    expect(kindName(7)).toBe('unresolved');
    expect(kindRgb(7)).toEqual(kindRgb(2));
  });

  it('converts hex to 0..1 RGB and rejects bad input', () => {
    expect(hexToRgb('#ff8000')).toEqual([1, 128 / 255, 0]);
    expect(() => hexToRgb('orange')).toThrow(/expected #rrggbb/);
  });

  it('counts kinds in the legend', () => {
    const legend = lineLegend(Uint8Array.from([0, 0, 1, 2, 0]));
    expect(legend.map((l) => l.label)).toEqual(['closed (3)', 'open (1)', 'unresolved (1)']);
  });
});
