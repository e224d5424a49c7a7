/**
 * Parser for IAGA's IGRF coefficient text table (the layout of IAGA Division V
 * WG V-MOD's igrf14coeffs.txt): `#` comment lines, a `c/s deg ord` row, a
 * `g/h n m <epochs…> <sv-span>` row, then one row per coefficient
 * `g|h n m <value per epoch…> <secular variation>`. Pure: takes the text.
 */
import { coefCount, coefIndex } from './layout';

/** A whole IGRF release, coefficients in the layout of `coefIndex` (nT; SV in nT/yr). */
export interface IgrfTable {
  /** Main-field epochs (decimal years), ascending, evenly spaced. */
  epochs: number[];
  /** Start and end of the secular-variation span (decimal years), e.g. 2025 and 2030. */
  svStartYear: number;
  svEndYear: number;
  /** Highest degree present. */
  nmax: number;
  /** g[e][coefIndex(n,m)] and h[e][coefIndex(n,m)] for epoch e (missing terms are 0). */
  g: number[][];
  h: number[][];
  /** Secular variation, nT/yr, same layout. */
  svG: number[];
  svH: number[];
}

function fail(line: number, what: string): never {
  throw new Error(`IGRF table, line ${line}: ${what}`);
}

/** Parse IAGA's IGRF text table. Throws Error naming the line on malformed input. */
export function parseIgrfTable(text: string): IgrfTable {
  const lines = text.split(/\r?\n/);
  let epochs: number[] | null = null;
  let svStartYear = NaN;
  let svEndYear = NaN;
  const rows: { gh: string; n: number; m: number; vals: number[]; line: number }[] = [];
  let nmax = 0;
  for (let i = 0; i < lines.length; i++) {
    const raw = lines[i].trim();
    if (raw === '' || raw.startsWith('#') || raw.startsWith('c/s')) continue;
    const w = raw.split(/\s+/);
    if (w[0] === 'g/h') {
      if (w[1] !== 'n' || w[2] !== 'm') fail(i + 1, 'expected "g/h n m" header');
      const cols = w.slice(3);
      const sv = cols.pop() ?? '';
      const span = /^(\d{4})-(\d{2}|\d{4})$/.exec(sv);
      if (!span) fail(i + 1, `expected a secular-variation span like 2025-30 as last column, got "${sv}"`);
      svStartYear = Number(span[1]);
      const end = span[2];
      svEndYear = end.length === 4 ? Number(end) : Math.floor(svStartYear / 100) * 100 + Number(end);
      epochs = cols.map((c) => {
        const v = Number(c);
        if (!Number.isFinite(v)) fail(i + 1, `bad epoch "${c}"`);
        return v;
      });
      continue;
    }
    if (w[0] !== 'g' && w[0] !== 'h') fail(i + 1, `expected a g or h row, got "${w[0]}"`);
    if (!epochs) fail(i + 1, 'coefficient row before the "g/h n m" header');
    const n = Number(w[1]);
    const m = Number(w[2]);
    if (!Number.isInteger(n) || !Number.isInteger(m) || n < 1 || m < 0 || m > n) fail(i + 1, `bad degree/order "${w[1]} ${w[2]}"`);
    if (w[0] === 'h' && m === 0) fail(i + 1, 'h with m = 0 does not exist');
    const vals = w.slice(3).map((c) => {
      const v = Number(c);
      if (!Number.isFinite(v)) fail(i + 1, `bad number "${c}"`);
      return v;
    });
    if (vals.length !== epochs.length + 1) fail(i + 1, `expected ${epochs.length + 1} values, got ${vals.length}`);
    rows.push({ gh: w[0], n, m, vals, line: i + 1 });
    if (n > nmax) nmax = n;
  }
  if (!epochs || rows.length === 0) throw new Error('IGRF table: no header or no coefficient rows');
  const len = coefCount(nmax);
  const ne = epochs.length;
  const g = Array.from({ length: ne }, () => new Array<number>(len).fill(0));
  const h = Array.from({ length: ne }, () => new Array<number>(len).fill(0));
  const svG = new Array<number>(len).fill(0);
  const svH = new Array<number>(len).fill(0);
  const seen = new Set<string>();
  for (const r of rows) {
    const key = `${r.gh}${r.n},${r.m}`;
    if (seen.has(key)) fail(r.line, `duplicate ${r.gh} ${r.n} ${r.m}`);
    seen.add(key);
    const k = coefIndex(r.n, r.m);
    const target = r.gh === 'g' ? g : h;
    for (let e = 0; e < ne; e++) target[e][k] = r.vals[e];
    (r.gh === 'g' ? svG : svH)[k] = r.vals[ne];
  }
  const expected = (nmax * (nmax + 2)); // n=1..nmax: (2n+1) terms each
  if (rows.length !== expected) throw new Error(`IGRF table: expected ${expected} coefficient rows for degree ${nmax}, got ${rows.length}`);
  return { epochs, svStartYear, svEndYear, nmax, g, h, svG, svH };
}
