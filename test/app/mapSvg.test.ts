import { describe, expect, it } from 'vitest';
import { conditionsLines, mapsSvgDocument, xmlText } from '../../src/app/panels/mapSvg';
import { DEMO_SCENARIO } from '../../src/app/scenario';

describe('maps SVG document', () => {
  const doc = mapsSvgDocument({
    maps: [{ markup: '<svg xmlns="http://www.w3.org/2000/svg" width="300" height="300"><text>&lt;b&gt;Quill</text></svg>', width: 300, height: 300 }],
    conditions: { ...DEMO_SCENARIO.conditions, dstNt: -120 },
    products: DEMO_SCENARIO.products,
    basemap: 'light',
  });

  it('carries a title, the UTC time, the conditions and a legend', () => {
    expect(doc.startsWith('<?xml version="1.0" encoding="UTF-8"?>\n<svg xmlns="http://www.w3.org/2000/svg"')).toBe(true);
    expect(doc).toContain('<title>Fieldline Atlas polar maps — 2025-03-20 22:00 UTC</title>');
    expect(doc).toMatch(/data-field="time">2025-03-20 22:00 UTC/);
    expect(doc).toContain('Pdyn 3 nPa, IMF Bz -5 nT, IMF By 2 nT, Dst -120 nT');
    expect(doc).toContain('footpoint altitude 110 km');
    expect(doc).toMatch(/<g id="legend"[^>]*><text[^>]*>Legend<\/text>/);
    for (const words of ['open–closed boundary', 'equatorward edge', 'edge not found', 'conjugate point']) expect(doc).toContain(words);
    expect(doc).toContain('id="export-hatch"');
    expect(doc).toContain('&lt;b&gt;Quill');
  });

  it('balances its tags (a light well-formedness check; the browser test parses it)', () => {
    const body = doc.replace(/<\?xml[^>]*\?>/, '');
    const stack: string[] = [];
    for (const m of body.matchAll(/<(\/?)([a-zA-Z][\w:-]*)[^>]*?(\/?)>/g)) {
      if (m[3] === '/') continue;
      if (m[1] === '/') expect(stack.pop(), `closing </${m[2]}>`).toBe(m[2]);
      else stack.push(m[2]);
    }
    expect(stack).toEqual([]);
  });

  it('says when the storm index is estimated, and escapes text', () => {
    expect(conditionsLines({ ...DEMO_SCENARIO.conditions }, DEMO_SCENARIO.products)[0]).toContain('Dst estimated');
    expect(xmlText('<a href="x">&')).toBe('&lt;a href=&quot;x&quot;&gt;&amp;');
  });
});
