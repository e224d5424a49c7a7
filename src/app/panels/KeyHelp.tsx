/** The keys of the 3D view: a button over the view, and an overlay that "?" also opens. */
import { useEffect } from 'react';
import { ui, useUi } from './selection';

export const VIEW_KEYS: { keys: string; what: string }[] = [
  { keys: '← →', what: 'turn the view around the Earth’s axis' },
  { keys: '↑ ↓', what: 'tilt the view towards a pole' },
  { keys: '+ −', what: 'zoom in and out' },
  { keys: '0 or Home', what: 'back to the first view' },
  { keys: '?', what: 'show or hide this help' },
  { keys: 'Esc', what: 'close this help' },
];

function typing(t: EventTarget | null): boolean {
  return t instanceof HTMLElement && (t.isContentEditable || ['INPUT', 'SELECT', 'TEXTAREA'].includes(t.tagName));
}

export function KeyHelp() {
  const open = useUi((s) => s.keyHelp);
  useEffect(() => {
    const onKey = (e: KeyboardEvent) => {
      if (e.key === '?' && !typing(e.target)) {
        ui.set({ keyHelp: !ui.get().keyHelp });
        e.preventDefault();
      } else if (e.key === 'Escape' && ui.get().keyHelp) ui.set({ keyHelp: false });
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, []);
  return (
    <>
      <button type="button" className="keys-btn" aria-expanded={open} aria-controls="key-help" onClick={() => ui.set({ keyHelp: !open })}>
        Keys (?)
      </button>
      {open && (
        <div className="key-help" id="key-help" role="dialog" aria-modal="false" aria-labelledby="key-help-h">
          <h2 id="key-help-h">Keys for the 3D view</h2>
          <p>Click the view or reach it with Tab, then:</p>
          <dl>
            {VIEW_KEYS.map((k) => (
              <div key={k.keys}>
                <dt>{k.keys}</dt>
                <dd>{k.what}</dd>
              </div>
            ))}
          </dl>
          <p>With a mouse: drag to turn, wheel to zoom, right-drag to move; shift-click the globe to add a site.</p>
          <button type="button" onClick={() => ui.set({ keyHelp: false })}>Close</button>
        </div>
      )}
    </>
  );
}
