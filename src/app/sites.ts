/** Site list operations (store mutations, no physics). Limits: APP_LIMITS (src/io/app-inputs.ts). */
import type { SiteInput } from '../../workers/protocol';
import { APP_LIMITS, APP_RANGES, inRange, siteLimitText, wrapLonDeg } from '../io/app-inputs';
import { store, setSites } from './store';

function nextName(sites: SiteInput[]): string {
  let k = sites.length + 1;
  while (sites.some((s) => s.name === `Site ${k}`)) k++;
  return `Site ${k}`;
}

/** Normalise to lat −90..90, lon −180..180 (rounded to 1e-4°, about 10 m); null outside the CLI's ranges. */
function normaliseSite(name: string, latDeg: number, lonDeg: number): SiteInput | null {
  if (!inRange(latDeg, APP_RANGES.latDeg) || !inRange(lonDeg, APP_RANGES.lonDeg)) return null;
  const round = (v: number) => Math.round(v * 1e4) / 1e4;
  return { name: [...name.trim()].slice(0, APP_LIMITS.maxNameChars).join(''), latDeg: round(latDeg), lonDeg: round(wrapLonDeg(lonDeg)) };
}

/** Add one site; returns the refusal (list full, position out of range) or '' when added. */
export function addSite(name: string, latDeg: number, lonDeg: number): string {
  const sites = store.get().sites;
  if (sites.length >= APP_LIMITS.maxSites) return `The site list is full: the app holds at most ${APP_LIMITS.maxSites} sites — use the command line's batch for more.`;
  const s = normaliseSite(name || nextName(sites), latDeg, lonDeg);
  if (!s) return 'Latitude must be −90..90° and longitude −360..360° (east positive).';
  setSites([...sites, s]);
  return '';
}

export function addSiteAt(latDeg: number, lonDeg: number): boolean {
  return addSite('', latDeg, lonDeg) === '';
}

export function removeSite(index: number): void {
  setSites(store.get().sites.filter((_, i) => i !== index));
}

/** Add sites up to the limit; `limit` says how many did not fit ('' when all did). */
export function addSites(list: SiteInput[]): { added: number; limit: string } {
  const cur = store.get().sites;
  const room = Math.max(0, APP_LIMITS.maxSites - cur.length);
  const ok = list.map((s) => normaliseSite(s.name, s.latDeg, s.lonDeg)).filter((s): s is SiteInput => s !== null);
  const add = ok.slice(0, room);
  if (add.length > 0) setSites([...cur, ...add]);
  return { added: add.length, limit: ok.length > room ? siteLimitText(ok.length, room) + (cur.length > 0 ? ` (${cur.length} already in the list)` : '') : '' };
}
