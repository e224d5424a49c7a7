/**
 * Bracketing root finders for one-dimensional searches whose function is costly
 * (each value is a field-line trace). Both keep a bracket and never step outside it.
 */

/**
 * Bisection on a predicate that holds at `lo` and fails at `hi` (a boundary
 * between two regions): halves [lo, hi] until it is no wider than `tol` and
 * returns its midpoint. `holds` is called once per halving, in order, so a caller
 * may record what it learns at each probe.
 */
export function bisectBoundary(lo: number, hi: number, tol: number, holds: (x: number) => boolean): number {
  while (hi - lo > tol) {
    const mid = 0.5 * (lo + hi);
    if (holds(mid)) lo = mid;
    else hi = mid;
  }
  return 0.5 * (lo + hi);
}

/** Most iterations of `illinoisRoot`. */
const ILLINOIS_MAX_ITERATIONS = 60;

/**
 * Root of an increasing g in [lo, hi] with g(lo) ≤ 0 < g(hi) by regula falsi,
 * Illinois variant (Dowell & Jarratt, 1971, BIT 11, 168, citation from memory: the retained end's value
 * is halved when the same end is kept twice). g may return NaN where it is not
 * defined (e.g. beyond the end of a region): such a point counts as the high side
 * and the step there falls back to bisection; `ghi` may be NaN on entry for the
 * same reason. A step closer than 5 % of the bracket to either end is moved to tol/2
 * inside that end, or, right after such a step, replaced by the midpoint (safeguard). When the secant step from the newest point is below a quarter
 * of `tol`, the next probe is placed tol/2 beyond the estimated root (inside the bracket), so
 * the bracket usually closes in one more value. Stops only when the bracket is no wider than
 * `tol` (a small step alone is no proof: on a flat stretch the secant creeps) and returns the
 * linear interpolation inside the final bracket (the midpoint when an end value is NaN): the
 * answer lies within `tol` of a sign change.
 */
export function illinoisRoot(g: (x: number) => number, lo: number, glo: number, hi: number, ghi: number, tol: number): number {
  let side = 0;
  let nearX = NaN; // a probe placed just across the estimated root, or NaN
  let nearEndTried = false; // the last probe was placed tol/2 inside an end
  for (let it = 0; it < ILLINOIS_MAX_ITERATIONS && hi - lo > tol; it++) {
    let x: number;
    if (Number.isFinite(nearX) && nearX > lo && nearX < hi) x = nearX;
    else {
      x = Number.isFinite(ghi) && ghi !== glo ? lo + (hi - lo) * (glo / (glo - ghi)) : 0.5 * (lo + hi);
      const guard = 0.05 * (hi - lo);
      if (!(x > lo + guard && x < hi - guard)) {
        // An estimate next to an end: probe tol/2 inside from it (the bracket closes when the estimate
        // holds); after such a probe failed to close it, the midpoint (at most every other step creeps).
        const inside = x <= lo + guard ? Math.max(x, lo) + 0.5 * tol : Math.min(x, hi) - 0.5 * tol;
        x = !nearEndTried && inside > lo && inside < hi ? inside : 0.5 * (lo + hi);
        nearEndTried = x === inside;
      } else nearEndTried = false;
    }
    nearX = NaN;
    const gx = g(x);
    if (gx <= 0) {
      lo = x; glo = gx;
      if (side === -1 && Number.isFinite(ghi)) ghi *= 0.5;
      side = -1;
    } else {
      hi = x; ghi = gx; // NaN when g is not defined at x
      if (side === 1) glo *= 0.5;
      side = 1;
    }
    // Near convergence: the secant step from the newest point is below a quarter of the tolerance.
    if (Number.isFinite(gx) && Number.isFinite(ghi) && Number.isFinite(glo) && ghi !== glo) {
      const slope = (ghi - glo) / (hi - lo);
      if (slope > 0 && Math.abs(gx / slope) < 0.25 * tol) {
        const est = x - gx / slope;
        nearX = gx <= 0 ? Math.max(est, x) + 0.5 * tol : Math.min(est, x) - 0.5 * tol;
      }
    }
  }
  if (Number.isFinite(glo) && Number.isFinite(ghi) && ghi > glo) {
    const r = lo + (hi - lo) * (-glo / (ghi - glo));
    if (r >= lo && r <= hi) return r;
  }
  return 0.5 * (lo + hi);
}
