import { describe, expect, it } from 'vitest';
import { bandRuns, gapRuns, loopRuns, placeLabels, runIndices } from '../../src/app/panels/mapGeometry';

describe('polar-map geometry', () => {
  it('finds runs on a closed MLT loop, joining the last sample to the first', () => {
    const ok = [true, true, false, true, true, true];
    const runs = loopRuns(ok.length, (i) => ok[i]);
    expect(runs).toEqual([{ start: 3, length: 5, whole: false }]);
    expect(runIndices(runs[0], 6)).toEqual([3, 4, 5, 0, 1]);
    expect(loopRuns(4, () => true)).toEqual([{ start: 0, length: 4, whole: true }]);
    expect(loopRuns(4, () => false)).toEqual([]);
    expect(loopRuns(0, () => true)).toEqual([]);
  });

  it('never draws the band where the equatorward edge is missing (no wedge from the pole), and marks that gap', () => {
    // Noon sectors (indices 3..5 of 8) without an equatorward edge, as in a strong compression.
    const oc = Float64Array.from([75, 76, 77, 78, 79, 78, 77, 76]);
    const eq = Float64Array.from([65, 66, 67, NaN, NaN, NaN, 67, 66]);
    const band = bandRuns(oc, eq);
    expect(band).toEqual([{ start: 6, length: 5, whole: false }]);
    const covered = band.flatMap((r) => runIndices(r, 8));
    expect(covered.every((i) => Number.isFinite(eq[i]) && Number.isFinite(oc[i]))).toBe(true);
    expect(gapRuns(oc, eq)).toEqual([{ start: 3, length: 3, whole: false }]);
    expect(gapRuns(eq, oc)).toEqual([]);
  });

  it('places labels without overlaps, inside the map, and drops one that cannot fit', () => {
    // Five sites on one spot: right, left, above, below, then no room left.
    const pts = ['A', 'B', 'C', 'D', 'E'].map((text) => ({ x: 100, y: 100, text }));
    const placed = placeLabels(pts, 300, 6, 12);
    const boxes = placed.map((p, i) => p && { ...p, w: pts[i].text.length * 6 });
    expect(placed.map((p) => p?.anchor ?? null)).toEqual(['start', 'end', 'middle', 'middle', null]);
    const two = placeLabels([{ x: 100, y: 100, text: 'Sollan Moor' }, { x: 102, y: 101, text: 'Harrowmere Fell' }], 300, 6, 12);
    expect(two.map((p) => p?.anchor)).toEqual(['start', 'end']);
    expect(placed[4]).toBeNull(); // four sides taken
    const rect = (b: NonNullable<(typeof boxes)[number]>) => {
      const x0 = b.anchor === 'start' ? b.x : b.anchor === 'end' ? b.x - b.w : b.x - b.w / 2;
      return { x0, x1: x0 + b.w, y0: b.y - 10, y1: b.y };
    };
    const r = boxes.filter((b): b is NonNullable<typeof b> => !!b).map(rect);
    for (let i = 0; i < r.length; i++) for (let j = i + 1; j < r.length; j++) {
      const o = r[i].x0 < r[j].x1 && r[i].x1 > r[j].x0 && r[i].y0 < r[j].y1 && r[i].y1 > r[j].y0;
      expect(o, `labels ${i} and ${j} overlap`).toBe(false);
    }
    expect(placeLabels([{ x: 295, y: 150, text: 'Edge Camp' }], 300, 6, 12)[0]?.anchor).toBe('end');
    expect(placeLabels([{ x: 50, y: 14, text: 'Top' }], 300, 6, 12, [{ x0: 0, y0: 0, x1: 150, y1: 18 }])[0]?.anchor).toBe('middle');
  });
});
