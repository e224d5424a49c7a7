/** Add sites by typing or by CSV import; the results table sits below. */
import { useState, type FormEvent } from 'react';
import { parseSitesCsv } from '../../io/app-csv';
import { APP_LIMITS, APP_RANGES, readNumber, readSiteName } from '../../io/app-inputs';
import { addSite, addSites } from '../sites';
import { SiteTable } from './SiteTable';

export function SitesPanel() {
  const [name, setName] = useState('');
  const [lat, setLat] = useState('');
  const [lon, setLon] = useState('');
  const [msg, setMsg] = useState('');
  const submit = (e: FormEvent) => {
    e.preventDefault();
    const la = readNumber('Latitude', lat, APP_RANGES.latDeg);
    const lo = readNumber('Longitude', lon, APP_RANGES.lonDeg);
    const nm = readSiteName('Site name', name);
    const refused = [la, lo, nm].filter((c) => !c.ok).map((c) => (c.ok ? '' : c.message));
    if (!la.ok || !lo.ok || !nm.ok) {
      setMsg(`${refused.join('; ')}.`);
      return;
    }
    const why = addSite(nm.value, la.value, lo.value);
    setMsg(why);
    if (!why) setName('');
  };
  const importFile = async (f: File | undefined) => {
    if (!f) return;
    const { sites, problems, rows } = parseSitesCsv(await f.text());
    const { added, limit } = addSites(sites);
    const parts = [`Imported ${added} of ${rows} site row${rows === 1 ? '' : 's'} from ${f.name}.`];
    if (limit) parts.push(`${limit}.`);
    if (problems.length) parts.push(`${problems.length} row${problems.length === 1 ? '' : 's'} not imported: ${problems.slice(0, 5).join('; ')}${problems.length > 5 ? `; and ${problems.length - 5} more` : ''}.`);
    setMsg(parts.join(' '));
  };
  return (
    <section className="panel sites" aria-labelledby="sites-h">
      <h2 id="sites-h">Sites and conjugates</h2>
      <form className="row wrap" onSubmit={submit} aria-label="Add a site">
        <label>Site name <input value={name} onChange={(e) => setName(e.target.value)} maxLength={APP_LIMITS.maxNameChars} /></label>
        <label>Latitude (deg) <input value={lat} onChange={(e) => setLat(e.target.value)} inputMode="decimal" size={8} /></label>
        <label>Longitude (deg, east +) <input value={lon} onChange={(e) => setLon(e.target.value)} inputMode="decimal" size={8} /></label>
        <button type="submit">Add site</button>
        <label className="file">
          Import sites (CSV: name, lat_deg, lon_deg)
          <input type="file" accept=".csv,text/csv" onChange={(e) => void importFile(e.target.files?.[0])} />
        </label>
      </form>
      <p className="hint">Shift-click the globe, or click a polar map, to add a site there.</p>
      {msg && <p role="status" className="msg">{msg}</p>}
      <SiteTable />
    </section>
  );
}
