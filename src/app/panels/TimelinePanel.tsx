/**
 * Replay an event: load a solar-wind series (file picker, drag-and-drop, or
 * the invented demo storm), strip plots of Pdyn, Bz, By and the storm index
 * with a cursor, step by the series' own cadence, play through every step;
 * the cursor sets the app's conditions, so the scene, maps, sites table and
 * sweep follow it. With no series: a night at a chosen step with the current
 * solar wind. Below, the per-site timelines and the timeline export.
 */
import { useEffect, useId, useState } from 'react';
import { useStore } from '../store';
import { useTimeline } from '../timeline/useTimeline';
import { timelineStore } from '../timeline/state';
import { loadDemo, loadFile, moveCursor, setNight, setPlaying, unloadSeries } from '../timeline/actions';
import { cadenceText, seriesSummary } from '../timeline/load';
import { nightTimesMs, nightStartMs, isoUtc } from '../timeline/steps';
import { startTimelineClient } from '../timeline/client';
import { exportTimeline } from '../timeline/download';
import { TimelineStrip } from './TimelineStrip';
import { TimelineSites } from './TimelineSites';
import '../timeline/timeline.css';

// Read-only hook for the e2e tests and the browser benchmark.
(globalThis as unknown as { __atlasTimeline?: object }).__atlasTimeline = { timelineStore, moveCursor, loadDemo, setPlaying };

const SPEEDS = [0.5, 1, 2, 4, 8];
const TWILIGHTS = [
  { deg: -6, text: 'civil (Sun below −6°)' },
  { deg: -12, text: 'nautical (Sun below −12°)' },
  { deg: -18, text: 'astronomical (Sun below −18°)' },
];
const NIGHT_STEPS_MIN = [5, 10, 15, 30, 60];

function LoadBar() {
  const fileId = useId();
  const loading = useTimeline((t) => t.loading);
  const series = useTimeline((t) => t.series);
  const [over, setOver] = useState(false);
  return (
    <div
      className={`tl-drop${over ? ' over' : ''}`}
      onDragOver={(e) => { e.preventDefault(); setOver(true); }}
      onDragLeave={() => setOver(false)}
      onDrop={(e) => {
        e.preventDefault();
        setOver(false);
        const f = e.dataTransfer.files[0];
        if (f) void loadFile(f);
      }}
    >
      <label htmlFor={fileId}>Solar-wind series file</label>
      <input id={fileId} type="file" accept=".csv,.txt,.dat,.asc,.lst,text/plain,text/csv" onChange={(e) => { const f = e.target.files?.[0]; if (f) void loadFile(f); e.target.value = ''; }} />
      <span className="tl-hint">or drop it here (our CSV, or the community hourly / 1-min / 5-min text files)</span>
      <div className="row">
        <button type="button" disabled={loading} onClick={() => void loadDemo('csv')}>Load the demo storm</button>
        <button type="button" disabled={loading} onClick={() => void loadDemo('hourly')}>Demo storm as an hourly file</button>
        {series && <button type="button" onClick={unloadSeries}>Unload series</button>}
      </div>
    </div>
  );
}

function Notice() {
  const series = useTimeline((t) => t.series);
  const loadError = useTimeline((t) => t.loadError);
  const loading = useTimeline((t) => t.loading);
  if (loading) return <p className="tl-notice" role="status">reading the series…</p>;
  if (loadError) return <p className="tl-error" role="alert">Could not load the series: {loadError}</p>;
  if (!series) return null;
  const notes = [...series.skipped.map((n) => ({ ...n, kind: 'skipped' })), ...series.errors.map((n) => ({ ...n, kind: 'unreadable' }))].sort((a, b) => a.line - b.line);
  return (
    <div className="tl-notice" role="status" aria-label="Series summary">
      <p>{seriesSummary(series)}</p>
      {notes.length > 0 && (
        <details>
          <summary>{notes.length} line{notes.length === 1 ? '' : 's'} not used</summary>
          <ul className="tl-notes">
            {notes.slice(0, 100).map((n) => <li key={`${n.kind}${n.line}`}>{n.kind}: {n.text}</li>)}
            {notes.length > 100 && <li>… and {notes.length - 100} more</li>}
          </ul>
        </details>
      )}
    </div>
  );
}

function NightPlanFields() {
  const night = useTimeline((t) => t.night);
  const conditions = useStore((s) => s.conditions);
  const ids = [useId(), useId(), useId()];
  const start = isoUtc(nightStartMs(night, conditions)).slice(0, 16);
  return (
    <div className="tl-night">
      <p className="tl-hint">No series loaded: the site timelines cover a night at a chosen step with the current solar wind.</p>
      <div className="row">
        <label htmlFor={ids[0]}>Night start (UTC)</label>
        <input id={ids[0]} type="datetime-local" step={60} value={start} onChange={(e) => { if (e.target.value) setNight({ startIso: `${e.target.value}:00Z` }); }} />
        <label htmlFor={ids[1]}>Length (h)</label>
        <input id={ids[1]} type="number" min={1} max={24} step={1} value={night.hours} onChange={(e) => { const v = Number(e.target.value); if (v >= 1 && v <= 24) setNight({ hours: v }); }} />
        <label htmlFor={ids[2]}>Step (min)</label>
        <select id={ids[2]} value={night.stepMin} onChange={(e) => setNight({ stepMin: Number(e.target.value) })}>
          {NIGHT_STEPS_MIN.map((m) => <option key={m} value={m}>{m}</option>)}
        </select>
      </div>
    </div>
  );
}

function Cursor() {
  const series = useTimeline((t) => t.series);
  const night = useTimeline((t) => t.night);
  const cursor = useTimeline((t) => t.cursor);
  const playing = useTimeline((t) => t.playing);
  const speed = useTimeline((t) => t.stepsPerSecond);
  const conditions = useStore((s) => s.conditions);
  const ids = [useId(), useId()];
  const n = series ? series.steps.length : nightTimesMs(night, conditions).length;
  const cadence = series ? cadenceText(series.cadenceMs) : `${night.stepMin} min`;
  const time = series ? series.steps[Math.min(cursor, n - 1)]?.time : isoUtc(nightTimesMs(night, conditions)[Math.min(cursor, n - 1)]);
  return (
    <div className="tl-cursor-bar">
      <label htmlFor={ids[0]}>Timeline step</label>
      <input id={ids[0]} type="range" min={0} max={Math.max(0, n - 1)} step={1} value={cursor} onChange={(e) => moveCursor(Number(e.target.value))} />
      <span className="tl-now" aria-live="polite">{`step ${cursor + 1} of ${n} · ${time?.slice(0, 16).replace('T', ' ')} UTC`}</span>
      <div className="row">
        <button type="button" aria-label={`Previous step (${cadence})`} disabled={cursor <= 0} onClick={() => moveCursor(cursor - 1)}>◀ {cadence}</button>
        <button type="button" aria-label={`Next step (${cadence})`} disabled={cursor >= n - 1} onClick={() => moveCursor(cursor + 1)}>{cadence} ▶</button>
        <button type="button" aria-pressed={playing} onClick={() => setPlaying(!playing)}>{playing ? 'Pause replay' : 'Replay'}</button>
        <label htmlFor={ids[1]}>Play speed (steps/s)</label>
        <select id={ids[1]} value={speed} onChange={(e) => timelineStore.set({ stepsPerSecond: Number(e.target.value) })}>
          {SPEEDS.map((v) => <option key={v} value={v}>{v}</option>)}
        </select>
      </div>
    </div>
  );
}

function Strips() {
  const series = useTimeline((t) => t.series);
  const cursor = useTimeline((t) => t.cursor);
  if (!series) return null;
  const st = series.steps;
  const estimated = st.map((s) => s.dstSource === 'estimated');
  const nEst = estimated.filter(Boolean).length;
  const dstLabel = `Storm index (nT, ${nEst === 0 ? 'given' : nEst === st.length ? 'estimated through the series' : 'given; dashed: estimated'})`;
  return (
    <div className="tl-strips">
      <TimelineStrip label="Pdyn (nPa)" values={st.map((s) => s.pdynNpa)} cursor={cursor} onScrub={moveCursor} colour="#e0a84a" />
      <TimelineStrip label="IMF Bz (nT)" values={st.map((s) => s.bzNt)} cursor={cursor} onScrub={moveCursor} colour="#6fb4ff" zero />
      <TimelineStrip label="IMF By (nT)" values={st.map((s) => s.byNt)} cursor={cursor} onScrub={moveCursor} colour="#b58cff" zero />
      <TimelineStrip label={dstLabel} values={st.map((s) => s.dstNt)} dashed={estimated} cursor={cursor} onScrub={moveCursor} colour="#ff7a7a" zero />
    </div>
  );
}

function Settings() {
  const id = useId();
  const sunLimit = useTimeline((t) => t.sunLimitDeg);
  const ready = useTimeline((t) => t.result !== null && !t.pending);
  const [msg, setMsg] = useState('');
  return (
    <div className="row tl-settings">
      <label htmlFor={id}>Dark sky</label>
      <select id={id} value={sunLimit} onChange={(e) => timelineStore.set({ sunLimitDeg: Number(e.target.value) })}>
        {TWILIGHTS.map((o) => <option key={o.deg} value={o.deg}>{o.text}</option>)}
      </select>
      <button type="button" disabled={!ready} onClick={() => setMsg(exportTimeline('csv') ? '' : 'the site timelines are not ready yet')}>Timeline CSV</button>
      <button type="button" disabled={!ready} onClick={() => setMsg(exportTimeline('json') ? '' : 'the site timelines are not ready yet')}>Timeline JSON</button>
      {msg && <span className="tl-hint">{msg}</span>}
    </div>
  );
}

export function TimelinePanel() {
  const series = useTimeline((t) => t.series);
  const [open, setOpen] = useState(false);
  // The site timelines are computed once the panel is opened (or a series is loaded), not at start-up.
  useEffect(() => { if (open || series) startTimelineClient(); }, [open, series]);
  useEffect(() => { if (series) setOpen(true); }, [series]);
  return (
    <section className="tl-panel" aria-label="Timeline">
      <details open={open} onToggle={(e) => setOpen((e.target as HTMLDetailsElement).open)}>
        <summary><h2>Timeline: replay a series, plan a night</h2></summary>
        <LoadBar />
        <Notice />
        {series ? <Strips /> : <NightPlanFields />}
        <Cursor />
        <Settings />
        <TimelineSites />
      </details>
    </section>
  );
}
