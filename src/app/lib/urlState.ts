/**
 * Shareable state in the URL query: conditions, product options and sites.
 * Pure (no DOM): encode to a query string, decode back.
 *
 * Decoding follows the app's one validation path (src/io/app-inputs.ts, the
 * CLI's ranges and wording): a value that is refused keeps the default and is
 * named in a notice, never swapped silently; a time without a zone is read as
 * UTC and said so; impossible dates (30 February) are refused, not rolled
 * over; at most APP_LIMITS.maxSites sites and names of at most
 * APP_LIMITS.maxNameChars characters are taken. The decoder never throws.
 *
 * Long states (many sites) travel compressed: `z=` holds the plain query,
 * deflate-raw (RFC 1951) and base64url (RFC 4648 §5); `shareLink` says when
 * even that is too long for a safe link.
 */
import { deflateSync, inflateSync, strFromU8, strToU8 } from 'fflate';
import type { FieldConditions, InternalFieldKind } from '../../physics/field/conditions';
import type { SiteInput } from '../../../workers/protocol';
import type { AltPreset, ProductSettings } from '../store';
import { APP_LIMITS, APP_RANGES, readNumber, readSiteName, readTime, wrapLonDeg, type ValueRange } from '../../io/app-inputs';

export interface UrlState {
  conditions: FieldConditions;
  products: ProductSettings;
  sites: SiteInput[];
  /** Map options shared through the link (absent: the defaults). */
  maps?: MapOptions;
}

/** Polar-map options carried by a link. */
export interface MapOptions {
  /** The corrected geomagnetic (CGM) graticule on the polar maps (cgm=1). */
  cgmGraticule: boolean;
}

export interface DecodedUrlState extends UrlState {
  maps: MapOptions;
  /** What the link asked for that was refused or read in a particular way, one plain sentence each. */
  notices: string[];
}

const num = (v: number): string => String(Math.round(v * 1e6) / 1e6);

/** The plain (uncompressed) query. */
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
  if (c.dstNt != null) q.set('dst', num(c.dstNt));
  if (c.speedKms != null) q.set('v', num(c.speedKms));
  q.set('alt', s.products.altPreset === 'custom' ? num(s.products.altKm) : s.products.altPreset);
  if (s.products.conjugateAltKm != null) q.set('calt', num(s.products.conjugateAltKm));
  if (s.products.sourceRe != null) q.set('src', num(s.products.sourceRe));
  q.set('minel', num(s.products.minElevationDeg));
  q.set('minlat', num(s.products.minLatDeg));
  if (s.maps?.cgmGraticule) q.set('cgm', '1');
  for (const site of s.sites) q.append('site', `${site.name}|${num(site.latDeg)}|${num(site.lonDeg)}`);
  return q.toString();
}

const b64url = (bytes: Uint8Array): string => {
  let bin = '';
  for (let i = 0; i < bytes.length; i++) bin += String.fromCharCode(bytes[i]);
  return btoa(bin).replace(/\+/g, '-').replace(/\//g, '_').replace(/=+$/, '');
};
const fromB64url = (text: string): Uint8Array => {
  const bin = atob(text.replace(/-/g, '+').replace(/_/g, '/'));
  const out = new Uint8Array(bin.length);
  for (let i = 0; i < bin.length; i++) out[i] = bin.charCodeAt(i);
  return out;
};

/** The query compressed into one `z=` parameter. */
export function compressQuery(query: string): string {
  return `z=${b64url(deflateSync(strToU8(query), { level: 9 }))}`;
}

/** Largest decompressed query accepted (a 200-site state is ~12 kB). */
const MAX_INFLATED_CHARS = 200_000;

export interface ShareLink {
  /** The link, or null when even compressed it would exceed APP_LIMITS.maxLinkChars. */
  url: string | null;
  compressed: boolean;
  chars: number;
}

/** A share link for `base` (origin + path): plain when short, compressed when long, null when too long either way. */
export function shareLink(base: string, s: UrlState): ShareLink {
  const plain = `${base}?${encodeUrlState(s)}`;
  if (plain.length <= APP_LIMITS.maxLinkChars) return { url: plain, compressed: false, chars: plain.length };
  const packed = `${base}?${compressQuery(encodeUrlState(s))}`;
  return { url: packed.length <= APP_LIMITS.maxLinkChars ? packed : null, compressed: true, chars: packed.length };
}

/** Parse one "name|lat|lon" site (the name may contain '|'); a refusal names the parameter. */
export function parseSiteParam(v: string, k = 1): { ok: true; value: SiteInput } | { ok: false; message: string } {
  const parts = v.split('|');
  if (parts.length < 3) return { ok: false, message: `site ${k}: expected name|lat|lon, got "${v.length > 40 ? `${v.slice(0, 40)}…` : v}"` };
  const lonText = parts.pop()!;
  const latText = parts.pop()!;
  const lat = readNumber(`site ${k} latitude`, latText, APP_RANGES.latDeg);
  if (!lat.ok) return lat;
  const lon = readNumber(`site ${k} longitude`, lonText, APP_RANGES.lonDeg);
  if (!lon.ok) return lon;
  const name = readSiteName(`site ${k}`, parts.join('|'));
  if (!name.ok) return name;
  return { ok: true, value: { name: name.value || `Site ${num(lat.value)},${num(lon.value)}`, latDeg: lat.value, lonDeg: wrapLonDeg(lon.value) } };
}

const ALT: Record<Exclude<AltPreset, 'custom'>, number> = { ground: 0, green: 110, red: 250 };

function expandCompressed(q: URLSearchParams, notices: string[]): URLSearchParams {
  const z = q.get('z');
  if (z === null) return q;
  try {
    const bytes = fromB64url(z);
    // A bound on the inflated size, so a crafted link cannot balloon.
    const text = strFromU8(inflateSync(bytes, { out: new Uint8Array(MAX_INFLATED_CHARS) }).slice());
    if (text.length >= MAX_INFLATED_CHARS) throw new RangeError('too long');
    const inner = new URLSearchParams(text);
    inner.delete('z');
    return inner;
  } catch {
    notices.push('The link\'s compressed state (z=) could not be read; the defaults are shown.');
    return new URLSearchParams();
  }
}

/** Reads one query's values; a refused value keeps its fallback and adds a notice. */
interface QueryReader {
  q: URLSearchParams;
  notices: string[];
  refused(message: string): void;
  number(key: string, what: string, range: ValueRange, fallback: number): number;
  flag(key: string, fallback: boolean): boolean;
}

function queryReader(q: URLSearchParams, notices: string[]): QueryReader {
  const refused = (message: string) => { notices.push(`${message} — the default is kept.`); };
  return {
    q, notices, refused,
    number(key, what, range, fallback) {
      const raw = q.get(key);
      if (raw === null) return fallback;
      const r = readNumber(`${what} (${key}=)`, raw, range);
      if (!r.ok) { refused(r.message); return fallback; }
      return r.value;
    },
    flag(key, fallback) {
      const raw = q.get(key);
      if (raw === null) return fallback;
      if (raw === '1' || raw === '0') return raw === '1';
      refused(`${key}=: expected 1 or 0, got "${raw.slice(0, 40)}"`);
      return fallback;
    },
  };
}

function decodeConditions(r: QueryReader, d: FieldConditions): FieldConditions {
  const { q, notices, refused, number, flag } = r;
  let time = d.time;
  const t = q.get('t');
  if (t !== null) {
    const rt = readTime('time (t=)', t);
    if (!rt.ok) refused(rt.message);
    else {
      time = rt.value.iso;
      if (rt.value.noZone) notices.push(`The link's time ${t.slice(0, 40)} has no zone; it is read as UTC (${time}).`);
    }
  }
  let internal: InternalFieldKind = d.internal;
  const intRaw = q.get('int');
  if (intRaw === 'igrf' || intRaw === 'dipole') internal = intRaw;
  else if (intRaw !== null) refused(`main field (int=): expected igrf or dipole, got "${intRaw.slice(0, 40)}"`);
  const tiltRaw = q.get('tilt');
  const dstRaw = q.get('dst');
  const vRaw = q.get('v');
  const conditions: FieldConditions = {
    ...d,
    time,
    pdynNpa: number('p', 'dynamic pressure', APP_RANGES.pdynNpa, d.pdynNpa),
    bzNt: number('bz', 'IMF Bz', APP_RANGES.imfNt, d.bzNt),
    byNt: number('by', 'IMF By', APP_RANGES.imfNt, d.byNt),
    internal,
    magnetopause: flag('mp', d.magnetopause),
    imfEfficiency: number('eps', 'IMF efficiency', APP_RANGES.imfEfficiency, d.imfEfficiency),
    tail: flag('tail', d.tail ?? true),
    tiltDeg: tiltRaw === null ? d.tiltDeg ?? null : number('tilt', 'dipole tilt', APP_RANGES.tiltDeg, d.tiltDeg ?? NaN),
    dstNt: dstRaw === null ? d.dstNt ?? null : number('dst', 'storm index', APP_RANGES.dstNt, d.dstNt ?? NaN),
    speedKms: vRaw === null ? d.speedKms ?? null : number('v', 'solar-wind speed', APP_RANGES.speedKms, d.speedKms ?? NaN),
  };
  // A refused optional value with no default stays "not set" (NaN marks it above).
  for (const k of ['tiltDeg', 'dstNt', 'speedKms'] as const) if (Number.isNaN(conditions[k])) conditions[k] = null;
  return conditions;
}

function decodeProducts(r: QueryReader, defaults: ProductSettings): ProductSettings {
  const { q, refused, number } = r;
  const products: ProductSettings = { ...defaults };
  const altRaw = q.get('alt');
  if (altRaw === 'ground' || altRaw === 'green' || altRaw === 'red') Object.assign(products, { altPreset: altRaw, altKm: ALT[altRaw] });
  else if (altRaw !== null) {
    const ra = readNumber('footpoint altitude (alt=)', altRaw, APP_RANGES.altKm);
    if (ra.ok) Object.assign(products, { altPreset: 'custom', altKm: ra.value });
    else refused(`${ra.message} (or ground, green, red)`);
  }
  const caltRaw = q.get('calt');
  if (caltRaw !== null) products.conjugateAltKm = number('calt', 'conjugate altitude', APP_RANGES.altKm, products.conjugateAltKm ?? NaN);
  if (Number.isNaN(products.conjugateAltKm)) products.conjugateAltKm = null;
  const srcRaw = q.get('src');
  if (srcRaw !== null) products.sourceRe = number('src', 'source distance', APP_RANGES.sourceRe, products.sourceRe ?? NaN);
  if (Number.isNaN(products.sourceRe)) products.sourceRe = null;
  products.minElevationDeg = number('minel', 'minimum elevation', APP_RANGES.minElevationDeg, products.minElevationDeg);
  products.minLatDeg = number('minlat', 'lowest boundary latitude', APP_RANGES.minLatDeg, products.minLatDeg);
  return products;
}

function decodeSites(q: URLSearchParams, defaults: UrlState['sites'], notices: string[]): UrlState['sites'] {
  if (!q.has('site')) return defaults;
  const all = q.getAll('site');
  const sites: SiteInput[] = [];
  const bad: string[] = [];
  let k = 0;
  for (; k < all.length && sites.length < APP_LIMITS.maxSites; k++) {
    const r = parseSiteParam(all[k], k + 1);
    if (r.ok) sites.push(r.value);
    else bad.push(r.message);
  }
  if (bad.length > 0) notices.push(`${bad.length} site${bad.length === 1 ? '' : 's'} in the link refused: ${bad.slice(0, 3).join('; ')}${bad.length > 3 ? '; …' : ''}.`);
  if (k < all.length) {
    notices.push(`The link names ${all.length} sites; the app holds at most ${APP_LIMITS.maxSites}, so ${all.length - k} were not loaded — use the command line's batch for more.`);
  }
  return sites;
}

/** Decode a query (with or without "?"); never throws. Each refused value keeps its default and adds a notice. */
export function decodeUrlState(query: string, defaults: UrlState): DecodedUrlState {
  const notices: string[] = [];
  let q: URLSearchParams;
  try {
    q = expandCompressed(new URLSearchParams(query.startsWith('?') ? query.slice(1) : query), notices);
  } catch {
    return { ...defaults, maps: { cgmGraticule: defaults.maps?.cgmGraticule ?? false }, notices: ['The link could not be read; the defaults are shown.'] };
  }
  const r = queryReader(q, notices);
  const conditions = decodeConditions(r, defaults.conditions);
  const products = decodeProducts(r, defaults.products);
  const sites = decodeSites(q, defaults.sites, notices);
  const maps: MapOptions = { cgmGraticule: r.flag('cgm', defaults.maps?.cgmGraticule ?? false) };
  return { conditions, products, sites, maps, notices };
}
