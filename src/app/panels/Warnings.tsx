/**
 * Engine errors and warnings, as text. Only real warnings (inputs outside a
 * fitted range, a poor fit) get the warning box; notes that hold on every
 * default load (an estimated storm index) are one quiet line, and the sweep's
 * out-of-range steps are noted in the sweep panel, where they belong.
 */
import { useStore } from '../store';

/** Messages that describe what the model did, not a problem with the inputs. */
export function isNote(message: string): boolean {
  return /^storm index: none given/.test(message);
}

export function Warnings() {
  const scene = useStore((s) => s.scene);
  const oval = useStore((s) => s.oval);
  const sites = useStore((s) => s.siteResults);
  const errors = useStore((s) => s.errors);
  const all = [...new Set([...(scene?.warnings ?? []), ...(oval?.warnings ?? []), ...(sites?.warnings ?? [])])];
  const warnings = all.filter((w) => !isNote(w));
  const notes = all.filter(isNote);
  const errs = Object.entries(errors).filter(([, v]) => v);
  if (warnings.length === 0 && errs.length === 0 && notes.length === 0) return null;
  return (
    <>
      {(warnings.length > 0 || errs.length > 0) && (
        <div className="warnings" role="status" aria-live="polite" aria-label="Engine warnings">
          {errs.map(([k, v]) => (
            <p key={k} className="err">Engine error ({k}): {v}</p>
          ))}
          {warnings.map((w) => (
            <p key={w}>⚠ {w}</p>
          ))}
        </div>
      )}
      {notes.map((n) => (
        <p key={n} className="note"><strong>Note:</strong> {n}</p>
      ))}
    </>
  );
}
