/**
 * Site import for the browser app, over the shared CSV reader (csv.ts).
 * Header names the columns name, lat_deg, lon_deg (any order; "lat"/"lon"
 * accepted). Bad rows are reported by line, never thrown.
 */
import { readCsvTable } from './csv';

interface ImportedSite {
  name: string;
  latDeg: number;
  lonDeg: number;
}

export function parseSitesCsv(text: string): { sites: ImportedSite[]; problems: string[] } {
  let table;
  try {
    table = readCsvTable(text);
  } catch (e) {
    return { sites: [], problems: [e instanceof Error ? e.message : String(e)] };
  }
  const head = table.header.map((h) => h.toLowerCase());
  const col = (...names: string[]) => {
    const i = head.findIndex((h) => names.includes(h));
    return i < 0 ? null : table.header[i];
  };
  const kName = col('name', 'site');
  const kLat = col('lat_deg', 'lat', 'latitude');
  const kLon = col('lon_deg', 'lon', 'longitude');
  if (!kLat || !kLon) return { sites: [], problems: ['the header must name the columns name, lat_deg, lon_deg'] };
  const sites: ImportedSite[] = [];
  const problems: string[] = [];
  table.records.forEach((rec, k) => {
    const line = k + 2;
    const lat = rec[kLat].trim() === '' ? NaN : Number(rec[kLat]);
    const lon = rec[kLon].trim() === '' ? NaN : Number(rec[kLon]);
    if (!Number.isFinite(lat) || lat < -90 || lat > 90) problems.push(`line ${line}: lat_deg must be a number in −90..90`);
    else if (!Number.isFinite(lon) || lon < -180 || lon > 360) problems.push(`line ${line}: lon_deg must be a number in −180..360`);
    else sites.push({ name: (kName ? rec[kName] : '').trim() || `Site ${line - 1}`, latDeg: lat, lonDeg: lon > 180 ? lon - 360 : lon });
  });
  return { sites, problems };
}
