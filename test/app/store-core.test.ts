import { describe, it, expect } from 'vitest';
import { createStore } from '../../src/app/store/core';

// Source: the store's contract (src/app/store/core.ts): a patch that changes no key (Object.is)
// keeps the state's reference and tells nobody; any changed key gives one notification with (new, previous).
describe('store core', () => {
  const initial = () => ({ a: 1, b: { x: 1 }, c: NaN });

  it('does not notify, nor replace the state, when a patch changes nothing', () => {
    const s = createStore(initial());
    const before = s.get();
    let calls = 0;
    s.subscribe(() => { calls++; });
    s.set({ a: 1 });
    s.set({ b: before.b, c: NaN }); // same reference; NaN equals NaN under Object.is
    s.set(() => ({}));
    expect(calls).toBe(0);
    expect(s.get()).toBe(before);
  });

  it('notifies once per change with the new and the previous state', () => {
    const s = createStore(initial());
    const before = s.get();
    const seen: [number, number][] = [];
    s.subscribe((now, prev) => { seen.push([now.a, prev.a]); });
    s.set({ a: 1, b: { x: 1 } }); // a new object is a change (shallow compare)
    s.set((st) => ({ a: st.a + 1 }));
    expect(seen).toEqual([[1, 1], [2, 1]]);
    expect(s.get()).not.toBe(before);
    expect(s.get().b).not.toBe(before.b);
  });

  it('stops notifying after unsubscribe', () => {
    const s = createStore(initial());
    let calls = 0;
    const off = s.subscribe(() => { calls++; });
    s.set({ a: 2 });
    off();
    s.set({ a: 3 });
    expect(calls).toBe(1);
  });
});
