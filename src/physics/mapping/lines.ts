/** A traced field line described: its type, length, equatorial crossing and footpoints. */
import type { PreparedModel } from '../field/model';
import { Tracer, type TraceOptions } from '../trace/tracer';
import { LINE_CLOSED, lineTypeName, type LineType } from '../trace/line-type';
import { describePoint, equatorCrossing, type Footpoint, type EquatorCrossing } from '../trace/footpoint';

export interface LineResult {
  type: LineType;
  lengthRe: number;
  equator: EquatorCrossing | null;
  /** Footpoints reached (0, 1 or 2), south-going (−B) end first. */
  footpoints: Footpoint[];
  /** Points GSM RE xyz (a copy), when asked for. */
  points?: Float64Array;
  evals: number;
}

/** A tracer bound to a model; reuse across calls for speed. */
export function makeTracer(model: PreparedModel, options: Partial<TraceOptions> = {}): Tracer {
  return new Tracer(model, options);
}

/** Describe the line last traced by `tracer`, whose type code is `type`. */
function describeLine(model: PreparedModel, tracer: Tracer, type: number, withPoints = false): LineResult {
  const f = model.frames;
  const p = tracer.points;
  const feet: Footpoint[] = [];
  for (const i of [tracer.footMinus, tracer.footPlus]) {
    if (i >= 0) feet.push(describePoint(f, p[3 * i], p[3 * i + 1], p[3 * i + 2]));
  }
  const closed = type === LINE_CLOSED;
  return {
    type: lineTypeName(type),
    lengthRe: tracer.lengthRe,
    equator: closed ? equatorCrossing(p, tracer.bMag, tracer.nPoints) : null,
    footpoints: feet,
    points: withPoints ? p.slice(0, 3 * tracer.nPoints) : undefined,
    evals: tracer.evals,
  };
}

/** Trace the line through a GSM point (RE). */
export function traceGsm(model: PreparedModel, tracer: Tracer, x: number, y: number, z: number, withPoints = false): LineResult {
  const type = tracer.trace(x, y, z);
  return describeLine(model, tracer, type, withPoints);
}
