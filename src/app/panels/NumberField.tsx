/**
 * A labelled number input that keeps what the user is typing, commits only
 * valid values (the app's validation path: plain decimals in the allowed
 * range, src/io/app-inputs.ts), shows its one-line hint under it and says
 * there why a value is refused.
 */
import { useEffect, useId, useState } from 'react';
import { readNumber, type ValueRange } from '../../io/app-inputs';

interface NumberFieldProps {
  label: string;
  value: number;
  /** Inclusive bounds (ignored when `range` is given). */
  min?: number;
  max?: number;
  /** The allowed range with its unit (e.g. APP_RANGES.pdynNpa). */
  range?: ValueRange;
  step?: number;
  onCommit: (v: number) => void;
  hint?: string;
  disabled?: boolean;
}

export function NumberField({ label, value, min = -Infinity, max = Infinity, range, step = 0.1, onCommit, hint, disabled }: NumberFieldProps) {
  const id = useId();
  const [text, setText] = useState(String(value));
  const [focused, setFocused] = useState(false);
  useEffect(() => {
    if (!focused) setText(String(value));
  }, [value, focused]);
  const r: ValueRange = range ?? { min, max, unit: '' };
  const checked = readNumber(label, text, r);
  return (
    <div className="field">
      <label htmlFor={id}>{label}</label>
      <input
        id={id}
        type="text"
        inputMode="decimal"
        data-step={step}
        value={text}
        disabled={disabled}
        aria-invalid={!checked.ok && !disabled}
        aria-describedby={[hint ? `${id}-hint` : '', checked.ok ? '' : `${id}-err`].filter(Boolean).join(' ') || undefined}
        title={r.above !== undefined ? `> ${r.above} to ${r.max}` : `${r.min} to ${r.max}`}
        onFocus={() => setFocused(true)}
        onBlur={() => setFocused(false)}
        onChange={(e) => {
          setText(e.target.value);
          const c = readNumber(label, e.target.value, r);
          if (c.ok) onCommit(c.value);
        }}
      />
      {hint && <span id={`${id}-hint`} className="hint field-hint">{hint}</span>}
      {!checked.ok && !disabled && <span id={`${id}-err`} className="field-error">{checked.message} — not applied.</span>}
    </div>
  );
}
