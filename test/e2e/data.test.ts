/**
 * End-to-end tests of the app's data rules (headless Debian Chromium through
 * playwright-core, a production build served by `vite preview`): no stale
 * numbers shown or exported, imports and links under the command line's
 * rules, storm inputs and the conjugate altitude in every export.
 */
import { existsSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readCsvTable } from '../../src/io/csv';
import { CHROMIUM, type Browser, type Served } from './harness';
import { downloadText, setNumber, waitFresh, openApp } from './pageHelpers';

const HAVE_BROWSER = existsSync(CHROMIUM);
if (!HAVE_BROWSER && process.env.CI) throw new Error(`e2e: ${CHROMIUM} is missing under CI`);

let served: Served;
let b: Browser;
const pageErrors: string[] = [];

type Atlas = { store: { get(): Record<string, unknown> & { siteResults: unknown; conditions: { time: string; pdynNpa: number; dstNt?: number | null }; sites: unknown[]; errors: Record<string, string> } } };
const atlas = <T,>(fn: (s: ReturnType<Atlas['store']['get']>) => T) => b.page.evaluate(`(${fn.toString()})(window.__atlas.store.get())`) as Promise<T>;

/** The `# key: value` metadata lines of a CSV export, and its table. */
function splitCsv(text: string): { meta: Record<string, string>; table: ReturnType<typeof readCsvTable> } {
  const lines = text.split('\r\n');
  const meta: Record<string, string> = {};
  for (const l of lines.filter((x) => x.startsWith('# '))) meta[l.slice(2, l.indexOf(':'))] = l.slice(l.indexOf(':') + 2);
  return { meta, table: readCsvTable(lines.filter((x) => !x.startsWith('# ')).join('\r\n')) };
}

async function status(text: string): Promise<void> {
  await expect.poll(() => b.page.getByText(text, { exact: false }).count(), { timeout: 10_000 }).toBeGreaterThan(0);
}

beforeAll(async () => {
  if (!HAVE_BROWSER) return;
  ({ served, b } = await openApp({
    query: 't=2025-03-20T22:00&tilt=95&p=0x3C&site=Tarrow%20Fen|56.5|-20&site=Short|61&minlat=35',
    before: (br) => br.page.on('pageerror', (e) => pageErrors.push(e.message)),
  }));
}, 300_000);

afterAll(async () => {
  await b?.close();
  await served?.close();
});

describe.skipIf(!HAVE_BROWSER)('app data rules', () => {
  it('reads a link time without a zone as UTC, refuses bad values with a notice, and keeps the good site', async () => {
    await status('has no zone; it is read as UTC (2025-03-20T22:00:00Z)');
    await status('dipole tilt (tilt=): expected a decimal number in -90..90 deg, got "95"');
    await status('dynamic pressure (p=): expected a decimal number in 0.01..10000 nPa, got "0x3C"');
    await status('1 site in the link refused: site 2: expected name|lat|lon');
    const s = await atlas((st) => ({ sites: st.sites, c: st.conditions }));
    expect(s.sites).toEqual([{ name: 'Tarrow Fen', latDeg: 56.5, lonDeg: -20 }]);
    expect(s.c.time).toBe('2025-03-20T22:00:00Z');
    expect(await b.page.getByLabel('Lowest boundary MLAT (deg)', { exact: true }).inputValue()).toBe('35');
  });

  it('clears the site results and refuses exports (with the reason) when the time leaves the model range; recovers after', async () => {
    const before = await atlas((st) => (st.siteResults as { sites: unknown[] }).sites.length);
    expect(before).toBe(1);
    await b.page.getByLabel('Time (UTC)', { exact: true }).fill('2031-06-01 00:00 UTC');
    await expect.poll(() => atlas((st) => st.errors.sites ?? ''), { timeout: 60_000 }).toMatch(/time/);
    expect(await atlas((st) => st.siteResults)).toBeNull();
    await b.page.getByRole('button', { name: 'Sites CSV', exact: true }).click();
    await status('Sites CSV not exported: no site results for the current inputs: time');
    await b.page.getByRole('button', { name: 'Boundaries GeoJSON', exact: true }).click();
    await status('Boundaries GeoJSON not exported: no boundaries for the current inputs');
    await b.page.getByLabel('Time (UTC)', { exact: true }).fill('2025-03-20 23:30 UTC');
    await waitFresh(b.page);
    const csv = await downloadText(b.page, 'Sites CSV');
    expect(csv.name).toBe('fieldline-atlas-sites-2025-03-20T2330Z.csv');
    const { meta, table } = splitCsv(csv.text);
    expect(meta.time).toBe('2025-03-20T23:30:00Z');
    expect(table.records.map((r) => r.name)).toEqual(['Tarrow Fen']);
  });

  it('imports the good rows of a file with a short row, hex and exponent values, and states the 200-site limit', async () => {
    const rows = ['name,lat_deg,lon_deg', 'Corrie Vane,62.25,-18.5', 'Short,61', 'Hexa,0x3C,10', 'Expo,6e1,10'];
    for (let i = 0; i < 300; i++) rows.push(`Survey grid point ${i},${50 + (i % 30)}.25,${(i * 7) % 360 - 180}.5`);
    await b.page.getByLabel('Import sites (CSV: name, lat_deg, lon_deg)').setInputFiles({ name: 'survey.csv', mimeType: 'text/csv', buffer: Buffer.from(rows.join('\n')) });
    await status('Imported 199 of 304 site rows from survey.csv.');
    await status('301 sites: the first 199 imported, 102 not imported: the app holds at most 200 sites');
    await status('3 rows not imported: line 3: 2 fields, but the header has 3; line 4: lat_deg: expected a decimal number in -90..90 deg, got "0x3C"; line 5: lat_deg: expected a decimal number in -90..90 deg, got "6e1"');
    const names = await atlas((st) => (st.sites as { name: string }[]).map((x) => x.name));
    expect(names.length).toBe(200);
    expect(names.slice(0, 2)).toEqual(['Tarrow Fen', 'Corrie Vane']);
    // A 200-site share link: compressed, under the safe size, served and read back (it failed with HTTP 431 before).
    await b.page.getByRole('button', { name: 'Share link', exact: true }).click();
    await status('The link is compressed (z=) to stay short.');
    const link = await b.page.getByLabel('Share link', { exact: true }).inputValue();
    expect(link.length).toBeLessThanOrEqual(6000);
    expect(new URL(link).searchParams.has('z')).toBe(true);
    const p2 = await b.context.newPage();
    try {
      const resp = await p2.goto(link);
      expect(resp?.status()).toBe(200);
      await p2.waitForFunction(() => (window as unknown as { __atlas?: { store: { get(): { sites: unknown[] } } } }).__atlas?.store.get().sites.length === 200, undefined, { timeout: 30_000 });
    } finally {
      await p2.close();
    }
    // Back to one site for the next tests.
    await b.page.evaluate(`window.__atlas.store.set({ sites: window.__atlas.store.get().sites.slice(0, 1) })`);
    await waitFresh(b.page);
  });

  it('"Use … nPa" applies exactly the pressure it names (9000 nPa for 500 cm⁻³ at 3000 km/s), and says so', async () => {
    await b.page.getByText('From density and speed').click();
    await setNumber(b.page, 'Solar-wind speed (km/s)', 3000);
    await setNumber(b.page, 'Proton density (cm⁻³)', 500);
    await b.page.getByRole('button', { name: 'Use 9000 nPa' }).click();
    await status('Dynamic pressure set to 9000 nPa.');
    expect(await atlas((st) => st.conditions.pdynNpa)).toBe(9000);
    expect(await b.page.getByLabel('Dynamic pressure (nPa)', { exact: true }).inputValue()).toBe('9000');
    await setNumber(b.page, 'Proton density (cm⁻³)', 5);
    await setNumber(b.page, 'Dynamic pressure (nPa)', 3);
    await b.page.getByRole('button', { name: /Use the nominal speed/ }).click();
    await waitFresh(b.page);
  });

  it('refuses a typed hex value under the field and keeps the last good value', async () => {
    await setNumber(b.page, 'IMF Bz (nT)' as string, -5);
    await b.page.getByLabel('IMF Bz (nT)', { exact: true }).fill('0x3C');
    await status('IMF Bz (nT): expected a decimal number in -1000..1000 nT, got "0x3C" — not applied.');
    expect(await atlas((st) => (st.conditions as unknown as { bzNt: number }).bzNt)).toBe(-5);
    await setNumber(b.page, 'IMF Bz (nT)', -5);
  });

  it('takes a storm index and a conjugate altitude, and every export names them (metadata and file)', async () => {
    await b.page.getByLabel('Storm index', { exact: true }).selectOption('given');
    await setNumber(b.page, 'Dst or SYM-H (nT)', -180);
    await b.page.getByLabel('conjugate point at the footpoint altitude').uncheck();
    await setNumber(b.page, 'Conjugate altitude (km)', 0);
    await waitFresh(b.page);
    const { meta, table } = splitCsv((await downloadText(b.page, 'Sites CSV')).text);
    expect([meta.dstNt, meta.dstSource, meta.conjugateAltKm, meta.altKm]).toEqual(['-180', 'given', '0', '110']);
    expect(Number(meta.dstStarNt)).toBeLessThan(-180); // Dst* = Dst − b√Pdyn + c (O'Brien & McPherron 2000; references §10): −180 − 7.26·√3 + 11 = −181.6
    expect(Number(meta.sourceRe)).toBeGreaterThan(1.5);
    expect(table.records[0].line_type).toBe('closed');
    expect(table.records[0].conjugate_alt_km).toBe('0');
    const gj = JSON.parse((await downloadText(b.page, 'Boundaries GeoJSON')).text);
    expect([gj.metadata.dstNt, gj.metadata.dstSource, gj.metadata.minLatDeg]).toEqual([-180, 'given', 35]);
    await expect.poll(() => new URL(b.page.url()).searchParams.get('dst'), { timeout: 5000 }).toBe('-180');
    expect(new URL(b.page.url()).searchParams.get('calt')).toBe('0');
    expect(pageErrors).toEqual([]);
  });
});
