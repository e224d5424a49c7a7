/// <reference lib="webworker" />
/**
 * The CGM graticule's own worker (channels/graticule.ts): one call, its typed
 * arrays transferred.
 */
import { expose, transfer, type Endpoint } from 'comlink';
import { computeGraticule, type GraticuleAnswer, type GraticuleRequest } from './channels/graticule';

export interface GraticuleApi {
  graticule(r: GraticuleRequest): Promise<GraticuleAnswer>;
}

const api: GraticuleApi = {
  async graticule(r) {
    const a = computeGraticule(r);
    if (!a.ok) return a;
    const buffers = a.graticule.lines.flatMap((l) => [l.latDeg.buffer, l.lonDeg.buffer, l.cgmLatDeg.buffer]) as ArrayBuffer[];
    return transfer(a, buffers);
  },
};

expose(api, self as unknown as Endpoint);
