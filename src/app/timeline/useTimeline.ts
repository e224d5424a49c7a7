/** React hook over the timeline's store (the same pattern as the app store's hook). */
import { useSyncExternalStore } from 'react';
import { timelineStore, type TimelineState } from './state';

export function useTimeline<U>(selector: (s: TimelineState) => U): U {
  return useSyncExternalStore(timelineStore.subscribe, () => selector(timelineStore.get()), () => selector(timelineStore.get()));
}
