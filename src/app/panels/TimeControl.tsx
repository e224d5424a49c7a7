/**
 * Time (UTC): a text field on the 24-hour clock ("YYYY-MM-DD HH:MM UTC",
 * checked by readUtcField of src/io/app-inputs.ts: the browser's date-time
 * picker shows a 12-hour clock in some locales), now, ±1 h steps and play
 * (advances 15 min per tick).
 */
import { useEffect, useId, useState } from 'react';
import { setConditions, setView, store, useStore } from '../store';
import { addHours, isoUtc } from '../lib/units';
import { readUtcField, utcFieldText } from '../../io/app-inputs';
import { HINTS } from './hints';

export function TimeControl() {
  const id = useId();
  const time = useStore((s) => s.conditions.time);
  const playing = useStore((s) => s.view.playing);
  const [text, setText] = useState(() => utcFieldText(time));
  const [focused, setFocused] = useState(false);
  useEffect(() => {
    if (!focused) setText(utcFieldText(time));
  }, [time, focused]);
  useEffect(() => {
    if (!playing) return;
    const t = setInterval(() => setConditions({ time: addHours(store.get().conditions.time, 0.25) }), 400);
    return () => clearInterval(t);
  }, [playing]);
  const checked = readUtcField('Time (UTC)', text);
  return (
    <div className="field">
      <label htmlFor={id}>Time (UTC)</label>
      <input
        id={id}
        type="text"
        inputMode="numeric"
        spellCheck={false}
        autoComplete="off"
        value={text}
        aria-invalid={!checked.ok}
        aria-describedby={`${id}-hint${checked.ok ? '' : ` ${id}-err`}`}
        onFocus={() => setFocused(true)}
        onBlur={() => setFocused(false)}
        onChange={(e) => {
          setText(e.target.value);
          const c = readUtcField('Time (UTC)', e.target.value);
          if (c.ok && c.value !== store.get().conditions.time) setConditions({ time: c.value });
        }}
      />
      <span id={`${id}-hint`} className="hint field-hint">24-hour clock, YYYY-MM-DD HH:MM UTC; {HINTS.tilt}</span>
      {!checked.ok && <span id={`${id}-err`} className="field-error">{checked.message} — not applied.</span>}
      <div className="row">
        <button type="button" onClick={() => setConditions({ time: isoUtc(Math.floor(Date.now() / 60000) * 60000) })}>Now</button>
        <button type="button" title="Step back 1 hour" onClick={() => setConditions({ time: addHours(time, -1) })}>−1 h</button>
        <button type="button" title="Step forward 1 hour" onClick={() => setConditions({ time: addHours(time, 1) })}>+1 h</button>
        <button type="button" aria-pressed={playing} onClick={() => setView({ playing: !playing })}>{playing ? 'Pause' : 'Play'}</button>
      </div>
    </div>
  );
}
