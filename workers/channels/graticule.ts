/**
 * The CGM graticule for the polar maps (mapping/cgm-graticule.ts), computed in
 * a worker of its own (workers/graticule.worker.ts) so that its tracing
 * (about 2,000 main-field traces for a new date, 820 for a new time of the
 * same date) never holds up the engine worker's scene, oval and sites. It
 * depends only on the main field, the time (MLT, and the tilt when
 * overridden) and the height: the app keys its cache by `graticuleKey`, so
 * other controls never recompute it.
 */
import { prepareModel } from '../../src/physics/field/model';
import { cgmGraticuleOf, type CgmGraticule, type GraticuleLine } from '../../src/physics/mapping';
import { graticuleKey, type GraticuleRequest } from './graticule-key';

export { graticuleKey, type GraticuleRequest };

export type GraticuleAnswer =
  | { key: string; ok: true; graticule: CgmGraticule; ms: number }
  | { key: string; ok: false; error: string };

/** Latitude circles by main field, UTC date and height (the latest few). */
const circleCache = new Map<string, GraticuleLine[]>();
const CIRCLE_CACHE_SIZE = 4;

const copyLine = (l: GraticuleLine): GraticuleLine => ({ ...l, latDeg: l.latDeg.slice(), lonDeg: l.lonDeg.slice(), cgmLatDeg: l.cgmLatDeg.slice() });

/**
 * Compute the graticule of a request; an input the engine refuses comes back as its message.
 * The latitude circles do not turn with the Sun: they depend on the time only through the main
 * field's secular change, so they are traced once per UTC date (at 12:00 UTC; measured: samples
 * converted back at 00:00 and 23:59 of the date are within 2.4e-4° of their latitude, 1e-4° at
 * noon) and kept; the MLT meridians are traced for the exact time. Answers carry copies (the
 * worker transfers their buffers).
 */
export function computeGraticule(r: GraticuleRequest): GraticuleAnswer {
  const key = graticuleKey(r);
  try {
    const t0 = performance.now();
    // Only the main field and the frames matter: the magnetosphere's terms are left off.
    const model = prepareModel({ time: r.time, internal: r.internal, tiltDeg: r.tiltDeg, magnetopause: false, tail: false });
    const day = new Date(model.ms).toISOString().slice(0, 10);
    const circleKey = `${r.internal}|${day}|${r.heightKm}`;
    let circles = circleCache.get(circleKey);
    let traces = 0;
    if (!circles) {
      const noon = prepareModel({ time: `${day}T12:00:00Z`, internal: r.internal, magnetopause: false, tail: false });
      const c = cgmGraticuleOf(noon, { heightKm: r.heightKm, mltHours: [] });
      circles = c.lines;
      traces += c.traces;
      circleCache.set(circleKey, circles);
      while (circleCache.size > CIRCLE_CACHE_SIZE) circleCache.delete(circleCache.keys().next().value as string);
    }
    const meridians = cgmGraticuleOf(model, { heightKm: r.heightKm, latitudesDeg: [] });
    traces += meridians.traces;
    const lines = [...circles.map(copyLine), ...meridians.lines];
    const undefinedSamples = lines.reduce((n, l) => n + l.latDeg.filter((v) => Number.isNaN(v)).length, 0);
    const graticule: CgmGraticule = { heightKm: r.heightKm, lines, maxLatDeg: meridians.maxLatDeg, undefinedSamples, traces };
    return { key, ok: true, graticule, ms: performance.now() - t0 };
  } catch (e) {
    return { key, ok: false, error: e instanceof Error ? e.message : String(e) };
  }
}
