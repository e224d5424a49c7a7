/**
 * Site import for the browser app. The header names the columns name,
 * lat_deg, lon_deg (any order; "site", "lat"/"latitude", "lon"/"longitude"
 * accepted). Every value passes the app's validation path (app-inputs.ts:
 * plain decimals, the CLI's ranges). Reading never stops at a bad row: a
 * short or long row, a malformed quote (the record splitter of batch-csv.ts
 * turns it into an error record) or a refused value is listed by its file
 * line, and every good row is kept.
 */
import { CsvRecordSplitter, type CsvRecord } from './batch-csv';
import { csvText } from './csv';
import { APP_RANGES, readNumber, readSiteName, wrapLonDeg } from './app-inputs';

export interface ImportedSite {
  name: string;
  latDeg: number;
  lonDeg: number;
}

export interface SitesImport {
  /** The good rows, in file order (lon wrapped to −180..180). */
  sites: ImportedSite[];
  /** One line per refused row (or a header problem), naming the file line. */
  problems: string[];
  /** Data rows read (good and bad). */
  rows: number;
}

const NAME_COLS = ['name', 'site'];
const LAT_COLS = ['lat_deg', 'lat', 'latitude'];
const LON_COLS = ['lon_deg', 'lon', 'longitude'];

export function parseSitesCsv(text: string): SitesImport {
  const splitter = new CsvRecordSplitter();
  // Leading `# key: value` metadata lines (the app's and the batch's exports) become empty lines, so line numbers hold.
  const src = text.replace(/^(?:\uFEFF)?(?:#[^\r\n]*(?:\r\n|\r|\n))+/, (m) => m.replace(/[^\r\n]+/g, ''));
  const records: CsvRecord[] = [...splitter.push(src), ...splitter.end()];
  const problems: string[] = [];
  const sites: ImportedSite[] = [];
  // The header: the first record that is not a quoting error.
  let h = 0;
  while (h < records.length && records[h].error) problems.push(records[h++].error!);
  if (h === records.length) return { sites, problems: [...problems, 'the file is empty: a header naming the columns name, lat_deg, lon_deg is required'], rows: 0 };
  const header = records[h].fields.map((f) => csvText(f.trim()).toLowerCase());
  const col = (names: string[]) => header.findIndex((x) => names.includes(x));
  const iName = col(NAME_COLS), iLat = col(LAT_COLS), iLon = col(LON_COLS);
  if (iLat < 0 || iLon < 0) {
    return { sites, problems: [...problems, `line ${records[h].line}: the header must name the columns name, lat_deg, lon_deg (got ${header.slice(0, 6).join(', ')})`], rows: 0 };
  }
  let rows = 0;
  for (const rec of records.slice(h + 1)) {
    rows++;
    if (rec.error) { problems.push(rec.error); continue; }
    const where = `line ${rec.line}`;
    if (rec.fields.length !== header.length) {
      problems.push(`${where}: ${rec.fields.length} field${rec.fields.length === 1 ? '' : 's'}, but the header has ${header.length}`);
      continue;
    }
    const lat = readNumber(`${where}: lat_deg`, rec.fields[iLat], APP_RANGES.latDeg);
    const lon = readNumber(`${where}: lon_deg`, rec.fields[iLon], APP_RANGES.lonDeg);
    const name = readSiteName(`${where}: name`, iName < 0 ? '' : csvText(rec.fields[iName]));
    const bad = [lat, lon, name].filter((c) => !c.ok);
    if (!lat.ok || !lon.ok || !name.ok) {
      problems.push(bad.map((c) => (c.ok ? '' : c.message)).join('; '));
      continue;
    }
    sites.push({ name: name.value || `Site ${rows}`, latDeg: lat.value, lonDeg: wrapLonDeg(lon.value) });
  }
  return { sites, problems, rows };
}
