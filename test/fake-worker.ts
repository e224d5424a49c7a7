/**
 * A Worker stand-in for tests in Node: the engine API (or any object) exposed over a
 * node:worker_threads MessageChannel through comlink, as the app's client expects a Worker.
 * Messages go through the port; no 'error' events (the adapter would deliver messages to them).
 */
import { MessageChannel } from 'node:worker_threads';
import { expose } from 'comlink';
import nodeEndpoint from 'comlink/dist/esm/node-adapter.mjs';
import { createEngineApi } from '../workers/engine-api';

export function portWorker(api: object = createEngineApi()): Worker {
  const { port1, port2 } = new MessageChannel();
  expose(api, nodeEndpoint(port2));
  const ep = nodeEndpoint(port1);
  return {
    postMessage: ep.postMessage.bind(ep),
    addEventListener: (type: string, l: EventListener) => { if (type === 'message') ep.addEventListener('message', l); },
    removeEventListener: (type: string, l: EventListener) => { if (type === 'message') ep.removeEventListener('message', l); },
    terminate: () => { port1.close(); port2.close(); },
  } as unknown as Worker;
}
