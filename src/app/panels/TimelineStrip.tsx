/** One strip plot of a series quantity against time, with the cursor; click or drag on it to scrub. */
import { useRef } from 'react';

interface Props {
  label: string;
  values: readonly number[];
  /** Steps drawn dashed (e.g. an estimated storm index). */
  dashed?: readonly boolean[];
  cursor: number;
  onScrub(i: number): void;
  colour: string;
  /** Draw the zero line. */
  zero?: boolean;
}

const W = 600;
const H = 56;
const PAD = 3;

/** Index of the step under a pointer x (client px) on an element. */
export function stepAt(el: Element, clientX: number, n: number): number {
  const r = el.getBoundingClientRect();
  const f = r.width > 0 ? (clientX - r.left) / r.width : 0;
  return Math.max(0, Math.min(n - 1, Math.round(f * (n - 1))));
}

export function TimelineStrip({ label, values, dashed, cursor, onScrub, colour, zero }: Props) {
  const ref = useRef<SVGSVGElement>(null);
  const n = values.length;
  let lo = Infinity, hi = -Infinity;
  for (const v of values) if (Number.isFinite(v)) { if (v < lo) lo = v; if (v > hi) hi = v; }
  if (lo === Infinity) { lo = 0; hi = 0; }
  if (zero) { lo = Math.min(lo, 0); hi = Math.max(hi, 0); }
  if (!(hi > lo)) { hi = lo + 1; lo -= 1; }
  const x = (i: number) => (n > 1 ? (i / (n - 1)) * W : W / 2);
  const y = (v: number) => PAD + (1 - (v - lo) / (hi - lo)) * (H - 2 * PAD);
  // Solid and dashed runs as separate paths; long series drawn as the min and max of each pixel-wide bucket.
  const paths: { d: string; dashed: boolean }[] = [];
  let prev = '';
  const add = (i: number, v: number, dsh: boolean) => {
    const last = paths[paths.length - 1];
    const pt = `${x(i).toFixed(1)},${y(v).toFixed(1)}`;
    if (last && last.dashed === dsh) last.d += ` L${pt}`;
    else paths.push({ d: `${prev ? `M${prev} L` : 'M'}${pt}`, dashed: dsh });
    prev = pt;
  };
  const bucket = n > 2 * W ? Math.ceil(n / W) : 1;
  for (let i0 = 0; i0 < n; i0 += bucket) {
    let lo = Infinity, hi = -Infinity, iLo = i0, iHi = i0, dsh = false;
    for (let i = i0; i < Math.min(n, i0 + bucket); i++) {
      const v = values[i];
      if (!Number.isFinite(v)) continue;
      if (v < lo) { lo = v; iLo = i; }
      if (v > hi) { hi = v; iHi = i; }
      dsh ||= !!dashed?.[i];
    }
    if (lo === Infinity) continue;
    if (iLo <= iHi) { add(iLo, lo, dsh); if (iHi !== iLo) add(iHi, hi, dsh); }
    else { add(iHi, hi, dsh); add(iLo, lo, dsh); }
  }
  const cur = values[cursor];
  const drag = (e: React.PointerEvent<SVGSVGElement>) => {
    if (e.buttons & 1 && ref.current) onScrub(stepAt(ref.current, e.clientX, n));
  };
  return (
    <div className="tl-strip">
      <div className="tl-strip-label">
        <span>{label}</span>
        <span className="tl-strip-value">{Number.isFinite(cur) ? cur.toFixed(Math.abs(cur) >= 100 ? 0 : 1) : '–'}</span>
        <span className="tl-strip-range">{lo.toFixed(0)} … {hi.toFixed(0)}</span>
      </div>
      <svg
        ref={ref}
        viewBox={`0 0 ${W} ${H}`}
        preserveAspectRatio="none"
        role="img"
        aria-label={`${label} through the timeline`}
        onPointerDown={(e) => { (e.target as Element).setPointerCapture?.(e.pointerId); if (ref.current) onScrub(stepAt(ref.current, e.clientX, n)); }}
        onPointerMove={drag}
      >
        {zero && lo < 0 && hi > 0 && <line x1={0} x2={W} y1={y(0)} y2={y(0)} className="tl-zero" />}
        {paths.map((p, k) => <path key={k} d={p.d} fill="none" stroke={colour} strokeWidth={1.5} strokeDasharray={p.dashed ? '5 3' : undefined} vectorEffect="non-scaling-stroke" />)}
        <line x1={x(cursor)} x2={x(cursor)} y1={0} y2={H} className="tl-cursor" vectorEffect="non-scaling-stroke" />
      </svg>
    </div>
  );
}
