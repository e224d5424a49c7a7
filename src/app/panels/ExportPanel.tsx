/** Export buttons and the share link. */
import { useState } from 'react';
import { runExport, type ExportKind } from '../exports';
import { shareUrl } from '../urlSync';

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
          <button key={b.kind} type="button" onClick={() => setMsg(runExport(b.kind) ? '' : `${b.label}: no results yet.`)}>
            {b.label}
          </button>
        ))}
        <button
          type="button"
          onClick={() => {
            const u = shareUrl();
            setLink(u);
            navigator.clipboard?.writeText(u).then(() => setMsg('Link copied.'), () => setMsg('Copy the link below.'));
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
