/// <reference lib="webworker" />
/**
 * The browser's engine worker: exposes createEngineApi() with comlink and
 * transfers the typed arrays of every answer (no copies).
 */
import { expose, releaseProxy, transfer, type Endpoint } from 'comlink';
import { createEngineApi } from './engine-api';
import type { EngineApi } from './protocol';

const inner = createEngineApi();

/** Collect the ArrayBuffers of the typed arrays in a result, down to 4 levels of nested arrays/objects (the answers need 3: sites → site → lineGeo). */
function buffersOf(v: unknown, acc: Set<ArrayBuffer>, depth = 0): Set<ArrayBuffer> {
  if (depth > 4 || v === null || typeof v !== 'object') return acc;
  if (ArrayBuffer.isView(v)) {
    if (v.buffer instanceof ArrayBuffer) acc.add(v.buffer);
    return acc;
  }
  for (const x of Array.isArray(v) ? v : Object.values(v)) buffersOf(x, acc, depth + 1);
  return acc;
}

function withTransfer<T>(p: Promise<T>): Promise<T> {
  return p.then((r) => transfer(r, [...buffersOf(r, new Set())]));
}

/** As withTransfer, with the call's wall time in the worker (from the call to the answer) as `workerMs`. */
function timed<T extends { workerMs?: number }>(call: () => Promise<T>): Promise<T> {
  const t0 = performance.now();
  return withTransfer(call().then((r) => ({ ...r, workerMs: performance.now() - t0 })));
}

const api: EngineApi = {
  scene: (id, c, fan) => timed(() => inner.scene(id, c, fan)),
  oval: (id, c, o) => timed(() => inner.oval(id, c, o)),
  sites: (id, c, o, s) => withTransfer(inner.sites(id, c, o, s)),
  sweep: (id, c, o) => withTransfer(inner.sweep(id, c, o)),
  // The progress callback arrives as a comlink proxy: release its port once the call is over.
  timeline: (id, b, st, o, s, p) => inner.timeline(id, b, st, o, s, p).finally(() => (p as unknown as { [releaseProxy]?: () => void } | undefined)?.[releaseProxy]?.()),
  timelineFocus: (id, k) => inner.timelineFocus(id, k),
};

expose(api, self as unknown as Endpoint);
