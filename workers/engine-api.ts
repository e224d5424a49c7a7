/**
 * The engine API behind the worker: coarse calls over src/physics that return
 * typed arrays. Pure (no DOM, no comlink), so tests call it in-process.
 * Stale requests: each channel remembers the newest request id it has seen;
 * long calls yield between pieces of work and answer { stale: true } once a
 * newer request for the same channel has arrived.
 */
import type { FieldConditions } from '../src/physics/field/conditions';
import { prepareModel, type PreparedModel } from '../src/physics/field/model';
import { makeTracer, sectorBoundaries, mltGrid, predictHint, DEFAULT_SOURCE_RE, type SectorBoundaries } from '../src/physics/mapping/mapping';
import { siteReport } from '../src/physics/mapping/site-report';
import { sweepBoundaries } from '../src/physics/mapping/sweep';
import { gsmAtMagneticLatMlt } from '../src/physics/trace/footpoint';
import type { Tracer } from '../src/physics/trace/tracer';
import type {
  EngineApi, FanSpec, SceneResult, OvalResult, SitesResult, SweepResult, SiteInput, SiteResult, BoundaryCurve, FrameInfo, LineBundle,
} from './protocol';

type Channel = 'scene' | 'oval' | 'sites' | 'sweep';

/**
 * Let queued messages (newer requests) run. A MessageChannel round trip is not
 * clamped like nested setTimeout (≥ 4 ms in browsers). Node has setImmediate.
 */
const yieldToQueue: () => Promise<void> = (() => {
  if (typeof setImmediate === 'function') return () => new Promise<void>((r) => setImmediate(r));
  if (typeof MessageChannel === 'undefined') return () => new Promise<void>((r) => setTimeout(r, 0));
  const ch = new MessageChannel();
  const waiting: (() => void)[] = [];
  ch.port1.onmessage = () => waiting.shift()?.();
  return () => new Promise<void>((r) => { waiting.push(r); ch.port2.postMessage(0); });
})();

export class StaleRequest extends Error {}

export function message(e: unknown): string {
  return e instanceof Error ? e.message : String(e);
}

export interface EngineApiInternals extends EngineApi {
  /** For tests: the newest request id per channel. */
  latest: Record<Channel, number>;
}

export function createEngineApi(): EngineApiInternals {
  const latest: Record<Channel, number> = { scene: -1, oval: -1, sites: -1, sweep: -1 };
  let cacheKey = '';
  let cacheModel: PreparedModel | null = null;
  const tracers = new Map<string, Tracer>();

  function model(c: FieldConditions): PreparedModel {
    const key = JSON.stringify(c);
    if (key !== cacheKey || !cacheModel) {
      cacheModel = prepareModel(c);
      cacheKey = key;
      tracers.clear();
    }
    return cacheModel;
  }

  function tracer(m: PreparedModel, altKm: number): Tracer {
    const k = String(altKm);
    let t = tracers.get(k);
    if (!t) {
      t = makeTracer(m, { altKm, ellipsoid: true });
      tracers.set(k, t);
    }
    return t;
  }

  function claim(ch: Channel, id: number): void {
    if (id > latest[ch]) latest[ch] = id;
  }
  function check(ch: Channel, id: number): void {
    if (latest[ch] > id) throw new StaleRequest();
  }

  function frameInfo(m: PreparedModel): FrameInfo {
    const f = m.frames;
    const g = f.gsmFromGeo;
    // GEO ← GSM is the transpose of GSM ← GEO.
    const geoFromGsm = new Float64Array([g[0], g[3], g[6], g[1], g[4], g[7], g[2], g[5], g[8]]);
    return {
      geoFromGsm,
      sunGeo: Float64Array.from(f.sunGeo),
      axisGeo: Float64Array.from(f.axisGeo),
      tiltDeg: (f.tiltRad * 180) / Math.PI,
      poleLatDeg: m.dipole.poleLatDeg,
      poleLonDeg: m.dipole.poleLonDeg,
      b0Nt: m.dipole.b0Nt,
      igrfEpoch: m.decimalYear,
    };
  }

  async function guarded<T extends { requestId: number }>(ch: Channel, id: number, empty: () => T, work: () => Promise<T>): Promise<T> {
    claim(ch, id);
    try {
      return await work();
    } catch (e) {
      const base = empty();
      if (e instanceof StaleRequest) return { ...base, stale: true };
      return { ...base, error: message(e) };
    }
  }

  const emptyFrames = (): FrameInfo => ({
    geoFromGsm: new Float64Array(9), sunGeo: new Float64Array(3), axisGeo: new Float64Array(3), tiltDeg: NaN, poleLatDeg: NaN, poleLonDeg: NaN, b0Nt: NaN, igrfEpoch: NaN,
  });
  const emptyLines = (): LineBundle => ({ pointsGeo: new Float64Array(0), offsets: new Int32Array(1), types: new Uint8Array(0) });

  const api: EngineApiInternals = {
    latest,

    scene(requestId: number, c: FieldConditions, fan: FanSpec): Promise<SceneResult> {
      return guarded<SceneResult>('scene', requestId,
        () => ({ requestId, warnings: [], frames: emptyFrames(), magnetopause: { enabled: false, r0Re: NaN, alpha: NaN }, lines: emptyLines() }),
        async () => {
          const m = model(c);
          const t = tracer(m, 0);
          const g = m.frames.gsmFromGeo;
          const seeds: number[][] = [];
          for (const mlt of fan.mltHours) for (const lat of fan.magLatDeg) seeds.push([lat, mlt]);
          const chunks: Float64Array[] = [];
          const offsets = new Int32Array(seeds.length + 1);
          const types = new Uint8Array(seeds.length);
          const s = new Float64Array(3);
          let total = 0;
          for (let i = 0; i < seeds.length; i++) {
            gsmAtMagneticLatMlt(s, m.frames, seeds[i][0], seeds[i][1], 0, true);
            types[i] = t.trace(s[0], s[1], s[2]);
            const n = t.nPoints;
            const pts = new Float64Array(3 * n);
            const p = t.points;
            for (let k = 0; k < n; k++) {
              const x = p[3 * k], y = p[3 * k + 1], z = p[3 * k + 2];
              pts[3 * k] = g[0] * x + g[3] * y + g[6] * z;
              pts[3 * k + 1] = g[1] * x + g[4] * y + g[7] * z;
              pts[3 * k + 2] = g[2] * x + g[5] * y + g[8] * z;
            }
            chunks.push(pts);
            total += n;
            offsets[i + 1] = total;
          }
          const pointsGeo = new Float64Array(3 * total);
          let o = 0;
          for (const ch of chunks) { pointsGeo.set(ch, o); o += ch.length; }
          const mp = m.magnetopause;
          return {
            requestId, warnings: [...m.warnings], frames: frameInfo(m),
            magnetopause: { enabled: mp !== null, r0Re: mp ? mp.r0Re : NaN, alpha: mp ? mp.alpha : NaN },
            lines: { pointsGeo, offsets, types },
          };
        });
    },

    oval(requestId, c, o): Promise<OvalResult> {
      return guarded<OvalResult>('oval', requestId, () => ({ requestId, warnings: [], curves: [] }), async () => {
        const m = model(c);
        const t = tracer(m, o.altKm);
        const mlts = mltGrid(o.mltStepHours);
        const curves: BoundaryCurve[] = [];
        for (const hemisphere of ['north', 'south'] as const) {
          const n = mlts.length;
          const cur: BoundaryCurve = {
            hemisphere, mltHours: Float64Array.from(mlts),
            openClosedMagLatDeg: new Float64Array(n).fill(NaN), openClosedGeoLatDeg: new Float64Array(n).fill(NaN), openClosedGeoLonDeg: new Float64Array(n).fill(NaN),
            equatorwardMagLatDeg: new Float64Array(n).fill(NaN), equatorwardGeoLatDeg: new Float64Array(n).fill(NaN), equatorwardGeoLonDeg: new Float64Array(n).fill(NaN),
          };
          let prev: SectorBoundaries | null = null, prev2: SectorBoundaries | null = null;
          for (let i = 0; i < n; i++) {
            await yieldToQueue();
            check('oval', requestId);
            const b = sectorBoundaries(m, t, hemisphere, mlts[i], { sourceRe: o.sourceRe ?? DEFAULT_SOURCE_RE, latTolDeg: o.latTolDeg ?? 0.01 }, predictHint(prev, prev2));
            prev2 = prev;
            prev = b;
            if (b.openClosed) {
              cur.openClosedMagLatDeg[i] = b.openClosed.magLatDeg; cur.openClosedGeoLatDeg[i] = b.openClosed.geoLatDeg; cur.openClosedGeoLonDeg[i] = b.openClosed.geoLonDeg;
            }
            if (b.equatorward) {
              cur.equatorwardMagLatDeg[i] = b.equatorward.magLatDeg; cur.equatorwardGeoLatDeg[i] = b.equatorward.geoLatDeg; cur.equatorwardGeoLonDeg[i] = b.equatorward.geoLonDeg;
            }
          }
          curves.push(cur);
        }
        return { requestId, warnings: [...m.warnings], curves };
      });
    },

    sites(requestId, c, o, sites: SiteInput[]): Promise<SitesResult> {
      return guarded<SitesResult>('sites', requestId, () => ({ requestId, warnings: [], sites: [] }), async () => {
        const m = model(c);
        const conjAlt = o.conjugateAltKm ?? 0;
        const tc = tracer(m, conjAlt);
        const ta = tracer(m, o.altKm);
        const minEl = o.minElevationDeg ?? 10;
        const out: SiteResult[] = [];
        for (const site of sites) {
          await yieldToQueue();
          check('sites', requestId);
          out.push(siteReport(m, tc, ta, site, { conjugateAltKm: conjAlt, altKm: o.altKm, sourceRe: o.sourceRe ?? DEFAULT_SOURCE_RE, minElevationDeg: minEl }));
        }
        return { requestId, warnings: [...m.warnings], sites: out };
      });
    },

    sweep(requestId, c, o): Promise<SweepResult> {
      const n = Math.max(0, Math.floor(o.steps));
      return guarded<SweepResult>('sweep', requestId,
        () => ({ requestId, warnings: [], vary: o.vary, mltHours: o.mltHours, values: new Float64Array(0), northOpenClosedMagLatDeg: new Float64Array(0), northEquatorwardMagLatDeg: new Float64Array(0), southOpenClosedMagLatDeg: new Float64Array(0), southEquatorwardMagLatDeg: new Float64Array(0) }),
        async () => {
          const rows = await sweepBoundaries(c, { vary: o.vary, from: o.from, to: o.to, steps: n, mltHours: o.mltHours, altKm: o.altKm, sourceRe: o.sourceRe ?? DEFAULT_SOURCE_RE },
            async () => { await yieldToQueue(); check('sweep', requestId); });
          const k = rows.values.length;
          const warnings = rows.warnings;
          return {
            requestId, warnings, vary: o.vary, mltHours: o.mltHours, values: Float64Array.from(rows.values),
            northOpenClosedMagLatDeg: Float64Array.from(rows.north.map((r) => r.openClosed?.magLatDeg ?? NaN)),
            northEquatorwardMagLatDeg: Float64Array.from(rows.north.map((r) => r.equatorward?.magLatDeg ?? NaN)),
            southOpenClosedMagLatDeg: Float64Array.from(rows.south.map((r) => r.openClosed?.magLatDeg ?? NaN)),
            southEquatorwardMagLatDeg: Float64Array.from(rows.south.map((r) => r.equatorward?.magLatDeg ?? NaN)),
            ...(k === 0 ? { error: 'sweep: no steps' } : {}),
          };
        });
    },
  };
  return api;
}

