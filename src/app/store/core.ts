/**
 * A framework-free store: one plain state object, a setter that merges a
 * patch, and subscribers told of each change with the new and previous state.
 * A patch whose every key already holds the same value (Object.is, one level
 * deep) changes nothing: the state keeps its reference and nobody is told.
 */
export interface Store<T> {
  get(): T;
  /** Merge a patch (or the patch a function of the current state returns); notifies only when a key changes. */
  set(patch: Partial<T> | ((s: T) => Partial<T>)): void;
  /** Called after every change; returns the unsubscribe function. */
  subscribe(fn: (s: T, prev: T) => void): () => void;
}

/** True when every key of `patch` already holds that value in `state` (Object.is). */
function changesNothing<T extends object>(state: T, patch: Partial<T>): boolean {
  for (const k of Object.keys(patch) as (keyof T)[]) {
    if (!Object.is(state[k], patch[k])) return false;
  }
  return true;
}

export function createStore<T extends object>(initial: T): Store<T> {
  let state = initial;
  const listeners = new Set<(s: T, prev: T) => void>();
  return {
    get: () => state,
    set(patch) {
      const p = typeof patch === 'function' ? patch(state) : patch;
      if (changesNothing(state, p)) return;
      const prev = state;
      state = { ...state, ...p };
      for (const fn of listeners) fn(state, prev);
    },
    subscribe(fn) {
      listeners.add(fn);
      return () => { listeners.delete(fn); };
    },
  };
}
