// Worker entry of `oval --conditions`: the CLI runs from TypeScript sources under tsx, and a
// worker thread does not inherit the parent's loader, so register it here first.
import { register } from 'tsx/esm/api';

register();
await import(new URL('./oval-worker.ts', import.meta.url).href);
