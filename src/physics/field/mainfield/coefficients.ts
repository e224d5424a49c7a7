/**
 * Main-field coefficients for a date: IGRF-14 (IAGA Division V WG V-MOD, 2024)
 * by linear interpolation between its 5-year epochs and, after the last epoch,
 * its secular variation (the IGRF's own rule). Any other Schmidt semi-normalised
 * set (e.g. a World Magnetic Model) enters through the same interface.
 */
import { InputError, requireFinite } from '../../errors';
import { IGRF14_TABLE } from './igrf14-table';
import type { IgrfTable } from './igrf-parse';
import { coefCount } from './layout';

/** Schmidt semi-normalised coefficients (nT) for one instant, layout coefIndex(n, m) = n(n+1)/2 + m. */
export interface MainFieldCoefficients {
  /** Highest degree; g and h hold coefCount(nmax) entries. */
  nmax: number;
  g: Float64Array;
  h: Float64Array;
  /** Decimal year the coefficients are valid for. */
  epochYear: number;
  /** Human-readable provenance, e.g. "IGRF-14 (IAGA 2024) at 2025.5". */
  source: string;
}

function checkDegree(nmax: number, limit: number): number {
  if (!Number.isInteger(nmax) || nmax < 1 || nmax > limit) {
    throw new InputError('nmax', `expected an integer degree 1..${limit}, got ${String(nmax)}`);
  }
  return nmax;
}

/**
 * Coefficients at `year` from a base set at `baseYear` plus secular variation (nT/yr):
 * g(t) = g(t0) + (t − t0)·ġ (IGRF and WMM both define their forecast span this way).
 * Inputs in the coefIndex layout, at least coefCount(nmax) long.
 */
export function applySecularVariation(
  g: ArrayLike<number>, h: ArrayLike<number>, svG: ArrayLike<number>, svH: ArrayLike<number>,
  nmax: number, baseYear: number, year: number, source: string,
): MainFieldCoefficients {
  checkDegree(nmax, 1000);
  const len = coefCount(nmax);
  if (g.length < len || h.length < len || svG.length < len || svH.length < len) {
    throw new InputError('coefficients', `need ${len} entries for degree ${nmax}; got g ${g.length}, h ${h.length}, svG ${svG.length}, svH ${svH.length}`);
  }
  const dt = requireFinite('time', year) - requireFinite('baseYear', baseYear);
  const og = new Float64Array(len);
  const oh = new Float64Array(len);
  for (let k = 0; k < len; k++) {
    og[k] = g[k] + dt * svG[k];
    oh[k] = h[k] + dt * svH[k];
  }
  return { nmax, g: og, h: oh, epochYear: year, source };
}

/** Coefficients from any IGRF-style table at `year` (linear between epochs, SV after the last). */
export function tableCoefficients(t: IgrfTable, name: string, decimalYear: number, nmax = t.nmax): MainFieldCoefficients {
  const year = requireFinite('time', decimalYear);
  checkDegree(nmax, t.nmax);
  const first = t.epochs[0];
  const last = t.epochs[t.epochs.length - 1];
  const end = t.svEndYear;
  if (year < first || year > end) {
    throw new InputError('time', `${name} covers ${first.toFixed(1)}–${end.toFixed(1)}; got ${year}`);
  }
  const source = `${name} at ${year}`;
  if (year >= last) {
    const e = t.epochs.length - 1;
    return applySecularVariation(t.g[e], t.h[e], t.svG, t.svH, nmax, last, year, source);
  }
  // Epochs are evenly spaced; find the bracketing pair by search to stay general.
  let i = 0;
  while (t.epochs[i + 1] <= year) i++;
  const t0 = t.epochs[i];
  const w = (year - t0) / (t.epochs[i + 1] - t0);
  const len = coefCount(nmax);
  const g = new Float64Array(len);
  const h = new Float64Array(len);
  const g0 = t.g[i], g1 = t.g[i + 1], h0 = t.h[i], h1 = t.h[i + 1];
  for (let k = 0; k < len; k++) {
    g[k] = g0[k] + w * (g1[k] - g0[k]);
    h[k] = h0[k] + w * (h1[k] - h0[k]);
  }
  return { nmax, g, h, epochYear: year, source };
}

/**
 * IGRF-14 coefficients for a decimal year in 1900.0–2030.0, truncated to degree nmax (1..13).
 * Throws InputError('time', …) outside that span.
 */
export function igrfCoefficients(decimalYear: number, nmax = 13): MainFieldCoefficients {
  return tableCoefficients(IGRF14_TABLE, 'IGRF-14', decimalYear, nmax);
}
