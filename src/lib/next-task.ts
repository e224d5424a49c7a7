/**
 * The next task: a promise that settles after the current task and its microtasks, once the
 * tasks already queued (e.g. newer worker messages) have had their turn. A MessageChannel
 * round trip, not clamped like nested setTimeout (≥ 4 ms in browsers); Node has setImmediate;
 * setTimeout where there is neither. Shared by the engine workers (a pause that lets newer
 * requests in) and the app's engine client (the oval request after the scene is drawn).
 */
export const nextTask: () => Promise<void> = (() => {
  if (typeof setImmediate === 'function') return () => new Promise<void>((r) => setImmediate(r));
  if (typeof MessageChannel === 'undefined') return () => new Promise<void>((r) => setTimeout(r, 0));
  const ch = new MessageChannel();
  const waiting: (() => void)[] = [];
  ch.port1.onmessage = () => waiting.shift()?.();
  return () => new Promise<void>((r) => { waiting.push(r); ch.port2.postMessage(0); });
})();
