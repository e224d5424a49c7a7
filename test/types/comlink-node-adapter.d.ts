// comlink ships node-adapter.d.ts beside the .mjs without an export map entry; declare the path we import.
declare module 'comlink/dist/esm/node-adapter.mjs' {
  import type { Endpoint } from 'comlink';
  import type { MessagePort, Worker } from 'node:worker_threads';
  export default function nodeEndpoint(nep: MessagePort | Worker): Endpoint;
}
