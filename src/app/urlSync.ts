/**
 * Keeps the shareable URL in step with the store (replaceState, debounced)
 * and restores it at start. Links longer than a safe size are compressed; a
 * state too large even then is shared without its sites (and the page says so).
 */
import { APP_LIMITS } from '../io/app-inputs';
import { decodeUrlState, shareLink, type UrlState } from './lib/urlState';
import { store } from './store';

export function restoreFromUrl(): void {
  if (!location.search) return;
  const s = store.get();
  const d = decodeUrlState(location.search, { conditions: s.conditions, products: s.products, sites: s.sites, maps: { cgmGraticule: s.view.cgmGraticule } });
  store.set({ conditions: d.conditions, products: d.products, sites: d.sites, view: { ...s.view, cgmGraticule: d.maps.cgmGraticule }, notices: d.notices, scenarioName: 'Shared link' });
}

const base = () => `${location.origin}${location.pathname}`;
const stateOf = (): UrlState => {
  const s = store.get();
  return { conditions: s.conditions, products: s.products, sites: s.sites, maps: { cgmGraticule: s.view.cgmGraticule } };
};

/** The link to share and what to tell the user about it ('' or a sentence ending in a space). */
export function makeShareLink(): { url: string; note: string } {
  const st = stateOf();
  const l = shareLink(base(), st);
  if (l.url) return { url: l.url, note: l.compressed ? 'The link is compressed (z=) to stay short. ' : '' };
  const bare = shareLink(base(), { ...st, sites: [] });
  return {
    url: bare.url ?? base(),
    note: `With ${st.sites.length} sites the link would be ${l.chars} characters even compressed (the safe limit is ${APP_LIMITS.maxLinkChars}), so it carries the conditions without the sites: share the sites as a file (Sites CSV; Import sites reads it). `,
  };
}

export function startUrlSync(): () => void {
  let t: ReturnType<typeof setTimeout> | undefined;
  const unsub = store.subscribe((s, prev) => {
    if (s.conditions === prev.conditions && s.products === prev.products && s.sites === prev.sites && s.view.cgmGraticule === prev.view.cgmGraticule) return;
    clearTimeout(t);
    t = setTimeout(() => {
      const l = shareLink(base(), stateOf());
      history.replaceState(null, '', l.url ?? makeShareLink().url);
    }, 200);
  });
  return () => {
    clearTimeout(t);
    unsub();
  };
}
