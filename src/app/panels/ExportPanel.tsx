/** Export buttons and the share link. Exports refuse, with the reason, while results lag the inputs. */
import { useState } from 'react';
import { runExport, type ExportKind } from '../exports';
import { makeShareLink } from '../urlSync';

const BUTTONS: { kind: ExportKind; label: string }[] = [
  { kind: 'sites-csv', label: 'Sites CSV' },
  { kind: 'sites-geojson', label: 'Sites GeoJSON' },
  { kind: 'boundaries-csv', label: 'Boundaries CSV' },
  { kind: 'boundaries-geojson', label: 'Boundaries GeoJSON' },
  { kind: 'sweep-csv', label: 'Sweep CSV' },
  { kind: 'all-json', label: 'Everything (JSON)' },
  { kind: 'png', label: '3D view PNG' },
  { kind: 'svg', label: 'Maps SVG' },
];

export function ExportPanel() {
  const [msg, setMsg] = useState('');
  const [link, setLink] = useState('');
  return (
    <section className="panel exports" aria-labelledby="exp-h">
      <h2 id="exp-h">Export</h2>
      <div className="row wrap">
        {BUTTONS.map((b) => (
          <button
            key={b.kind}
            type="button"
            onClick={() => {
              const why = runExport(b.kind);
              setMsg(why ? `${b.label} not exported: ${why}.` : '');
            }}
          >
            {b.label}
          </button>
        ))}
        <button
          type="button"
          onClick={() => {
            const l = makeShareLink();
            setLink(l.url);
            // Said at once (the clipboard may never answer, e.g. without permission); "copied" only once it is.
            setMsg(`${l.note}Copy the link below.`);
            void navigator.clipboard?.writeText(l.url).then(() => setMsg(`${l.note}Link copied.`), () => {});
          }}
        >
          Share link
        </button>
      </div>
      {link && <input className="share" readOnly aria-label="Share link" value={link} onFocus={(e) => e.target.select()} />}
      {msg && <p role="status" className="msg">{msg}</p>}
    </section>
  );
}
