/** Engine warnings (out of the fitted range, etc.) and errors, as text. */
import { useStore } from '../store';

export function Warnings() {
  const scene = useStore((s) => s.scene);
  const oval = useStore((s) => s.oval);
  const sites = useStore((s) => s.siteResults);
  const sweep = useStore((s) => s.sweep);
  const errors = useStore((s) => s.errors);
  const warnings = [...new Set([...(scene?.warnings ?? []), ...(oval?.warnings ?? []), ...(sites?.warnings ?? [])])];
  // The sweep visits extreme values on purpose: summarise its warnings in one line.
  const sweepNote = sweep && sweep.warnings.length > 0 ? `Sweep: ${sweep.warnings.length} step${sweep.warnings.length === 1 ? '' : 's'} outside a model's fitted range (values extrapolated).` : null;
  const errs = Object.entries(errors).filter(([, v]) => v);
  if (warnings.length === 0 && errs.length === 0 && !sweepNote) return null;
  return (
    <div className="warnings" role="status" aria-live="polite" aria-label="Engine warnings">
      {errs.map(([k, v]) => (
        <p key={k} className="err">Engine error ({k}): {v}</p>
      ))}
      {warnings.map((w) => (
        <p key={w}>⚠ {w}</p>
      ))}
      {sweepNote && <p className="minor">{sweepNote}</p>}
    </div>
  );
}
