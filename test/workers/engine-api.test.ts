import { describe, it, expect } from 'vitest';
import { MessageChannel } from 'node:worker_threads';
import { wrap, expose, type Endpoint } from 'comlink';
import nodeEndpoint from 'comlink/dist/esm/node-adapter.mjs';
import { createEngineApi } from '../../workers/engine-api';
import type { EngineApi } from '../../workers/protocol';
import { prepareModel } from '../../src/physics/field/model';
import { makeTracer, traceSite } from '../../src/physics/mapping';
import { LINE_CLOSED } from '../../src/physics/trace/line-type';
import { expectClose } from '../helpers';

const C = { time: '2025-03-20T22:00:00Z', pdynNpa: 3, bzNt: -5, byNt: 2, internal: 'dipole' as const, magnetopause: true, imfEfficiency: 0.2, tail: false };
const O = { altKm: 110, sourceRe: 8 };

describe('engine worker API (in-process)', () => {
  it('scene returns one line per seed, GEO points in typed arrays, and consistent offsets', async () => {
    const api = createEngineApi();
    const r = await api.scene(1, C, { mltHours: [0, 12], magLatDeg: [60, 70, 80] });
    expect(r.error).toBeUndefined();
    expect(r.lines.types.length).toBe(6);
    expect(r.lines.offsets.length).toBe(7);
    expect(r.lines.pointsGeo.length).toBe(3 * r.lines.offsets[6]);
    expect(r.lines.pointsGeo).toBeInstanceOf(Float64Array);
    // The 60° lines are closed (dipole L ≈ 4).
    expect(r.lines.types[0]).toBe(LINE_CLOSED);
    expect(r.magnetopause.enabled).toBe(true);
    expect(r.frames.geoFromGsm.length).toBe(9);
  });

  it('a newer request on the same channel makes the older one answer stale', async () => {
    const api = createEngineApi();
    const first = api.oval(1, C, { ...O, mltStepHours: 6 });
    const second = api.oval(2, { ...C, pdynNpa: 5 }, { ...O, mltStepHours: 6 });
    const [a, b] = await Promise.all([first, second]);
    expect(a.stale).toBe(true);
    expect(b.stale).toBeUndefined();
    expect(b.curves.length).toBe(2);
  });

  it('errors come back as messages, not exceptions or hangs', async () => {
    const api = createEngineApi();
    const r = await api.oval(1, { ...C, pdynNpa: -1 }, { ...O, mltStepHours: 6 });
    expect(r.error).toMatch(/pdynNpa/);
    const s = await api.sites(1, C, O, [{ name: 'Bad', latDeg: 95, lonDeg: 0 }]);
    expect(s.error).toBeUndefined();
    expect(s.sites[0].error).toMatch(/lat/);
    const w = await api.sweep(1, C, { ...O, vary: 'pdyn', from: 0, to: 5, steps: 3, mltHours: 0 });
    expect(w.error).toMatch(/pressure|from/);
  });

  it('a site conjugate equals the engine trace for the same conditions (same engine, 1e-9°)', async () => {
    const api = createEngineApi();
    const r = await api.sites(1, C, { ...O, conjugateAltKm: 0 }, [{ name: 'Test site', latDeg: 64.2, lonDeg: -21.5 }]);
    const m = prepareModel(C);
    const line = traceSite(m, makeTracer(m, { altKm: 0, ellipsoid: true }), 64.2, -21.5, 0, 'geo');
    expectClose(r.sites[0].conjugate!.geoLatDeg, line.conjugate!.geoLatDeg, 1e-9, 'conjugate latitude');
    expectClose(r.sites[0].conjugate!.geoLonDeg, line.conjugate!.geoLonDeg, 1e-9, 'conjugate longitude');
  });
});

describe('engine worker API over comlink (Node MessageChannel)', () => {
  it('answers through a message port with typed arrays intact', async () => {
    const { port1, port2 } = new MessageChannel();
    expose(createEngineApi(), nodeEndpoint(port1) as Endpoint);
    const remote = wrap<EngineApi>(nodeEndpoint(port2) as Endpoint);
    try {
      const r = await remote.scene(7, C, { mltHours: [6], magLatDeg: [65] });
      expect(r.requestId).toBe(7);
      expect(r.lines.pointsGeo).toBeInstanceOf(Float64Array);
      expect(r.lines.pointsGeo.length).toBeGreaterThan(30);
    } finally {
      port1.close();
      port2.close();
    }
  });
});
