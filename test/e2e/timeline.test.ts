/**
 * The timeline in the browser (headless Debian Chromium, production build):
 * load the invented demo storm, scrub to three steps and compare the sites
 * table (the sites channel's own answer) and the site timelines at those steps
 * with the CLI's `timeline` command run on the same steps and sites (a child
 * process: line type, relation to the oval with its margin, the oval's sky
 * elevation and azimuth, Sun, twilight, dark sky, Moon; 0.01°, categories
 * exact) and with the per-site report computed in Node; replay through the end
 * without console errors and without skipping a step; the timeline export
 * parses with one row per site per step. Also prints the cursor → table and
 * cursor → maps times (benchmark figures, not asserted; bench/timeline-browser.ts
 * gives them over more scrubs and runs).
 */
import { existsSync, readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readCsvTable } from '../../src/io/csv';
import { readSeriesText } from '../../src/io/series/series';
import { prepareModel } from '../../src/physics/field/model';
import type { FieldConditions } from '../../src/physics/field/conditions';
import { makeTracer, sectorBoundaries, siteReport, type SiteInput, type SiteResult } from '../../src/physics/mapping';
import { CHROMIUM, ROOT, type Browser, type Served } from './harness';
import { downloadText, waitFresh, openApp } from './pageHelpers';
import { expectClose } from '../helpers';
import { scratchDir, spawnCli } from '../cli/helpers';

const HAVE_BROWSER = existsSync(CHROMIUM);
if (!HAVE_BROWSER && process.env.CI) throw new Error(`e2e: ${CHROMIUM} is missing under CI`);

let served: Served;
let b: Browser;
const consoleErrors: string[] = [];

interface PageState {
  conditions: FieldConditions;
  products: { altKm: number; sourceRe: number | null; minElevationDeg: number; minLatDeg: number; conjugateAltKm?: number | null };
  sites: SiteInput[];
  siteResults: { sites: SiteResult[]; fromTimeline?: boolean } | null;
}

/** A timeline cell as the page holds it (workers/protocol.ts TimelineCell, the fields compared here). */
interface PageCell {
  type: string; ovalRelation: string; ovalMarginDeg: number | null; ovalElevationDeg: number | null; ovalAzimuthDeg: number | null;
  sunElevationDeg: number; twilight: string; dark: boolean; moonElevationDeg: number; moonIlluminatedFraction: number;
}

/** A row of the CLI's `timeline --format json` (src/cli/commands/timeline.ts COLUMNS). */
interface CliRow {
  time_utc: string; site: string; line_type: string; oval_relation: string; oval_margin_deg: number | null;
  oval_elevation_deg: number | null; oval_azimuth_deg: number | null; sun_elevation_deg: number; twilight: string; dark: boolean;
  moon_elevation_deg: number; moon_illuminated_fraction: number;
}

const DEMO = readSeriesText(readFileSync(resolve(ROOT, 'examples/demo-storm.csv'), 'utf8')).flatMap((r) => (r.kind === 'ok' ? [r.value] : []));

beforeAll(async () => {
  if (!HAVE_BROWSER) return;
  ({ served, b } = await openApp({
    before: (br) => {
      br.page.on('console', (m) => { if (m.type() === 'error') consoleErrors.push(m.text()); });
      br.page.on('pageerror', (e) => consoleErrors.push(`pageerror: ${e.message}`));
    },
  }));
});

afterAll(async () => {
  await b?.close();
  await served?.close();
});

const pageState = () => b.page.evaluate(() => {
  const s = (window as unknown as { __atlas: { store: { get(): Record<string, unknown> } } }).__atlas.store.get();
  return JSON.parse(JSON.stringify({ conditions: s.conditions, products: s.products, sites: s.sites, siteResults: s.siteResults })) as unknown;
}) as Promise<PageState>;

const cursorOf = () => b.page.evaluate(() => (window as unknown as { __atlasTimeline: { timelineStore: { get(): { cursor: number } } } }).__atlasTimeline.timelineStore.get().cursor);

describe.skipIf(!HAVE_BROWSER)('timeline (browser)', () => {
  it('loads the demo storm with one click and reports its summary', async () => {
    await b.page.getByText('Timeline: replay a series, plan a night', { exact: true }).click();
    await b.page.getByRole('button', { name: 'Load the demo storm', exact: true }).click();
    await expect.poll(() => b.page.getByLabel('Series summary').textContent(), { timeout: 30_000 }).toMatch(/72 steps every 1 h from demo-storm\.csv \(csv\)/);
    const hourly = b.page.getByRole('button', { name: 'Demo storm as an hourly file', exact: true });
    await hourly.click();
    // The hand-made hourly file: 24 lines, one Bz fill value skipped with its reason and line number.
    await expect.poll(() => b.page.getByLabel('Series summary').textContent(), { timeout: 30_000 }).toMatch(/23 steps .*1 line skipped/);
    await b.page.getByText('1 line not used').click();
    expect(await b.page.getByLabel('Series summary').textContent()).toMatch(/line 10: word 17 \(Bz GSM\) is a fill value/);
    // The file picker: a bad line reported by its number, the rest kept.
    await b.page.getByLabel('Solar-wind series file', { exact: true }).setInputFiles({
      name: 'camp-wind.csv', mimeType: 'text/csv',
      buffer: Buffer.from('time,pdyn_npa,bz_nt,by_nt\n2027-10-14T00:00:00Z,2,-3,1\n2027-10-14T01:00:00Z,two,-3,1\n2027-10-14T02:00:00Z,2.5,-6,1\n'),
    });
    await expect.poll(() => b.page.getByLabel('Series summary').textContent(), { timeout: 30_000 }).toMatch(/2 steps every 2 h from camp-wind\.csv \(csv\).*storm index estimated through the series; 1 line unreadable/);
    await b.page.getByText('1 line not used').click();
    expect(await b.page.getByLabel('Series summary').textContent()).toMatch(/unreadable: series line 3/);
    // Drag-and-drop: the hourly demo file dropped on the load area.
    const hourlyText = readFileSync(resolve(ROOT, 'examples/demo-storm-hourly.txt'), 'utf8');
    await b.page.evaluate((text) => {
      const dt = new DataTransfer();
      dt.items.add(new File([text], 'dropped-hourly.txt', { type: 'text/plain' }));
      document.querySelector('.tl-drop')!.dispatchEvent(new DragEvent('drop', { dataTransfer: dt, bubbles: true, cancelable: true }));
    }, hourlyText);
    await expect.poll(() => b.page.getByLabel('Series summary').textContent(), { timeout: 30_000 }).toMatch(/23 steps every 1 h from dropped-hourly\.txt \(hourly\)/);
    await b.page.getByRole('button', { name: 'Load the demo storm', exact: true }).click();
    await expect.poll(() => b.page.getByLabel('Series summary').textContent(), { timeout: 30_000 }).toMatch(/72 steps/);
  });

  it('at three scrubbed steps the sites table and the site timelines equal the CLI timeline command on the same steps and sites (0.01°, categories exact) and the per-site report in Node', async () => {
    const STEPS = [5, 22, 47];
    // The site timelines of the demo storm must be in (the cursor's step is read from them below).
    await b.page.waitForFunction(() => {
      const t = (window as unknown as { __atlasTimeline: { timelineStore: { get(): { result: { stepsMs: number[] } | null; pending: boolean } } } }).__atlasTimeline.timelineStore.get();
      return !t.pending && t.result !== null && t.result.stepsMs.length === 72;
    }, undefined, { timeout: 170_000, polling: 200 });
    const first = await pageState();
    const sunLimitDeg = await b.page.evaluate(() => (window as unknown as { __atlasTimeline: { timelineStore: { get(): { sunLimitDeg: number } } } }).__atlasTimeline.timelineStore.get().sunLimitDeg);
    // The CLI on the same inputs: the demo file's rows of those steps, the app's sites, model switches and products.
    const dir = scratchDir('atlas-e2e-timeline-');
    let cliRows: CliRow[];
    try {
      const lines = readFileSync(resolve(ROOT, 'examples/demo-storm.csv'), 'utf8').split(/\r?\n/);
      const seriesPath = dir.file('steps.csv', [lines[0], ...STEPS.map((k) => lines[1 + k])].join('\n') + '\n');
      const sitesPath = dir.file('sites.csv', ['name,lat_deg,lon_deg', ...first.sites.map((x) => `${x.name},${x.latDeg},${x.lonDeg}`)].join('\n') + '\n');
      const c = first.conditions, p = first.products;
      const r = spawnCli('timeline', '--sites', sitesPath, '--conditions', seriesPath, '--format', 'json',
        '--internal', c.internal, '--magnetopause', c.magnetopause ? 'on' : 'off', '--tail', c.tail === false ? 'off' : 'on', '--imf-efficiency', String(c.imfEfficiency),
        '--alt-km', String(p.altKm), '--conjugate-alt-km', String(p.conjugateAltKm ?? p.altKm), '--min-elevation-deg', String(p.minElevationDeg),
        '--sun-limit-deg', String(sunLimitDeg), ...(p.sourceRe === null ? [] : ['--source-re', String(p.sourceRe)]));
      expect(r.code, r.err).toBe(0);
      cliRows = (JSON.parse(r.out) as { rows: CliRow[] }).rows;
    } finally {
      dir.remove();
    }
    expect(first.products.minLatDeg, 'the CLI searches from 30° (the engine default); so must the app here').toBe(30);
    expect(cliRows.length).toBe(STEPS.length * first.sites.length);
    for (const step of STEPS) {
      await b.page.getByLabel('Timeline step', { exact: true }).fill(String(step));
      await waitFresh(b.page, ['sites', 'oval']);
      // The sites channel's own answer (a table filled from the timeline is replaced by it).
      await b.page.waitForFunction(() => (window as unknown as { __atlas: { store: { get(): { siteResults: { fromTimeline?: boolean } | null } } } }).__atlas.store.get().siteResults?.fromTimeline !== true, undefined, { timeout: 120_000, polling: 50 });
      await waitFresh(b.page, ['sites', 'oval']);
      const s = await pageState();
      const row = DEMO[step];
      expect(s.conditions.time).toBe(row.time);
      expectClose(s.conditions.pdynNpa, row.pdynNpa, 0, `step ${step} Pdyn from the series`);
      expectClose(s.conditions.bzNt, row.bzNt, 0, `step ${step} Bz from the series`);
      expectClose(s.conditions.dstNt!, row.dstNt!, 0, `step ${step} storm index from the series`);
      const cells = await b.page.evaluate((k) => {
        const r = (window as unknown as { __atlasTimeline: { timelineStore: { get(): { result: { sites: { cells: unknown[] }[] } } } } }).__atlasTimeline.timelineStore.get().result;
        return JSON.parse(JSON.stringify(r.sites.map((x) => x.cells[k]))) as unknown;
      }, step) as PageCell[];
      const shown = s.siteResults!.sites;
      expect(shown.length).toBe(s.sites.length);
      const m = prepareModel(s.conditions);
      // The app's rules: the conjugate at the footpoint altitude unless set apart; the storm-following
      // source distance unless set; searches from the lowest latitude setting.
      const conjAltKm = s.products.conjugateAltKm ?? s.products.altKm;
      const sourceRe = s.products.sourceRe ?? m.sourceRe;
      const tConj = makeTracer(m, { altKm: conjAltKm, ellipsoid: true });
      const tAlt = makeTracer(m, { altKm: s.products.altKm, ellipsoid: true });
      const opts = { conjugateAltKm: conjAltKm, altKm: s.products.altKm, sourceRe, minElevationDeg: s.products.minElevationDeg };
      const boundaryAt = (h: 'north' | 'south', mlt: number) => sectorBoundaries(m, tAlt, h, mlt, { sourceRe, minLatDeg: s.products.minLatDeg });
      s.sites.forEach((site, k) => {
        const got = shown[k];
        const cell = cells[k];
        const cli = cliRows.find((x) => x.site === site.name && Date.parse(x.time_utc) === Date.parse(row.time));
        expect(cli, `CLI row for ${site.name} at ${row.time}`).toBeDefined();
        const what = (x: string) => `${site.name} ${x} at step ${step}`;
        // Sites table (the sites channel) against the CLI.
        expect(got.type, what('line type, table vs CLI')).toBe(cli!.line_type);
        expect(got.ovalRelation, what('oval relation, table vs CLI')).toBe(cli!.oval_relation);
        expect(got.sky === null, what('oval point in the sky, table vs CLI')).toBe(cli!.oval_elevation_deg === null);
        if (got.sky) {
          expectClose(got.sky.elevationDeg, cli!.oval_elevation_deg!, 0.01, what('oval elevation, table vs CLI'));
          expectClose(got.sky.azimuthDeg, cli!.oval_azimuth_deg!, 0.01, what('oval azimuth, table vs CLI'));
        }
        // Site timeline cell against the CLI: every column of the CLI's row.
        expect(cell.type, what('line type, timeline vs CLI')).toBe(cli!.line_type);
        expect(cell.ovalRelation, what('oval relation, timeline vs CLI')).toBe(cli!.oval_relation);
        expect(cell.ovalMarginDeg === null, what('margin present, timeline vs CLI')).toBe(cli!.oval_margin_deg === null);
        if (cell.ovalMarginDeg !== null) expectClose(cell.ovalMarginDeg, Math.abs(cli!.oval_margin_deg!), 0.01, what('oval margin, timeline vs CLI'));
        expect(cell.ovalElevationDeg === null, what('oval point in the sky, timeline vs CLI')).toBe(cli!.oval_elevation_deg === null);
        if (cell.ovalElevationDeg !== null) {
          expectClose(cell.ovalElevationDeg, cli!.oval_elevation_deg!, 0.01, what('oval elevation, timeline vs CLI'));
          expectClose(cell.ovalAzimuthDeg!, cli!.oval_azimuth_deg!, 0.01, what('oval azimuth, timeline vs CLI'));
        }
        expectClose(cell.sunElevationDeg, cli!.sun_elevation_deg, 0.01, what('Sun elevation, timeline vs CLI'));
        expect(cell.twilight, what('twilight, timeline vs CLI')).toBe(cli!.twilight);
        expect(cell.dark, what('dark sky, timeline vs CLI')).toBe(cli!.dark);
        expectClose(cell.moonElevationDeg, cli!.moon_elevation_deg, 0.01, what('Moon elevation, timeline vs CLI'));
        expectClose(cell.moonIlluminatedFraction, cli!.moon_illuminated_fraction, 0.001, what('Moon illuminated fraction, timeline vs CLI'));
        // And the per-site report computed here in Node (conjugate point, boundary, magnetic latitude).
        const want = siteReport(m, tConj, tAlt, site, opts, boundaryAt, false);
        expect(got.type, what('line type vs Node')).toBe(want.type);
        expectClose(got.magLatDeg, want.magLatDeg, 0.01, what('magnetic latitude vs Node'));
        if (want.conjugate) {
          expectClose(got.conjugate!.geoLatDeg, want.conjugate.geoLatDeg, 0.01, what('conjugate latitude vs Node'));
          expectClose(got.conjugate!.geoLonDeg, want.conjugate.geoLonDeg, 0.01, what('conjugate longitude vs Node'));
        }
        if (want.boundaries?.openClosedMagLatDeg != null) expectClose(got.boundaries!.openClosedMagLatDeg!, want.boundaries.openClosedMagLatDeg, 0.01, what('open–closed boundary vs Node'));
      });
      // The table in the page shows the same conjugate latitude (3 decimals).
      const withConj = shown.findIndex((r) => r.conjugate);
      if (withConj >= 0) {
        const cell = await b.page.locator(`tr[data-site-index="${withConj}"] td[data-col="conj-lat"]`).textContent();
        expectClose(Number(cell), shown[withConj].conjugate!.geoLatDeg, 0.0006, 'table cell shows the conjugate latitude');
      }
    }
  });

  it('replay runs through to the end, visiting every step in order, without console errors', async () => {
    await b.page.getByLabel('Timeline step', { exact: true }).fill('62');
    await b.page.getByLabel('Play speed (steps/s)', { exact: true }).selectOption('8');
    await b.page.evaluate(() => {
      const w = window as unknown as { __visited: number[]; __atlasTimeline: { timelineStore: { subscribe(f: (s: { cursor: number }, p: { cursor: number }) => void): void } } };
      w.__visited = [];
      w.__atlasTimeline.timelineStore.subscribe((s, p) => { if (s.cursor !== p.cursor) w.__visited.push(s.cursor); });
    });
    await b.page.getByRole('button', { name: 'Replay', exact: true }).click();
    await b.page.waitForFunction(() => !(window as unknown as { __atlasTimeline: { timelineStore: { get(): { playing: boolean } } } }).__atlasTimeline.timelineStore.get().playing, undefined, { timeout: 120_000, polling: 100 });
    const visited = await b.page.evaluate(() => (window as unknown as { __visited: number[] }).__visited);
    expect(visited).toEqual([63, 64, 65, 66, 67, 68, 69, 70, 71]);
    expect(await cursorOf()).toBe(71);
    expect(consoleErrors).toEqual([]);
  });

  it('the timeline export parses and has one row per site per step', async () => {
    await b.page.waitForFunction(() => {
      const t = (window as unknown as { __atlasTimeline: { timelineStore: { get(): { result: { stepsMs: number[] } | null; pending: boolean } } } }).__atlasTimeline.timelineStore.get();
      return !t.pending && t.result !== null && t.result.stepsMs.length === 72;
    }, undefined, { timeout: 170_000, polling: 200 });
    const s = await pageState();
    const csv = await downloadText(b.page, 'Timeline CSV');
    expect(csv.name).toBe('fieldline-atlas-timeline-20271014T0000Z-20271016T2300Z.csv');
    const lines = csv.text.split(/\r\n/);
    expect(lines[0]).toMatch(/^# generator: Fieldline Atlas/);
    const body = lines.filter((l) => !l.startsWith('#')).join('\r\n');
    const table = readCsvTable(body);
    expect(table.records.length).toBe(72 * s.sites.length);
    for (const name of s.sites.map((x) => x.name)) expect(table.records.filter((r) => r.site === name).length).toBe(72);
    const at22 = table.records.filter((r) => r.time === DEMO[22].time);
    expect(at22.length).toBe(s.sites.length);
    expectClose(Number(at22[0].dst_nt), DEMO[22].dstNt!, 0, 'storm index column');
    expect(at22[0].dst_source).toBe('given');
    const json = await downloadText(b.page, 'Timeline JSON');
    const parsed = JSON.parse(json.text) as { rows: unknown[]; bestHours: { sentence: string }[] };
    expect(parsed.rows.length).toBe(72 * s.sites.length);
    expect(parsed.bestHours.length).toBe(s.sites.length);
    expect(consoleErrors).toEqual([]);
  });

  it('benchmark: cursor move → sites table and maps updated, 8 sites (printed, not asserted)', async () => {
    await b.page.evaluate(() => {
      const st = (window as unknown as { __atlas: { store: { get(): { sites: unknown[] }; set(p: object): void } } }).__atlas.store;
      st.set({ sites: [...st.get().sites, { name: 'Tarn Vey', latDeg: 69.3, lonDeg: 19.0 }, { name: 'Corrow Point', latDeg: 61.4, lonDeg: -149.7 }, { name: 'Mossbank', latDeg: 55.9, lonDeg: -3.2 }].slice(0, 8) });
    });
    await waitFresh(b.page, ['sites', 'oval']);
    // The site timelines (second worker) recompute for the new sites; time the cursor once they are idle.
    await b.page.waitForFunction(() => {
      const t = (window as unknown as { __atlasTimeline: { timelineStore: { get(): { result: { sites: unknown[] } | null; pending: boolean } } } }).__atlasTimeline.timelineStore.get();
      return !t.pending && t.result?.sites.length === 8;
    }, undefined, { timeout: 170_000, polling: 200 });
    // And every step's oval kept (computed ahead in the timeline worker since the series was loaded).
    await b.page.waitForFunction(() => (window as unknown as { __atlasTimelineClient?: { ovalsMissing(): number } }).__atlasTimelineClient?.ovalsMissing() === 0, undefined, { timeout: 170_000, polling: 250 });
    const times: { sites: number; both: number }[] = [];
    for (const step of [10, 11, 20, 21, 30, 31, 40, 41, 50]) {
      // Page-side: from the cursor move to the store holding the table and the oval for the new step, plus one frame.
      times.push(await b.page.evaluate((k) => new Promise<{ sites: number; both: number }>((res) => {
        const w = window as unknown as { __atlas: { store: { get(): Record<string, unknown>; subscribe(f: (s: Record<string, unknown>) => void): () => void } }; __atlasTimeline: { moveCursor(i: number): void } };
        const t0 = performance.now();
        let tSites = 0;
        const fresh = (s: Record<string, unknown>, ch: string) => (s.answeredFor as Record<string, { conditions: unknown } | undefined>)[ch]?.conditions === s.conditions;
        const unsub = w.__atlas.store.subscribe((s) => {
          if (!tSites && fresh(s, 'sites')) tSites = performance.now() - t0;
          if (fresh(s, 'sites') && fresh(s, 'oval')) {
            unsub();
            requestAnimationFrame(() => res({ sites: tSites, both: performance.now() - t0 }));
          }
        });
        w.__atlasTimeline.moveCursor(k);
      }), step));
    }
    const med = (xs: number[]) => [...xs].sort((x, y) => x - y)[xs.length >> 1];
    console.log(`timeline bench, 8 sites, cursor move → sites table: median ${med(times.map((t) => t.sites)).toFixed(0)} ms; → table and maps (refined oval): median ${med(times.map((t) => t.both)).toFixed(0)} ms; all ${times.map((t) => `${t.sites.toFixed(0)}/${t.both.toFixed(0)}`).join(' ')}`);
    expect(times.length).toBe(9);
  });
});
