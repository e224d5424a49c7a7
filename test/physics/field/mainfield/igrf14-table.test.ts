import { describe, it, expect } from 'vitest';
import { readFileSync } from 'node:fs';
import { createHash } from 'node:crypto';
import { fileURLToPath } from 'node:url';
import { parseIgrfTable } from '../../../../src/physics/field/mainfield/igrf-parse';
import { IGRF14_TABLE, IGRF14_SOURCE_SHA256 } from '../../../../src/physics/field/mainfield/igrf14-table';
import { coefIndex, coefCount } from '../../../../src/physics/field/mainfield/layout';

// Source: data/igrf14coeffs.txt (IGRF-14, IAGA Division V WG V-MOD, 2024). The generated module
// must equal a fresh parse of the committed text file value for value (no drift).
const dataPath = fileURLToPath(new URL('../../../../data/igrf14coeffs.txt', import.meta.url));
const raw = readFileSync(dataPath);
const text = raw.toString('utf8');

describe('IGRF-14 generated table', () => {
  it('was generated from the committed data file (sha256 in header matches)', () => {
    const sha = createHash('sha256').update(raw).digest('hex');
    expect(IGRF14_SOURCE_SHA256, 'run `npx tsx scripts/gen-igrf.ts` after changing data/igrf14coeffs.txt').toBe(sha);
  });

  it('equals a fresh parse of data/igrf14coeffs.txt value for value', () => {
    const t = parseIgrfTable(text);
    expect(IGRF14_TABLE.epochs).toEqual(t.epochs);
    expect([IGRF14_TABLE.svStartYear, IGRF14_TABLE.svEndYear, IGRF14_TABLE.nmax]).toEqual([t.svStartYear, t.svEndYear, t.nmax]);
    let compared = 0;
    for (let e = 0; e < t.epochs.length; e++) {
      for (let k = 0; k < coefCount(t.nmax); k++) {
        expect(IGRF14_TABLE.g[e][k], `g epoch ${t.epochs[e]} index ${k}`).toBe(t.g[e][k]);
        expect(IGRF14_TABLE.h[e][k], `h epoch ${t.epochs[e]} index ${k}`).toBe(t.h[e][k]);
        compared += 2;
      }
    }
    for (let k = 0; k < coefCount(t.nmax); k++) {
      expect(IGRF14_TABLE.svG[k], `svG index ${k}`).toBe(t.svG[k]);
      expect(IGRF14_TABLE.svH[k], `svH index ${k}`).toBe(t.svH[k]);
    }
    expect(compared).toBe(26 * 105 * 2);
  });

  it('parses the layout IAGA documents: 26 epochs 1900–2025, SV 2025–2030, degree 13, first and last rows', () => {
    // Row values read off data/igrf14coeffs.txt lines 5 and 199 (IAGA table).
    const t = parseIgrfTable(text);
    expect(t.epochs[0]).toBe(1900);
    expect(t.epochs[25]).toBe(2025);
    expect([t.svStartYear, t.svEndYear, t.nmax]).toEqual([2025, 2030, 13]);
    expect(t.g[0][coefIndex(1, 0)]).toBe(-31543);
    expect(t.g[25][coefIndex(1, 0)]).toBe(-29350.0);
    expect(t.svG[coefIndex(1, 0)]).toBe(12.6);
    expect(t.h[20][coefIndex(13, 13)]).toBe(-0.9);
    expect(t.h[25][coefIndex(13, 13)]).toBe(-0.5);
  });

  it('rejects malformed tables with the line number', () => {
    const lines = text.split('\n');
    const cut = [...lines];
    cut[6] = cut[6].replace(/\s+\S+$/, ''); // drop the SV value of row g 2 0
    expect(() => parseIgrfTable(cut.join('\n'))).toThrow(/line 7: expected 27 values, got 26/);
    const bad = [...lines];
    bad[4] = bad[4].replace('-31543', 'x31543');
    expect(() => parseIgrfTable(bad.join('\n'))).toThrow(/line 5: bad number "x31543"/);
    expect(() => parseIgrfTable(lines.slice(0, 50).join('\n'))).toThrow(/expected 48 coefficient rows for degree 6, got 46/);
    expect(() => parseIgrfTable('')).toThrow(/no header/);
  });
});
