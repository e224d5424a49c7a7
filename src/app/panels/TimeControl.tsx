/** Time (UTC): a datetime field, now, ±1 h steps and play (advances 15 min per tick). */
import { useEffect, useId } from 'react';
import { setConditions, setView, store, useStore } from '../store';
import { addHours, isoFromLocalInput, isoUtc, localInputFromIso } from '../lib/units';

export function TimeControl() {
  const id = useId();
  const time = useStore((s) => s.conditions.time);
  const playing = useStore((s) => s.view.playing);
  useEffect(() => {
    if (!playing) return;
    const t = setInterval(() => setConditions({ time: addHours(store.get().conditions.time, 0.25) }), 400);
    return () => clearInterval(t);
  }, [playing]);
  return (
    <div className="field">
      <label htmlFor={id}>Time (UTC)</label>
      <input
        id={id}
        type="datetime-local"
        step={60}
        value={localInputFromIso(time)}
        onChange={(e) => {
          const iso = isoFromLocalInput(e.target.value);
          if (iso) setConditions({ time: iso });
        }}
      />
      <div className="row">
        <button type="button" onClick={() => setConditions({ time: isoUtc(Math.floor(Date.now() / 60000) * 60000) })}>Now</button>
        <button type="button" title="Step back 1 hour" onClick={() => setConditions({ time: addHours(time, -1) })}>−1 h</button>
        <button type="button" title="Step forward 1 hour" onClick={() => setConditions({ time: addHours(time, 1) })}>+1 h</button>
        <button type="button" aria-pressed={playing} onClick={() => setView({ playing: !playing })}>{playing ? 'Pause' : 'Play'}</button>
      </div>
    </div>
  );
}
