/**
 * The timeline in the browser (headless Debian Chromium, production build):
 * load the invented demo storm, scrub to three steps and compare the sites
 * table with the per-site report computed in Node for the same conditions
 * (the same engine the CLI uses) to 0.01°; replay through the end without
 * console errors and without skipping a step; the timeline export parses with
 * one row per site per step. Also prints the cursor → table-and-maps time
 * (benchmark figure, not asserted).
 */
import { existsSync, readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readCsvTable } from '../../src/io/csv';
import { readSeriesText } from '../../src/io/series/series';
import { prepareModel } from '../../src/physics/field/model';
import type { FieldConditions } from '../../src/physics/field/conditions';
import { makeTracer, sectorBoundaries, siteReport, type SiteInput, type SiteResult } from '../../src/physics/mapping';
import { CHROMIUM, launch, ROOT, serveApp, waitForEngine, type Browser, type Served } from './harness';
import { downloadText, waitFresh } from './pageHelpers';
import { expectClose } from '../helpers';

const HAVE_BROWSER = existsSync(CHROMIUM);
if (!HAVE_BROWSER && process.env.CI) throw new Error(`e2e: ${CHROMIUM} is missing under CI`);

let served: Served;
let b: Browser;
const consoleErrors: string[] = [];

interface PageState {
  conditions: FieldConditions;
  products: { altKm: number; sourceRe: number | null; minElevationDeg: number; minLatDeg: number; conjugateAltKm?: number | null };
  sites: SiteInput[];
  siteResults: { sites: SiteResult[] } | null;
}

const DEMO = readSeriesText(readFileSync(resolve(ROOT, 'examples/demo-storm.csv'), 'utf8')).flatMap((r) => (r.kind === 'ok' ? [r.value] : []));

beforeAll(async () => {
  if (!HAVE_BROWSER) return;
  served = await serveApp();
  b = await launch();
  b.page.on('console', (m) => { if (m.type() === 'error') consoleErrors.push(m.text()); });
  b.page.on('pageerror', (e) => consoleErrors.push(`pageerror: ${e.message}`));
  await b.page.goto(served.url);
  await waitForEngine(b.page);
  await waitFresh(b.page, ['scene', 'oval', 'sites']);
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

  it('at three scrubbed steps the sites table equals the per-site report computed in Node for that step (0.01°)', async () => {
    for (const step of [5, 22, 47]) {
      await b.page.getByLabel('Timeline step', { exact: true }).fill(String(step));
      await waitFresh(b.page, ['sites', 'oval']);
      const s = await pageState();
      const row = DEMO[step];
      expect(s.conditions.time).toBe(row.time);
      expectClose(s.conditions.pdynNpa, row.pdynNpa, 0, `step ${step} Pdyn from the series`);
      expectClose(s.conditions.bzNt, row.bzNt, 0, `step ${step} Bz from the series`);
      expectClose(s.conditions.dstNt!, row.dstNt!, 0, `step ${step} storm index from the series`);
      const m = prepareModel(s.conditions);
      // The app's rules: the conjugate at the footpoint altitude unless set apart; the storm-following
      // source distance unless set; searches from the lowest latitude setting.
      const conjAltKm = s.products.conjugateAltKm ?? s.products.altKm;
      const sourceRe = s.products.sourceRe ?? m.sourceRe;
      const tConj = makeTracer(m, { altKm: conjAltKm, ellipsoid: true });
      const tAlt = makeTracer(m, { altKm: s.products.altKm, ellipsoid: true });
      const opts = { conjugateAltKm: conjAltKm, altKm: s.products.altKm, sourceRe, minElevationDeg: s.products.minElevationDeg };
      const boundaryAt = (h: 'north' | 'south', mlt: number) => sectorBoundaries(m, tAlt, h, mlt, { sourceRe, minLatDeg: s.products.minLatDeg });
      const shown = s.siteResults!.sites;
      expect(shown.length).toBe(s.sites.length);
      s.sites.forEach((site, k) => {
        const want = siteReport(m, tConj, tAlt, site, opts, boundaryAt, false);
        const got = shown[k];
        expect(got.type, `${site.name} line type at step ${step}`).toBe(want.type);
        expect(got.ovalRelation, `${site.name} oval relation at step ${step}`).toBe(want.ovalRelation);
        expectClose(got.magLatDeg, want.magLatDeg, 0.01, `${site.name} magnetic latitude at step ${step}`);
        if (want.conjugate) {
          expectClose(got.conjugate!.geoLatDeg, want.conjugate.geoLatDeg, 0.01, `${site.name} conjugate latitude at step ${step}`);
          expectClose(got.conjugate!.geoLonDeg, want.conjugate.geoLonDeg, 0.01, `${site.name} conjugate longitude at step ${step}`);
        }
        if (want.boundaries?.openClosedMagLatDeg != null) expectClose(got.boundaries!.openClosedMagLatDeg!, want.boundaries.openClosedMagLatDeg, 0.01, `${site.name} open–closed boundary at step ${step}`);
        if (want.sky) expectClose(got.sky!.elevationDeg, want.sky.elevationDeg, 0.01, `${site.name} oval elevation at step ${step}`);
      });
      // The table in the page shows the same conjugate latitude (3 decimals).
      const first = shown.findIndex((r) => r.conjugate);
      if (first >= 0) {
        const cell = await b.page.locator(`tr[data-site-index="${first}"] td[data-col="conj-lat"]`).textContent();
        expectClose(Number(cell), shown[first].conjugate!.geoLatDeg, 0.0006, 'table cell shows the conjugate latitude');
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
