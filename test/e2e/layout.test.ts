/**
 * Layout, keyboard and accessibility of the page at four screen sizes (one
 * page load each), in headless Debian Chromium: no sideways page scroll, the
 * answer card above the fold from 1280×720 up, the sites table scrolling in
 * its own box with the site column sticky, maps that grow, the 3D view turned
 * and reset from the keyboard, no serious or critical axe-core findings, and
 * the maps SVG export parsed by the browser. Screenshots go to test-artifacts/.
 */
import { existsSync, mkdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { CHROMIUM, launch, ROOT, serveApp, waitForEngine, type Browser, type Served } from './harness';
import { downloadText, waitFresh } from './pageHelpers';

const HAVE_BROWSER = existsSync(CHROMIUM);
const ARTIFACTS = join(ROOT, 'test-artifacts');
let served: Served;
let b: Browser;
const consoleErrors: string[] = [];

beforeAll(async () => {
  if (!HAVE_BROWSER) return;
  mkdirSync(ARTIFACTS, { recursive: true });
  served = await serveApp();
  b = await launch({ width: 390, height: 844 });
  b.page.on('console', (m) => { if (m.type() === 'error') consoleErrors.push(m.text()); });
  b.page.on('pageerror', (e) => consoleErrors.push(`pageerror: ${e.message}`));
});

afterAll(async () => {
  await b?.close();
  await served?.close();
});

async function open(page: Page, width: number, height: number): Promise<void> {
  await page.setViewportSize({ width, height });
  await page.goto(served.url);
  await waitForEngine(page);
  await waitFresh(page, ['scene', 'oval', 'sites']);
  await page.waitForTimeout(300); // maps re-measure their boxes
}

const scroll = (page: Page) => page.evaluate(() => ({ sw: document.documentElement.scrollWidth, iw: innerWidth, ih: innerHeight }));
const camera = (page: Page) => page.locator('.scene canvas').evaluate((c) => (c as HTMLCanvasElement).dataset.camera ?? '');
const dist = (s: string) => Math.hypot(...s.split(',').map(Number));

async function shot(page: Page, name: string): Promise<void> {
  await page.screenshot({ path: join(ARTIFACTS, `${name}.png`) });
}

describe.skipIf(!HAVE_BROWSER)('page layout on four screens', () => {
  it('390×844 (phone): one column, 3D view full width, no sideways scroll', async () => {
    await open(b.page, 390, 844);
    const m = await scroll(b.page);
    expect(m.sw, 'page scrollWidth vs innerWidth').toBeLessThanOrEqual(m.iw);
    const view = await b.page.locator('.scene').boundingBox();
    expect(view!.width, '3D view width on a phone (px)').toBeGreaterThan(m.iw - 30);
    const answer = await b.page.locator('section.answer').boundingBox();
    const controls = await b.page.locator('aside.left').boundingBox();
    expect(answer!.y, 'answer card comes before the controls').toBeLessThan(controls!.y);
    await shot(b.page, 'layout-390x844');
    await b.page.screenshot({ path: join(ARTIFACTS, 'layout-390x844-full.png'), fullPage: true });
  });

  it('1280×720: answer card above the fold, table scrolls in its own box with a sticky site column', async () => {
    await open(b.page, 1280, 720);
    const m = await scroll(b.page);
    expect(m.sw, 'page scrollWidth vs innerWidth').toBeLessThanOrEqual(m.iw);
    const card = await b.page.locator('section.answer').boundingBox();
    expect(card!.y + card!.height, 'answer card bottom (px) within the first screen').toBeLessThanOrEqual(m.ih);
    await expect.poll(() => b.page.locator('[data-answer="oval"]').textContent()).toMatch(/oval/);
    expect(await b.page.locator('[data-answer="look"]').textContent()).toMatch(/from north, eastward/);
    await shot(b.page, 'layout-1280x720');
    // The table: wider than its box, which scrolls; the site column stays put.
    const wrap = b.page.locator('.table-wrap');
    const dims = await wrap.evaluate((el) => ({ sw: el.scrollWidth, cw: el.clientWidth }));
    expect(dims.sw, 'table wider than its box at 1280 px').toBeGreaterThan(dims.cw);
    await wrap.evaluate((el) => { el.scrollLeft = el.scrollWidth; });
    const wrapBox = await wrap.boundingBox();
    const nameBox = await b.page.locator('tbody th.name').first().boundingBox();
    expect(Math.abs(nameBox!.x - wrapBox!.x), 'site column at the left edge of the scrolled box (px)').toBeLessThanOrEqual(2);
    expect((await scroll(b.page)).sw, 'page still not scrolling sideways').toBeLessThanOrEqual(m.iw);
    // Choosing a site in the table moves the answer card to it.
    await b.page.locator('tbody th.name button', { hasText: 'Aster Bay Hut' }).click();
    await expect.poll(() => b.page.getByLabel('Site for the answer').inputValue()).toBe('Aster Bay Hut');
    expect(await b.page.locator('[data-answer="line"]').textContent()).toMatch(/open/);
  });

  it('turns, zooms and resets the 3D view from the keyboard, with the keys listed in a help overlay', async () => {
    const canvas = b.page.locator('.scene canvas');
    // Reach the view with Tab from the control before it (no mouse).
    await b.page.getByRole('button', { name: 'South pole' }).focus();
    await b.page.keyboard.press('Tab');
    expect(await canvas.evaluate((c) => c === document.activeElement), 'Tab reaches the 3D view').toBe(true);
    const start = await camera(b.page);
    expect(start).toMatch(/^-?\d/);
    await b.page.keyboard.press('ArrowLeft');
    await b.page.keyboard.press('ArrowLeft');
    const turned = await camera(b.page);
    expect(turned, 'arrow keys turn the view').not.toBe(start);
    expect(Math.abs(dist(turned) - dist(start)), 'turning keeps the distance (RE)').toBeLessThan(1e-2);
    await b.page.keyboard.press('ArrowUp');
    await b.page.keyboard.press('+');
    expect(dist(await camera(b.page)), 'the + key zooms in').toBeLessThan(dist(start) * 0.9);
    await b.page.keyboard.press('Home');
    expect(await camera(b.page), 'Home resets to the first view').toBe(start);
    await b.page.keyboard.press('-');
    await b.page.keyboard.press('0');
    expect(await camera(b.page), '0 resets too').toBe(start);
    await b.page.keyboard.press('?');
    await expect.poll(() => b.page.getByRole('dialog', { name: 'Keys for the 3D view' }).count()).toBe(1);
    expect(await b.page.getByRole('dialog', { name: 'Keys for the 3D view' }).textContent()).toMatch(/0 or Home/);
    await b.page.keyboard.press('Escape');
    await expect.poll(() => b.page.getByRole('dialog', { name: 'Keys for the 3D view' }).count()).toBe(0);
  });

  it('has no serious or critical accessibility findings (axe-core)', async () => {
    await b.page.evaluate(readFileSync(join(ROOT, 'node_modules/axe-core/axe.min.js'), 'utf8'));
    const found = await b.page.evaluate(async () => {
      const axe = (window as unknown as { axe: { run(ctx: Document, o: object): Promise<{ violations: { id: string; impact: string; help: string; nodes: { target: string[] }[] }[] }> } }).axe;
      const r = await axe.run(document, { resultTypes: ['violations'] });
      return r.violations.filter((v) => v.impact === 'serious' || v.impact === 'critical').map((v) => `${v.impact} ${v.id}: ${v.help} — ${v.nodes.slice(0, 3).map((n) => n.target.join(' ')).join(' | ')}`);
    });
    expect(found).toEqual([]);
  });

  it('exports the maps as an SVG the browser parses, with the time and a legend', async () => {
    const svg = await downloadText(b.page, 'Maps SVG');
    const parsed = await b.page.evaluate((text) => {
      const d = new DOMParser().parseFromString(text, 'image/svg+xml');
      return { error: d.getElementsByTagName('parsererror').length, maps: d.querySelectorAll('svg[data-map]').length, time: d.querySelector('[data-field="time"]')?.textContent ?? '', legend: d.getElementById('legend')?.textContent ?? '' };
    }, svg.text);
    expect(parsed.error, 'parser errors').toBe(0);
    expect(parsed.maps).toBe(2);
    expect(parsed.time).toContain('2025-03-20 22:00 UTC');
    expect(parsed.legend).toMatch(/Legend.*open–closed boundary.*equatorward edge/);
  });

  it('1400×900: no sideways scroll, maps larger than before (300 px), a map opens larger', async () => {
    await open(b.page, 1400, 900);
    const m = await scroll(b.page);
    expect(m.sw, 'page scrollWidth vs innerWidth').toBeLessThanOrEqual(m.iw);
    const card = await b.page.locator('section.answer').boundingBox();
    expect(card!.y + card!.height).toBeLessThanOrEqual(m.ih);
    const map = await b.page.locator('#polar-maps svg[data-map="north"]').boundingBox();
    expect(map!.width, 'north map width (px)').toBeGreaterThan(400);
    await shot(b.page, 'layout-1400x900');
    await b.page.getByRole('button', { name: 'Enlarge the north polar map' }).click();
    const big = await b.page.getByRole('dialog', { name: 'North polar map, enlarged' }).locator('svg[data-map]').boundingBox();
    expect(big!.width, 'enlarged map (px)').toBeGreaterThan(map!.width);
    await b.page.keyboard.press('Escape');
    await expect.poll(() => b.page.getByRole('dialog', { name: 'North polar map, enlarged' }).count()).toBe(0);
  });

  it('1920×1080: no sideways scroll, answer card and the maps on the first screen', async () => {
    await open(b.page, 1920, 1080);
    const m = await scroll(b.page);
    expect(m.sw, 'page scrollWidth vs innerWidth').toBeLessThanOrEqual(m.iw);
    const card = await b.page.locator('section.answer').boundingBox();
    expect(card!.y + card!.height).toBeLessThanOrEqual(m.ih);
    const maps = await b.page.locator('#polar-maps').boundingBox();
    expect(maps!.y + maps!.height, 'maps bottom (px)').toBeLessThanOrEqual(m.ih);
    await shot(b.page, 'layout-1920x1080');
    expect(consoleErrors).toEqual([]);
  });
});
