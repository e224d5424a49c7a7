/**
 * The per-site timeline: for each site a strip over the timeline's steps —
 * line type, relation to the oval, sky darkness (Sun, with the Moon above
 * the horizon marked), the best hours — the values at the cursor, and the
 * plain-language best-hours sentence. Computed by the worker's timeline channel.
 */
import { store, useStore } from '../store';
import { LINE_COLOURS } from '../lib/palette';
import { useTimeline } from '../timeline/useTimeline';
import { moveCursor } from '../timeline/actions';
import { BEST_COLOUR, MOON_COLOUR, RELATION_COLOURS, TWILIGHT_COLOURS } from '../timeline/colours';
import { stepAt } from './TimelineStrip';
import type { TimelineCell, TimelineSite } from '../../../workers/protocol';

const W = 600;
const ROW = 9;

function fmt(v: number | null | undefined, d: number): string {
  return v === null || v === undefined || !Number.isFinite(v) ? '–' : v.toFixed(d);
}

/** Runs of equal values along the steps: [from, to) each, so a strip draws one rectangle per change, not per step. */
function runs<V>(cells: readonly TimelineCell[], key: (c: TimelineCell) => V): { from: number; to: number; value: V }[] {
  const out: { from: number; to: number; value: V }[] = [];
  cells.forEach((c, i) => {
    const v = key(c);
    const last = out[out.length - 1];
    if (last && last.value === v) last.to = i + 1;
    else out.push({ from: i, to: i + 1, value: v });
  });
  return out;
}

/** The cell at the cursor in words. */
function cellText(c: TimelineCell): string {
  const m = c.ovalMarginDeg === null ? '' : fmt(c.ovalMarginDeg, 2);
  const rel = c.ovalRelation === 'unknown' ? 'oval relation unknown'
    : c.ovalRelation === 'inside' ? `inside the oval${m ? `, ${m}° from its nearer edge` : ''}`
      : `${c.ovalRelation} of the oval${m ? ` by ${m}°` : ''}`;
  const sky = c.ovalElevationDeg === null ? 'no oval point in the sky' : `nearest oval point at elevation ${fmt(c.ovalElevationDeg, 1)}°, azimuth ${fmt(c.ovalAzimuthDeg, 0)}°`;
  const sun = `Sun ${fmt(c.sunElevationDeg, 1)}° (${c.twilight}), ${c.dark ? 'dark' : 'not dark'}`;
  const moon = `Moon ${fmt(c.moonElevationDeg, 1)}°, ${Math.round(c.moonIlluminatedFraction * 100)} % lit`;
  return `${c.error ? `error: ${c.error}; ` : ''}${c.type} line, ${rel}; ${sky}; ${sun}; ${moon}`;
}

function SiteStrip({ site, n, cursor, stepsMs }: { site: TimelineSite; n: number; cursor: number; stepsMs: number[] }) {
  const w = W / n;
  const x = (i: number) => i * w;
  const t0 = stepsMs[0], t1 = stepsMs[n - 1] + (n > 1 ? (stepsMs[n - 1] - stepsMs[0]) / (n - 1) : 1);
  const xt = (ms: number) => ((ms - t0) / (t1 - t0)) * W;
  const c = site.cells[cursor];
  return (
    <li className="tl-site">
      <div className="tl-site-head"><strong>{site.name}</strong> <span className="tl-best">{site.bestHours}</span></div>
      <svg
        viewBox={`0 0 ${W} ${ROW * 4 + 2}`}
        preserveAspectRatio="none"
        role="img"
        aria-label={`${site.name}: line type, oval relation, sky darkness and best hours through the timeline`}
        onPointerDown={(e) => moveCursor(stepAt(e.currentTarget, e.clientX, n))}
      >
        {runs(site.cells, (c) => c.type).map((r) => <rect key={`t${r.from}`} x={x(r.from)} y={0} width={x(r.to) - x(r.from) + 0.3} height={ROW} fill={LINE_COLOURS[r.value]} />)}
        {runs(site.cells, (c) => c.ovalRelation).map((r) => <rect key={`o${r.from}`} x={x(r.from)} y={ROW} width={x(r.to) - x(r.from) + 0.3} height={ROW} fill={RELATION_COLOURS[r.value]} />)}
        {runs(site.cells, (c) => c.twilight).map((r) => <rect key={`s${r.from}`} x={x(r.from)} y={2 * ROW} width={x(r.to) - x(r.from) + 0.3} height={ROW} fill={TWILIGHT_COLOURS[r.value]} />)}
        {runs(site.cells, (c) => c.moonElevationDeg > 0).filter((r) => r.value).map((r) => <rect key={`m${r.from}`} x={x(r.from)} y={3 * ROW - 3} width={x(r.to) - x(r.from) + 0.3} height={3} fill={MOON_COLOUR} opacity={0.3 + 0.7 * site.cells[r.from].moonIlluminatedFraction} />)}
        {site.bestIntervals.map((iv, k) => <rect key={k} x={xt(iv.startMs)} y={3 * ROW + 1} width={Math.max(1, xt(iv.endMs) - xt(iv.startMs))} height={ROW} fill={BEST_COLOUR} />)}
        <rect x={x(cursor)} y={0} width={Math.max(w, 1.5)} height={ROW * 4 + 2} className="tl-site-cursor" />
      </svg>
      {c && <div className="tl-site-now">{cellText(c)}</div>}
    </li>
  );
}

export function TimelineSites() {
  const result = useTimeline((t) => t.result);
  const cursor = useTimeline((t) => t.cursor);
  const pending = useTimeline((t) => t.pending);
  const progress = useTimeline((t) => t.progress);
  const error = useTimeline((t) => t.error);
  const sites = useStore((s) => s.sites);
  const n = result?.stepsMs.length ?? 0;
  const current = result !== null && result.sites.length === sites.length && result.sites.every((r, i) => r.name === store.get().sites[i]?.name);
  return (
    <div className="tl-sites" aria-busy={pending}>
      <div className="tl-legend">
        <span>rows: line type · oval (<i style={{ color: RELATION_COLOURS.poleward }}>poleward</i> / <i style={{ color: RELATION_COLOURS.inside }}>inside</i> / <i style={{ color: RELATION_COLOURS.equatorward }}>equatorward</i>) · sky (day → night, Moon up as a pale bar) · <i style={{ color: BEST_COLOUR }}>best hours</i></span>
        {pending && <span className="tl-progress" role="status">computing the site timelines… {progress.done}/{progress.total} steps</span>}
      </div>
      {error && <p className="tl-error" role="alert">{error}</p>}
      {result && n > 0 && (
        <ul className="tl-site-list" aria-label="Site timelines" data-current={current}>
          {result.sites.map((s, k) => <SiteStrip key={`${k}-${s.name}`} site={s} n={n} cursor={Math.min(cursor, n - 1)} stepsMs={result.stepsMs} />)}
        </ul>
      )}
    </div>
  );
}
