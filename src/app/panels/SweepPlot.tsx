/** Boundary magnetic latitudes at one MLT against Pdyn (log axis) or IMF Bz (uPlot), current value marked. */
import { useEffect, useRef } from 'react';
import uPlot from 'uplot';
import 'uplot/dist/uPlot.min.css';
import { setView, store, useStore } from '../store';
import { OVAL_COLOURS } from '../lib/palette';
import { NumberField } from './NumberField';

function current(): number {
  const s = store.get();
  return s.view.sweepVary === 'pdyn' ? s.conditions.pdynNpa : s.conditions.bzNt;
}

function makePlot(el: HTMLElement, vary: 'pdyn' | 'bz', data: uPlot.AlignedData): uPlot {
  const s = (label: string, stroke: string, dash?: number[]) => ({ label, stroke, width: 1.6, dash, spanGaps: false });
  return new uPlot(
    {
      width: Math.max(240, el.clientWidth),
      height: 220,
      legend: { live: false },
      scales: { x: { time: false, distr: vary === 'pdyn' ? 3 : 1 }, y: { auto: true } },
      axes: [
        { label: vary === 'pdyn' ? 'Pdyn (nPa)' : 'IMF Bz (nT)', stroke: '#c8d3e0', grid: { stroke: '#2a3447' } },
        { label: '|magnetic latitude| (°)', stroke: '#c8d3e0', grid: { stroke: '#2a3447' } },
      ],
      series: [
        { label: vary === 'pdyn' ? 'Pdyn (nPa)' : 'Bz (nT)' },
        s('N open–closed', OVAL_COLOURS.openClosed),
        s('N equatorward', OVAL_COLOURS.equatorward),
        s('S open–closed', OVAL_COLOURS.openClosed, [5, 4]),
        s('S equatorward', OVAL_COLOURS.equatorward, [5, 4]),
      ],
      hooks: {
        draw: [
          (u) => {
            const x = u.valToPos(current(), 'x', true);
            if (!Number.isFinite(x)) return;
            const ctx = u.ctx;
            ctx.save();
            ctx.strokeStyle = '#ff5fa2';
            ctx.lineWidth = 2;
            ctx.beginPath();
            ctx.moveTo(x, u.bbox.top);
            ctx.lineTo(x, u.bbox.top + u.bbox.height);
            ctx.stroke();
            ctx.restore();
          },
        ],
      },
    },
    data,
    el,
  );
}

export function SweepPlot() {
  const host = useRef<HTMLDivElement>(null);
  const plot = useRef<uPlot | null>(null);
  const vary = useStore((s) => s.view.sweepVary);
  const mlt = useStore((s) => s.view.sweepMlt);
  const sweep = useStore((s) => s.sweep);
  const marker = useStore((s) => (s.view.sweepVary === 'pdyn' ? s.conditions.pdynNpa : s.conditions.bzNt));
  // Rebuilt per answer (13 points): uPlot cannot lay out a log axis over empty data.
  useEffect(() => {
    if (!host.current || !sweep || sweep.vary !== vary || sweep.values.length === 0) return;
    const abs = (a: Float64Array) => Array.from(a, (v) => (Number.isFinite(v) ? Math.abs(v) : null));
    const data = [Array.from(sweep.values), abs(sweep.northOpenClosedMagLatDeg), abs(sweep.northEquatorwardMagLatDeg), abs(sweep.southOpenClosedMagLatDeg), abs(sweep.southEquatorwardMagLatDeg)] as uPlot.AlignedData;
    const p = makePlot(host.current, vary, data);
    plot.current = p;
    return () => { p.destroy(); plot.current = null; };
  }, [sweep, vary]);
  useEffect(() => { plot.current?.redraw(false, false); }, [marker]);
  return (
    <section className="panel sweep" aria-labelledby="sweep-h">
      <h2 id="sweep-h">Sweep</h2>
      <div className="row">
        <div className="field">
          <label htmlFor="sweep-vary">Sweep variable</label>
          <select id="sweep-vary" value={vary} onChange={(e) => setView({ sweepVary: e.target.value === 'bz' ? 'bz' : 'pdyn' })}>
            <option value="pdyn">Pdyn (nPa, log)</option>
            <option value="bz">IMF Bz (nT)</option>
          </select>
        </div>
        <NumberField label="Sweep MLT (h)" value={mlt} min={0} max={24} step={1} onCommit={(v) => setView({ sweepMlt: v % 24 })} hint="magnetic local time of the sweep: 0 midnight, 12 noon" />
      </div>
      <div ref={host} className="plot" aria-label="Boundary latitude sweep plot" role="img" />
      {sweep && sweep.warnings.length > 0 && (
        <p className="hint">{`${sweep.warnings.length} sweep step${sweep.warnings.length === 1 ? '' : 's'} lie outside a model's fitted range (values extrapolated there).`}</p>
      )}
    </section>
  );
}
