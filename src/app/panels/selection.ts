/**
 * Presentation-only state of the page (not shared through the URL): which
 * site the answer card describes, the map basemap, the enlarged map and the
 * key-help overlay. A small store of its own (the framework-free core).
 */
import { useSyncExternalStore } from 'react';
import { createStore } from '../store/core';

export type Basemap = 'light' | 'dark';

interface UiState {
  /** Name of the site the answer card shows (null: the first site). */
  selectedSite: string | null;
  basemap: Basemap;
  enlargedMap: 'north' | 'south' | null;
  keyHelp: boolean;
}

export const ui = createStore<UiState>({ selectedSite: null, basemap: 'light', enlargedMap: null, keyHelp: false });

export function useUi<U>(selector: (s: UiState) => U): U {
  return useSyncExternalStore(ui.subscribe, () => selector(ui.get()), () => selector(ui.get()));
}
