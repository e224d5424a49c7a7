/**
 * End-to-end (headless Debian Chromium through playwright-core, a production
 * build served by `vite preview`):
 * 1. the polar maps' CGM grid option: it draws the CGM latitude circles and MLT
 *    meridians in both maps, survives the link (cgm=1) round trip, is not
 *    recomputed by other controls, and the maps' SVG export carries it with its
 *    legend entry;
 * 2. one invented site through the app, the command line's `trace` and its
 *    `batch` at the same footpoint altitude (110 km; the conjugate altitude left
 *    to follow it, the one rule of all three) and the same conditions: the
 *    conjugate footpoint and the site's CGM latitude agree (the issue asks 0.01°;
 *    they agree to 1e-5°) (app values
 *    from its JSON export and its sites table; CLI values from trace's JSON and
 *    batch's CSV).
 */
import { existsSync, mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { execFile } from 'node:child_process';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { promisify } from 'node:util';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readCsvTable } from '../../src/io/csv';
import { expectClose } from '../helpers';
import { CHROMIUM, ROOT, waitForEngine, type Browser, type Served } from './harness';
import { downloadText, setNumber, waitFresh, openApp } from './pageHelpers';

const HAVE_BROWSER = existsSync(CHROMIUM);
if (!HAVE_BROWSER && process.env.CI) throw new Error(`e2e: ${CHROMIUM} is missing under CI`);

const run = promisify(execFile);

// Invented site and conditions (not a real station or event).
const SITE = { name: 'Skerrow Point', latDeg: 61.3, lonDeg: -38.7 };
const TIME = '2025-03-20T22:00:00Z';
const COND = { pdyn: 3, bz: -5, by: 2, dst: -40, speed: 450, eps: 0.913 };
const QUERY = `t=${TIME}&p=${COND.pdyn}&bz=${COND.bz}&by=${COND.by}&dst=${COND.dst}&v=${COND.speed}&eps=${COND.eps}&int=igrf&mp=1&tail=1&alt=green`
  + `&site=${encodeURIComponent(`${SITE.name}|${SITE.latDeg}|${SITE.lonDeg}`)}`;
const CLI_COND = ['--time', TIME, '--pdyn', String(COND.pdyn), '--bz', String(COND.bz), '--by', String(COND.by), '--dst', String(COND.dst),
  '--speed', String(COND.speed), '--imf-efficiency', String(COND.eps), '--internal', 'igrf', '--magnetopause', 'on', '--tail', 'on', '--alt-km', '110'];
const CGM_LABEL = 'CGM grid (corrected geomagnetic latitude and MLT)';

let served: Served;
let b: Browser;
const pageErrors: string[] = [];

beforeAll(async () => {
  if (!HAVE_BROWSER) return;
  ({ served, b } = await openApp({ query: QUERY, before: (br) => br.page.on('pageerror', (e) => pageErrors.push(e.message)) }));
}, 300_000);

afterAll(async () => {
  await b?.close();
  await served?.close();
});

/** Number of drawn CGM path commands per map and kind ('latitude' | 'mlt'), and labels. */
async function gridCounts(page: Browser['page']): Promise<{ north: number; south: number; labels: number }> {
  return page.evaluate(() => {
    const count = (hemi: string) => {
      const g = document.querySelector(`#polar-maps svg[data-map="${hemi}"] [data-layer="cgm-graticule"]`);
      if (!g) return 0;
      return [...g.querySelectorAll('path')].reduce((n, p) => n + ((p.getAttribute('d') ?? '').match(/M/g)?.length ?? 0), 0);
    };
    return { north: count('north'), south: count('south'), labels: document.querySelectorAll('#polar-maps [data-cgm-label]').length };
  });
}

describe.skipIf(!HAVE_BROWSER)('CGM grid on the polar maps', () => {
  it('is off by default; the option draws latitude circles and MLT meridians in both maps, with labels', async () => {
    const box = b.page.getByLabel(CGM_LABEL, { exact: true });
    expect(await box.isChecked()).toBe(false);
    expect((await gridCounts(b.page)).north).toBe(0);
    // Keyboard: focus the checkbox and toggle it with Space.
    await box.focus();
    await b.page.keyboard.press('Space');
    expect(await box.isChecked()).toBe(true);
    await expect.poll(async () => (await gridCounts(b.page)).north, { timeout: 60_000 }).toBeGreaterThan(0);
    const c = await gridCounts(b.page);
    // 5 circles + 8 meridians per map at least (a circle cut by the rim adds pieces).
    expect(c.north).toBeGreaterThanOrEqual(13);
    expect(c.south).toBeGreaterThanOrEqual(13);
    expect(c.labels).toBeGreaterThanOrEqual(8);
    expect(await b.page.locator('#polar-maps svg[data-map="north"] [data-cgm-label="latitude"]', { hasText: '60°' }).count()).toBe(1);
    // MLT labels: 00, 06, 12, 18, less any that would sit on a local-time label at the rim.
    expect(await b.page.locator('#polar-maps svg[data-map="north"] [data-cgm-label="mlt"]', { hasText: / MLT$/ }).count()).toBeGreaterThanOrEqual(2);
    await expect.poll(() => b.page.getByText('CGM grid at 110 km', { exact: false }).count()).toBeGreaterThan(0);
    mkdirSync(join(ROOT, 'test-artifacts'), { recursive: true });
    await b.page.locator('#polar-maps').screenshot({ path: join(ROOT, 'test-artifacts', 'maps-cgm-grid.png') });
  });

  it('is kept in the link (cgm=1) and restored from it', async () => {
    await expect.poll(() => new URL(b.page.url()).searchParams.get('cgm'), { timeout: 5_000 }).toBe('1');
    const p2 = await b.context.newPage();
    try {
      await p2.goto(b.page.url());
      await waitForEngine(p2);
      expect(await p2.getByLabel(CGM_LABEL, { exact: true }).isChecked()).toBe(true);
      await expect.poll(async () => (await gridCounts(p2)).south, { timeout: 60_000 }).toBeGreaterThan(0);
    } finally {
      await p2.close();
    }
  });

  it('other controls do not recompute it (pressure, off and on again); a new time does', async () => {
    const requests = () => b.page.locator('#polar-maps').getAttribute('data-cgm-requests').then(Number);
    const before = await requests();
    expect(before).toBeGreaterThanOrEqual(1);
    await setNumber(b.page, 'Dynamic pressure (nPa)', 4);
    await waitFresh(b.page);
    expect(await b.page.getByText('computing the CGM grid', { exact: false }).count()).toBe(0);
    expect((await gridCounts(b.page)).north).toBeGreaterThan(0);
    const box = b.page.getByLabel(CGM_LABEL, { exact: true });
    await box.uncheck();
    await box.check();
    expect((await gridCounts(b.page)).north).toBeGreaterThan(0);
    expect(await requests()).toBe(before);
    await setNumber(b.page, 'Dynamic pressure (nPa)', COND.pdyn);
    await b.page.getByLabel('Time (UTC)', { exact: true }).fill('2025-03-20 23:00 UTC');
    await expect.poll(requests, { timeout: 30_000 }).toBe(before + 1);
    // The latitude circles stay drawn while the new time's meridians are traced (same date).
    const circles = () => b.page.locator('#polar-maps svg[data-map="north"] [data-cgm="latitude"]').getAttribute('d');
    expect((await circles())?.length ?? 0).toBeGreaterThan(100);
    await expect.poll(() => b.page.getByText('computing the CGM grid', { exact: false }).count(), { timeout: 30_000 }).toBe(0);
    await b.page.getByLabel('Time (UTC)', { exact: true }).fill('2025-03-20 22:00 UTC');
    await waitFresh(b.page);
    // Back to the first time: served from the cache.
    expect(await requests()).toBe(before + 1);
    await expect.poll(async () => (await gridCounts(b.page)).north, { timeout: 30_000 }).toBeGreaterThan(0);
  });

  it('the maps SVG export carries the grid and names it in the legend; it parses', async () => {
    const svg = await downloadText(b.page, 'Maps SVG');
    expect((svg.text.match(/data-layer="cgm-graticule"/g) ?? []).length).toBe(2);
    expect(svg.text).toContain('CGM grid at 110 km: corrected geomagnetic latitude every 10°');
    expect(svg.text).toMatch(/the lines stop where CGM is undefined/);
    const parsed = await b.page.evaluate((t) => {
      const d = new DOMParser().parseFromString(t, 'image/svg+xml');
      return { error: d.getElementsByTagName('parsererror').length, legend: d.getElementById('legend')?.textContent ?? '' };
    }, svg.text);
    expect(parsed.error).toBe(0);
    expect(parsed.legend).toContain('CGM grid');
  });

  it('off again: no grid drawn and none in the export', async () => {
    await b.page.getByLabel(CGM_LABEL, { exact: true }).uncheck();
    expect((await gridCounts(b.page)).north).toBe(0);
    const svg = await downloadText(b.page, 'Maps SVG');
    expect(svg.text).not.toContain('cgm-graticule');
    expect(svg.text).not.toContain('CGM grid');
    expect(pageErrors).toEqual([]);
  });
});

interface Answer { conjLat: number; conjLon: number; cgmLat: number }

describe.skipIf(!HAVE_BROWSER)('one site through the app, trace and batch (110 km, conjugate at the footpoint altitude)', () => {
  const tmp = mkdtempSync(join(tmpdir(), 'atlas-3way-'));
  afterAll(() => rmSync(tmp, { recursive: true, force: true }));
  const tsx = join(ROOT, 'node_modules', '.bin', 'tsx');
  const cli = join(ROOT, 'src', 'cli', 'main.ts');

  it('conjugate footpoint and CGM latitude agree across the three (asked: 0.01°; held to 1e-5°)', async () => {
    await waitFresh(b.page);
    // App: the full JSON export (all digits) and the sites table (2 decimals).
    const all = JSON.parse((await downloadText(b.page, 'Everything (JSON)')).text) as {
      metadata: { conjugateAltKm: number; altKm?: number };
      sites: { name: string; conjugate: { geoLatDeg: number; geoLonDeg: number; altKm: number } | null; cgm: { defined: boolean; latDeg?: number } }[];
    };
    expect(all.metadata.conjugateAltKm).toBe(110);
    const s = all.sites.find((x) => x.name === SITE.name)!;
    // The tracer's ellipsoid stop surface is exact to < 1 m (geodesy.ts).
    expectClose(s.conjugate!.altKm, 110, 1e-3, 'app conjugate altitude (km)');
    expect(s.cgm.defined).toBe(true);
    const app: Answer = { conjLat: s.conjugate!.geoLatDeg, conjLon: s.conjugate!.geoLonDeg, cgmLat: s.cgm.latDeg! };
    const cell = await b.page.locator('td[data-col="cgm-lat"]').first().textContent();
    expectClose(Number(cell), app.cgmLat, 0.0051, 'CGM latitude in the sites table vs the JSON export');

    // trace: JSON.
    const tr = await run(tsx, [cli, 'trace', '--lat', String(SITE.latDeg), '--lon', String(SITE.lonDeg), ...CLI_COND], { cwd: ROOT, timeout: 120_000 });
    const tj = JSON.parse(tr.stdout) as { conditions: { conjugateAltKm: number }; site: { cgm: { latDeg: number } }; conjugate: { geoLatDeg: number; geoLonDeg: number; altKm: number } };
    expect(tj.conditions.conjugateAltKm).toBe(110);
    expectClose(tj.conjugate.altKm, 110, 1e-3, 'trace conjugate altitude (km)');
    const trace: Answer = { conjLat: tj.conjugate.geoLatDeg, conjLon: tj.conjugate.geoLonDeg, cgmLat: tj.site.cgm.latDeg };

    // batch: CSV with the CGM columns.
    const sites = join(tmp, 'sites.csv');
    writeFileSync(sites, `name,lat_deg,lon_deg\n${SITE.name},${SITE.latDeg},${SITE.lonDeg}\n`);
    const bt = await run(tsx, [cli, 'batch', '--sites', sites, '--cgm', '--workers', '1', ...CLI_COND], { cwd: ROOT, timeout: 120_000 });
    const table = readCsvTable(bt.stdout.split(/\r?\n/).filter((l) => !l.startsWith('#')).join('\n'));
    expect(table.records.length).toBe(1);
    const row = table.records[0];
    expect(row.line_type).toBe('closed');
    const batch: Answer = { conjLat: Number(row.conj_geo_lat_deg), conjLon: Number(row.conj_geo_lon_deg), cgmLat: Number(row.cgm_lat_deg) };

    // The issue asks for 0.01°; measured 3.3e-7° (batch's CSV carries 6 decimals; the three call the same engine
    // functions), so the check holds them to 1e-5°. The largest difference is printed.
    const diffs = [app, trace, batch].flatMap((x) => [app, trace, batch].flatMap((y) => [Math.abs(x.conjLat - y.conjLat), Math.abs(((x.conjLon - y.conjLon + 540) % 360) - 180), Math.abs(x.cgmLat - y.cgmLat)]));
    console.log(`three-way: largest difference ${Math.max(...diffs).toExponential(2)}° (conjugate ${app.conjLat.toFixed(4)}°, ${app.conjLon.toFixed(4)}°; CGM ${app.cgmLat.toFixed(4)}°)`);
    for (const [a, bName, x, y] of [['app', 'trace', app, trace], ['app', 'batch', app, batch], ['trace', 'batch', trace, batch]] as const) {
      expectClose(x.conjLat, y.conjLat, 1e-5, `conjugate latitude, ${a} vs ${bName}`);
      expectClose(((x.conjLon - y.conjLon + 540) % 360) - 180, 0, 1e-5, `conjugate longitude, ${a} vs ${bName}`);
      expectClose(x.cgmLat, y.cgmLat, 1e-5, `site CGM latitude, ${a} vs ${bName}`);
    }
    // A southern conjugate of a northern site, as a check that the comparison is not vacuous.
    expect(app.conjLat).toBeLessThan(-50);
  });
});
