/**
 * Pure geometry for the polar maps: which MLT samples of a boundary curve can
 * carry the oval band (both edges found), where an edge is missing, and
 * label placement without overlaps. No DOM.
 */

/** A run of consecutive samples on a closed MLT loop: start index and length (indices wrap modulo n). */
export interface Run {
  start: number;
  length: number;
  /** True when the run covers the whole loop (a closed ring). */
  whole: boolean;
}

/** Runs of consecutive samples where `ok(i)` holds, on a loop of n samples (the last sample neighbours the first). */
export function loopRuns(n: number, ok: (i: number) => boolean): Run[] {
  if (n === 0) return [];
  let firstBad = -1;
  for (let i = 0; i < n; i++) if (!ok(i)) { firstBad = i; break; }
  if (firstBad < 0) return [{ start: 0, length: n, whole: true }];
  const runs: Run[] = [];
  let start = -1;
  for (let k = 1; k <= n; k++) {
    const i = (firstBad + k) % n;
    if (ok(i)) {
      if (start < 0) start = i;
    } else if (start >= 0) {
      runs.push({ start, length: (i - start + n) % n, whole: false });
      start = -1;
    }
  }
  return runs;
}

const fin = (a: ArrayLike<number>, i: number) => Number.isFinite(a[i]);

/**
 * Where the band can be drawn: both edges found at the sample. The band is
 * never closed towards the pole: where the equatorward edge is missing there is
 * no band (and loopRuns marks the gap).
 */
export function bandRuns(ocLat: ArrayLike<number>, eqLat: ArrayLike<number>): Run[] {
  return loopRuns(ocLat.length, (i) => fin(ocLat, i) && fin(eqLat, i));
}

/** Samples where one edge is found and the other is not: the gaps to mark. */
export function gapRuns(have: ArrayLike<number>, missing: ArrayLike<number>): Run[] {
  return loopRuns(have.length, (i) => fin(have, i) && !fin(missing, i));
}

/** Indices of a run, in order. */
export function runIndices(r: Run, n: number): number[] {
  return Array.from({ length: r.length }, (_, k) => (r.start + k) % n);
}

export interface LabelBox {
  x: number;
  y: number;
  anchor: 'start' | 'end' | 'middle';
}

/**
 * Greedy label placement: for each point try right, left, above, below; keep
 * the first spot that overlaps no placed label (nor a reserved box) and stays
 * inside [0, size]; null when none fits (the mark keeps its tooltip).
 * Text boxes are estimated as charW per character × lineH.
 */
export function placeLabels(
  pts: { x: number; y: number; text: string }[],
  size: number,
  charW: number,
  lineH: number,
  reserved: { x0: number; y0: number; x1: number; y1: number }[] = [],
): (LabelBox | null)[] {
  const taken = [...reserved];
  return pts.map((p) => {
    const w = Math.min(p.text.length, 24) * charW;
    const tries: { box: { x0: number; y0: number; x1: number; y1: number }; at: LabelBox }[] = [
      { box: { x0: p.x + 5, y0: p.y - lineH / 2, x1: p.x + 5 + w, y1: p.y + lineH / 2 }, at: { x: p.x + 5, y: p.y + lineH * 0.35, anchor: 'start' } },
      { box: { x0: p.x - 5 - w, y0: p.y - lineH / 2, x1: p.x - 5, y1: p.y + lineH / 2 }, at: { x: p.x - 5, y: p.y + lineH * 0.35, anchor: 'end' } },
      { box: { x0: p.x - w / 2, y0: p.y - 5 - lineH, x1: p.x + w / 2, y1: p.y - 5 }, at: { x: p.x, y: p.y - 5 - lineH * 0.25, anchor: 'middle' } },
      { box: { x0: p.x - w / 2, y0: p.y + 5, x1: p.x + w / 2, y1: p.y + 5 + lineH }, at: { x: p.x, y: p.y + 5 + lineH * 0.75, anchor: 'middle' } },
    ];
    for (const t of tries) {
      const b = t.box;
      if (b.x0 < 0 || b.y0 < 0 || b.x1 > size || b.y1 > size) continue;
      if (taken.some((o) => b.x0 < o.x1 && b.x1 > o.x0 && b.y0 < o.y1 && b.y1 > o.y0)) continue;
      taken.push(b);
      return t.at;
    }
    return null;
  });
}
