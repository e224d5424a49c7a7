/**
 * The one encoding of a field line's type and of how each half of a trace ended.
 * The numeric codes travel in typed arrays (tracer, worker, app); the names are
 * what reports, tables and legends show.
 */

/** Both ends reach the stop surface / at least one end leaves through the boundary or past the distance limit / a budget ran out. */
export type LineType = 'closed' | 'open' | 'unresolved';
/** Numeric code of a line type: the index into LINE_TYPE_NAMES. */
export type LineTypeCode = 0 | 1 | 2;

export const LINE_CLOSED = 0;
export const LINE_OPEN = 1;
export const LINE_UNRESOLVED = 2;
/** Line type names by code. */
export const LINE_TYPE_NAMES = ['closed', 'open', 'unresolved'] as const satisfies readonly LineType[];

/** The name of a line type code; anything that is not a known code reads as 'unresolved'. */
export function lineTypeName(code: number): LineType {
  return code === LINE_CLOSED || code === LINE_OPEN || code === LINE_UNRESOLVED ? LINE_TYPE_NAMES[code] : 'unresolved';
}

// End states of one half-trace (one direction from the seed).
/** Reached the stop surface (a footpoint). */
export const END_SURFACE = 0;
/** Left through the magnetopause. */
export const END_MAGNETOPAUSE = 1;
/** Passed the distance limit rMaxRe. */
export const END_DISTANCE = 2;
/** Step or length budget exhausted, or |B| vanished. */
export const END_BUDGET = 3;
/** Started below the stop surface and the direction leads down: no points. */
export const END_START_BELOW = 4;
/**
 * Came back inward below the return radius of a classification trace (Tracer.trace's
 * returnStopRe) after having been above it: bound for the stop surface, no footpoint recorded.
 */
export const END_RETURNED = 5;

/** Line type code from the two half-trace end states. */
export function classify(endMinus: number, endPlus: number): LineTypeCode {
  if (endMinus === END_BUDGET || endPlus === END_BUDGET) return LINE_UNRESOLVED;
  const footM = endMinus === END_SURFACE || endMinus === END_START_BELOW || endMinus === END_RETURNED;
  const footP = endPlus === END_SURFACE || endPlus === END_START_BELOW || endPlus === END_RETURNED;
  if (footM && footP) return LINE_CLOSED;
  return LINE_OPEN;
}
