/** Add sites by typing or by CSV import; the results table sits below. */
import { useState, type FormEvent } from 'react';
import { parseSitesCsv } from '../../io/app-csv';
import { addSite, addSites } from '../sites';
import { SiteTable } from './SiteTable';

export function SitesPanel() {
  const [name, setName] = useState('');
  const [lat, setLat] = useState('');
  const [lon, setLon] = useState('');
  const [msg, setMsg] = useState('');
  const submit = (e: FormEvent) => {
    e.preventDefault();
    const la = Number(lat);
    const lo = Number(lon);
    if (lat.trim() === '' || lon.trim() === '' || !Number.isFinite(la) || !Number.isFinite(lo) || Math.abs(la) > 90 || lo < -180 || lo > 360) {
      setMsg('Latitude must be −90..90° and longitude −180..360° (east positive).');
      return;
    }
    setMsg(addSite(name, la, lo) ? '' : 'Site list is full.');
    setName('');
  };
  const importFile = async (f: File | undefined) => {
    if (!f) return;
    const { sites, problems } = parseSitesCsv(await f.text());
    const n = addSites(sites);
    setMsg(`Imported ${n} site${n === 1 ? '' : 's'} from ${f.name}.${problems.length ? ` Skipped: ${problems.slice(0, 3).join('; ')}${problems.length > 3 ? '…' : ''}` : ''}`);
  };
  return (
    <section className="panel sites" aria-labelledby="sites-h">
      <h2 id="sites-h">Sites and conjugates</h2>
      <form className="row wrap" onSubmit={submit} aria-label="Add a site">
        <label>Site name <input value={name} onChange={(e) => setName(e.target.value)} maxLength={80} /></label>
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
