/**
 * The engine API behind the worker: coarse calls over src/physics that return
 * typed arrays, one module per channel (workers/channels/), sharing one model
 * cache and the stale-request bookkeeping (channels/context.ts). Pure (no DOM,
 * no comlink), so tests call it in-process.
 */
import type { EngineApi } from './protocol';
import { createEngineContext } from './channels/context';
import { sceneChannel } from './channels/scene';
import { ovalChannel } from './channels/oval';
import { sitesChannel } from './channels/sites';
import { sweepChannel } from './channels/sweep';
import { timelineChannel, timelineFocusChannel } from './channels/timeline';

export function createEngineApi(): EngineApi {
  const ctx = createEngineContext();
  return {
    scene: sceneChannel(ctx),
    oval: ovalChannel(ctx),
    sites: sitesChannel(ctx),
    sweep: sweepChannel(ctx),
    timeline: timelineChannel(ctx),
    timelineFocus: timelineFocusChannel(ctx),
  };
}
