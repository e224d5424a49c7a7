/** Site list operations (store mutations, no physics). */
import type { SiteInput } from '../../workers/protocol';
import { store, setSites } from './store';

/** At most this many sites, so a pasted file cannot stall the worker. */
const MAX_SITES = 200;

function nextName(sites: SiteInput[]): string {
  let k = sites.length + 1;
  while (sites.some((s) => s.name === `Site ${k}`)) k++;
  return `Site ${k}`;
}

/** Normalise to lat −90..90, lon −180..180 (rounded to 1e-4°, about 10 m). */
function normaliseSite(name: string, latDeg: number, lonDeg: number): SiteInput | null {
  if (!Number.isFinite(latDeg) || !Number.isFinite(lonDeg) || Math.abs(latDeg) > 90) return null;
  let lon = ((((lonDeg + 180) % 360) + 360) % 360) - 180;
  if (lon === -180 && lonDeg > 0) lon = 180;
  const round = (v: number) => Math.round(v * 1e4) / 1e4;
  return { name: name.trim().slice(0, 80), latDeg: round(latDeg), lonDeg: round(lon) };
}

export function addSite(name: string, latDeg: number, lonDeg: number): boolean {
  const sites = store.get().sites;
  const s = normaliseSite(name || nextName(sites), latDeg, lonDeg);
  if (!s || sites.length >= MAX_SITES) return false;
  setSites([...sites, s]);
  return true;
}

export function addSiteAt(latDeg: number, lonDeg: number): boolean {
  return addSite('', latDeg, lonDeg);
}

export function removeSite(index: number): void {
  setSites(store.get().sites.filter((_, i) => i !== index));
}

export function addSites(list: SiteInput[]): number {
  const cur = store.get().sites;
  const room = Math.max(0, MAX_SITES - cur.length);
  const add = list.map((s) => normaliseSite(s.name, s.latDeg, s.lonDeg)).filter((s): s is SiteInput => s !== null).slice(0, room);
  setSites([...cur, ...add]);
  return add.length;
}
