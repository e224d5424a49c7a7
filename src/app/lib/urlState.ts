/**
 * Shareable state in the URL query: conditions, product options and sites.
 * Pure (no DOM): encode to a query string, decode back. Unknown or malformed
 * parameters fall back to the defaults given, so a hand-edited URL never breaks the page.
 */
import type { FieldConditions, InternalFieldKind } from '../../physics/field/conditions';
import type { SiteInput } from '../../../workers/protocol';
import type { AltPreset, ProductSettings } from '../store';

export interface UrlState {
  conditions: FieldConditions;
  products: ProductSettings;
  sites: SiteInput[];
}

const num = (v: number): string => String(Math.round(v * 1e6) / 1e6);

export function encodeUrlState(s: UrlState): string {
  const q = new URLSearchParams();
  const c = s.conditions;
  q.set('t', c.time);
  q.set('p', num(c.pdynNpa));
  q.set('bz', num(c.bzNt));
  q.set('by', num(c.byNt));
  q.set('int', c.internal);
  q.set('mp', c.magnetopause ? '1' : '0');
  q.set('eps', num(c.imfEfficiency));
  q.set('tail', c.tail === false ? '0' : '1');
  if (c.tiltDeg != null) q.set('tilt', num(c.tiltDeg));
  q.set('alt', s.products.altPreset === 'custom' ? num(s.products.altKm) : s.products.altPreset);
  q.set('src', num(s.products.sourceRe));
  q.set('minel', num(s.products.minElevationDeg));
  for (const site of s.sites) q.append('site', `${site.name}|${num(site.latDeg)}|${num(site.lonDeg)}`);
  return q.toString();
}

function finiteOr(v: string | null, fallback: number, lo = -Infinity, hi = Infinity): number {
  if (v === null || v.trim() === '') return fallback;
  const x = Number(v);
  return Number.isFinite(x) && x >= lo && x <= hi ? x : fallback;
}

/** Parse one "name|lat|lon" site; the name may itself contain '|'. Null when malformed. */
export function parseSiteParam(v: string): SiteInput | null {
  const parts = v.split('|');
  if (parts.length < 3) return null;
  const lonDeg = Number(parts.pop());
  const latDeg = Number(parts.pop());
  const name = parts.join('|').trim();
  if (!Number.isFinite(latDeg) || !Number.isFinite(lonDeg) || latDeg < -90 || latDeg > 90 || lonDeg < -180 || lonDeg > 360) return null;
  return { name: name || `Site ${num(latDeg)},${num(lonDeg)}`, latDeg, lonDeg: lonDeg > 180 ? lonDeg - 360 : lonDeg };
}

const ALT: Record<Exclude<AltPreset, 'custom'>, number> = { ground: 0, green: 110, red: 250 };

export function decodeUrlState(query: string, defaults: UrlState): UrlState {
  const q = new URLSearchParams(query.startsWith('?') ? query.slice(1) : query);
  const d = defaults.conditions;
  const t = q.get('t');
  const time = t !== null && !Number.isNaN(Date.parse(t)) ? new Date(Date.parse(t)).toISOString().replace('.000Z', 'Z') : d.time;
  const internal: InternalFieldKind = q.get('int') === 'igrf' ? 'igrf' : q.get('int') === 'dipole' ? 'dipole' : d.internal;
  const tiltRaw = q.get('tilt');
  const conditions: FieldConditions = {
    ...d,
    time,
    pdynNpa: finiteOr(q.get('p'), d.pdynNpa, 0.01, 1000),
    bzNt: finiteOr(q.get('bz'), d.bzNt, -500, 500),
    byNt: finiteOr(q.get('by'), d.byNt, -500, 500),
    internal,
    magnetopause: q.has('mp') ? q.get('mp') !== '0' : d.magnetopause,
    imfEfficiency: finiteOr(q.get('eps'), d.imfEfficiency, 0, 1),
    tail: q.has('tail') ? q.get('tail') !== '0' : d.tail ?? true,
    tiltDeg: tiltRaw === null ? d.tiltDeg ?? null : finiteOr(tiltRaw, 0, -90, 90),
  };
  const altRaw = q.get('alt');
  let products: ProductSettings = { ...defaults.products };
  if (altRaw === 'ground' || altRaw === 'green' || altRaw === 'red') products = { ...products, altPreset: altRaw, altKm: ALT[altRaw] };
  else if (altRaw !== null && Number.isFinite(Number(altRaw)) && Number(altRaw) >= 0 && Number(altRaw) <= 2000)
    products = { ...products, altPreset: 'custom', altKm: Number(altRaw) };
  products.sourceRe = finiteOr(q.get('src'), products.sourceRe, 2, 60);
  products.minElevationDeg = finiteOr(q.get('minel'), products.minElevationDeg, 0, 60);
  const siteParams = q.getAll('site');
  const sites = q.has('site') ? siteParams.map(parseSiteParam).filter((s): s is SiteInput => s !== null) : defaults.sites;
  return { conditions, products, sites };
}
