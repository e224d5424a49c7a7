/** Keeps the shareable URL in step with the store (replaceState, debounced) and restores it at start. */
import { decodeUrlState, encodeUrlState } from './lib/urlState';
import { store } from './store';

export function restoreFromUrl(): void {
  if (!location.search) return;
  const s = store.get();
  const d = decodeUrlState(location.search, { conditions: s.conditions, products: s.products, sites: s.sites });
  store.set({ ...d, scenarioName: 'Shared link' });
}

export function shareUrl(): string {
  const s = store.get();
  return `${location.origin}${location.pathname}?${encodeUrlState({ conditions: s.conditions, products: s.products, sites: s.sites })}`;
}

export function startUrlSync(): () => void {
  let t: ReturnType<typeof setTimeout> | undefined;
  const unsub = store.subscribe((s, prev) => {
    if (s.conditions === prev.conditions && s.products === prev.products && s.sites === prev.sites) return;
    clearTimeout(t);
    t = setTimeout(() => history.replaceState(null, '', shareUrl()), 200);
  });
  return () => {
    clearTimeout(t);
    unsub();
  };
}
